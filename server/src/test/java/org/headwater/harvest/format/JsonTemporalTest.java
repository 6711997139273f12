package org.headwater.harvest.format;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.LocalDate;
import java.time.format.DateTimeFormatter;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** The JSON reader's date and time test agrees with java.time's ISO-8601 parsers, the reference it replaces. */
class JsonTemporalTest {
    /** What java.time says: ISO_LOCAL_DATE for ten characters, ISO_DATE_TIME for longer text. */
    private static String reference(String text) {
        try {
            if (text.length() == 10) {
                LocalDate.parse(text);
                return "date";
            }
            DateTimeFormatter.ISO_DATE_TIME.parse(text);
            return "timestamp";
        } catch (DateTimeParseException e) {
            return "text";
        }
    }

    @Test
    void handWrittenIsoCheckAgreesWithJavaTimeOnKnownAndGeneratedStrings() {
        List<String> texts = new ArrayList<>(List.of("2024-02-29", "2023-02-29", "2025-13-01", "2025-04-31", "2025-04-30",
                "2025-04-30T12:00", "2025-04-30T24:00", "2025-04-30T23:59:59", "2025-04-30T23:59:60", "2025-04-30T10:15:30.123",
                "2025-04-30T10:15:30.1234567891", "2025-04-30T10:15:30Z", "2025-04-30T10:15:30+02:00", "2025-04-30T10:15+19:00",
                "2025-04-30T10:15:30-05:30:15", "2025-04-30 10:15:30", "2025-04-30T10:15:30+0200", "20250430", "2025-4-30",
                "2025-04-30Z", "2025-04-30T10", "2025-04-30T10:15:30.", "1999-12-31T23:59:59.999999999Z"));
        // Generated: valid shapes with digits and separators changed at random.
        SplittableRandom random = new SplittableRandom(20261202);
        String alphabet = "0123456789-:T.Z+ ";
        for (int k = 0; k < 20_000; k++) {
            StringBuilder b = new StringBuilder(Fuzzish.SHAPES[random.nextInt(Fuzzish.SHAPES.length)]);
            for (int m = random.nextInt(4); m > 0; m--) {
                int at = random.nextInt(b.length());
                b.setCharAt(at, alphabet.charAt(random.nextInt(alphabet.length())));
            }
            texts.add(b.toString());
        }
        for (String text : texts) {
            assertThat(JsonRecordsReader.isoTemporal(text)).as(text).isEqualTo(reference(text));
        }
    }

    /** Shapes of ISO-8601 text, to be mutated. */
    private static final class Fuzzish {
        static final String[] SHAPES = {"2025-04-30", "2025-04-30T10:15", "2025-04-30T10:15:30", "2025-04-30T10:15:30.250",
                "2025-04-30T10:15:30Z", "2025-04-30T10:15:30+02:00", "2024-02-29T00:00:00-11:30", "1970-01-01T00:00:00.000000001Z"};
    }
}

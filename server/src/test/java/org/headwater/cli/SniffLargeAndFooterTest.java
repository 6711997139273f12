package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedWriter;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code sniff --json} keys of issue 3 item 11 that the demo files do not exercise: footers, thousands, estimates. */
class SniffLargeAndFooterTest {

    @TempDir
    Path dir;

    private static JsonNode sniff(Path file) throws Exception {
        StringWriter out = new StringWriter();
        int exit = Main.run(new PrintWriter(out, true), new PrintWriter(new StringWriter(), true), "sniff", "--json", file.toString());
        assertThat(exit).isZero();
        return new ObjectMapper().readTree(out.toString()).get(0);
    }

    @Test
    void reportsATotalsFooterAndThousandsSeparatorsAndCountsRowsWithoutTheFooter() throws Exception {
        Path file = dir.resolve("visits.csv");
        Files.writeString(file, "keeper,visits\nIlsa,\"1,250\"\nTavi,\"12,075\"\nQuen,\"3,400\"\nTotal,\"16,725\"\n");
        JsonNode r = sniff(file);
        assertThat(r.get("footer_lines").asInt()).isEqualTo(1);
        assertThat(r.get("thousands_separator").asText()).isEqualTo(",");
        assertThat(r.get("columns").get(1).get("type").asText()).isEqualTo("integer");
        assertThat(r.get("row_count").asLong()).isEqualTo(3);
        assertThat(r.get("row_count_exact").asBoolean()).isTrue();
    }

    @Test
    void estimatesTheRowCountOfAFileBeyondTheWholeFileCapAndMarksItEstimated() throws Exception {
        // Generated: fixed-width rows of 15 bytes, so the head's bytes per row hold for the whole file.
        Path file = dir.resolve("big.csv");
        long rows = SniffCommand.WHOLE_FILE_CAP / 15 + 1000;
        try (BufferedWriter w = Files.newBufferedWriter(file, StandardCharsets.US_ASCII)) {
            w.write("id,depth_m\n");
            for (long i = 0; i < rows; i++) {
                w.write(String.format(Locale.ROOT, "%08d,%05.2f\n", i, (i % 9000) / 100.0));
            }
        }
        assertThat(Files.size(file)).isGreaterThan(SniffCommand.WHOLE_FILE_CAP);
        JsonNode r = sniff(file);
        assertThat(r.get("row_count_exact").asBoolean()).isFalse();
        assertThat((double) r.get("row_count").asLong()).isBetween(rows * 0.99, rows * 1.01);
    }
}

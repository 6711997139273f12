package org.headwater.model;

import java.time.Instant;
import java.time.LocalDate;
import java.time.ZoneOffset;
import java.time.format.DateTimeParseException;

/** Reads the times people type for history questions ("as of"). */
public final class Times {
    private Times() {
    }

    /**
     * An ISO instant ({@code 2026-03-01T12:00:00Z}), or a date, meaning the end of that day in UTC so that
     * "as of 2026-03-01" includes everything that happened on that day.
     *
     * @throws IllegalArgumentException with a message for the person who typed it
     */
    public static Instant parse(String raw) {
        String text = raw.trim();
        try {
            return Instant.parse(text);
        } catch (DateTimeParseException notInstant) {
            try {
                return LocalDate.parse(text).plusDays(1).atStartOfDay().toInstant(ZoneOffset.UTC).minusNanos(1000);
            } catch (DateTimeParseException notDate) {
                throw new IllegalArgumentException("'" + raw + "' is not a time: use 2026-03-01 or 2026-03-01T12:00:00Z");
            }
        }
    }
}

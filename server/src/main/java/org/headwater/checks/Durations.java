package org.headwater.checks;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** Reads and writes the short durations of policies and options: {@code 36h}, {@code 7d}, {@code 1d12h}, {@code 90m}. */
public final class Durations {
    private static final Pattern PART = Pattern.compile("(\\d{1,9})([wdhms])");
    // Largest first: the canonical text uses the largest unit that divides the duration exactly.
    private static final long[] SECONDS = {7 * 86_400L, 86_400L, 3_600L, 60L, 1L};
    private static final String UNITS = "wdhms";
    private static final String[] WORDS = {"week", "day", "hour", "minute", "second"};

    private Durations() {
    }

    /**
     * Parses one or more number-unit pairs (w weeks, d days, h hours, m minutes, s seconds).
     *
     * @throws IllegalArgumentException with a message for the person who wrote it
     */
    public static Duration parse(String text) {
        String raw = text == null ? "" : text.trim().toLowerCase(java.util.Locale.ROOT);
        Matcher m = PART.matcher(raw);
        long seconds = 0;
        int end = 0;
        while (m.lookingAt()) {
            seconds += Long.parseLong(m.group(1)) * SECONDS[UNITS.indexOf(m.group(2))];
            end = m.end();
            m.region(end, raw.length());
        }
        if (raw.isEmpty() || end != raw.length() || seconds == 0) {
            throw new IllegalArgumentException("'" + text + "' is not a duration: write for example 36h, 7d, 1d12h or 90m"
                    + " (w weeks, d days, h hours, m minutes, s seconds; more than zero)");
        }
        return Duration.ofSeconds(seconds);
    }

    /** The canonical text: a whole number of the largest unit that fits exactly ({@code 36h}, {@code 2w}, {@code 90m}). */
    public static String text(Duration duration) {
        long seconds = duration.getSeconds();
        for (int i = 0; i < SECONDS.length; i++) {
            if (seconds % SECONDS[i] == 0) {
                return seconds / SECONDS[i] + UNITS.substring(i, i + 1);
            }
        }
        throw new AssertionError("every whole number of seconds is divisible by one");
    }

    /** Words for a sentence, the two largest non-zero units: "2 days 3 hours", "40 minutes", "under a second". */
    public static String words(Duration duration) {
        long seconds = Math.abs(duration.getSeconds());
        List<String> parts = new ArrayList<>();
        // Weeks are left out: "10 days" reads better than "1 week 3 days" in a why sentence.
        for (int i = 1; i < SECONDS.length && parts.size() < 2; i++) {
            long n = seconds / SECONDS[i];
            if (n > 0) {
                parts.add(n + " " + WORDS[i] + (n == 1 ? "" : "s"));
                seconds -= n * SECONDS[i];
            } else if (!parts.isEmpty()) {
                break;
            }
        }
        return parts.isEmpty() ? "under a second" : String.join(" ", parts);
    }
}

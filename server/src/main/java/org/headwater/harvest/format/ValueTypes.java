package org.headwater.harvest.format;

import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.regex.Pattern;

/**
 * A basic guess of a column's logical type from its values. The table of patterns is data: the first
 * type whose pattern every non-missing value matches wins, in the order of {@link #TYPES}.
 */
public final class ValueTypes {

    /** A logical type and the shape its values must have. */
    record ValueType(String name, Pattern pattern) {
    }

    // Order matters: the narrowest type comes first.
    static final List<ValueType> TYPES = List.of(
            new ValueType("boolean", Pattern.compile("(?i)true|false|yes|no")),
            new ValueType("integer", Pattern.compile("[-+]?\\d{1,18}")),
            new ValueType("decimal", Pattern.compile("[-+]?(\\d+([.,]\\d*)?|[.,]\\d+)([eE][-+]?\\d+)?")),
            new ValueType("date", Pattern.compile("\\d{4}-\\d{2}-\\d{2}|\\d{2}[./]\\d{2}[./]\\d{4}")),
            new ValueType("timestamp", Pattern.compile(
                    "\\d{4}-\\d{2}-\\d{2}[T ]\\d{2}:\\d{2}(:\\d{2}(\\.\\d+)?)?(Z|[+-]\\d{2}:?\\d{2})?")));

    // common practice, no source: the usual spellings of "no value" in exported tables.
    static final Set<String> MISSING = Set.of("", "na", "n/a", "null", "none", "nan", "-");

    private ValueTypes() {
    }

    public static boolean isMissing(String value) {
        return MISSING.contains(value.trim().toLowerCase(Locale.ROOT));
    }

    /** The narrowest type all present values fit; {@code text} when none fits, or when all are missing. */
    public static String guess(Iterable<String> values) {
        boolean[] possible = new boolean[TYPES.size()];
        java.util.Arrays.fill(possible, true);
        boolean any = false;
        for (String raw : values) {
            if (isMissing(raw)) {
                continue;
            }
            any = true;
            String value = raw.trim();
            for (int t = 0; t < TYPES.size(); t++) {
                if (possible[t] && !TYPES.get(t).pattern().matcher(value).matches()) {
                    possible[t] = false;
                }
            }
        }
        if (!any) {
            return "text";
        }
        for (int t = 0; t < TYPES.size(); t++) {
            if (possible[t]) {
                return TYPES.get(t).name();
            }
        }
        return "text";
    }
}

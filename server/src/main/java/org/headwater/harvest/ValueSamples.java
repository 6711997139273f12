package org.headwater.harvest;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.harvest.format.Reading;

/**
 * Removes cell values from what a format reader found, for sources that keep value sampling off: a
 * column's minimum and maximum are values of some row and may be personal data.
 */
final class ValueSamples {
    /** Keys of a column's statistics that hold values taken from cells. */
    private static final Set<String> VALUE_KEYS = Set.of("min", "max");

    private ValueSamples() {
    }

    static Reading withoutValues(Reading reading) {
        if (reading == null || reading.details() == null || !(reading.details().get("column_stats") instanceof List<?> stats)) {
            return reading;
        }
        List<Object> cleaned = new ArrayList<>();
        for (Object stat : stats) {
            if (stat instanceof Map<?, ?> map) {
                Map<Object, Object> copy = new LinkedHashMap<>(map);
                copy.keySet().removeAll(VALUE_KEYS);
                cleaned.add(copy);
            } else {
                cleaned.add(stat);
            }
        }
        Map<String, Object> details = new LinkedHashMap<>(reading.details());
        details.put("column_stats", cleaned);
        return new Reading(reading.format(), reading.kind(), reading.columns(), reading.rowCount(),
                reading.rowCountExact(), details);
    }
}

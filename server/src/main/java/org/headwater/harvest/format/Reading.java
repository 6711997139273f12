package org.headwater.harvest.format;

import java.util.List;
import java.util.Map;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;

/**
 * What a reader learned about one file.
 *
 * @param columns the column structure, or {@code null} when the format has none
 * @param rowCount number of data rows or records, or {@code null} when unknown
 * @param rowCountExact false when {@code rowCount} was estimated from a sample
 * @param details format-specific facts (delimiter, encoding, dimensions…), stored as JSON
 */
public record Reading(String format, DatasetKind kind, List<ColumnDef> columns, Long rowCount, boolean rowCountExact,
        Map<String, Object> details) {

    /** A file whose format is known but which has no columns to read. */
    public static Reading opaque(String format, DatasetKind kind) {
        return new Reading(format, kind, null, null, false, Map.of());
    }
}

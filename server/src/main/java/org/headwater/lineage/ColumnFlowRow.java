package org.headwater.lineage;

import java.util.Objects;
import org.headwater.ingest.Observation.ColumnRole;

/**
 * One column-level flow of a dataset edge version.
 *
 * @param targetColumn the column written, or null when the source column only influences the target
 */
public record ColumnFlowRow(long edgeId, String sourceColumn, String targetColumn, ColumnRole role) {
    public ColumnFlowRow {
        Objects.requireNonNull(sourceColumn, "sourceColumn");
        Objects.requireNonNull(role, "role");
    }
}

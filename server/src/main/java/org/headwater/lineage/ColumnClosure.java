package org.headwater.lineage;

import java.util.Objects;

/**
 * The columns connected to a start column. {@code flows} are reached through direct and derived flows
 * only: their values are copied or computed from the start. {@code indirect} are reached only when
 * influencing flows (filters, join keys, groupings) are crossed too: the start decides which rows they
 * hold, not what the values are. No column is in both.
 */
public record ColumnClosure(ColumnKey start, ColumnReach flows, ColumnReach indirect) {
    public ColumnClosure {
        Objects.requireNonNull(start, "start");
        Objects.requireNonNull(flows, "flows");
        Objects.requireNonNull(indirect, "indirect");
    }
}

package org.headwater.lineage;

import java.util.List;

/** A column a walk reached: how many hops away, and one shortest path between it and the start column. */
public record ReachedColumn(ColumnKey column, int distance, List<ColumnHop> path) {
    public ReachedColumn {
        path = List.copyOf(path);
    }
}

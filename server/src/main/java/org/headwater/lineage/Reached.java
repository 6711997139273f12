package org.headwater.lineage;

import java.util.List;

/** A dataset a walk reached: how many hops away, and one shortest path between it and the start. */
public record Reached(long datasetId, int distance, List<Hop> path) {
    public Reached {
        path = List.copyOf(path);
    }
}

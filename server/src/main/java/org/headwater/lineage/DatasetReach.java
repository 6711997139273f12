package org.headwater.lineage;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * The datasets a walk reached, nearest first (breadth-first order), each with its distance and one
 * shortest path. The start itself is not among them; {@link #startInCycle()} says whether the walk came
 * back to it. Paths are built when asked for, so a closure of ten thousand datasets costs little more
 * than its ids.
 */
public final class DatasetReach {
    private final long start;
    private final long[] ids;
    private final Trace trace;

    DatasetReach(long start, long[] ids, Trace trace) {
        this.start = start;
        this.ids = ids;
        this.trace = trace;
    }

    static DatasetReach empty(long start) {
        Trace trace = Trace.empty();
        trace.finish();
        return new DatasetReach(start, new long[] {start}, trace);
    }

    public long start() {
        return start;
    }

    /** Whether an edge the walk was allowed to cross leads back to the start (within the depth limit). */
    public boolean startInCycle() {
        return trace.returnsToStart;
    }

    public int size() {
        return trace.size();
    }

    public boolean isEmpty() {
        return size() == 0;
    }

    public long datasetId(int i) {
        return ids[trace.reported(i)];
    }

    public int distance(int i) {
        return trace.distance[trace.reported(i)];
    }

    public List<Hop> path(int i) {
        return pathTo(trace.reported(i));
    }

    public Reached get(int i) {
        return new Reached(datasetId(i), distance(i), path(i));
    }

    /** Every reported dataset with its path, nearest first. */
    public List<Reached> reached() {
        List<Reached> all = new ArrayList<>(size());
        for (int i = 0; i < size(); i++) {
            all.add(get(i));
        }
        return all;
    }

    /** The reported dataset ids, nearest first. */
    public long[] datasetIds() {
        long[] reportedIds = new long[size()];
        for (int i = 0; i < reportedIds.length; i++) {
            reportedIds[i] = datasetId(i);
        }
        return reportedIds;
    }

    /** The reported dataset with this id, if reached; a linear search, for a few look-ups per walk. */
    public Optional<Reached> find(long datasetId) {
        for (int i = 0; i < size(); i++) {
            if (datasetId(i) == datasetId) {
                return Optional.of(get(i));
            }
        }
        return Optional.empty();
    }

    private List<Hop> pathTo(int position) {
        List<Hop> hops = new ArrayList<>(trace.distance[position]);
        for (int p : trace.hopsTo(position)) {
            long near = ids[trace.parent[p]];
            long far = ids[p];
            hops.add(new Hop(trace.edgeId(p), trace.upstream ? far : near, trace.upstream ? near : far,
                    trace.scriptId(p), trace.runId(p), trace.evidence(p), trace.confidence(p)));
        }
        return hops;
    }
}

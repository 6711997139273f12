package org.headwater.lineage;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.headwater.ingest.Observation.ColumnRole;

/** Columns a column walk reached, nearest first, each with its distance and one shortest path. */
public final class ColumnReach {
    private static final ColumnRole[] ROLES = ColumnRole.values();

    private final ColumnKey[] keys;
    private final byte[] roles;
    private final Trace trace;

    ColumnReach(ColumnKey[] keys, byte[] roles, Trace trace) {
        this.keys = keys;
        this.roles = roles;
        this.trace = trace;
    }

    static ColumnReach empty(ColumnKey start) {
        Trace trace = Trace.empty();
        trace.finish();
        return new ColumnReach(new ColumnKey[] {start}, new byte[1], trace);
    }

    /** Whether a column edge the walk was allowed to cross leads back to the start column. */
    public boolean startInCycle() {
        return trace.returnsToStart;
    }

    public int size() {
        return trace.size();
    }

    public boolean isEmpty() {
        return size() == 0;
    }

    public ColumnKey column(int i) {
        return keys[trace.reported(i)];
    }

    public int distance(int i) {
        return trace.distance[trace.reported(i)];
    }

    public List<ColumnHop> path(int i) {
        int position = trace.reported(i);
        List<ColumnHop> hops = new ArrayList<>(trace.distance[position]);
        for (int p : trace.hopsTo(position)) {
            ColumnKey near = keys[trace.parent[p]];
            ColumnKey far = keys[p];
            hops.add(new ColumnHop(trace.edgeId(p), trace.upstream ? far : near, trace.upstream ? near : far,
                    ROLES[roles[p]], trace.scriptId(p), trace.runId(p), trace.evidence(p), trace.confidence(p)));
        }
        return hops;
    }

    public ReachedColumn get(int i) {
        return new ReachedColumn(column(i), distance(i), path(i));
    }

    /** Every reported column with its path, nearest first. */
    public List<ReachedColumn> reached() {
        List<ReachedColumn> all = new ArrayList<>(size());
        for (int i = 0; i < size(); i++) {
            all.add(get(i));
        }
        return all;
    }

    /** The reported columns, nearest first. */
    public List<ColumnKey> columns() {
        List<ColumnKey> all = new ArrayList<>(size());
        for (int i = 0; i < size(); i++) {
            all.add(column(i));
        }
        return all;
    }

    /** The reported column, if reached; a linear search, for a few look-ups per walk. */
    public Optional<ReachedColumn> find(ColumnKey column) {
        for (int i = 0; i < size(); i++) {
            if (column(i).equals(column)) {
                return Optional.of(get(i));
            }
        }
        return Optional.empty();
    }
}

package org.headwater.lineage;

import java.util.Arrays;
import org.headwater.model.DatasetKind;

/** Dataset nodes: store id to node number and back, with the two facts queries filter on (kind, source). */
final class DatasetNodes {
    /** Stands for "no source" in {@link #source}; store ids start at 1. */
    static final long NO_SOURCE = Long.MIN_VALUE;

    private final LongIntMap byId;
    private long[] ids;
    private byte[] kinds;
    private long[] sources;
    private int count;

    DatasetNodes(int expected) {
        byId = new LongIntMap(expected);
        int capacity = Math.max(16, expected);
        ids = new long[capacity];
        kinds = new byte[capacity];
        sources = new long[capacity];
    }

    int count() {
        return count;
    }

    /** Drops the growth room left after bulk loading. */
    void trim() {
        int capacity = Math.max(16, count);
        ids = Arrays.copyOf(ids, capacity);
        kinds = Arrays.copyOf(kinds, capacity);
        sources = Arrays.copyOf(sources, capacity);
    }

    /** The node of a dataset, or -1 when the graph has never heard of it. */
    int node(long datasetId) {
        return byId.get(datasetId);
    }

    /** Adds the dataset or refreshes its kind and source (both may be corrected after it was first seen). */
    int put(long datasetId, DatasetKind kind, Long sourceId) {
        int node = byId.get(datasetId);
        if (node < 0) {
            node = count++;
            if (node == ids.length) {
                int capacity = ids.length + (ids.length >> 1);
                ids = Arrays.copyOf(ids, capacity);
                kinds = Arrays.copyOf(kinds, capacity);
                sources = Arrays.copyOf(sources, capacity);
            }
            ids[node] = datasetId;
            byId.put(datasetId, node);
        }
        kinds[node] = (byte) kind.ordinal();
        sources[node] = sourceId == null ? NO_SOURCE : sourceId;
        return node;
    }

    /** The node of a dataset named by an edge, adding it as kind {@code other} if no dataset row was read. */
    int ensure(long datasetId) {
        int node = byId.get(datasetId);
        return node >= 0 ? node : put(datasetId, DatasetKind.OTHER, null);
    }

    long id(int node) {
        return ids[node];
    }

    int kind(int node) {
        return kinds[node];
    }

    long source(int node) {
        return sources[node];
    }
}

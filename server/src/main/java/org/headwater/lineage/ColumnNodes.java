package org.headwater.lineage;

import java.util.Arrays;

/**
 * Column nodes: (dataset node, column name) interned to one int. Column names repeat across datasets, so
 * they are interned once and a column is the pair packed into a long key. A null column name stands for
 * the dataset as a whole: what an influencing column reaches when the edge names no target columns.
 */
final class ColumnNodes {
    private static final int WHOLE = -1;

    private final Names names = new Names();
    private final LongIntMap byKey;
    private int[] datasets;
    private int[] nameIds;
    private int count;

    ColumnNodes(int expected) {
        byKey = new LongIntMap(expected);
        int capacity = Math.max(16, expected);
        datasets = new int[capacity];
        nameIds = new int[capacity];
    }

    int count() {
        return count;
    }

    /** Drops the growth room left after bulk loading. */
    void trim() {
        int capacity = Math.max(16, count);
        datasets = Arrays.copyOf(datasets, capacity);
        nameIds = Arrays.copyOf(nameIds, capacity);
    }

    /** The node of a column, or -1 when no column edge ever touched it. */
    int node(int datasetNode, String column) {
        int name = column == null ? WHOLE : names.find(column);
        if (column != null && name < 0) {
            return -1;
        }
        return byKey.get(key(datasetNode, name));
    }

    int ensure(int datasetNode, String column) {
        int name = column == null ? WHOLE : names.intern(column);
        long key = key(datasetNode, name);
        int node = byKey.get(key);
        if (node >= 0) {
            return node;
        }
        node = count++;
        if (node == datasets.length) {
            int capacity = datasets.length + (datasets.length >> 1);
            datasets = Arrays.copyOf(datasets, capacity);
            nameIds = Arrays.copyOf(nameIds, capacity);
        }
        datasets[node] = datasetNode;
        nameIds[node] = name;
        byKey.put(key, node);
        return node;
    }

    int dataset(int node) {
        return datasets[node];
    }

    /** The column name, or null for the dataset as a whole. */
    String column(int node) {
        int name = nameIds[node];
        return name == WHOLE ? null : names.name(name);
    }

    private static long key(int datasetNode, int name) {
        return ((long) datasetNode << 32) | ((name + 1) & 0xFFFFFFFFL);
    }
}

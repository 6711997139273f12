package org.headwater.lineage;

import java.util.Arrays;

/**
 * Per-node lists of edge slots in one direction, kept sorted by a caller-given order key (the store's edge
 * id) so that a graph kept current edge by edge walks its edges in the same order as one rebuilt from the
 * store. Bulk loading sizes every list exactly, like a CSR row; later additions grow a list by doubling.
 */
final class Adjacency {
    private static final int[] EMPTY = new int[0];

    /** Says how two edge slots are ordered in a list. */
    @FunctionalInterface
    interface Order {
        boolean after(int slot, int other);
    }

    private int[][] lists = new int[16][];
    private int[] sizes = new int[16];

    void ensureNodes(int nodes) {
        if (nodes > lists.length) {
            int capacity = Math.max(nodes, lists.length + (lists.length >> 1));
            lists = Arrays.copyOf(lists, capacity);
            sizes = Arrays.copyOf(sizes, capacity);
        }
    }

    /** Bulk loading: gives a node a list of exactly this capacity, to be filled with {@link #append}. */
    void reserve(int node, int capacity) {
        lists[node] = capacity == 0 ? null : new int[capacity];
        sizes[node] = 0;
    }

    /** Adds at the end; the caller guarantees order (bulk loading in edge-id order). */
    void append(int node, int slot) {
        int[] list = lists[node];
        int size = sizes[node];
        if (list == null || size == list.length) {
            list = lists[node] = Arrays.copyOf(list == null ? EMPTY : list, Math.max(2, size * 2));
        }
        list[size] = slot;
        sizes[node] = size + 1;
    }

    /** Adds in order: after every slot that does not come after it. New edges have the highest ids, so this
     * normally stops at once. */
    void insert(int node, int slot, Order order) {
        append(node, slot);
        int[] list = lists[node];
        int i = sizes[node] - 1;
        while (i > 0 && order.after(list[i - 1], slot)) {
            list[i] = list[i - 1];
            i--;
        }
        list[i] = slot;
    }

    boolean remove(int node, int slot) {
        int[] list = lists[node];
        int size = sizes[node];
        for (int i = 0; i < size; i++) {
            if (list[i] == slot) {
                System.arraycopy(list, i + 1, list, i, size - i - 1);
                sizes[node] = size - 1;
                return true;
            }
        }
        return false;
    }

    int size(int node) {
        return node < sizes.length ? sizes[node] : 0;
    }

    /** The backing array of a node's list; only the first {@link #size} entries are meaningful. */
    int[] slots(int node) {
        int[] list = node < lists.length ? lists[node] : null;
        return list == null ? EMPTY : list;
    }
}

package org.headwater.lineage;

import java.util.Arrays;

/**
 * Per-node lists of edge slots in one direction, kept in a caller-given order (the store's edge id) so
 * that a graph kept current edge by edge walks its edges in the same order as one rebuilt from the store.
 *
 * <p>Bulk loading lays every list out back to back in one array (compressed sparse rows: no object per
 * node, neighbours contiguous). The first change to a node's list moves that list into an array of its
 * own, which then grows by doubling; its old stretch of the packed array is simply no longer read.
 */
final class Adjacency {
    private static final int[] EMPTY = new int[0];

    /** Says how two edge slots are ordered in a list. */
    @FunctionalInterface
    interface Order {
        boolean after(int slot, int other);
    }

    private int[] packed = EMPTY;
    private int[] offsets = new int[16];
    private int[] sizes = new int[16];
    /** Lists moved out of {@link #packed}; null until the first change after bulk loading. */
    private int[][] own;

    void ensureNodes(int nodes) {
        if (nodes > sizes.length) {
            int capacity = Math.max(nodes, sizes.length + (sizes.length >> 1));
            offsets = Arrays.copyOf(offsets, capacity);
            sizes = Arrays.copyOf(sizes, capacity);
            if (own != null) {
                own = Arrays.copyOf(own, capacity);
            }
        }
    }

    /** Bulk loading: lays out empty lists of the given degrees, to be filled in order with {@link #append}. */
    void layout(int nodes, int[] degrees) {
        ensureNodes(nodes);
        int total = 0;
        for (int node = 0; node < nodes; node++) {
            offsets[node] = total;
            sizes[node] = 0;
            total += degrees[node];
        }
        packed = new int[total];
        own = null;
    }

    /** Bulk loading: adds at the end of a node's laid-out list; the caller adds in order. */
    void append(int node, int slot) {
        packed[offsets[node] + sizes[node]++] = slot;
    }

    /** Adds in order: after every slot that does not come after it. New edges have the highest ids, so the
     * shifting normally stops at once. */
    void insert(int node, int slot, Order order) {
        int size = sizes[node];
        int[] list = owned(node, size + 1);
        int i = size;
        while (i > 0 && order.after(list[i - 1], slot)) {
            list[i] = list[i - 1];
            i--;
        }
        list[i] = slot;
        sizes[node] = size + 1;
    }

    boolean remove(int node, int slot) {
        int size = sizes[node];
        int[] list = owned(node, size);
        for (int i = 0; i < size; i++) {
            if (list[i] == slot) {
                System.arraycopy(list, i + 1, list, i, size - i - 1);
                sizes[node] = size - 1;
                return true;
            }
        }
        return false;
    }

    /** The node's own list, moved out of the packed array if needed, with room for {@code capacity} slots. */
    private int[] owned(int node, int capacity) {
        if (own == null) {
            own = new int[sizes.length][];
        }
        int[] list = own[node];
        if (list == null) {
            list = new int[Math.max(2, capacity)];
            System.arraycopy(packed, offsets[node], list, 0, sizes[node]);
            own[node] = list;
        } else if (list.length < capacity) {
            list = own[node] = Arrays.copyOf(list, Math.max(capacity, list.length * 2));
        }
        return list;
    }

    int size(int node) {
        return node < sizes.length ? sizes[node] : 0;
    }

    /** The array holding a node's list, from {@link #offset} for {@link #size} entries. */
    int[] array(int node) {
        int[] list = own == null || node >= own.length ? null : own[node];
        return list != null ? list : packed;
    }

    int offset(int node) {
        int[] list = own == null || node >= own.length ? null : own[node];
        // a node added after the last growth of these arrays has no list yet: an empty one at 0
        return list != null || node >= offsets.length ? 0 : offsets[node];
    }
}

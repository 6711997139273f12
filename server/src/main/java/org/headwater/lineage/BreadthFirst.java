package org.headwater.lineage;

/**
 * The one breadth-first walk, over either level. It leaves its result in the {@link Scratch}: the nodes in
 * visiting order in {@code queue[0..count)}, and for each its distance, the edge it was reached by and
 * its position in the queue. Breadth-first order makes every recorded path a shortest one; among equally
 * short paths it keeps the one found first, taking each node's edges in store-id order.
 */
final class BreadthFirst {
    private BreadthFirst() {
    }

    /** Whether the walk may cross an edge slot. */
    @FunctionalInterface
    interface EdgeTest {
        boolean crosses(int slot);
    }

    /**
     * @param stamp the visited marks to use ({@code scratch.stamp} or {@code scratch.stampB})
     * @param far for each edge slot, the node at the end the walk moves to
     * @return the number of nodes visited, the start included
     */
    static int walk(Scratch scratch, int[] stamp, int generation, int start, Adjacency adjacency, int[] far,
            EdgeTest test, int maxDepth) {
        int[] queue = scratch.queue;
        int[] distance = scratch.distance;
        int[] via = scratch.via;
        int[] position = scratch.position;
        boolean returns = false;
        queue[0] = start;
        stamp[start] = generation;
        distance[start] = 0;
        via[start] = -1;
        position[start] = 0;
        int head = 0;
        int tail = 1;
        while (head < tail) {
            int node = queue[head++];
            int next = distance[node] + 1;
            if (next > maxDepth) {
                break;
            }
            int[] slots = adjacency.array(node);
            int end = adjacency.offset(node) + adjacency.size(node);
            for (int i = adjacency.offset(node); i < end; i++) {
                int slot = slots[i];
                int to = far[slot];
                if (stamp[to] == generation) {
                    returns |= to == start && test.crosses(slot);
                    continue;
                }
                if (!test.crosses(slot)) {
                    continue;
                }
                stamp[to] = generation;
                distance[to] = next;
                via[to] = slot;
                position[to] = tail;
                queue[tail++] = to;
            }
        }
        scratch.returnsToStart = returns;
        return tail;
    }
}

package org.headwater.lineage;

import java.util.Arrays;

/**
 * The working arrays of one walk at a time. "Visited" is {@code stamp[node] == generation}, so starting a
 * walk costs one increment instead of clearing a bitset the size of the graph; the arrays are reused
 * from walk to walk and only grow with the graph.
 */
final class Scratch {
    int[] stamp = new int[0];
    /** A second visited mark, for walks that must remember an earlier walk's nodes (column closures). */
    int[] stampB = new int[0];
    int[] distance = new int[0];
    int[] via = new int[0];
    int[] position = new int[0];
    int[] queue = new int[0];
    boolean returnsToStart;
    private int generation;

    void ensure(int nodes) {
        if (queue.length >= nodes) {
            return;
        }
        int capacity = Math.max(nodes, queue.length + (queue.length >> 1));
        stamp = new int[capacity];
        stampB = new int[capacity];
        distance = new int[capacity];
        via = new int[capacity];
        position = new int[capacity];
        queue = new int[capacity];
        generation = 0;
    }

    int nextGeneration() {
        if (generation == Integer.MAX_VALUE) {
            Arrays.fill(stamp, 0);
            Arrays.fill(stampB, 0);
            generation = 0;
        }
        return ++generation;
    }
}

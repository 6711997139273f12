package org.headwater.search;

import java.util.Arrays;

/**
 * PageRank (Page, Brin, Motwani and Winograd 1999) by power iteration over a graph in int arrays. A node
 * without out-links spreads its rank evenly over all nodes, so the ranks always sum to 1.
 */
final class PageRank {
    static final double DAMPING = 0.85;
    private static final int MAX_ITERATIONS = 100;
    private static final double TOLERANCE = 1e-10;

    private PageRank() {
    }

    /** Ranks of nodes {@code 0..n-1} given edges {@code from[i] -> to[i]}. */
    static double[] of(int n, int[] from, int[] to) {
        if (n == 0) {
            return new double[0];
        }
        int[] outDegree = new int[n];
        for (int f : from) {
            outDegree[f]++;
        }
        double[] rank = new double[n];
        Arrays.fill(rank, 1.0 / n);
        double[] next = new double[n];
        for (int iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
            double dangling = 0;
            for (int v = 0; v < n; v++) {
                if (outDegree[v] == 0) {
                    dangling += rank[v];
                }
            }
            Arrays.fill(next, (1 - DAMPING) / n + DAMPING * dangling / n);
            for (int e = 0; e < from.length; e++) {
                next[to[e]] += DAMPING * rank[from[e]] / outDegree[from[e]];
            }
            double change = 0;
            for (int v = 0; v < n; v++) {
                change += Math.abs(next[v] - rank[v]);
            }
            double[] swap = rank;
            rank = next;
            next = swap;
            if (change < TOLERANCE) {
                break;
            }
        }
        return rank;
    }
}

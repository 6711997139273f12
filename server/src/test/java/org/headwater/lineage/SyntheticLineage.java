package org.headwater.lineage;

import java.util.Random;

/**
 * A random layered lineage DAG for the closure benchmark (invented data). Datasets sit in layers of equal
 * width; each edge leads from a dataset to one in the next layer (80 %), the one after (15 %) or the one
 * after that (5 %), at a position within {@code window} of its own, so a dataset's descendants grow with
 * the square of its distance to the last layer: from ten for the next-to-last layer to tens of thousands
 * for the first. Every edge carries exactly one column flow between the datasets' columns
 * {@code c0..c(columns-1)}: mostly the same column, sometimes another, with the role direct (60 %),
 * derived (30 %) or influencing (10 %).
 *
 * <p>Dataset ids are 1..datasets, edge ids 1..edges (in array order), script ids 1..scripts.
 */
record SyntheticLineage(int datasets, int layers, int columns, int scripts, long[] source, long[] target,
        int[] script, byte[] evidence, double[] confidence, byte[] sourceColumn, byte[] targetColumn, byte[] role) {

    static SyntheticLineage generate(long seed, int datasets, int edges, int layers, int window, int columns,
            int scripts) {
        Random random = new Random(seed);
        int width = datasets / layers;
        if (width * layers != datasets) {
            throw new IllegalArgumentException("datasets must be a multiple of layers");
        }
        int withEdges = datasets - width;
        int base = edges / withEdges;
        int extra = edges - base * withEdges;
        long[] source = new long[edges];
        long[] target = new long[edges];
        int e = 0;
        long[] chosen = new long[base + 2];
        for (int node = 0; node < withEdges; node++) {
            int layer = node / width;
            int position = node % width;
            // The first `extra` datasets (spread by the stride) get one edge more, so the total is exact.
            int degree = base + (((long) node * extra) / withEdges != ((long) (node + 1) * extra) / withEdges ? 1 : 0);
            for (int k = 0; k < degree; k++) {
                long to;
                int tries = 0;
                do {
                    double jump = random.nextDouble();
                    int toLayer = Math.min(layers - 1, layer + (jump < 0.80 ? 1 : jump < 0.95 ? 2 : 3));
                    int spread = window + tries / 4; // widen the window rather than loop on a crowded one
                    int toPosition = Math.floorMod(position + random.nextInt(2 * spread + 1) - spread, width);
                    to = (long) toLayer * width + toPosition + 1;
                    tries++;
                } while (contains(chosen, k, to));
                chosen[k] = to;
                source[e] = node + 1;
                target[e] = to;
                e++;
            }
        }
        int[] script = new int[edges];
        byte[] evidence = new byte[edges];
        double[] confidence = new double[edges];
        byte[] sourceColumn = new byte[edges];
        byte[] targetColumn = new byte[edges];
        byte[] role = new byte[edges];
        for (int i = 0; i < edges; i++) {
            script[i] = (int) (target[i] % scripts) + 1;
            double ev = random.nextDouble();
            evidence[i] = (byte) (ev < 0.70 ? 0 : ev < 0.90 ? 1 : ev < 0.95 ? 2 : 3); // Evidence ordinals
            confidence[i] = (50 + random.nextInt(51)) / 100.0;
            sourceColumn[i] = (byte) random.nextInt(columns);
            targetColumn[i] = random.nextDouble() < 0.8 ? sourceColumn[i] : (byte) random.nextInt(columns);
            double r = random.nextDouble();
            role[i] = (byte) (r < 0.6 ? 0 : r < 0.9 ? 1 : 2); // ColumnRole ordinals
        }
        return new SyntheticLineage(datasets, layers, columns, scripts, source, target, script, evidence, confidence,
                sourceColumn, targetColumn, role);
    }

    int edges() {
        return source.length;
    }

    static String column(int index) {
        return "c" + index;
    }

    private static boolean contains(long[] values, int count, long value) {
        for (int i = 0; i < count; i++) {
            if (values[i] == value) {
                return true;
            }
        }
        return false;
    }
}

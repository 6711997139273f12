package org.headwater.lineage;

import java.util.Arrays;
import org.headwater.model.Evidence;

/**
 * What a walk found, copied out of the graph so that it stays true after the graph changes: for each
 * visited node (position 0 is the start) the position of the node it was reached from, its distance, and
 * the metadata of the dataset edge crossed to reach it. Paths are rebuilt from it only when asked for.
 */
final class Trace {
    private static final Evidence[] EVIDENCE = Evidence.values();

    final boolean upstream;
    final boolean returnsToStart;
    final int[] parent;
    final int[] distance;
    private final long[] edgeIds;
    private final long[] scripts;
    private final String[] runs;
    private final byte[] evidence;
    private final float[] confidence;
    private int[] reported;
    private int reportedCount;

    Trace(int visited, boolean upstream, boolean returnsToStart) {
        this.upstream = upstream;
        this.returnsToStart = returnsToStart;
        parent = new int[visited];
        distance = new int[visited];
        edgeIds = new long[visited];
        scripts = new long[visited];
        runs = new String[visited];
        evidence = new byte[visited];
        confidence = new float[visited];
        reported = new int[Math.max(0, visited - 1)];
        parent[0] = -1;
    }

    static Trace empty() {
        return new Trace(1, false, false);
    }

    /** Records how the node at {@code position} was reached: from {@code parentPosition} over edge {@code slot}. */
    void record(int position, int parentPosition, int hops, EdgeTable edges, int slot) {
        parent[position] = parentPosition;
        distance[position] = hops;
        edgeIds[position] = edges.id(slot);
        scripts[position] = edges.script(slot);
        runs[position] = edges.run(slot);
        evidence[position] = (byte) edges.evidenceOrdinal(slot);
        confidence[position] = edges.confidence(slot);
    }

    void report(int position) {
        reported[reportedCount++] = position;
    }

    void finish() {
        reported = Arrays.copyOf(reported, reportedCount);
    }

    int size() {
        return reported.length;
    }

    int reported(int i) {
        return reported[i];
    }

    /** The positions whose hops make the path to {@code position}, in the direction data flows. */
    int[] hopsTo(int position) {
        int length = distance[position];
        int[] hops = new int[length];
        int p = position;
        for (int i = 0; i < length; i++) {
            // Walking back to the start lists downstream hops last-first and upstream hops first-first.
            hops[upstream ? i : length - 1 - i] = p;
            p = parent[p];
        }
        return hops;
    }

    long edgeId(int position) {
        return edgeIds[position];
    }

    Long scriptId(int position) {
        long script = scripts[position];
        return script == EdgeTable.NO_SCRIPT ? null : script;
    }

    String runId(int position) {
        return runs[position];
    }

    Evidence evidence(int position) {
        return EVIDENCE[evidence[position]];
    }

    /** The shortest decimal that reads back as the stored float: 0.9, not 0.8999999761581421. */
    double confidence(int position) {
        float stored = confidence[position];
        // Catalog confidences have few decimals; in [0, 1] two 4-decimal values never share a float, so a
        // 4-decimal value that reads back as the float is the shortest one. Float.toString costs far more.
        double rounded = Math.rint(stored * 10_000.0) / 10_000.0;
        return (float) rounded == stored ? rounded : Double.parseDouble(Float.toString(stored));
    }
}

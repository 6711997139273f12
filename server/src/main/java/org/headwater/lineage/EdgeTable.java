package org.headwater.lineage;

import java.util.Arrays;
import org.headwater.model.Evidence;

/**
 * Dataset edges as parallel arrays indexed by slot: endpoints, the store's edge id, and the metadata a
 * hop reports or a filter tests. Slots of removed edges are reused. Confidence is kept in single
 * precision: catalog confidences are short decimals (0.9, 0.75), which a float holds to seven digits.
 */
final class EdgeTable {
    static final long NO_SCRIPT = Long.MIN_VALUE;
    private static final int NONE = -1;
    static final int NO_RUN = -1;
    private static final Evidence[] EVIDENCE = Evidence.values();

    private final LongIntMap byId;
    private final Names runs = new Names();
    private final LongIntMap scriptIndex = new LongIntMap(64);
    private long[] scriptIds = new long[64];
    private int scriptCount;
    private long[] ids;
    private int[] from;
    private int[] to;
    private byte[] evidence;
    private float[] confidence;
    /** Index into {@link #scriptIds}: a catalog has far fewer scripts than edges. */
    private int[] scripts;
    private int[] runIds;
    private int[] firstColumnEdge;
    private int[] columnEdgeCount;
    private int highWater;
    private int[] free = new int[16];
    private int freeCount;

    EdgeTable(int expected) {
        byId = new LongIntMap(expected);
        resize(Math.max(16, expected));
    }

    private void resize(int capacity) {
        ids = ids == null ? new long[capacity] : Arrays.copyOf(ids, capacity);
        from = from == null ? new int[capacity] : Arrays.copyOf(from, capacity);
        to = to == null ? new int[capacity] : Arrays.copyOf(to, capacity);
        evidence = evidence == null ? new byte[capacity] : Arrays.copyOf(evidence, capacity);
        confidence = confidence == null ? new float[capacity] : Arrays.copyOf(confidence, capacity);
        scripts = scripts == null ? new int[capacity] : Arrays.copyOf(scripts, capacity);
        runIds = runIds == null ? new int[capacity] : Arrays.copyOf(runIds, capacity);
        firstColumnEdge = firstColumnEdge == null ? new int[capacity] : Arrays.copyOf(firstColumnEdge, capacity);
        columnEdgeCount = columnEdgeCount == null ? new int[capacity] : Arrays.copyOf(columnEdgeCount, capacity);
    }

    /** Number of live edges. */
    int count() {
        return byId.size();
    }

    /** One past the highest slot ever used; slots below it may be free (see {@link #live}). */
    int highWater() {
        return highWater;
    }

    int slot(long edgeId) {
        return byId.get(edgeId);
    }

    int add(EdgeRow row, int fromNode, int toNode) {
        int slot;
        if (freeCount > 0) {
            slot = free[--freeCount];
        } else {
            if (highWater == ids.length) {
                resize(ids.length + (ids.length >> 1));
            }
            slot = highWater++;
        }
        ids[slot] = row.id();
        from[slot] = fromNode;
        to[slot] = toNode;
        evidence[slot] = (byte) row.evidence().ordinal();
        confidence[slot] = (float) row.confidence();
        scripts[slot] = row.scriptId() == null ? NONE : internScript(row.scriptId());
        runIds[slot] = row.runId() == null ? NO_RUN : runs.intern(row.runId());
        firstColumnEdge[slot] = 0;
        columnEdgeCount[slot] = 0;
        byId.put(row.id(), slot);
        return slot;
    }

    private int internScript(long scriptId) {
        int index = scriptIndex.get(scriptId);
        if (index < 0) {
            index = scriptCount++;
            if (index == scriptIds.length) {
                scriptIds = Arrays.copyOf(scriptIds, index * 2);
            }
            scriptIds[index] = scriptId;
            scriptIndex.put(scriptId, index);
        }
        return index;
    }

    /** Drops the growth room left after bulk loading. */
    void trim() {
        int capacity = Math.max(16, highWater);
        if (capacity < ids.length) {
            ids = Arrays.copyOf(ids, capacity);
            from = Arrays.copyOf(from, capacity);
            to = Arrays.copyOf(to, capacity);
            evidence = Arrays.copyOf(evidence, capacity);
            confidence = Arrays.copyOf(confidence, capacity);
            scripts = Arrays.copyOf(scripts, capacity);
            runIds = Arrays.copyOf(runIds, capacity);
            firstColumnEdge = Arrays.copyOf(firstColumnEdge, capacity);
            columnEdgeCount = Arrays.copyOf(columnEdgeCount, capacity);
        }
    }

    void release(int slot) {
        byId.remove(ids[slot]);
        from[slot] = -1;
        to[slot] = -1;
        if (freeCount == free.length) {
            free = Arrays.copyOf(free, free.length * 2);
        }
        free[freeCount++] = slot;
    }

    boolean live(int slot) {
        return from[slot] >= 0;
    }

    long id(int slot) {
        return ids[slot];
    }

    int from(int slot) {
        return from[slot];
    }

    int to(int slot) {
        return to[slot];
    }

    /** The endpoint arrays themselves, for the breadth-first loop. */
    int[] fromArray() {
        return from;
    }

    int[] toArray() {
        return to;
    }

    int evidenceOrdinal(int slot) {
        return evidence[slot];
    }

    Evidence evidence(int slot) {
        return EVIDENCE[evidence[slot]];
    }

    float confidence(int slot) {
        return confidence[slot];
    }

    /** The script's store id, or {@link #NO_SCRIPT}. */
    long script(int slot) {
        int index = scripts[slot];
        return index == NONE ? NO_SCRIPT : scriptIds[index];
    }

    String run(int slot) {
        int run = runIds[slot];
        return run == NO_RUN ? null : runs.name(run);
    }

    void columnEdges(int slot, int first, int count) {
        firstColumnEdge[slot] = first;
        columnEdgeCount[slot] = count;
    }

    int firstColumnEdge(int slot) {
        return firstColumnEdge[slot];
    }

    int columnEdgeCount(int slot) {
        return columnEdgeCount[slot];
    }

    /** Whether two slots hold the same natural key (source, target, script, evidence). */
    boolean sameKey(int slot, int other) {
        return from[slot] == from[other] && to[slot] == to[other] && scripts[slot] == scripts[other]
                && evidence[slot] == evidence[other];
    }

    /** Adjacency order: by the store's edge id, which is the order edges entered the catalog. */
    boolean after(int slot, int other) {
        return ids[slot] > ids[other];
    }
}

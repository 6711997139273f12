package org.headwater.lineage;

import java.util.Arrays;
import org.headwater.ingest.Observation.ColumnRole;

/**
 * Column edges as parallel arrays: endpoints (column nodes), role, and the dataset edge slot they belong
 * to. The column edges of one dataset edge occupy consecutive slots, so a dataset edge needs only a
 * (first, count) pair to find them. Slots are never reused; the few left by removed edges go away when
 * the graph is next rebuilt from the store.
 */
final class ColumnEdgeTable {
    static final int INFLUENCING = ColumnRole.INFLUENCING.ordinal();
    private static final ColumnRole[] ROLES = ColumnRole.values();

    private int[] from;
    private int[] to;
    private int[] owner;
    private byte[] roles;
    private int count;
    private int dead;

    ColumnEdgeTable(int expected) {
        int capacity = Math.max(16, expected);
        from = new int[capacity];
        to = new int[capacity];
        owner = new int[capacity];
        roles = new byte[capacity];
    }

    int add(int fromNode, int toNode, ColumnRole role, int ownerSlot) {
        if (count == from.length) {
            int capacity = from.length + (from.length >> 1);
            from = Arrays.copyOf(from, capacity);
            to = Arrays.copyOf(to, capacity);
            owner = Arrays.copyOf(owner, capacity);
            roles = Arrays.copyOf(roles, capacity);
        }
        from[count] = fromNode;
        to[count] = toNode;
        owner[count] = ownerSlot;
        roles[count] = (byte) role.ordinal();
        return count++;
    }

    /** Drops the growth room left after bulk loading. */
    void trim() {
        int capacity = Math.max(16, count);
        from = Arrays.copyOf(from, capacity);
        to = Arrays.copyOf(to, capacity);
        owner = Arrays.copyOf(owner, capacity);
        roles = Arrays.copyOf(roles, capacity);
    }

    void kill(int slot) {
        from[slot] = -1;
        to[slot] = -1;
        owner[slot] = -1;
        dead++;
    }

    /** Slots ever used, live or not. */
    int highWater() {
        return count;
    }

    /** Live column edges. */
    int live() {
        return count - dead;
    }

    boolean isLive(int slot) {
        return from[slot] >= 0;
    }

    int from(int slot) {
        return from[slot];
    }

    int to(int slot) {
        return to[slot];
    }

    int[] fromArray() {
        return from;
    }

    int[] toArray() {
        return to;
    }

    int owner(int slot) {
        return owner[slot];
    }

    int roleOrdinal(int slot) {
        return roles[slot];
    }

    ColumnRole role(int slot) {
        return ROLES[roles[slot]];
    }
}

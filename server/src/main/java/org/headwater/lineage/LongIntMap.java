package org.headwater.lineage;

/**
 * A map from long keys to non-negative int values, open addressing with linear probing. Store ids are
 * longs and node numbers are ints; a boxed {@code HashMap<Long, Integer>} would cost several objects per
 * entry for a million edges.
 */
final class LongIntMap {
    static final int MISSING = -1;
    /** Linear probing stays short below this load; a million ids take 24 MiB instead of 48. */
    private static final double MAX_LOAD = 0.7;

    private long[] keys;
    private int[] values;
    private int mask;
    private int size;

    LongIntMap(int expected) {
        int capacity = 16;
        while (capacity * MAX_LOAD < expected) {
            capacity <<= 1;
        }
        allocate(capacity);
    }

    private void allocate(int capacity) {
        keys = new long[capacity];
        values = new int[capacity];
        java.util.Arrays.fill(values, MISSING);
        mask = capacity - 1;
    }

    int size() {
        return size;
    }

    int get(long key) {
        for (int i = home(key); values[i] != MISSING; i = (i + 1) & mask) {
            if (keys[i] == key) {
                return values[i];
            }
        }
        return MISSING;
    }

    void put(long key, int value) {
        if (value < 0) {
            throw new IllegalArgumentException("values must be non-negative: " + value);
        }
        int i = home(key);
        while (values[i] != MISSING) {
            if (keys[i] == key) {
                values[i] = value;
                return;
            }
            i = (i + 1) & mask;
        }
        keys[i] = key;
        values[i] = value;
        if (++size > keys.length * MAX_LOAD) {
            grow();
        }
    }

    /** Removes a key and returns its value, or {@link #MISSING}. */
    int remove(long key) {
        int i = home(key);
        while (values[i] != MISSING && keys[i] != key) {
            i = (i + 1) & mask;
        }
        if (values[i] == MISSING) {
            return MISSING;
        }
        int removed = values[i];
        // Backward-shift deletion: no tombstones, so lookups never slow down after many removals.
        int gap = i;
        for (int j = (i + 1) & mask; values[j] != MISSING; j = (j + 1) & mask) {
            int h = home(keys[j]);
            if (((j - h) & mask) >= ((j - gap) & mask)) {
                keys[gap] = keys[j];
                values[gap] = values[j];
                gap = j;
            }
        }
        values[gap] = MISSING;
        size--;
        return removed;
    }

    private void grow() {
        long[] oldKeys = keys;
        int[] oldValues = values;
        allocate(keys.length * 2);
        size = 0;
        for (int i = 0; i < oldKeys.length; i++) {
            if (oldValues[i] != MISSING) {
                put(oldKeys[i], oldValues[i]);
            }
        }
    }

    private int home(long key) {
        long h = key * 0x9E3779B97F4A7C15L;
        return (int) (h ^ (h >>> 32)) & mask;
    }
}

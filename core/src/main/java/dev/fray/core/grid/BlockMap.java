package dev.fray.core.grid;

import java.util.Arrays;

/**
 * Open-addressing hash map from packed block coordinates (long) to dense block indices assigned in insertion
 * order. Cleared and refilled every step; never shrinks, grows by doubling.
 */
final class BlockMap {
    private static final long EMPTY = Long.MIN_VALUE;
    private long[] keys;
    private int[] values;
    private int mask;
    private int size;

    BlockMap(int expected) {
        int cap = Integer.highestOneBit(Math.max(16, expected * 2) - 1) << 1;
        keys = new long[cap];
        values = new int[cap];
        mask = cap - 1;
        Arrays.fill(keys, EMPTY);
    }

    int size() {
        return size;
    }

    void clear() {
        Arrays.fill(keys, EMPTY);
        size = 0;
    }

    /** @return the index of key, inserting it with index size() if absent */
    int getOrInsert(long key) {
        if (2 * (size + 1) > keys.length) {
            grow();
        }
        int h = hash(key) & mask;
        while (true) {
            long k = keys[h];
            if (k == key) {
                return values[h];
            }
            if (k == EMPTY) {
                keys[h] = key;
                values[h] = size;
                return size++;
            }
            h = (h + 1) & mask;
        }
    }

    /** @return the index of key, or -1 */
    int get(long key) {
        int h = hash(key) & mask;
        while (true) {
            long k = keys[h];
            if (k == key) {
                return values[h];
            }
            if (k == EMPTY) {
                return -1;
            }
            h = (h + 1) & mask;
        }
    }

    private void grow() {
        long[] oldKeys = keys;
        int[] oldValues = values;
        keys = new long[oldKeys.length * 2];
        values = new int[oldKeys.length * 2];
        mask = keys.length - 1;
        Arrays.fill(keys, EMPTY);
        for (int i = 0; i < oldKeys.length; i++) {
            if (oldKeys[i] != EMPTY) {
                int h = hash(oldKeys[i]) & mask;
                while (keys[h] != EMPTY) {
                    h = (h + 1) & mask;
                }
                keys[h] = oldKeys[i];
                values[h] = oldValues[i];
            }
        }
    }

    long memoryBytes() {
        return keys.length * 12L;
    }

    private static int hash(long key) {
        long h = key * 0x9E3779B97F4A7C15L;
        return (int) (h ^ (h >>> 29));
    }
}

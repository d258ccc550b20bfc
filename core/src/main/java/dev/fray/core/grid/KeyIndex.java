package dev.fray.core.grid;

import java.util.Arrays;

/** Dense ids for packed block keys in first-seen order, with the keys kept in id order. Reused across steps. */
public final class KeyIndex {
    private final BlockMap map = new BlockMap(1024);
    private long[] keys = new long[1024];

    /** Forgets all keys. */
    public void clear() {
        map.clear();
    }

    /**
     * @param key packed block key
     * @return its id, assigning the next id if new
     */
    public int id(long key) {
        int before = map.size();
        int id = map.getOrInsert(key);
        if (map.size() != before) {
            if (id >= keys.length) {
                keys = Arrays.copyOf(keys, keys.length * 2);
            }
            keys[id] = key;
        }
        return id;
    }

    /** @return number of distinct keys */
    public int size() {
        return map.size();
    }

    /** @return keys by id (live array, valid up to size()) */
    public long[] keys() {
        return keys;
    }
}

package dev.fray.io.mesh;

import java.util.Arrays;

/**
 * Gives one index to every distinct position: exact comparison of the coordinates, with -0.0 taken as 0.0 (so a
 * vertex written as -0 by one face and 0 by another is still shared). Open addressing on an int table; positions
 * live in a growing double array, so nothing is boxed. Not thread-safe; one per read.
 */
final class VertexWelder {
    private double[] xyz;
    private int size;
    private int[] table;
    private int mask;

    /** @param expected expected number of distinct vertices (a hint; the welder grows as needed) */
    VertexWelder(int expected) {
        int cap = 16;
        while (cap < 2L * Math.max(expected, 8) && cap < (1 << 30)) {
            cap <<= 1;
        }
        table = new int[cap];
        Arrays.fill(table, -1);
        mask = cap - 1;
        xyz = new double[3 * Math.max(8, Math.min(expected, 1 << 20))];
    }

    /** @return number of distinct positions so far */
    int size() {
        return size;
    }

    /** @return the positions, 3 per distinct vertex, trimmed to the size */
    double[] positions() {
        return Arrays.copyOf(xyz, 3 * size);
    }

    /** @return the positions converted to float (exact when every input came from a float) */
    float[] floatPositions() {
        float[] out = new float[3 * size];
        for (int i = 0; i < out.length; i++) {
            out[i] = (float) xyz[i];
        }
        return out;
    }

    /**
     * @param x position, m
     * @param y position, m
     * @param z position, m
     * @return the index of that position, new or existing
     */
    int add(double x, double y, double z) {
        // Adding +0.0 turns -0.0 into +0.0 and leaves every other value unchanged.
        x += 0.0;
        y += 0.0;
        z += 0.0;
        int slot = hash(x, y, z) & mask;
        while (true) {
            int v = table[slot];
            if (v < 0) {
                break;
            }
            if (xyz[3 * v] == x && xyz[3 * v + 1] == y && xyz[3 * v + 2] == z) {
                return v;
            }
            slot = (slot + 1) & mask;
        }
        if (3 * size + 3 > xyz.length) {
            xyz = Arrays.copyOf(xyz, (int) Math.min(Integer.MAX_VALUE - 8L, 2L * xyz.length));
        }
        int v = size++;
        xyz[3 * v] = x;
        xyz[3 * v + 1] = y;
        xyz[3 * v + 2] = z;
        table[slot] = v;
        if (2L * size > table.length) {
            grow();
        }
        return v;
    }

    private void grow() {
        int cap = table.length << 1;
        table = new int[cap];
        Arrays.fill(table, -1);
        mask = cap - 1;
        for (int v = 0; v < size; v++) {
            int slot = hash(xyz[3 * v], xyz[3 * v + 1], xyz[3 * v + 2]) & mask;
            while (table[slot] >= 0) {
                slot = (slot + 1) & mask;
            }
            table[slot] = v;
        }
    }

    private static int hash(double x, double y, double z) {
        long h = Double.doubleToLongBits(x);
        h = h * 0x9E3779B97F4A7C15L + Double.doubleToLongBits(y);
        h = h * 0x9E3779B97F4A7C15L + Double.doubleToLongBits(z);
        h ^= h >>> 29;
        h *= 0xBF58476D1CE4E5B9L;
        h ^= h >>> 32;
        return (int) h;
    }
}

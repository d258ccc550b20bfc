package dev.fray.io.mesh;

import java.util.Arrays;

/** Growing int array for the readers: doubles its capacity, so memory stays within 2x of the content. */
final class IntList {
    private int[] a = new int[1024];
    private int size;

    /** @param v value to append */
    void add(int v) {
        if (size == a.length) {
            a = Arrays.copyOf(a, (int) Math.min(Integer.MAX_VALUE - 8L, 2L * a.length));
        }
        a[size++] = v;
    }

    /** @return number of values */
    int size() {
        return size;
    }

    /** @return the values, trimmed */
    int[] toArray() {
        return Arrays.copyOf(a, size);
    }
}

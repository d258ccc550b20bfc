package dev.fray.core.math;

/**
 * A 3-vector of doubles held in public fields {@code x, y, z}, for per-worker scratch and API edges.
 *
 * <p>Flat arrays are read and written as {@code x, y, z} at consecutive indices. Instances are mutable and not
 * thread-safe; give each worker its own.
 */
public final class Vec3 {
    /** First component. */
    public double x;
    /** Second component. */
    public double y;
    /** Third component. */
    public double z;

    /** Creates the zero vector. */
    public Vec3() {
    }

    /**
     * Creates a vector with the given components.
     *
     * @param x first component
     * @param y second component
     * @param z third component
     */
    public Vec3(double x, double y, double z) {
        this.x = x;
        this.y = y;
        this.z = z;
    }

    /**
     * Creates a copy.
     *
     * @param other (input, not modified) vector to copy
     */
    public Vec3(Vec3 other) {
        x = other.x;
        y = other.y;
        z = other.z;
    }

    /**
     * Sets all three components.
     *
     * @param x first component
     * @param y second component
     * @param z third component
     * @return this
     */
    public Vec3 set(double x, double y, double z) {
        this.x = x;
        this.y = y;
        this.z = z;
        return this;
    }

    /**
     * Copies another vector into this one.
     *
     * @param other (input, not modified) source; may be this
     * @return this
     */
    public Vec3 set(Vec3 other) {
        return set(other.x, other.y, other.z);
    }

    /**
     * Reads {@code a[off]}, {@code a[off + 1]}, {@code a[off + 2]} into x, y, z.
     *
     * @param a   (input, not modified) source array
     * @param off index of x in {@code a}
     * @return this
     * @throws ArrayIndexOutOfBoundsException if {@code a} has fewer than {@code off + 3} elements
     */
    public Vec3 load(double[] a, int off) {
        x = a[off];
        y = a[off + 1];
        z = a[off + 2];
        return this;
    }

    /**
     * Writes x, y, z to {@code a[off]}, {@code a[off + 1]}, {@code a[off + 2]}.
     *
     * @param a   (output, overwritten at {@code off .. off + 2}) destination array
     * @param off index where x goes
     * @throws ArrayIndexOutOfBoundsException if {@code a} has fewer than {@code off + 3} elements
     */
    public void store(double[] a, int off) {
        a[off] = x;
        a[off + 1] = y;
        a[off + 2] = z;
    }

    /**
     * Returns the components, for debugging; allocates.
     *
     * @return e.g. {@code [1.0, 2.0, 3.0]}
     */
    @Override
    public String toString() {
        return "[" + x + ", " + y + ", " + z + "]";
    }
}

package dev.fray.core.math;

/**
 * A 3x3 matrix of doubles held in nine public fields, for per-worker scratch and API edges.
 *
 * <p>Field {@code mRC} is the entry in row {@code R}, column {@code C}:
 * <pre>
 *   | m00 m01 m02 |
 *   | m10 m11 m12 |
 *   | m20 m21 m22 |
 * </pre>
 * Flat arrays are read and written in row-major order ({@code m00, m01, m02, m10, ..., m22}), the layout of
 * Fray's particle channels. Operations live in {@link Mat3Ops}; this class only holds and moves values.
 *
 * <p>Instances are mutable and not thread-safe; give each worker its own. Do not keep one per particle: particle
 * state lives in {@code double[]} channels.
 */
public final class Mat3 {
    /** Row 0, column 0. */
    public double m00;
    /** Row 0, column 1. */
    public double m01;
    /** Row 0, column 2. */
    public double m02;
    /** Row 1, column 0. */
    public double m10;
    /** Row 1, column 1. */
    public double m11;
    /** Row 1, column 2. */
    public double m12;
    /** Row 2, column 0. */
    public double m20;
    /** Row 2, column 1. */
    public double m21;
    /** Row 2, column 2. */
    public double m22;

    /** Creates the zero matrix. */
    public Mat3() {
    }

    /**
     * Creates a copy.
     *
     * @param other (input, not modified) matrix to copy
     */
    public Mat3(Mat3 other) {
        m00 = other.m00;
        m01 = other.m01;
        m02 = other.m02;
        m10 = other.m10;
        m11 = other.m11;
        m12 = other.m12;
        m20 = other.m20;
        m21 = other.m21;
        m22 = other.m22;
    }

    /**
     * Sets all nine entries, given row by row.
     *
     * @param m00 row 0, column 0
     * @param m01 row 0, column 1
     * @param m02 row 0, column 2
     * @param m10 row 1, column 0
     * @param m11 row 1, column 1
     * @param m12 row 1, column 2
     * @param m20 row 2, column 0
     * @param m21 row 2, column 1
     * @param m22 row 2, column 2
     * @return this
     */
    public Mat3 set(double m00, double m01, double m02,
                    double m10, double m11, double m12,
                    double m20, double m21, double m22) {
        this.m00 = m00;
        this.m01 = m01;
        this.m02 = m02;
        this.m10 = m10;
        this.m11 = m11;
        this.m12 = m12;
        this.m20 = m20;
        this.m21 = m21;
        this.m22 = m22;
        return this;
    }

    /**
     * Sets this matrix to the identity.
     *
     * @return this
     */
    public Mat3 setIdentity() {
        return set(1, 0, 0, 0, 1, 0, 0, 0, 1);
    }

    /**
     * Reads nine values in row-major order: {@code a[off]} is m00, {@code a[off + 1]} is m01, ...,
     * {@code a[off + 8]} is m22.
     *
     * @param a   (input, not modified) source array
     * @param off index of m00 in {@code a}
     * @return this
     * @throws ArrayIndexOutOfBoundsException if {@code a} has fewer than {@code off + 9} elements
     */
    public Mat3 load(double[] a, int off) {
        m00 = a[off];
        m01 = a[off + 1];
        m02 = a[off + 2];
        m10 = a[off + 3];
        m11 = a[off + 4];
        m12 = a[off + 5];
        m20 = a[off + 6];
        m21 = a[off + 7];
        m22 = a[off + 8];
        return this;
    }

    /**
     * Writes the nine entries in row-major order, the inverse of {@link #load(double[], int)}.
     *
     * @param a   (output, overwritten at {@code off .. off + 8}) destination array
     * @param off index where m00 goes
     * @throws ArrayIndexOutOfBoundsException if {@code a} has fewer than {@code off + 9} elements
     */
    public void store(double[] a, int off) {
        a[off] = m00;
        a[off + 1] = m01;
        a[off + 2] = m02;
        a[off + 3] = m10;
        a[off + 4] = m11;
        a[off + 5] = m12;
        a[off + 6] = m20;
        a[off + 7] = m21;
        a[off + 8] = m22;
    }

    /**
     * Returns the entries row by row, for debugging; allocates.
     *
     * @return e.g. {@code [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]]}
     */
    @Override
    public String toString() {
        return "[[" + m00 + ", " + m01 + ", " + m02 + "], ["
                + m10 + ", " + m11 + ", " + m12 + "], ["
                + m20 + ", " + m21 + ", " + m22 + "]]";
    }
}

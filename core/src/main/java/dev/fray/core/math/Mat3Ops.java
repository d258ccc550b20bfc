package dev.fray.core.math;

/**
 * Static, unrolled 3x3 operations on {@link Mat3} and {@link Vec3}, and on row-major {@code double[]} blocks.
 *
 * <p>Conventions, taken from EJML's fixed-size ops: the output is the last argument and is returned; nothing is
 * allocated; every op is alias-safe because it reads all inputs into locals before it writes the output, so an
 * output may be the same instance as any input. Numerical failure is a return value ({@link #invert}), never an
 * exception. No operation uses {@code Math.fma}, so results are bit-reproducible across JVMs.
 */
public final class Mat3Ops {
    private Mat3Ops() {
    }

    /**
     * Matrix product: out = a b, that is out<sub>ij</sub> = &sum;<sub>k</sub> a<sub>ik</sub> b<sub>kj</sub>.
     *
     * @param a   (input, not modified) left factor
     * @param b   (input, not modified) right factor
     * @param out (output, overwritten) result; out may be the same instance as a or b
     * @return out
     */
    public static Mat3 mul(Mat3 a, Mat3 b, Mat3 out) {
        double a00 = a.m00, a01 = a.m01, a02 = a.m02;
        double a10 = a.m10, a11 = a.m11, a12 = a.m12;
        double a20 = a.m20, a21 = a.m21, a22 = a.m22;
        double b00 = b.m00, b01 = b.m01, b02 = b.m02;
        double b10 = b.m10, b11 = b.m11, b12 = b.m12;
        double b20 = b.m20, b21 = b.m21, b22 = b.m22;
        out.m00 = a00 * b00 + a01 * b10 + a02 * b20;
        out.m01 = a00 * b01 + a01 * b11 + a02 * b21;
        out.m02 = a00 * b02 + a01 * b12 + a02 * b22;
        out.m10 = a10 * b00 + a11 * b10 + a12 * b20;
        out.m11 = a10 * b01 + a11 * b11 + a12 * b21;
        out.m12 = a10 * b02 + a11 * b12 + a12 * b22;
        out.m20 = a20 * b00 + a21 * b10 + a22 * b20;
        out.m21 = a20 * b01 + a21 * b11 + a22 * b21;
        out.m22 = a20 * b02 + a21 * b12 + a22 * b22;
        return out;
    }

    /**
     * Product with the left factor transposed: out = a<sup>T</sup> b, that is
     * out<sub>ij</sub> = &sum;<sub>k</sub> a<sub>ki</sub> b<sub>kj</sub>.
     *
     * @param a   (input, not modified) left factor, used transposed
     * @param b   (input, not modified) right factor
     * @param out (output, overwritten) result; out may be the same instance as a or b
     * @return out
     */
    public static Mat3 mulTransA(Mat3 a, Mat3 b, Mat3 out) {
        double a00 = a.m00, a01 = a.m01, a02 = a.m02;
        double a10 = a.m10, a11 = a.m11, a12 = a.m12;
        double a20 = a.m20, a21 = a.m21, a22 = a.m22;
        double b00 = b.m00, b01 = b.m01, b02 = b.m02;
        double b10 = b.m10, b11 = b.m11, b12 = b.m12;
        double b20 = b.m20, b21 = b.m21, b22 = b.m22;
        out.m00 = a00 * b00 + a10 * b10 + a20 * b20;
        out.m01 = a00 * b01 + a10 * b11 + a20 * b21;
        out.m02 = a00 * b02 + a10 * b12 + a20 * b22;
        out.m10 = a01 * b00 + a11 * b10 + a21 * b20;
        out.m11 = a01 * b01 + a11 * b11 + a21 * b21;
        out.m12 = a01 * b02 + a11 * b12 + a21 * b22;
        out.m20 = a02 * b00 + a12 * b10 + a22 * b20;
        out.m21 = a02 * b01 + a12 * b11 + a22 * b21;
        out.m22 = a02 * b02 + a12 * b12 + a22 * b22;
        return out;
    }

    /**
     * Product with the right factor transposed: out = a b<sup>T</sup>, that is
     * out<sub>ij</sub> = &sum;<sub>k</sub> a<sub>ik</sub> b<sub>jk</sub>.
     *
     * @param a   (input, not modified) left factor
     * @param b   (input, not modified) right factor, used transposed
     * @param out (output, overwritten) result; out may be the same instance as a or b
     * @return out
     */
    public static Mat3 mulTransB(Mat3 a, Mat3 b, Mat3 out) {
        double a00 = a.m00, a01 = a.m01, a02 = a.m02;
        double a10 = a.m10, a11 = a.m11, a12 = a.m12;
        double a20 = a.m20, a21 = a.m21, a22 = a.m22;
        double b00 = b.m00, b01 = b.m01, b02 = b.m02;
        double b10 = b.m10, b11 = b.m11, b12 = b.m12;
        double b20 = b.m20, b21 = b.m21, b22 = b.m22;
        out.m00 = a00 * b00 + a01 * b01 + a02 * b02;
        out.m01 = a00 * b10 + a01 * b11 + a02 * b12;
        out.m02 = a00 * b20 + a01 * b21 + a02 * b22;
        out.m10 = a10 * b00 + a11 * b01 + a12 * b02;
        out.m11 = a10 * b10 + a11 * b11 + a12 * b12;
        out.m12 = a10 * b20 + a11 * b21 + a12 * b22;
        out.m20 = a20 * b00 + a21 * b01 + a22 * b02;
        out.m21 = a20 * b10 + a21 * b11 + a22 * b12;
        out.m22 = a20 * b20 + a21 * b21 + a22 * b22;
        return out;
    }

    /**
     * Accumulating product: out = out + a b, that is out<sub>ij</sub> += &sum;<sub>k</sub> a<sub>ik</sub>
     * b<sub>kj</sub>. The product is formed first and then added, so the rounding matches {@code mul} followed by
     * {@code addEquals}.
     *
     * @param a   (input, not modified) left factor
     * @param b   (input, not modified) right factor
     * @param out (input and output, overwritten) accumulator; out may be the same instance as a or b
     * @return out
     */
    public static Mat3 mulAdd(Mat3 a, Mat3 b, Mat3 out) {
        double a00 = a.m00, a01 = a.m01, a02 = a.m02;
        double a10 = a.m10, a11 = a.m11, a12 = a.m12;
        double a20 = a.m20, a21 = a.m21, a22 = a.m22;
        double b00 = b.m00, b01 = b.m01, b02 = b.m02;
        double b10 = b.m10, b11 = b.m11, b12 = b.m12;
        double b20 = b.m20, b21 = b.m21, b22 = b.m22;
        out.m00 += a00 * b00 + a01 * b10 + a02 * b20;
        out.m01 += a00 * b01 + a01 * b11 + a02 * b21;
        out.m02 += a00 * b02 + a01 * b12 + a02 * b22;
        out.m10 += a10 * b00 + a11 * b10 + a12 * b20;
        out.m11 += a10 * b01 + a11 * b11 + a12 * b21;
        out.m12 += a10 * b02 + a11 * b12 + a12 * b22;
        out.m20 += a20 * b00 + a21 * b10 + a22 * b20;
        out.m21 += a20 * b01 + a21 * b11 + a22 * b21;
        out.m22 += a20 * b02 + a21 * b12 + a22 * b22;
        return out;
    }

    /**
     * Sum: out<sub>ij</sub> = a<sub>ij</sub> + b<sub>ij</sub>.
     *
     * @param a   (input, not modified) first term
     * @param b   (input, not modified) second term
     * @param out (output, overwritten) result; out may be the same instance as a or b
     * @return out
     */
    public static Mat3 add(Mat3 a, Mat3 b, Mat3 out) {
        // element-wise, so each entry is read before it is written even when out is a or b
        out.m00 = a.m00 + b.m00;
        out.m01 = a.m01 + b.m01;
        out.m02 = a.m02 + b.m02;
        out.m10 = a.m10 + b.m10;
        out.m11 = a.m11 + b.m11;
        out.m12 = a.m12 + b.m12;
        out.m20 = a.m20 + b.m20;
        out.m21 = a.m21 + b.m21;
        out.m22 = a.m22 + b.m22;
        return out;
    }

    /**
     * Difference: out<sub>ij</sub> = a<sub>ij</sub> - b<sub>ij</sub>.
     *
     * @param a   (input, not modified) minuend
     * @param b   (input, not modified) subtrahend
     * @param out (output, overwritten) result; out may be the same instance as a or b
     * @return out
     */
    public static Mat3 sub(Mat3 a, Mat3 b, Mat3 out) {
        out.m00 = a.m00 - b.m00;
        out.m01 = a.m01 - b.m01;
        out.m02 = a.m02 - b.m02;
        out.m10 = a.m10 - b.m10;
        out.m11 = a.m11 - b.m11;
        out.m12 = a.m12 - b.m12;
        out.m20 = a.m20 - b.m20;
        out.m21 = a.m21 - b.m21;
        out.m22 = a.m22 - b.m22;
        return out;
    }

    /**
     * Scaling: out<sub>ij</sub> = alpha a<sub>ij</sub>.
     *
     * @param alpha scale factor
     * @param a     (input, not modified) matrix
     * @param out   (output, overwritten) result; out may be the same instance as a
     * @return out
     */
    public static Mat3 scale(double alpha, Mat3 a, Mat3 out) {
        out.m00 = alpha * a.m00;
        out.m01 = alpha * a.m01;
        out.m02 = alpha * a.m02;
        out.m10 = alpha * a.m10;
        out.m11 = alpha * a.m11;
        out.m12 = alpha * a.m12;
        out.m20 = alpha * a.m20;
        out.m21 = alpha * a.m21;
        out.m22 = alpha * a.m22;
        return out;
    }

    /**
     * In-place sum: a<sub>ij</sub> = a<sub>ij</sub> + b<sub>ij</sub>.
     *
     * @param a (input and output, overwritten) accumulator
     * @param b (input, not modified) term; b may be the same instance as a (then a is doubled)
     */
    public static void addEquals(Mat3 a, Mat3 b) {
        a.m00 += b.m00;
        a.m01 += b.m01;
        a.m02 += b.m02;
        a.m10 += b.m10;
        a.m11 += b.m11;
        a.m12 += b.m12;
        a.m20 += b.m20;
        a.m21 += b.m21;
        a.m22 += b.m22;
    }

    /**
     * Determinant by cofactor expansion along the first row:
     * det = a<sub>00</sub>(a<sub>11</sub>a<sub>22</sub> - a<sub>12</sub>a<sub>21</sub>)
     * - a<sub>01</sub>(a<sub>10</sub>a<sub>22</sub> - a<sub>12</sub>a<sub>20</sub>)
     * + a<sub>02</sub>(a<sub>10</sub>a<sub>21</sub> - a<sub>11</sub>a<sub>20</sub>).
     *
     * @param a (input, not modified) matrix
     * @return det(a)
     */
    public static double det(Mat3 a) {
        return a.m00 * (a.m11 * a.m22 - a.m12 * a.m21)
                - a.m01 * (a.m10 * a.m22 - a.m12 * a.m20)
                + a.m02 * (a.m10 * a.m21 - a.m11 * a.m20);
    }

    /**
     * Determinant of the row-major 3x3 block {@code a[off .. off + 8]}, with the same formula and rounding as
     * {@link #det(Mat3)}.
     *
     * @param a   (input, not modified) array holding m00, m01, ..., m22 at consecutive indices
     * @param off index of m00
     * @return the determinant
     * @throws ArrayIndexOutOfBoundsException if {@code a} has fewer than {@code off + 9} elements
     */
    public static double det(double[] a, int off) {
        double a00 = a[off], a01 = a[off + 1], a02 = a[off + 2];
        double a10 = a[off + 3], a11 = a[off + 4], a12 = a[off + 5];
        double a20 = a[off + 6], a21 = a[off + 7], a22 = a[off + 8];
        return a00 * (a11 * a22 - a12 * a21)
                - a01 * (a10 * a22 - a12 * a20)
                + a02 * (a10 * a21 - a11 * a20);
    }

    /**
     * Trace: a<sub>00</sub> + a<sub>11</sub> + a<sub>22</sub>.
     *
     * @param a (input, not modified) matrix
     * @return the trace
     */
    public static double trace(Mat3 a) {
        return a.m00 + a.m11 + a.m22;
    }

    /**
     * Transpose: out<sub>ij</sub> = a<sub>ji</sub>.
     *
     * @param a   (input, not modified) matrix
     * @param out (output, overwritten) result; out may be the same instance as a
     * @return out
     */
    public static Mat3 transpose(Mat3 a, Mat3 out) {
        double a01 = a.m01, a02 = a.m02, a12 = a.m12;
        out.m00 = a.m00;
        out.m11 = a.m11;
        out.m22 = a.m22;
        out.m01 = a.m10;
        out.m02 = a.m20;
        out.m12 = a.m21;
        out.m10 = a01;
        out.m20 = a02;
        out.m21 = a12;
        return out;
    }

    /**
     * Inverse by the adjugate: out = adj(a) / det(a).
     *
     * <p>As in EJML's fixed-size {@code invert}, the entries are first divided by the largest absolute entry, so
     * the cofactors neither overflow nor underflow for badly scaled input. This is less stable than an LU
     * factorisation for ill-conditioned matrices; the result is as good as the condition number allows.
     *
     * @param a   (input, not modified) matrix to invert
     * @param out (output, overwritten only on success) the inverse; out may be the same instance as a
     * @return true on success; false when a is singular, has a NaN or infinite entry, or the inverse is not finite,
     *         in which case out is left unchanged
     */
    public static boolean invert(Mat3 a, Mat3 out) {
        double max = Math.max(Math.max(Math.max(Math.abs(a.m00), Math.abs(a.m01)), Math.max(Math.abs(a.m02), Math.abs(a.m10))),
                Math.max(Math.max(Math.abs(a.m11), Math.abs(a.m12)), Math.max(Math.max(Math.abs(a.m20), Math.abs(a.m21)), Math.abs(a.m22))));
        // Math.max propagates NaN, so this also rejects NaN entries
        if (!(max > 0 && max <= Double.MAX_VALUE)) {
            return false;
        }
        double sc = 1.0 / max;
        double a00 = a.m00 * sc, a01 = a.m01 * sc, a02 = a.m02 * sc;
        double a10 = a.m10 * sc, a11 = a.m11 * sc, a12 = a.m12 * sc;
        double a20 = a.m20 * sc, a21 = a.m21 * sc, a22 = a.m22 * sc;
        // cofactors of the scaled matrix: c_ij = (-1)^(i+j) minor_ij
        double c00 = a11 * a22 - a12 * a21;
        double c01 = -(a10 * a22 - a12 * a20);
        double c02 = a10 * a21 - a11 * a20;
        double c10 = -(a01 * a22 - a02 * a21);
        double c11 = a00 * a22 - a02 * a20;
        double c12 = -(a00 * a21 - a01 * a20);
        double c20 = a01 * a12 - a02 * a11;
        double c21 = -(a00 * a12 - a02 * a10);
        double c22 = a00 * a11 - a01 * a10;
        // scaled cofactors carry sc^2 and the scaled det sc^3; dividing the det by sc cancels both
        double det = (a00 * c00 + a01 * c01 + a02 * c02) / sc;
        double i00 = c00 / det, i01 = c10 / det, i02 = c20 / det;
        double i10 = c01 / det, i11 = c11 / det, i12 = c21 / det;
        double i20 = c02 / det, i21 = c12 / det, i22 = c22 / det;
        // a zero det gives infinite or NaN entries; check every entry rather than a sum that could overflow
        if (!(Double.isFinite(i00) && Double.isFinite(i01) && Double.isFinite(i02)
                && Double.isFinite(i10) && Double.isFinite(i11) && Double.isFinite(i12)
                && Double.isFinite(i20) && Double.isFinite(i21) && Double.isFinite(i22))) {
            return false;
        }
        out.m00 = i00;
        out.m01 = i01;
        out.m02 = i02;
        out.m10 = i10;
        out.m11 = i11;
        out.m12 = i12;
        out.m20 = i20;
        out.m21 = i21;
        out.m22 = i22;
        return true;
    }

    /**
     * Copy: out<sub>ij</sub> = a<sub>ij</sub>.
     *
     * @param a   (input, not modified) source
     * @param out (output, overwritten) destination; out may be the same instance as a
     * @return out
     */
    public static Mat3 copy(Mat3 a, Mat3 out) {
        out.m00 = a.m00;
        out.m01 = a.m01;
        out.m02 = a.m02;
        out.m10 = a.m10;
        out.m11 = a.m11;
        out.m12 = a.m12;
        out.m20 = a.m20;
        out.m21 = a.m21;
        out.m22 = a.m22;
        return out;
    }

    /**
     * Frobenius norm: sqrt(&sum;<sub>ij</sub> a<sub>ij</sub><sup>2</sup>). Not rescaled, so it overflows for
     * entries above about 1e154; that is far outside any deformation gradient or stress in SI units.
     *
     * @param a (input, not modified) matrix
     * @return ||a||<sub>F</sub>
     */
    public static double normF(Mat3 a) {
        return Math.sqrt(a.m00 * a.m00 + a.m01 * a.m01 + a.m02 * a.m02
                + a.m10 * a.m10 + a.m11 * a.m11 + a.m12 * a.m12
                + a.m20 * a.m20 + a.m21 * a.m21 + a.m22 * a.m22);
    }

    /**
     * Matrix-vector product: out<sub>i</sub> = &sum;<sub>j</sub> a<sub>ij</sub> v<sub>j</sub>.
     *
     * @param a   (input, not modified) matrix
     * @param v   (input, not modified) vector
     * @param out (output, overwritten) result; out may be the same instance as v
     * @return out
     */
    public static Vec3 mulVec(Mat3 a, Vec3 v, Vec3 out) {
        double x = v.x, y = v.y, z = v.z;
        out.x = a.m00 * x + a.m01 * y + a.m02 * z;
        out.y = a.m10 * x + a.m11 * y + a.m12 * z;
        out.z = a.m20 * x + a.m21 * y + a.m22 * z;
        return out;
    }

    /**
     * Matrix product on row-major 3x3 blocks of flat arrays: out = a b, with the same formula and rounding as
     * {@link #mul(Mat3, Mat3, Mat3)}. Meant for particle channels, so no {@link Mat3} is needed.
     *
     * @param a  (input, not modified) array holding the left factor at {@code ao .. ao + 8}
     * @param ao index of a's m00
     * @param b  (input, not modified) array holding the right factor at {@code bo .. bo + 8}
     * @param bo index of b's m00
     * @param out (output, overwritten at {@code oo .. oo + 8}) result; out may be the same array as a or b, with
     *            the same or an overlapping offset
     * @param oo index of out's m00
     * @throws ArrayIndexOutOfBoundsException if a block does not fit its array
     */
    public static void mul(double[] a, int ao, double[] b, int bo, double[] out, int oo) {
        double a00 = a[ao], a01 = a[ao + 1], a02 = a[ao + 2];
        double a10 = a[ao + 3], a11 = a[ao + 4], a12 = a[ao + 5];
        double a20 = a[ao + 6], a21 = a[ao + 7], a22 = a[ao + 8];
        double b00 = b[bo], b01 = b[bo + 1], b02 = b[bo + 2];
        double b10 = b[bo + 3], b11 = b[bo + 4], b12 = b[bo + 5];
        double b20 = b[bo + 6], b21 = b[bo + 7], b22 = b[bo + 8];
        out[oo] = a00 * b00 + a01 * b10 + a02 * b20;
        out[oo + 1] = a00 * b01 + a01 * b11 + a02 * b21;
        out[oo + 2] = a00 * b02 + a01 * b12 + a02 * b22;
        out[oo + 3] = a10 * b00 + a11 * b10 + a12 * b20;
        out[oo + 4] = a10 * b01 + a11 * b11 + a12 * b21;
        out[oo + 5] = a10 * b02 + a11 * b12 + a12 * b22;
        out[oo + 6] = a20 * b00 + a21 * b10 + a22 * b20;
        out[oo + 7] = a20 * b01 + a21 * b11 + a22 * b21;
        out[oo + 8] = a20 * b02 + a21 * b12 + a22 * b22;
    }
}

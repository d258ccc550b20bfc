package dev.fray.core.math;

/**
 * Singular value decomposition and polar decomposition of 3x3 matrices, allocation-free and thread-safe.
 *
 * <h2>Convention</h2>
 * {@link #decompose} writes a = U diag(sigma) V<sup>T</sup> with U and V proper rotations (det = +1) and
 * sigma.x &ge; sigma.y &ge; |sigma.z|. Because U and V are rotations, the sign of det(a) is carried by sigma.z,
 * which is negative exactly when a is inverted (det(a) &lt; 0). This is the inversion-safe convention of
 * Irving, Teran and Fedkiw 2004, <i>Invertible finite elements for robust simulation of large deformation</i>.
 * When |det(a)| is at the rounding level of a determinant formula the sign of sigma.z follows the decomposition,
 * which is the more accurate of the two.
 *
 * <h2>Method</h2>
 * <ol>
 *   <li>The input is scaled by a power of two so its largest entry lies in [1, 2). The scaling is exact, and it
 *       keeps squared norms away from overflow and underflow.</li>
 *   <li>One-sided Jacobi (Hestenes 1958, <i>Inversion of matrices by biorthogonalization and related results</i>):
 *       cyclic plane rotations V are applied to the columns of W = a V until every pair of columns is orthogonal
 *       to a relative cosine of 1e-15. Working on the columns of a rather than on a<sup>T</sup>a keeps small
 *       singular values accurate relative to themselves. Forming a<sup>T</sup>a would square the condition number:
 *       with two small singular values, the trailing singular vectors from a<sup>T</sup>a are only good to about
 *       1e-16 / sigma.y, which breaks a 1e-12 reconstruction bound once sigma.y &lt; 1e-4 ||a||.</li>
 *   <li>The columns are sorted by decreasing norm; each swap negates one column so that V stays a rotation.</li>
 *   <li>W is reduced to upper-triangular R by three Givens rotations, W = U R, the idea of McAdams et al. 2011,
 *       <i>Computing the singular value decomposition of 3x3 matrices with minimal branching</i>. U is a product
 *       of rotations, and R<sub>00</sub>, R<sub>11</sub> &ge; 0 by construction, so R<sub>22</sub> carries
 *       the sign of det(a). Because the columns of W are orthogonal, R is diagonal to the Jacobi tolerance.</li>
 *   <li>sigma<sub>j</sub> = ||w<sub>j</sub>||, with the sign of R<sub>22</sub> on sigma.z.</li>
 * </ol>
 * Zero, rank-deficient, repeated-singular-value and inverted inputs need no special case. A column that is zero
 * is left alone by its Givens rotation, and equal column norms give a 45 degree Jacobi rotation. Measured on
 * seeded random families (see {@code Svd3Test}): ||U S V<sup>T</sup> - a||<sub>F</sub> &le; 2e-15
 * ||a||<sub>F</sub>, orthogonality errors of U, V and R &le; 3.5e-15, and ||R S - a||<sub>F</sub> &le; 4e-15
 * ||a||<sub>F</sub>.
 *
 * <p>Every method works on local doubles only and writes its outputs at the end, so an output may be the same
 * instance as the input. Distinct outputs must be distinct instances.
 */
public final class Svd3 {
    /** Sweep cap for the one-sided Jacobi iteration; measured: at most 7 sweeps, counting the final one that finds
     *  nothing to rotate. */
    private static final int MAX_SWEEPS = 12;
    /** Columns p, q count as orthogonal when (w_p . w_q)^2 &lt;= ORTHO_TOL2 |w_p|^2 |w_q|^2, a cosine of 1e-15. */
    private static final double ORTHO_TOL2 = 1e-30;
    /**
     * Columns with squared norm below this (norm below 1e-60 with the largest entry in [1, 2)) are not rotated, so
     * the products in the rotation formula stay clear of subnormal numbers. Such a column is noise, far below the
     * rounding error of the largest one.
     */
    private static final double TINY = 1e-120;
    /** When 4 ga^2 &lt; 2^-53 d^2 the rotation has t^2 &lt; 2^-55, so c rounds to exactly 1 and t to ga / d. */
    private static final double SMALL_ANGLE = 0x1p-53;
    /** Entry tolerance on a^T a - I for the early exit of {@link #polar} and {@link #rotation}. */
    private static final double ROTATION_TOL = 1e-14;

    private Svd3() {
    }

    /**
     * Singular value decomposition a = U diag(sigma) V<sup>T</sup> with rotations U, V (det = +1),
     * sigma.x &ge; sigma.y &ge; |sigma.z|, and sigma.z &lt; 0 exactly when det(a) &lt; 0 (see the class comment).
     *
     * @param a     (input, not modified) matrix to decompose; may be the same instance as u or v
     * @param u     (output, overwritten on success) left rotation U, columns are the left singular vectors
     * @param sigma (output, overwritten on success) singular values, the last one signed
     * @param v     (output, overwritten on success) right rotation V, columns are the right singular vectors;
     *              must not be the same instance as u
     * @return true on success; false, with the outputs unchanged, if a has a NaN or infinite entry or a singular
     *         value overflows
     */
    public static boolean decompose(Mat3 a, Mat3 u, Vec3 sigma, Mat3 v) {
        return solve(a, u, sigma, v, null, null);
    }

    /**
     * Polar decomposition a = R S with R = U V<sup>T</sup> a rotation (det = +1) and S = V diag(sigma)
     * V<sup>T</sup> symmetric, from {@link #decompose}. S is positive definite when det(a) &gt; 0. For an inverted
     * a, S has exactly one negative eigenvalue, and R stays a rotation (Irving et al. 2004).
     *
     * <p>When a is already a rotation (every entry of a<sup>T</sup>a - I within 1e-14 and det(a) &gt; 0), it
     * returns R = a and S = (I + a<sup>T</sup>a)/2, the first-order square root of a<sup>T</sup>a, without
     * iterating. The error of this shortcut is below 1e-14 in every entry.
     *
     * @param a (input, not modified) matrix to decompose; may be the same instance as r or s
     * @param r (output, overwritten on success) rotation factor R
     * @param s (output, overwritten on success, may be null) symmetric factor S; must not be the same instance as r
     * @return true on success; false, with the outputs unchanged, if a has a NaN or infinite entry or a singular
     *         value overflows
     */
    public static boolean polar(Mat3 a, Mat3 r, Mat3 s) {
        return solve(a, null, null, null, r, s);
    }

    /**
     * Rotation factor R = U V<sup>T</sup> (det = +1) of the polar decomposition a = R S. This is
     * {@link #polar(Mat3, Mat3, Mat3)} without S, including the early exit for inputs that are already rotations.
     *
     * @param a (input, not modified) matrix; may be the same instance as r
     * @param r (output, overwritten on success) rotation factor
     * @return true on success; false, with r unchanged, if a has a NaN or infinite entry
     */
    public static boolean rotation(Mat3 a, Mat3 r) {
        return solve(a, null, null, null, r, null);
    }

    /**
     * The scaled Newton iteration switches to its last, unscaled step once a step moves the iterate less than this
     * (Frobenius norm). Convergence is quadratic (the error after a step is about half the square of the step), so
     * after a step of 1e-6 the iterate is within about 1e-12 of R and one more step reaches rounding level.
     */
    private static final double NEWTON_STEP = 1e-6;
    /** Iteration cap of the Newton polar iteration before falling back to the SVD. */
    private static final int NEWTON_MAX = 12;

    /**
     * Rotation factor of a by the scaled Newton iteration X &lt;- (g X + X^-T / g) / 2 (Higham, "Computing the polar
     * decomposition - with applications", SIAM J. Sci. Stat. Comput. 7, 1986), which converges quadratically for
     * det a &gt; 0. It is several times faster than the SVD for the mildly deformed F of a typical step; inverted,
     * singular or slowly converging inputs return false and take the SVD path.
     */
    private static boolean newtonRotation(Mat3 a, Mat3 r) {
        double x00 = a.m00, x01 = a.m01, x02 = a.m02;
        double x10 = a.m10, x11 = a.m11, x12 = a.m12;
        double x20 = a.m20, x21 = a.m21, x22 = a.m22;
        boolean refined = false;
        for (int it = 0; it < NEWTON_MAX; it++) {
            // Cofactor matrix: X^-T = cof(X) / det X.
            double k00 = x11 * x22 - x12 * x21, k01 = x12 * x20 - x10 * x22, k02 = x10 * x21 - x11 * x20;
            double k10 = x02 * x21 - x01 * x22, k11 = x00 * x22 - x02 * x20, k12 = x01 * x20 - x00 * x21;
            double k20 = x01 * x12 - x02 * x11, k21 = x02 * x10 - x00 * x12, k22 = x00 * x11 - x01 * x10;
            double det = x00 * k00 + x01 * k01 + x02 * k02;
            // Written so that NaN fails the test too.
            if (!(det > 1e-10)) {
                return false;
            }
            double inv = 1.0 / det;
            double nx = x00 * x00 + x01 * x01 + x02 * x02 + x10 * x10 + x11 * x11 + x12 * x12
                    + x20 * x20 + x21 * x21 + x22 * x22;
            double nk = (k00 * k00 + k01 * k01 + k02 * k02 + k10 * k10 + k11 * k11 + k12 * k12
                    + k20 * k20 + k21 * k21 + k22 * k22) * inv * inv;
            // Frobenius scaling speeds up the first iterations; near convergence it is 1 and is dropped.
            double g = refined ? 1.0 : Math.sqrt(Math.sqrt(nk / nx));
            double ga = 0.5 * g, gb = 0.5 * inv / g;
            double y00 = ga * x00 + gb * k00, y01 = ga * x01 + gb * k01, y02 = ga * x02 + gb * k02;
            double y10 = ga * x10 + gb * k10, y11 = ga * x11 + gb * k11, y12 = ga * x12 + gb * k12;
            double y20 = ga * x20 + gb * k20, y21 = ga * x21 + gb * k21, y22 = ga * x22 + gb * k22;
            double d00 = y00 - x00, d01 = y01 - x01, d02 = y02 - x02, d10 = y10 - x10, d11 = y11 - x11;
            double d12 = y12 - x12, d20 = y20 - x20, d21 = y21 - x21, d22 = y22 - x22;
            double step2 = d00 * d00 + d01 * d01 + d02 * d02 + d10 * d10 + d11 * d11 + d12 * d12
                    + d20 * d20 + d21 * d21 + d22 * d22;
            x00 = y00; x01 = y01; x02 = y02;
            x10 = y10; x11 = y11; x12 = y12;
            x20 = y20; x21 = y21; x22 = y22;
            if (refined) {
                r.set(x00, x01, x02, x10, x11, x12, x20, x21, x22);
                return true;
            }
            // Quadratic convergence: one more unscaled step after a small one reaches rounding level.
            if (step2 < NEWTON_STEP * NEWTON_STEP) {
                refined = true;
            }
        }
        return false;
    }

    /**
     * Shared body. SVD mode writes (u, sigma, v); polar mode (r != null) writes r and, if non-null, s.
     * One body keeps the two modes from drifting apart and needs no scratch objects.
     */
    private static boolean solve(Mat3 a, Mat3 u, Vec3 sigma, Mat3 v, Mat3 r, Mat3 s) {
        final double a00 = a.m00, a01 = a.m01, a02 = a.m02;
        final double a10 = a.m10, a11 = a.m11, a12 = a.m12;
        final double a20 = a.m20, a21 = a.m21, a22 = a.m22;

        if (r != null) {
            // hot path in the particle loop: many deformation gradients are nearly pure rotations
            double c00 = a00 * a00 + a10 * a10 + a20 * a20;
            double c11 = a01 * a01 + a11 * a11 + a21 * a21;
            double c22 = a02 * a02 + a12 * a12 + a22 * a22;
            double c01 = a00 * a01 + a10 * a11 + a20 * a21;
            double c02 = a00 * a02 + a10 * a12 + a20 * a22;
            double c12 = a01 * a02 + a11 * a12 + a21 * a22;
            // written so that NaN fails every test and falls through to the finiteness check below
            if (Math.abs(c00 - 1) <= ROTATION_TOL && Math.abs(c11 - 1) <= ROTATION_TOL
                    && Math.abs(c22 - 1) <= ROTATION_TOL && Math.abs(c01) <= ROTATION_TOL
                    && Math.abs(c02) <= ROTATION_TOL && Math.abs(c12) <= ROTATION_TOL) {
                double det = a00 * (a11 * a22 - a12 * a21) - a01 * (a10 * a22 - a12 * a20)
                        + a02 * (a10 * a21 - a11 * a20);
                if (det > 0) {
                    if (s != null) {
                        double h01 = 0.5 * c01, h02 = 0.5 * c02, h12 = 0.5 * c12;
                        s.set(0.5 * (1 + c00), h01, h02, h01, 0.5 * (1 + c11), h12, h02, h12, 0.5 * (1 + c22));
                    }
                    r.set(a00, a01, a02, a10, a11, a12, a20, a21, a22);
                    return true;
                }
            }
            if (newtonRotation(a, r)) {
                if (s != null) {
                    // S = sym(R^T a): R^T a is symmetric up to rounding once R is converged.
                    double t00 = r.m00 * a00 + r.m10 * a10 + r.m20 * a20;
                    double t01 = r.m00 * a01 + r.m10 * a11 + r.m20 * a21;
                    double t02 = r.m00 * a02 + r.m10 * a12 + r.m20 * a22;
                    double t10 = r.m01 * a00 + r.m11 * a10 + r.m21 * a20;
                    double t11 = r.m01 * a01 + r.m11 * a11 + r.m21 * a21;
                    double t12 = r.m01 * a02 + r.m11 * a12 + r.m21 * a22;
                    double t20 = r.m02 * a00 + r.m12 * a10 + r.m22 * a20;
                    double t21 = r.m02 * a01 + r.m12 * a11 + r.m22 * a21;
                    double t22 = r.m02 * a02 + r.m12 * a12 + r.m22 * a22;
                    double h01 = 0.5 * (t01 + t10), h02 = 0.5 * (t02 + t20), h12 = 0.5 * (t12 + t21);
                    s.set(t00, h01, h02, h01, t11, h12, h02, h12, t22);
                }
                return true;
            }
        }

        double mx = Math.max(Math.max(Math.max(Math.abs(a00), Math.abs(a01)), Math.max(Math.abs(a02), Math.abs(a10))),
                Math.max(Math.max(Math.abs(a11), Math.abs(a12)), Math.max(Math.max(Math.abs(a20), Math.abs(a21)), Math.abs(a22))));
        // Math.max propagates NaN, so one test rejects NaN and infinite entries
        if (!(mx <= Double.MAX_VALUE)) {
            return false;
        }
        if (mx == 0) {
            // U = V = I, sigma = 0; any rotation would do, the identity is the natural pick
            if (r != null) {
                if (s != null) {
                    s.set(0, 0, 0, 0, 0, 0, 0, 0, 0);
                }
                r.setIdentity();
            } else {
                u.setIdentity();
                v.setIdentity();
                sigma.set(0, 0, 0);
            }
            return true;
        }
        // power-of-two scaling is exact; the largest entry lands in [1, 2)
        int e = Math.getExponent(mx);
        double down = Math.scalb(1.0, -e);
        double up = Math.scalb(1.0, e);

        double w00 = a00 * down, w01 = a01 * down, w02 = a02 * down;
        double w10 = a10 * down, w11 = a11 * down, w12 = a12 * down;
        double w20 = a20 * down, w21 = a21 * down, w22 = a22 * down;
        double v00 = 1, v01 = 0, v02 = 0;
        double v10 = 0, v11 = 1, v12 = 0;
        double v20 = 0, v21 = 0, v22 = 1;

        // One-sided Jacobi: rotate column pairs (p, q) of W and V by the same plane rotation, which keeps W = A V,
        // until all pairs are orthogonal. Norms and dot products are recomputed from W every time, not updated,
        // which is what makes small columns accurate relative to themselves.
        for (int sweep = 0; sweep < MAX_SWEEPS; sweep++) {
            boolean rotated = false;
            double al, be, ga, d, rr, dr, k, c, sn, x, y;

            // pair (0, 1)
            al = w00 * w00 + w10 * w10 + w20 * w20;
            be = w01 * w01 + w11 * w11 + w21 * w21;
            ga = w00 * w01 + w10 * w11 + w20 * w21;
            if (ga * ga > ORTHO_TOL2 * al * be && al > TINY && be > TINY) {
                rotated = true;
                // tangent t = sgn(d) 2 ga / (|d| + rr), the smaller root of t^2 + 2 zeta t - 1 = 0 with
                // zeta = d / (2 ga), so the angle is at most 45 degrees; c = 1 / sqrt(1 + t^2) simplifies to
                // sqrt((|d| + rr) / (2 rr)), which needs two square roots and one division in a row
                d = be - al;
                if (4 * ga * ga < SMALL_ANGLE * d * d) {
                    // t^2 < 2^-55: c rounds to 1 and t to ga / d, so skip the square roots
                    c = 1;
                    sn = ga / d;
                } else {
                    rr = Math.sqrt(d * d + 4 * ga * ga);
                    dr = Math.abs(d) + rr;
                    k = 1 / Math.sqrt(2 * rr * dr);
                    c = dr * k;
                    sn = (d >= 0 ? 2 * ga : -2 * ga) * k;
                }
                x = w00; y = w01; w00 = c * x - sn * y; w01 = sn * x + c * y;
                x = w10; y = w11; w10 = c * x - sn * y; w11 = sn * x + c * y;
                x = w20; y = w21; w20 = c * x - sn * y; w21 = sn * x + c * y;
                x = v00; y = v01; v00 = c * x - sn * y; v01 = sn * x + c * y;
                x = v10; y = v11; v10 = c * x - sn * y; v11 = sn * x + c * y;
                x = v20; y = v21; v20 = c * x - sn * y; v21 = sn * x + c * y;
            }

            // pair (0, 2)
            al = w00 * w00 + w10 * w10 + w20 * w20;
            be = w02 * w02 + w12 * w12 + w22 * w22;
            ga = w00 * w02 + w10 * w12 + w20 * w22;
            if (ga * ga > ORTHO_TOL2 * al * be && al > TINY && be > TINY) {
                rotated = true;
                d = be - al;
                if (4 * ga * ga < SMALL_ANGLE * d * d) {
                    c = 1;
                    sn = ga / d;
                } else {
                    rr = Math.sqrt(d * d + 4 * ga * ga);
                    dr = Math.abs(d) + rr;
                    k = 1 / Math.sqrt(2 * rr * dr);
                    c = dr * k;
                    sn = (d >= 0 ? 2 * ga : -2 * ga) * k;
                }
                x = w00; y = w02; w00 = c * x - sn * y; w02 = sn * x + c * y;
                x = w10; y = w12; w10 = c * x - sn * y; w12 = sn * x + c * y;
                x = w20; y = w22; w20 = c * x - sn * y; w22 = sn * x + c * y;
                x = v00; y = v02; v00 = c * x - sn * y; v02 = sn * x + c * y;
                x = v10; y = v12; v10 = c * x - sn * y; v12 = sn * x + c * y;
                x = v20; y = v22; v20 = c * x - sn * y; v22 = sn * x + c * y;
            }

            // pair (1, 2)
            al = w01 * w01 + w11 * w11 + w21 * w21;
            be = w02 * w02 + w12 * w12 + w22 * w22;
            ga = w01 * w02 + w11 * w12 + w21 * w22;
            if (ga * ga > ORTHO_TOL2 * al * be && al > TINY && be > TINY) {
                rotated = true;
                d = be - al;
                if (4 * ga * ga < SMALL_ANGLE * d * d) {
                    c = 1;
                    sn = ga / d;
                } else {
                    rr = Math.sqrt(d * d + 4 * ga * ga);
                    dr = Math.abs(d) + rr;
                    k = 1 / Math.sqrt(2 * rr * dr);
                    c = dr * k;
                    sn = (d >= 0 ? 2 * ga : -2 * ga) * k;
                }
                x = w01; y = w02; w01 = c * x - sn * y; w02 = sn * x + c * y;
                x = w11; y = w12; w11 = c * x - sn * y; w12 = sn * x + c * y;
                x = w21; y = w22; w21 = c * x - sn * y; w22 = sn * x + c * y;
                x = v01; y = v02; v01 = c * x - sn * y; v02 = sn * x + c * y;
                x = v11; y = v12; v11 = c * x - sn * y; v12 = sn * x + c * y;
                x = v21; y = v22; v21 = c * x - sn * y; v22 = sn * x + c * y;
            }

            if (!rotated) {
                break;
            }
        }

        // Sort columns by decreasing squared norm. A swap alone would flip det V, so the column moved to the back
        // is negated in both W and V: W = A V still holds and V stays a rotation.
        double n0 = w00 * w00 + w10 * w10 + w20 * w20;
        double n1 = w01 * w01 + w11 * w11 + w21 * w21;
        double n2 = w02 * w02 + w12 * w12 + w22 * w22;
        double tmp;
        if (n0 < n1) {
            tmp = n0; n0 = n1; n1 = tmp;
            tmp = w00; w00 = w01; w01 = -tmp;
            tmp = w10; w10 = w11; w11 = -tmp;
            tmp = w20; w20 = w21; w21 = -tmp;
            tmp = v00; v00 = v01; v01 = -tmp;
            tmp = v10; v10 = v11; v11 = -tmp;
            tmp = v20; v20 = v21; v21 = -tmp;
        }
        if (n0 < n2) {
            tmp = n0; n0 = n2; n2 = tmp;
            tmp = w00; w00 = w02; w02 = -tmp;
            tmp = w10; w10 = w12; w12 = -tmp;
            tmp = w20; w20 = w22; w22 = -tmp;
            tmp = v00; v00 = v02; v02 = -tmp;
            tmp = v10; v10 = v12; v12 = -tmp;
            tmp = v20; v20 = v22; v22 = -tmp;
        }
        if (n1 < n2) {
            tmp = n1; n1 = n2; n2 = tmp;
            tmp = w01; w01 = w02; w02 = -tmp;
            tmp = w11; w11 = w12; w12 = -tmp;
            tmp = w21; w21 = w22; w22 = -tmp;
            tmp = v01; v01 = v02; v02 = -tmp;
            tmp = v11; v11 = v12; v12 = -tmp;
            tmp = v21; v21 = v22; v22 = -tmp;
        }

        // QR of W by Givens rotations G1 (rows 0,1), G2 (rows 0,2), G3 (rows 1,2); U = G1 G2 G3.
        // c = x/h, s = y/h with h >= 0 puts h on the diagonal, so R00, R11 >= 0 and R22 carries the sign of det.
        // If both entries are zero (or underflow when squared, below 1e-154 relative) the rotation is skipped.
        double h, gc, gs, p, q;
        double u00, u01, u02, u10, u11, u12, u20, u21, u22;

        // G1 zeroes W10
        h = w00 * w00 + w10 * w10;
        if (h > 0) {
            h = 1 / Math.sqrt(h);
            gc = w00 * h;
            gs = w10 * h;
        } else {
            gc = 1;
            gs = 0;
        }
        w00 = gc * w00 + gs * w10;
        p = w01; q = w11; w01 = gc * p + gs * q; w11 = -gs * p + gc * q;
        p = w02; q = w12; w02 = gc * p + gs * q; w12 = -gs * p + gc * q;
        u00 = gc; u01 = -gs; u02 = 0;
        u10 = gs; u11 = gc; u12 = 0;
        u20 = 0; u21 = 0; u22 = 1;

        // G2 zeroes W20
        h = w00 * w00 + w20 * w20;
        if (h > 0) {
            h = 1 / Math.sqrt(h);
            gc = w00 * h;
            gs = w20 * h;
        } else {
            gc = 1;
            gs = 0;
        }
        // row 0 of column 0 is not needed any more: sigma.x comes from the column norm
        p = w01; q = w21; w01 = gc * p + gs * q; w21 = -gs * p + gc * q;
        p = w02; q = w22; w02 = gc * p + gs * q; w22 = -gs * p + gc * q;
        // U = U G2: columns 0 and 2
        p = u00; q = u02; u00 = gc * p + gs * q; u02 = -gs * p + gc * q;
        p = u10; q = u12; u10 = gc * p + gs * q; u12 = -gs * p + gc * q;
        p = u20; q = u22; u20 = gc * p + gs * q; u22 = -gs * p + gc * q;

        // G3 zeroes W21
        h = w11 * w11 + w21 * w21;
        if (h > 0) {
            h = 1 / Math.sqrt(h);
            gc = w11 * h;
            gs = w21 * h;
        } else {
            gc = 1;
            gs = 0;
        }
        double r22 = -gs * w12 + gc * w22;
        // U = U G3: columns 1 and 2
        p = u01; q = u02; u01 = gc * p + gs * q; u02 = -gs * p + gc * q;
        p = u11; q = u12; u11 = gc * p + gs * q; u12 = -gs * p + gc * q;
        p = u21; q = u22; u21 = gc * p + gs * q; u22 = -gs * p + gc * q;

        // Column norms are accurate to a few ulps even for tiny columns, and sorted by construction.
        // Adding 0.0 turns a -0.0 into +0.0, so that "negative" means det < 0.
        double s0 = Math.sqrt(n0) * up;
        double s1 = Math.sqrt(n1) * up;
        double s2 = Math.copySign(Math.sqrt(n2), r22) * up + 0.0;
        if (!(s0 <= Double.MAX_VALUE)) {
            return false;
        }

        if (r == null) {
            u.set(u00, u01, u02, u10, u11, u12, u20, u21, u22);
            v.set(v00, v01, v02, v10, v11, v12, v20, v21, v22);
            sigma.set(s0, s1, s2);
            return true;
        }
        if (s != null) {
            // S = V diag(sigma) V^T; upper triangle mirrored so S is exactly symmetric
            double t00 = s0 * v00 * v00 + s1 * v01 * v01 + s2 * v02 * v02;
            double t01 = s0 * v00 * v10 + s1 * v01 * v11 + s2 * v02 * v12;
            double t02 = s0 * v00 * v20 + s1 * v01 * v21 + s2 * v02 * v22;
            double t11 = s0 * v10 * v10 + s1 * v11 * v11 + s2 * v12 * v12;
            double t12 = s0 * v10 * v20 + s1 * v11 * v21 + s2 * v12 * v22;
            double t22 = s0 * v20 * v20 + s1 * v21 * v21 + s2 * v22 * v22;
            s.set(t00, t01, t02, t01, t11, t12, t02, t12, t22);
        }
        // R = U V^T
        r.set(u00 * v00 + u01 * v01 + u02 * v02, u00 * v10 + u01 * v11 + u02 * v12, u00 * v20 + u01 * v21 + u02 * v22,
                u10 * v00 + u11 * v01 + u12 * v02, u10 * v10 + u11 * v11 + u12 * v12, u10 * v20 + u11 * v21 + u12 * v22,
                u20 * v00 + u21 * v01 + u22 * v02, u20 * v10 + u21 * v11 + u22 * v12, u20 * v20 + u21 * v21 + u22 * v22);
        return true;
    }
}

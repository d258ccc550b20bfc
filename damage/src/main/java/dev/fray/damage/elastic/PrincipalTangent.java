package dev.fray.damage.elastic;

/**
 * The stress differential dP/dF of an isotropic energy psi(s_1, s_2, s_3) of the signed singular values of
 * F = U diag(s) V^T, from the principal gradient g_i = dpsi/ds_i and Hessian H_ij (Teran, Sifakis, Irving and
 * Fedkiw 2005, <i>Robust quasistatic finite elements and flesh simulation</i>; Stomakhin, Howes, Schroeder and Teran
 * 2012). In the principal frame (dF^ = U^T dF V, dP^ = U^T dP V) the differential decouples into
 * <pre>
 *   dP^_ii = sum_j H_ij dF^_jj                                    (a 3x3 block)
 *   (dP^_ij, dP^_ji) = [[a, b], [b, a]] (dF^_ij, dF^_ji), i &lt; j   (three 2x2 blocks)
 * </pre>
 * with eigenvalues a + b = (g_i - g_j) / (s_i - s_j) on the symmetric mode dF^_ij = dF^_ji and
 * a - b = (g_i + g_j) / (s_i + s_j) on the antisymmetric one. Where s_i and s_j (nearly) coincide the second quotient is replaced by its limit
 * H_ii - H_ij, exact for a symmetric function of the s_i. The positive semi-definite projection clamps the
 * eigenvalues of the 3x3 block and of each 2x2 block at zero, which is the eigen-projection of the whole 9x9 matrix.
 *
 * <p>Per-worker scratch; not thread-safe, allocate one per batch call.
 */
final class PrincipalTangent {
    /** Relative gap between two singular values below which the difference quotient uses its limit. */
    private static final double COINCIDENT = 1e-7;
    /** E_ij = u_i (x) v_j flattened row-major, 9 per (i, j) at 9 (3i + j). */
    private final double[] basis = new double[81];
    private final double[] h = new double[9];
    private final double[] q = new double[9];
    private final double[] lam = new double[3];
    private final double[] mode = new double[9];

    /**
     * Writes dP/dF at out[o..o+80].
     *
     * @param u        left rotation of the SVD, row-major (input)
     * @param s0       first signed singular value
     * @param s1       second
     * @param s2       third
     * @param v        right rotation of the SVD, row-major (input)
     * @param g        principal gradient, 3 values (input)
     * @param hess     principal Hessian, 9 values row-major, symmetric (input)
     * @param definite whether to clamp the eigenvalues at zero
     * @param out      (output) 81 values at o
     * @param o        offset in out
     */
    void assemble(double[] u, double s0, double s1, double s2, double[] v, double[] g, double[] hess, boolean definite,
                  double[] out, int o) {
        double[] e = basis;
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                int b = 9 * (3 * i + j);
                for (int r = 0; r < 3; r++) {
                    double ur = u[3 * r + i];
                    for (int c = 0; c < 3; c++) {
                        e[b + 3 * r + c] = ur * v[3 * c + j];
                    }
                }
            }
        }
        java.util.Arrays.fill(out, o, o + 81, 0.0);
        System.arraycopy(hess, 0, h, 0, 9);
        if (definite) {
            symmetricEigen(h, q, lam);
            for (int k = 0; k < 3; k++) {
                double l = Math.max(lam[k], 0.0);
                for (int x = 0; x < 9; x++) {
                    mode[x] = q[k] * e[x] + q[3 + k] * e[36 + x] + q[6 + k] * e[72 + x];
                }
                addOuter(out, o, l, mode, mode);
            }
        } else {
            for (int i = 0; i < 3; i++) {
                for (int k = 0; k < 3; k++) {
                    addOuter(out, o, h[3 * i + k], e, 36 * i, e, 36 * k);
                }
            }
        }
        double[] s = {s0, s1, s2};
        for (int i = 0; i < 3; i++) {
            for (int j = i + 1; j < 3; j++) {
                double diff = s[i] - s[j];
                double scale = Math.abs(s[i]) + Math.abs(s[j]);
                double anti = Math.abs(diff) > COINCIDENT * scale ? (g[i] - g[j]) / diff
                        : hess[4 * i] - hess[3 * i + j];
                double sum = s[i] + s[j];
                double sym = Math.abs(sum) > COINCIDENT * scale ? (g[i] + g[j]) / sum
                        : hess[4 * i] + hess[3 * i + j];
                if (definite) {
                    anti = Math.max(anti, 0.0);
                    sym = Math.max(sym, 0.0);
                }
                int bij = 9 * (3 * i + j), bji = 9 * (3 * j + i);
                for (int x = 0; x < 9; x++) {
                    mode[x] = (e[bij + x] + e[bji + x]) * Math.sqrt(0.5);
                }
                // the symmetric mode takes the difference quotient, the antisymmetric one the sum quotient
                addOuter(out, o, anti, mode, mode);
                for (int x = 0; x < 9; x++) {
                    mode[x] = (e[bij + x] - e[bji + x]) * Math.sqrt(0.5);
                }
                addOuter(out, o, sym, mode, mode);
            }
        }
    }

    private static void addOuter(double[] out, int o, double c, double[] a, double[] b) {
        addOuter(out, o, c, a, 0, b, 0);
    }

    private static void addOuter(double[] out, int o, double c, double[] a, int ao, double[] b, int bo) {
        if (c == 0.0) {
            return;
        }
        for (int x = 0; x < 9; x++) {
            double ca = c * a[ao + x];
            int row = o + 9 * x;
            for (int y = 0; y < 9; y++) {
                out[row + y] += ca * b[bo + y];
            }
        }
    }

    /**
     * Eigen-decomposition of a symmetric 3x3 matrix by cyclic Jacobi rotations (Golub and Van Loan, Matrix
     * Computations, 8.5): a = Q diag(lam) Q^T, eigenvectors in the columns of q (row-major).
     */
    static void symmetricEigen(double[] a, double[] q, double[] lam) {
        double a00 = a[0], a11 = a[4], a22 = a[8];
        double a01 = 0.5 * (a[1] + a[3]), a02 = 0.5 * (a[2] + a[6]), a12 = 0.5 * (a[5] + a[7]);
        double[] m = {a00, a01, a02, a01, a11, a12, a02, a12, a22};
        java.util.Arrays.fill(q, 0.0);
        q[0] = 1;
        q[4] = 1;
        q[8] = 1;
        for (int sweep = 0; sweep < 30; sweep++) {
            double off = m[1] * m[1] + m[2] * m[2] + m[5] * m[5];
            double diag = m[0] * m[0] + m[4] * m[4] + m[8] * m[8];
            if (off <= 1e-30 * diag || off == 0.0) {
                break;
            }
            for (int p = 0; p < 2; p++) {
                for (int r = p + 1; r < 3; r++) {
                    double apr = m[3 * p + r];
                    if (apr == 0.0) {
                        continue;
                    }
                    double theta = (m[3 * r + r] - m[3 * p + p]) / (2.0 * apr);
                    double t = Math.signum(theta) / (Math.abs(theta) + Math.sqrt(theta * theta + 1.0));
                    if (theta == 0.0) {
                        t = 1.0;
                    }
                    double c = 1.0 / Math.sqrt(t * t + 1.0), sn = t * c;
                    // m <- J^T m J with J the rotation in the (p, r) plane
                    for (int k = 0; k < 3; k++) {
                        double mkp = m[3 * k + p], mkr = m[3 * k + r];
                        m[3 * k + p] = c * mkp - sn * mkr;
                        m[3 * k + r] = sn * mkp + c * mkr;
                    }
                    for (int k = 0; k < 3; k++) {
                        double mpk = m[3 * p + k], mrk = m[3 * r + k];
                        m[3 * p + k] = c * mpk - sn * mrk;
                        m[3 * r + k] = sn * mpk + c * mrk;
                    }
                    for (int k = 0; k < 3; k++) {
                        double qkp = q[3 * k + p], qkr = q[3 * k + r];
                        q[3 * k + p] = c * qkp - sn * qkr;
                        q[3 * k + r] = sn * qkp + c * qkr;
                    }
                }
            }
        }
        lam[0] = m[0];
        lam[1] = m[4];
        lam[2] = m[8];
    }

    /** Adds the derivatives of c/2 sum (s_i - shift)^2 to a principal gradient and Hessian. */
    static void addStretch(double c, double shift, double s0, double s1, double s2, double[] g, double[] hess) {
        g[0] += c * (s0 - shift);
        g[1] += c * (s1 - shift);
        g[2] += c * (s2 - shift);
        hess[0] += c;
        hess[4] += c;
        hess[8] += c;
    }

    /**
     * Adds the derivatives of a function of J = s0 s1 s2 with slope d1 and curvature d2 in J to a principal
     * gradient and Hessian.
     */
    static void addVolume(double s0, double s1, double s2, double d1, double d2, double[] g, double[] hess) {
        double c0 = s1 * s2, c1 = s0 * s2, c2 = s0 * s1;
        g[0] += d1 * c0;
        g[1] += d1 * c1;
        g[2] += d1 * c2;
        hess[0] += d2 * c0 * c0;
        hess[4] += d2 * c1 * c1;
        hess[8] += d2 * c2 * c2;
        double h01 = d2 * c0 * c1 + d1 * s2, h02 = d2 * c0 * c2 + d1 * s1, h12 = d2 * c1 * c2 + d1 * s0;
        hess[1] += h01;
        hess[3] += h01;
        hess[2] += h02;
        hess[6] += h02;
        hess[5] += h12;
        hess[7] += h12;
    }
}

package dev.fray.core.grid;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.fail;

import dev.fray.core.kernel.Kernel;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.GridFixture;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * The stencil's weights, gradients and index arithmetic. Weight properties are those of B-splines, used by every
 * MPM code (common practice, no source; the inertia D = dx^2/4 quadratic, dx^2/3 cubic is published in Jiang et al.,
 * The affine particle-in-cell method, ACM TOG 34(4), 2015).
 */
class StencilTest extends FrayTestBase {
    private static final double DX = 0.05;
    private static final double[] ORIGIN = {-0.3, 0.1, 0.0};
    private static final int CASES = 200;
    private static final double TOL = 1e-13;

    /**
     * At random positions: sum w_i = 1 (partition of unity), sum w_i (x_i - x_p) = 0 (first moment) and
     * sum w_i (x_i - x_p)(x_i - x_p)^T = D I; the gradients satisfy sum grad w_i = 0 and
     * sum (x_i - x_p) (x) grad w_i = I (the derivative of the first moment), and match central differences of the
     * weights.
     */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void weightsHaveBSplineMoments(Kernel kernel) {
        Stencil st = new Stencil(kernel, ORIGIN[0], ORIGIN[1], ORIGIN[2], DX);
        int s = kernel.support();
        int n = s * s * s;
        double d = kernel.inertia(DX);
        double[] x = new double[3];
        for (int c = 0; c < CASES; c++) {
            for (int a = 0; a < 3; a++) {
                x[a] = ORIGIN[a] + 2 * rand.nextDouble() - 0.5;
            }
            st.locate(x, 0, SparseGrid.key(0, 0, 0), Stencil.RAW_DERIVATIVES);
            st.products(true);
            double[] w = st.w.clone();
            double[] g = new double[3 * n];
            for (int k = 0; k < n; k++) {
                g[3 * k] = st.gx[k];
                g[3 * k + 1] = st.gy[k];
                g[3 * k + 2] = st.gz[k];
            }
            double sum = 0;
            double[] first = new double[3];
            double[][] second = new double[3][3];
            double[] gradSum = new double[3];
            double[][] gradMoment = new double[3][3];
            for (int k = 0; k < n; k++) {
                double[] r = {(st.bx + k / (s * s)) * DX + ORIGIN[0] - x[0],
                    (st.by + (k / s) % s) * DX + ORIGIN[1] - x[1], (st.bz + k % s) * DX + ORIGIN[2] - x[2]};
                sum += w[k];
                for (int a = 0; a < 3; a++) {
                    first[a] += w[k] * r[a];
                    gradSum[a] += g[3 * k + a];
                    for (int b = 0; b < 3; b++) {
                        second[a][b] += w[k] * r[a] * r[b];
                        gradMoment[a][b] += r[a] * g[3 * k + b];
                    }
                }
            }
            assertEquals(1.0, sum, TOL, "partition of unity");
            for (int a = 0; a < 3; a++) {
                assertEquals(0.0, first[a], TOL * DX, "first moment");
                assertEquals(0.0, gradSum[a], TOL / DX, "sum of gradients");
                for (int b = 0; b < 3; b++) {
                    assertEquals(a == b ? d : 0.0, second[a][b], TOL * DX * DX, "second moment (D I)");
                    assertEquals(a == b ? 1.0 : 0.0, gradMoment[a][b], 10 * TOL, "gradient moment (I)");
                }
            }
            checkCentralDifferences(st, x, w, g, n);
        }
    }

    /** Gradient of each weight against central differences in the particle position (relative 1e-6 of |grad|). */
    private static void checkCentralDifferences(Stencil st, double[] x, double[] w, double[] g, int n) {
        double h = 1e-6 * DX;
        int bx = st.bx, by = st.by, bz = st.bz;
        for (int a = 0; a < 3; a++) {
            double[] xp = x.clone();
            double[] xm = x.clone();
            xp[a] += h;
            xm[a] -= h;
            st.locate(xp, 0, SparseGrid.key(0, 0, 0), Stencil.NO_DERIVATIVES);
            st.products(false);
            double[] wp = st.w.clone();
            boolean sameBase = st.bx == bx && st.by == by && st.bz == bz;
            st.locate(xm, 0, SparseGrid.key(0, 0, 0), Stencil.NO_DERIVATIVES);
            st.products(false);
            sameBase &= st.bx == bx && st.by == by && st.bz == bz;
            if (!sameBase) {
                continue; // the difference straddles a change of first node; the weights are then indexed differently
            }
            for (int k = 0; k < n; k++) {
                double fd = (wp[k] - st.w[k]) / (2 * h);
                assertEquals(g[3 * k + a], fd, 1e-6 / DX, "d w_" + k + " / d x_" + a);
            }
        }
    }

    /** Spatial derivatives are the raw ones over dx. */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void spatialDerivativesAreRawOverDx(Kernel kernel) {
        Stencil st = new Stencil(kernel, ORIGIN[0], ORIGIN[1], ORIGIN[2], DX);
        double[] x = {0.123, 0.456, 0.789};
        st.locate(x, 0, SparseGrid.key(0, 0, 0), Stencil.RAW_DERIVATIVES);
        double[] raw = st.dwx.clone();
        st.locate(x, 0, SparseGrid.key(0, 0, 0), Stencil.SPATIAL_DERIVATIVES);
        for (int i = 0; i < kernel.support(); i++) {
            assertEquals(raw[i] / DX, st.dwx[i], 1e-12 * Math.abs(raw[i] / DX));
        }
    }

    /**
     * In a prepared layout, the packed local index of each stencil node, decoded as (i L + j) L + l, is the node's
     * lattice coordinate minus the buffer's origin (one node below the block), and {@link BlockLayout#node} of it is
     * {@link Stencil#node}; {@link Stencil#localBase} agrees with what {@link Stencil#locate} returns.
     */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void localIndicesAgreeWithTheLayout(Kernel kernel) {
        int l = BlockLayout.LOCAL;
        try (GridFixture fx = new GridFixture(GridFixture.randomParticles(rand, 1000, -0.2, 0.6), kernel, ORIGIN, DX,
                1)) {
            Stencil st = fx.stencils[0];
            int s = kernel.support();
            double[] x = fx.store.position();
            for (int r = 0; r < fx.layout.blockCount(); r++) {
                long key = fx.layout.key(r);
                int[] o = {4 * SparseGrid.keyX(key) - 1, 4 * SparseGrid.keyY(key) - 1, 4 * SparseGrid.keyZ(key) - 1};
                for (int p = fx.layout.start(r); p < fx.layout.end(r); p++) {
                    int lb = st.locate(x, p, key, Stencil.NO_DERIVATIVES);
                    int[] first = {st.bx, st.by, st.bz};
                    if (lb != st.localBase(x, p, key) || lb != Stencil.localBase(st.bx, st.by, st.bz, key)) {
                        fail("local base of particle " + p);
                    }
                    for (int k = 0; k < s * s * s; k++) {
                        int li = st.localIndex(lb, k);
                        int[] local = {li / (l * l), (li / l) % l, li % l};
                        int[] offset = {k / (s * s), (k / s) % s, k % s};
                        for (int a = 0; a < 3; a++) {
                            if (local[a] != first[a] + offset[a] - o[a]) {
                                fail("local coordinate " + a + " of stencil node " + k + " of particle " + p);
                            }
                        }
                        if (fx.layout.node(r, local[0], local[1], local[2]) != st.node(fx.layout, r, lb, k)) {
                            fail("BlockLayout.node and Stencil.node disagree at stencil node " + k + " of particle "
                                    + p);
                        }
                    }
                }
            }
        }
    }
}

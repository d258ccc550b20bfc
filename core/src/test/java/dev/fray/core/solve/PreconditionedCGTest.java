package dev.fray.core.solve;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.grid.SparseGrid;
import dev.fray.core.parallel.Workers;
import dev.fray.core.testing.FrayTestBase;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.Arrays;

/**
 * Jacobi-preconditioned conjugate gradients against EJML's dense Cholesky solve (a general-purpose reference library)
 * on random symmetric positive definite matrices over the nodes of one or two grid blocks. Conjugate gradients reach
 * the solution of an n-unknown SPD system in at most n steps in exact arithmetic (Hestenes and Stiefel 1952).
 */
class PreconditionedCGTest extends FrayTestBase {
    private static final double REL_TOL = 1e-13;

    /** Solution within 1e-9 relative of Cholesky, in at most n iterations, the same bits with 1 and 2 workers. */
    @ParameterizedTest
    @ValueSource(ints = {1, 2})
    void matchesCholeskyOnARandomSpdMatrix(int blocks, TestReporter reporter) {
        int n = blocks * SparseGrid.NODES_PER_BLOCK;
        DMatrixRMaj a = randomSpd(n);
        double[] b = randomVector(n);
        double[] mask = new double[n];
        Arrays.fill(mask, 1);
        double[] reference = cholesky(a, b);
        double[] x1 = new double[n];
        double[] x2 = new double[n];
        int it1 = solve(1, a, b, x1, mask, blocks);
        int it2 = solve(2, a, b, x2, mask, blocks);
        reporter.publishEntry("n, iterations, relative error against Cholesky",
                n + ", " + it1 + ", " + relativeError(reference, x1));
        assertTrue(it1 > 0 && it1 <= n, "iterations " + it1 + " of at most n = " + n);
        assertTrue(relativeError(reference, x1) < 1e-9, "relative error " + relativeError(reference, x1));
        assertEquals(it1, it2, "iterations with 1 and 2 workers");
        assertArrayEquals(x1, x2, 0.0, "bitwise the same with 1 and 2 workers");
    }

    /**
     * Nodes with mask 0 keep their initial guess bit for bit; the others solve the system restricted to them,
     * A_uu x_u = b_u (the operator drops the held nodes, as its contract asks), compared with Cholesky on A_uu.
     */
    @Test
    void maskedNodesKeepTheirGuess() {
        int blocks = 2;
        int n = blocks * SparseGrid.NODES_PER_BLOCK;
        DMatrixRMaj a = randomSpd(n);
        double[] b = randomVector(n);
        double[] mask = new double[n];
        double[] x = new double[n];
        int free = 0;
        for (int i = 0; i < n; i++) {
            mask[i] = rand.nextDouble() < 0.25 ? 0 : 1;
            x[i] = rand.nextGaussian();
            free += (int) mask[i];
        }
        double[] guess = x.clone();
        int[] index = new int[free];
        for (int i = 0, k = 0; i < n; i++) {
            if (mask[i] > 0) {
                index[k++] = i;
            }
        }
        DMatrixRMaj sub = new DMatrixRMaj(free, free);
        double[] bSub = new double[free];
        for (int r = 0; r < free; r++) {
            bSub[r] = b[index[r]];
            for (int c = 0; c < free; c++) {
                sub.set(r, c, a.get(index[r], index[c]));
            }
        }
        double[] reference = cholesky(sub, bSub);
        int it = solve(2, a, b, x, mask, blocks);
        assertTrue(it <= free, "iterations " + it + " of at most " + free);
        double[] solved = new double[free];
        for (int r = 0; r < free; r++) {
            solved[r] = x[index[r]];
        }
        assertTrue(relativeError(reference, solved) < 1e-9, "relative error " + relativeError(reference, solved));
        for (int i = 0; i < n; i++) {
            if (mask[i] == 0) {
                assertEquals(Double.doubleToLongBits(guess[i]), Double.doubleToLongBits(x[i]), "held node " + i);
            }
        }
    }

    /**
     * On 40 blocks (2560 unknowns, so the fixed node partition has several tasks) with a sparse random SPD operator,
     * the iterates are the same bits for 1, 2 and 3 workers, and the residual |b - A x| / |b| is below 1e-11.
     */
    @Test
    void sparseSolveIsBitwiseTheSameForAnyThreadCount() {
        int blocks = 40;
        int n = blocks * SparseGrid.NODES_PER_BLOCK;
        int[] far = {1, 7, 64};
        double[] d = new double[n];
        double[] weight = new double[far.length * n];
        double[] diag = new double[n];
        for (int i = 0; i < n; i++) {
            d[i] = 0.05 + rand.nextDouble();
            diag[i] += d[i];
            for (int e = 0; e < far.length; e++) {
                if (i + far[e] < n) {
                    double w = Math.exp(3 * rand.nextDouble());
                    weight[far.length * i + e] = w;
                    diag[i] += w;
                    diag[i + far[e]] += w;
                }
            }
        }
        // A = diag(d) + sum over links w (e_i - e_j)(e_i - e_j)^T: symmetric and positive definite.
        LinearOperator op = (in, out) -> {
            for (int i = 0; i < n; i++) {
                out[i] = d[i] * in[i];
            }
            for (int i = 0; i < n; i++) {
                for (int e = 0; e < far.length; e++) {
                    double w = weight[far.length * i + e];
                    if (w != 0) {
                        double f = w * (in[i] - in[i + far[e]]);
                        out[i] += f;
                        out[i + far[e]] -= f;
                    }
                }
            }
        };
        double[] b = randomVector(n);
        double[] mask = new double[n];
        Arrays.fill(mask, 1);
        double[] reference = null;
        for (int threads = 1; threads <= 3; threads++) {
            double[] x = new double[n];
            try (Workers workers = new Workers(threads)) {
                new PreconditionedCG(workers).solve(op, b, x, diag, mask, blocks, REL_TOL, 0, n);
            }
            if (reference == null) {
                reference = x;
                double[] ax = new double[n];
                op.apply(x, ax);
                double r2 = 0;
                double b2 = 0;
                for (int i = 0; i < n; i++) {
                    r2 += (b[i] - ax[i]) * (b[i] - ax[i]);
                    b2 += b[i] * b[i];
                }
                assertTrue(Math.sqrt(r2 / b2) < 1e-11, "relative residual " + Math.sqrt(r2 / b2));
            }
            assertArrayEquals(reference, x, 0.0, "bitwise the same with " + threads + " threads");
        }
    }

    /** Runs the solver from guess x with the dense matrix applied to the masked nodes only. */
    private static int solve(int threads, DMatrixRMaj a, double[] b, double[] x, double[] mask, int blocks) {
        int n = b.length;
        double[] diag = new double[n];
        for (int i = 0; i < n; i++) {
            diag[i] = mask[i] > 0 ? a.get(i, i) : 1;
        }
        LinearOperator op = (in, out) -> {
            for (int i = 0; i < n; i++) {
                double s = 0;
                if (mask[i] > 0) {
                    for (int j = 0; j < n; j++) {
                        s += a.get(i, j) * mask[j] * in[j];
                    }
                }
                out[i] = s;
            }
        };
        try (Workers workers = new Workers(threads)) {
            return new PreconditionedCG(workers).solve(op, b, x, diag, mask, blocks, REL_TOL, 0, n);
        }
    }

    /**
     * S (B B^T + n/3 I) S with B uniform in [-1, 1] and S diagonal log-uniform in [1, 10]: the middle factor has
     * eigenvalues in about [n/3, 5n/3], and S makes the diagonal uneven so the Jacobi preconditioner has work to do.
     */
    private DMatrixRMaj randomSpd(int n) {
        DMatrixRMaj bm = new DMatrixRMaj(n, n);
        for (int i = 0; i < n * n; i++) {
            bm.data[i] = 2 * rand.nextDouble() - 1;
        }
        DMatrixRMaj a = new DMatrixRMaj(n, n);
        CommonOps_DDRM.multTransB(bm, bm, a);
        double[] s = new double[n];
        for (int i = 0; i < n; i++) {
            a.add(i, i, n / 3.0);
            s[i] = Math.pow(10, rand.nextDouble());
        }
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                a.set(i, j, s[i] * a.get(i, j) * s[j]);
            }
        }
        return a;
    }

    private double[] randomVector(int n) {
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            v[i] = rand.nextGaussian();
        }
        return v;
    }

    private static double[] cholesky(DMatrixRMaj a, double[] b) {
        LinearSolverDense<DMatrixRMaj> chol = LinearSolverFactory_DDRM.chol(a.numRows);
        assertTrue(chol.setA(a.copy()), "EJML Cholesky: matrix is SPD");
        DMatrixRMaj x = new DMatrixRMaj(b.length, 1);
        chol.solve(new DMatrixRMaj(b.length, 1, true, b), x);
        return x.data.clone();
    }

    private static double relativeError(double[] expected, double[] actual) {
        double e = 0;
        double s = 0;
        for (int i = 0; i < expected.length; i++) {
            e += (expected[i] - actual[i]) * (expected[i] - actual[i]);
            s += expected[i] * expected[i];
        }
        return Math.sqrt(e / s);
    }
}

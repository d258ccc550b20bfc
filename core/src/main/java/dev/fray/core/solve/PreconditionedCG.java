package dev.fray.core.solve;

import dev.fray.core.parallel.Reductions;
import dev.fray.core.parallel.Workers;

/**
 * Jacobi-preconditioned conjugate gradients for a symmetric positive definite operator on the nodes of the first
 * grid blocks (Hestenes and Stiefel 1952; the preconditioned form as in Saad, Iterative Methods for Sparse Linear
 * Systems, algorithm 9.1). Every dot product is formed over the fixed node partition of {@link Reductions} and
 * combined in task order, so the iterates are bitwise identical for any thread count.
 *
 * <p>Stop rule: iterate while the residual norm exceeds {@code relTol} times the larger of |b| and the first
 * residual, and the largest Jacobi correction |r_i / diag_i| exceeds {@code absTol} (a tolerance in the unknown's
 * own units: once no node would move by more than that, further iterations only chase roundoff), up to
 * {@code maxIterations}. A non-positive curvature p . A p ends the iteration.
 */
public final class PreconditionedCG {
    private final Workers workers;
    private double[] r = new double[0];
    private double[] z = new double[0];
    private double[] dir = new double[0];
    private double[] q = new double[0];
    private double[] partial = new double[0];
    private final double[][] sums;
    private double lastFirst;
    private double lastSecond;
    private double lastMax;
    private int iterations;
    private double residual;

    /** @param workers the workers */
    public PreconditionedCG(Workers workers) {
        this.workers = workers;
        this.sums = new double[workers.threads()][3];
    }

    @FunctionalInterface
    private interface DotBody {
        void run(int from, int to, double[] out);
    }

    /**
     * Solves A x = b.
     *
     * @param a             the operator; it must return 0 at nodes outside the mask
     * @param b             (input) right-hand side per node
     * @param x             (input and output) the initial guess, then the solution
     * @param diag          (input) the Jacobi preconditioner: A's diagonal, 1 outside the mask
     * @param mask          (input) nodes with mask &gt; 0 are unknowns, the others are held at their guess
     * @param gridBlocks    active grid blocks: the vectors cover their nodes
     * @param relTol        relative residual tolerance
     * @param absTol        largest Jacobi correction at which to stop, in the unknown's units
     * @param maxIterations iteration cap
     * @return iterations taken
     */
    public int solve(LinearOperator a, double[] b, double[] x, double[] diag, double[] mask, int gridBlocks,
                     double relTol, double absTol, int maxIterations) {
        int nodes = gridBlocks * dev.fray.core.grid.SparseGrid.NODES_PER_BLOCK;
        if (r.length < nodes) {
            int cap = Math.max(nodes, r.length + r.length / 2);
            r = new double[cap];
            z = new double[cap];
            dir = new double[cap];
            q = new double[cap];
        }
        int tasks = Reductions.gridTasks(gridBlocks);
        if (partial.length < 3 * tasks) {
            partial = new double[3 * tasks];
        }
        a.apply(x, q);
        double rz = dots(tasks, gridBlocks, (s, e, out) -> {
            double s1 = 0, s2 = 0, big = 0;
            for (int i = s; i < e; i++) {
                if (mask[i] > 0) {
                    r[i] = b[i] - q[i];
                    z[i] = r[i] / diag[i];
                } else {
                    r[i] = 0;
                    z[i] = 0;
                }
                dir[i] = z[i];
                s1 += r[i] * z[i];
                s2 += b[i] * b[i];
                big = Math.max(big, Math.abs(z[i]));
            }
            out[0] = s1;
            out[1] = s2;
            out[2] = big;
        });
        double bnorm = Math.sqrt(lastSecond);
        double correction = lastMax;
        dots(tasks, gridBlocks, (s, e, out) -> {
            double s1 = 0;
            for (int i = s; i < e; i++) {
                s1 += r[i] * r[i];
            }
            out[0] = s1;
            out[1] = 0;
            out[2] = 0;
        });
        double rnorm = Math.sqrt(lastFirst);
        // Relative to the larger of b and the first residual: with b = 0 and a non-zero guess the solve must still
        // stop once the guess has decayed.
        double scale = Math.max(Math.max(bnorm, rnorm), Double.MIN_NORMAL);
        double tol = relTol * scale;
        int it = 0;
        while (rnorm > tol && correction > absTol && it < maxIterations) {
            a.apply(dir, q);
            double pq = dots(tasks, gridBlocks, (s, e, out) -> {
                double s1 = 0;
                for (int i = s; i < e; i++) {
                    s1 += dir[i] * q[i];
                }
                out[0] = s1;
                out[1] = 0;
                out[2] = 0;
            });
            if (!(pq > 0)) {
                break;
            }
            double alpha = rz / pq;
            double rzNew = dots(tasks, gridBlocks, (s, e, out) -> {
                double s1 = 0, s2 = 0, big = 0;
                for (int i = s; i < e; i++) {
                    x[i] += alpha * dir[i];
                    r[i] -= alpha * q[i];
                    z[i] = r[i] / diag[i];
                    s1 += r[i] * z[i];
                    s2 += r[i] * r[i];
                    big = Math.max(big, Math.abs(z[i]));
                }
                out[0] = s1;
                out[1] = s2;
                out[2] = big;
            });
            rnorm = Math.sqrt(lastSecond);
            correction = lastMax;
            double beta = rzNew / rz;
            rz = rzNew;
            Reductions.overNodes(workers, gridBlocks, (w, t, s, e) -> {
                for (int i = s; i < e; i++) {
                    dir[i] = z[i] + beta * dir[i];
                }
            });
            it++;
        }
        iterations = it;
        residual = rnorm / scale;
        return it;
    }

    /** @return iterations of the last solve */
    public int iterations() {
        return iterations;
    }

    /** @return relative residual reached by the last solve */
    public double residual() {
        return residual;
    }

    /** Two sums and a maximum over nodes, formed per fixed task and combined in task order; returns the first sum. */
    private double dots(int tasks, int gridBlocks, DotBody body) {
        Reductions.overNodes(workers, gridBlocks, (w, t, s, e) -> {
            double[] out = sums[w];
            body.run(s, e, out);
            partial[3 * t] = out[0];
            partial[3 * t + 1] = out[1];
            partial[3 * t + 2] = out[2];
        });
        double s1 = 0, s2 = 0, big = 0;
        for (int t = 0; t < tasks; t++) {
            s1 += partial[3 * t];
            s2 += partial[3 * t + 1];
            big = Math.max(big, partial[3 * t + 2]);
        }
        lastFirst = s1;
        lastSecond = s2;
        lastMax = big;
        return s1;
    }
}

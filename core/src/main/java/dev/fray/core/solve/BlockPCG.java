package dev.fray.core.solve;

import dev.fray.core.grid.SparseGrid;
import dev.fray.core.parallel.Reductions;
import dev.fray.core.parallel.Workers;

/**
 * Preconditioned conjugate gradients for a symmetric positive semi-definite operator on 3-vectors per grid node
 * (Hestenes and Stiefel 1952; preconditioned form as in Saad, Iterative Methods for Sparse Linear Systems,
 * algorithm 9.1), with a block-Jacobi preconditioner: the inverse of each node's 3x3 diagonal block, given by the
 * caller. Constrained directions are removed by a per-node 3x3 projector S applied to the residual and the
 * preconditioned residual, so the iterates stay in the admissible subspace (the modified PCG of Baraff and Witkin
 * 1998, with S the filter). Every dot product is formed over the fixed node partition of {@link Reductions} and
 * combined in task order: bitwise identical for any thread count.
 *
 * <p>Stop rule: the residual's norm in the metric of the lumped mass, sqrt(sum |r_i|^2 / m_i), at most
 * {@code tolerance}, or {@code maxIterations}. A non-positive curvature p . A p ends the iteration.
 */
public final class BlockPCG {
    private final Workers workers;
    private double[] r = new double[0];
    private double[] z = new double[0];
    private double[] dir = new double[0];
    private double[] q = new double[0];
    private double[] partial = new double[0];
    private double lastA;
    private double lastB;
    private int iterations;
    private double residual;

    /** @param workers the workers */
    public BlockPCG(Workers workers) {
        this.workers = workers;
    }

    /** Per-node data of the system. */
    public interface Nodes {
        /** @return node masses, kg; nodes with mass &lt;= 0 are not unknowns */
        double[] mass();

        /** @return inverse diagonal block per node, 9 row-major (only read where mass &gt; 0) */
        double[] inverseDiagonal();

        /** @return constraint projector per node, 9 row-major, or null where {@link #constrained()} is 0 */
        double[] projector();

        /** @return 1 where a node's projector applies, 0 where the node is free */
        byte[] constrained();
    }

    /**
     * Solves A x = b in the admissible subspace, starting from x = 0.
     *
     * @param a             the operator (its output must be zero at massless nodes)
     * @param b             (input) right-hand side, 3 per node, already projected
     * @param x             (output) the solution, 3 per node
     * @param nodes         masses, preconditioner and projectors
     * @param gridBlocks    active grid blocks: the vectors cover their nodes
     * @param tolerance     stop when sqrt(sum |r_i|^2 / m_i) is at most this
     * @param maxIterations iteration cap
     * @return iterations taken
     */
    public int solve(LinearOperator a, double[] b, double[] x, Nodes nodes, int gridBlocks, double tolerance,
                     int maxIterations) {
        int n = gridBlocks * SparseGrid.NODES_PER_BLOCK;
        if (r.length < 3 * n) {
            int cap = Math.max(3 * n, r.length + r.length / 2);
            r = new double[cap];
            z = new double[cap];
            dir = new double[cap];
            q = new double[cap];
        }
        int tasks = Reductions.gridTasks(gridBlocks);
        if (partial.length < 2 * tasks) {
            partial = new double[2 * tasks];
        }
        double[] m = nodes.mass();
        double[] inv = nodes.inverseDiagonal();
        double[] proj = nodes.projector();
        byte[] con = nodes.constrained();
        double rz = reduce(gridBlocks, (s, e, out) -> {
            double s1 = 0, s2 = 0;
            for (int i = s; i < e; i++) {
                int i3 = 3 * i;
                x[i3] = 0;
                x[i3 + 1] = 0;
                x[i3 + 2] = 0;
                if (!(m[i] > 0)) {
                    zero(r, i3);
                    zero(z, i3);
                    zero(dir, i3);
                    continue;
                }
                r[i3] = b[i3];
                r[i3 + 1] = b[i3 + 1];
                r[i3 + 2] = b[i3 + 2];
                precondition(i, inv, proj, con);
                dir[i3] = z[i3];
                dir[i3 + 1] = z[i3 + 1];
                dir[i3 + 2] = z[i3 + 2];
                s1 += r[i3] * z[i3] + r[i3 + 1] * z[i3 + 1] + r[i3 + 2] * z[i3 + 2];
                s2 += (r[i3] * r[i3] + r[i3 + 1] * r[i3 + 1] + r[i3 + 2] * r[i3 + 2]) / m[i];
            }
            out[0] = s1;
            out[1] = s2;
        });
        double rnorm = Math.sqrt(lastB);
        int it = 0;
        while (rnorm > tolerance && it < maxIterations) {
            a.apply(dir, q);
            double pq = reduce(gridBlocks, (s, e, out) -> {
                double s1 = 0;
                for (int i = s; i < e; i++) {
                    if (m[i] > 0) {
                        int i3 = 3 * i;
                        project(q, i3, proj, con, i);
                        s1 += dir[i3] * q[i3] + dir[i3 + 1] * q[i3 + 1] + dir[i3 + 2] * q[i3 + 2];
                    }
                }
                out[0] = s1;
                out[1] = 0;
            });
            if (!(pq > 0)) {
                break;
            }
            double alpha = rz / pq;
            double rzNew = reduce(gridBlocks, (s, e, out) -> {
                double s1 = 0, s2 = 0;
                for (int i = s; i < e; i++) {
                    if (!(m[i] > 0)) {
                        continue;
                    }
                    int i3 = 3 * i;
                    for (int k = 0; k < 3; k++) {
                        x[i3 + k] += alpha * dir[i3 + k];
                        r[i3 + k] -= alpha * q[i3 + k];
                    }
                    precondition(i, inv, proj, con);
                    s1 += r[i3] * z[i3] + r[i3 + 1] * z[i3 + 1] + r[i3 + 2] * z[i3 + 2];
                    s2 += (r[i3] * r[i3] + r[i3 + 1] * r[i3 + 1] + r[i3 + 2] * r[i3 + 2]) / m[i];
                }
                out[0] = s1;
                out[1] = s2;
            });
            rnorm = Math.sqrt(lastB);
            double beta = rzNew / rz;
            rz = rzNew;
            Reductions.overNodes(workers, gridBlocks, (w, t, s, e) -> {
                for (int i = 3 * s; i < 3 * e; i++) {
                    dir[i] = z[i] + beta * dir[i];
                }
            });
            it++;
        }
        iterations = it;
        residual = rnorm;
        return it;
    }

    /** z_i = S_i D_i^-1 S_i r_i (S the projector where the node is constrained). */
    private void precondition(int i, double[] inv, double[] proj, byte[] con) {
        int i3 = 3 * i, i9 = 9 * i;
        if (con[i] != 0) {
            project(r, i3, proj, con, i);
        }
        double r0 = r[i3], r1 = r[i3 + 1], r2 = r[i3 + 2];
        z[i3] = inv[i9] * r0 + inv[i9 + 1] * r1 + inv[i9 + 2] * r2;
        z[i3 + 1] = inv[i9 + 3] * r0 + inv[i9 + 4] * r1 + inv[i9 + 5] * r2;
        z[i3 + 2] = inv[i9 + 6] * r0 + inv[i9 + 7] * r1 + inv[i9 + 8] * r2;
        if (con[i] != 0) {
            project(z, i3, proj, con, i);
        }
    }

    /**
     * Applies node i's projector to the 3-vector at v[i3] if the node is constrained.
     *
     * @param v    vectors, 3 per node
     * @param i3   offset of node i's vector
     * @param proj projectors, 9 per node
     * @param con  constraint flags
     * @param i    the node
     */
    public static void project(double[] v, int i3, double[] proj, byte[] con, int i) {
        if (con[i] == 0) {
            return;
        }
        int i9 = 9 * i;
        double a = v[i3], b = v[i3 + 1], c = v[i3 + 2];
        v[i3] = proj[i9] * a + proj[i9 + 1] * b + proj[i9 + 2] * c;
        v[i3 + 1] = proj[i9 + 3] * a + proj[i9 + 4] * b + proj[i9 + 5] * c;
        v[i3 + 2] = proj[i9 + 6] * a + proj[i9 + 7] * b + proj[i9 + 8] * c;
    }

    private static void zero(double[] v, int i3) {
        v[i3] = 0;
        v[i3 + 1] = 0;
        v[i3 + 2] = 0;
    }

    /** @return iterations of the last solve */
    public int iterations() {
        return iterations;
    }

    /** @return mass-metric residual norm reached by the last solve */
    public double residual() {
        return residual;
    }

    @FunctionalInterface
    private interface Body {
        void run(int from, int to, double[] out);
    }

    /** Two sums over nodes, formed per fixed task and combined in task order; returns the first. */
    private double reduce(int gridBlocks, Body body) {
        int tasks = Reductions.gridTasks(gridBlocks);
        Reductions.overNodes(workers, gridBlocks, (w, t, s, e) -> {
            double[] out = new double[2];
            body.run(s, e, out);
            partial[2 * t] = out[0];
            partial[2 * t + 1] = out[1];
        });
        lastA = Reductions.sum(partial, tasks, 2, 0);
        lastB = Reductions.sum(partial, tasks, 2, 1);
        return lastA;
    }
}

package dev.fray.core.sim;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.particles.ParticleStore;

import java.util.Arrays;

/**
 * The grid solve of phase-field damage: a d - div(D grad d) = b, with per-particle coefficients from the damage
 * models, discretised with the transfer's B-spline shape functions and particle quadrature (a blend of the
 * consistent and lumped reaction term, consistent diffusion term), solved matrix-free by Jacobi-preconditioned
 * conjugate gradients warm-started from the particles' current damage, and interpolated back to the particles. Scatters use the same colour
 * phases as the transfer and every dot product sums fixed grid-block tasks in order, so the result does not
 * depend on the thread count. One field is shared by all phase-field bodies.
 */
final class PhaseFieldSolve {
    private static final int C = DamageModel.COEFFICIENTS;
    private final Simulation sim;
    private double[] coef = new double[0];
    private double[] reaction = new double[0];
    private double[] reactionDiag = new double[0];
    /**
     * Weight of the consistent reaction term against the lumped one. Fully consistent is the most accurate (crack
     * band length within 0.3% at l = 2 dx, lumped: 3%) but nodes at a body's edge, reached by few particles, make
     * it nearly singular and conjugate gradients stall; the half-and-half blend keeps the matrix diagonally
     * dominant in the reaction part.
     */
    static final double CONSISTENT = 0.5;
    private double[] source = new double[0];
    private double[] diag = new double[0];
    private double[] x = new double[0];
    private double[] r = new double[0];
    private double[] z = new double[0];
    private double[] dir = new double[0];
    private double[] q = new double[0];
    private double[] weight = new double[0];
    private double[] partial = new double[0];
    private int lastIterations;
    private double lastResidual;

    /** Per worker: the partial sums of one dot-product task (two sums and a maximum). */
    private final double[][] sums;
    /** Per worker: block-local node buffer, {@link #FIELDS} values per node of the LOCAL^3 block neighbourhood. */
    private final double[][] local;
    /** Per worker: the nodes a block reaches, as local buffer indices and grid nodes (see nodesOf). */
    private final int[][] localIndex;
    private final int[][] gridNode;
    /** Values per node in the local buffer: the six assembled fields, or a gathered and a scattered vector. */
    private static final int FIELDS = 6;
    private static final int L = Simulation.LOCAL;
    /** Per particle block: smallest and largest local stencil base of its phase-field particles (x, y, z). */
    private int[] range = new int[0];
    /** Per particle block: largest b / a of its phase-field particles, or +infinity if one is already damaged. */
    private double[] blockBound = new double[0];
    /**
     * The solve is skipped while the field it would produce is below this fraction of the tolerance everywhere:
     * with no damage yet, the solution is bounded by the largest b / a (maximum principle of the reaction-diffusion
     * equation), so an intact body costs no grid solve.
     */
    private static final double SKIP_FRACTION = 1e-3;

    PhaseFieldSolve(Simulation sim) {
        this.sim = sim;
        this.sums = new double[sim.workers.threads()][3];
        this.local = new double[sim.workers.threads()][FIELDS * L * L * L];
        this.localIndex = new int[sim.workers.threads()][L * L * L];
        this.gridNode = new int[sim.workers.threads()][L * L * L];
    }

    int lastIterations() {
        return lastIterations;
    }

    double lastResidual() {
        return lastResidual;
    }

    void solve(double h) {
        ParticleStore store = sim.store;
        int n = store.size();
        if (coef.length < C * n) {
            coef = new double[C * n];
        }
        int nodes = sim.grid.blockCount() * SparseGrid.NODES_PER_BLOCK;
        if (reaction.length < nodes) {
            int cap = Math.max(nodes, reaction.length + reaction.length / 2);
            reaction = new double[cap];
            reactionDiag = new double[cap];
            source = new double[cap];
            diag = new double[cap];
            x = new double[cap];
            r = new double[cap];
            z = new double[cap];
            dir = new double[cap];
            q = new double[cap];
            weight = new double[cap];
        }
        int gridTasks = gridTasks();
        if (partial.length < 3 * gridTasks) {
            partial = new double[3 * gridTasks];
        }
        sim.workers.forEach(gridTasks, (w, t) -> {
            int a = t * Simulation.GRID_TASK_BLOCKS * SparseGrid.NODES_PER_BLOCK;
            int b = Math.min(nodes, a + Simulation.GRID_TASK_BLOCKS * SparseGrid.NODES_PER_BLOCK);
            for (double[] v : new double[][] {reaction, reactionDiag, source, diag, x, weight}) {
                Arrays.fill(v, a, b, 0.0);
            }
        });
        if (range.length < 6 * sim.blockCount) {
            range = new int[6 * Math.max(sim.blockCount, range.length / 3)];
            blockBound = new double[range.length / 6];
        }
        double[] damage = store.channel(DamageModel.DAMAGE);
        // Coefficients per particle of phase-field bodies, and the node range each block's particles reach.
        sim.workers.forEach(sim.blockCount, (w, blk) -> {
            int[] rg = range;
            rg[6 * blk] = rg[6 * blk + 1] = rg[6 * blk + 2] = L;
            rg[6 * blk + 3] = rg[6 * blk + 4] = rg[6 * blk + 5] = -1;
            blockBound[blk] = 0;
            forRuns(blk, (from, to, model) -> {
                double[] out = sim.scratch[w].work(C * (to - from));
                model.phaseFieldCoefficients(store, from, to, h, out);
                System.arraycopy(out, 0, coef, C * from, C * (to - from));
                double bound = blockBound[blk];
                for (int p = from; p < to; p++) {
                    double a = coef[C * p], b = coef[C * p + 1];
                    // Written so that NaN, a damaged particle or a non-positive reaction force the solve.
                    double q = damage[p] == 0 && a > 0 ? Math.abs(b) / a : Double.POSITIVE_INFINITY;
                    if (!(q <= bound)) {
                        bound = Double.isNaN(q) ? Double.POSITIVE_INFINITY : q;
                    }
                }
                blockBound[blk] = bound;
                int[] lb = sim.scratch[w].node;
                for (int p = from; p < to; p++) {
                    localBase(blk, p, lb);
                    for (int axis = 0; axis < 3; axis++) {
                        rg[6 * blk + axis] = Math.min(rg[6 * blk + axis], lb[axis]);
                        rg[6 * blk + 3 + axis] = Math.max(rg[6 * blk + 3 + axis], lb[axis]);
                    }
                }
            });
        });
        double bound = 0;
        for (int blk = 0; blk < sim.blockCount; blk++) {
            bound = Math.max(bound, blockBound[blk]);
        }
        if (bound <= SKIP_FRACTION * sim.scene.phaseFieldTolerance()) {
            lastIterations = 0;
            lastResidual = 0;
            return;
        }
        // Assembly: source, the diagonals of the reaction and diffusion operators, and the warm start, summed per
        // block in its local buffer and then added to the grid.
        double[] vol = store.volume();
        int s3 = sim.kernel.support();
        scatterPhases((w, blk) -> {
            if (range[6 * blk + 3] < 0) {
                return;
            }
            Simulation.Scratch sc = sim.scratch[w];
            double[] loc = local[w];
            clear(loc, blk, FIELDS);
            forRuns(blk, (from, to, model) -> {
                for (int p = from; p < to; p++) {
                    int base = axisWeights(sc, blk, p);
                    double v = vol[p];
                    int c = C * p;
                    double aa = coef[c], bb = coef[c + 1];
                    double dxx = coef[c + 2], dyy = coef[c + 3], dzz = coef[c + 4];
                    double dxy = coef[c + 5], dxz = coef[c + 6], dyz = coef[c + 7];
                    double dp = damage[p];
                    boolean quadratic = s3 == 3;
                    for (int i = 0; quadratic ? i < 3 : i < s3; i++) {
                        for (int j = 0; quadratic ? j < 3 : j < s3; j++) {
                            double wij = sc.wx[i] * sc.wy[j];
                            double gij = sc.dwx[i] * sc.wy[j], hij = sc.wx[i] * sc.dwy[j];
                            int o = FIELDS * (base + (i * L + j) * L);
                            for (int l = 0; quadratic ? l < 3 : l < s3; l++) {
                                double wt = wij * sc.wz[l];
                                double gx = gij * sc.wz[l], gy = hij * sc.wz[l], gz = wij * sc.dwz[l];
                                double wv = wt * v;
                                int q = o + FIELDS * l;
                                // Lumped row sums of the reaction term; the blend with the consistent term is
                                // applied below.
                                loc[q] += wv * aa;
                                loc[q + 1] += wv * wt * aa;
                                loc[q + 2] += wv * bb;
                                loc[q + 3] += wv;
                                loc[q + 4] += wv * dp;
                                loc[q + 5] += v * (gx * (dxx * gx + dxy * gy + dxz * gz)
                                        + gy * (dxy * gx + dyy * gy + dyz * gz)
                                        + gz * (dxz * gx + dyz * gy + dzz * gz));
                            }
                        }
                    }
                }
            });
            int[] li = localIndex[w], gn = gridNode[w];
            for (int k = 0, count = nodesOf(blk, li, gn); k < count; k++) {
                int f = FIELDS * li[k], node = gn[k];
                reaction[node] += loc[f];
                reactionDiag[node] += loc[f + 1];
                source[node] += loc[f + 2];
                weight[node] += loc[f + 3];
                x[node] += loc[f + 4];
                diag[node] += loc[f + 5];
            }
        });
        // Initial residual r = b - A x and the first search direction.
        nodeTasks(gridTasks, nodes, (a, b) -> {
            for (int i = a; i < b; i++) {
                if (weight[i] > 0) {
                    x[i] /= weight[i];
                    diag[i] += (1 - CONSISTENT) * reaction[i] + CONSISTENT * reactionDiag[i];
                } else {
                    x[i] = 0;
                    diag[i] = 1;
                }
            }
        });
        apply(x, q, gridTasks, nodes);
        double rz = nodeDots(gridTasks, nodes, (a, b, out) -> {
            double s1 = 0, s2 = 0, big = 0;
            for (int i = a; i < b; i++) {
                if (weight[i] > 0) {
                    r[i] = source[i] - q[i];
                    z[i] = r[i] / diag[i];
                } else {
                    r[i] = 0;
                    z[i] = 0;
                }
                dir[i] = z[i];
                s1 += r[i] * z[i];
                s2 += source[i] * source[i];
                big = Math.max(big, Math.abs(z[i]));
            }
            out[0] = s1;
            out[1] = s2;
            out[2] = big;
        });
        double bnorm = Math.sqrt(lastSecond);
        double correction = lastMax;
        double rnorm = residualNorm(gridTasks, nodes);
        // Relative to the larger of b and the first residual: with b = 0 and a non-zero warm start the solve
        // must still stop once the warm start has decayed.
        double scale = Math.max(Math.max(bnorm, rnorm), Double.MIN_NORMAL);
        double tol = sim.scene.phaseFieldTolerance() * scale;
        // The field is damage, between 0 and 1: once the largest Jacobi correction r_i / diag_i is below the
        // tolerance in damage units the field is as good as it gets, however small b is. Without this an intact
        // body (b near 0) iterates on roundoff.
        double absTol = sim.scene.phaseFieldTolerance();
        int maxIt = sim.scene.phaseFieldMaxIterations();
        int it = 0;
        while (rnorm > tol && correction > absTol && it < maxIt) {
            apply(dir, q, gridTasks, nodes);
            double pq = nodeDots(gridTasks, nodes, (a, b, out) -> {
                double s1 = 0;
                for (int i = a; i < b; i++) {
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
            double rzNew = nodeDots(gridTasks, nodes, (a, b, out) -> {
                double s1 = 0, s2 = 0, big = 0;
                for (int i = a; i < b; i++) {
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
            nodeTasks(gridTasks, nodes, (a, b) -> {
                for (int i = a; i < b; i++) {
                    dir[i] = z[i] + beta * dir[i];
                }
            });
            it++;
        }
        lastIterations = it;
        lastResidual = rnorm / scale;
        // Back to the particles.
        sim.workers.forEach(sim.blockCount, (w, blk) -> {
            if (range[6 * blk + 3] < 0) {
                return;
            }
            Simulation.Scratch sc = sim.scratch[w];
            double[] loc = local[w];
            double[] xs = x;
            int[] li = localIndex[w], gn = gridNode[w];
            for (int k = 0, count = nodesOf(blk, li, gn); k < count; k++) {
                loc[li[k]] = xs[gn[k]];
            }
            forRuns(blk, (from, to, model) -> {
                double[] out = sc.work(to - from);
                for (int p = from; p < to; p++) {
                    int base = axisWeights(sc, blk, p);
                    double d = 0;
                    boolean quadratic = s3 == 3;
                    for (int i = 0; quadratic ? i < 3 : i < s3; i++) {
                        for (int j = 0; quadratic ? j < 3 : j < s3; j++) {
                            double wij = sc.wx[i] * sc.wy[j];
                            int o = base + (i * L + j) * L;
                            for (int l = 0; quadratic ? l < 3 : l < s3; l++) {
                                d += wij * sc.wz[l] * loc[o + l];
                            }
                        }
                    }
                    out[p - from] = d;
                }
                model.acceptPhaseField(store, from, to, out);
            });
        });
    }

    private double residualNorm(int gridTasks, int nodes) {
        nodeDots(gridTasks, nodes, (a, b, out) -> {
            double s = 0;
            for (int i = a; i < b; i++) {
                s += r[i] * r[i];
            }
            out[0] = s;
            out[1] = 0;
            out[2] = 0;
        });
        return Math.sqrt(lastFirst);
    }

    /**
     * out = A v: reaction plus diffusion operator, matrix-free through the particles. Each particle block loads v
     * over its nodes into its local buffer; each particle gathers v and its gradient there and scatters its
     * reaction and flux back into the buffer at once, which is then added to out. Blocks run in the colour phases
     * of the transfer, so blocks running together touch disjoint nodes.
     */
    private void apply(double[] v, double[] out, int gridTasks, int nodes) {
        double[] vol = sim.store.volume();
        int s3 = sim.kernel.support();
        nodeTasks(gridTasks, nodes, (a, b) -> Arrays.fill(out, a, b, 0.0));
        // Consistent part of the reaction, sum_p V a w_i (sum_j w_j v_j), plus diffusion
        // sum_p grad w_i . (V D grad v); the lumped part of the reaction is added node by node after.
        scatterPhases((w, blk) -> {
            if (range[6 * blk + 3] < 0) {
                return;
            }
            Simulation.Scratch sc = sim.scratch[w];
            double[] loc = local[w];
            int[] li = localIndex[w], gn = gridNode[w];
            int count = nodesOf(blk, li, gn);
            // The listed nodes are exactly the block's range, so this also clears the scattered slots.
            for (int k = 0; k < count; k++) {
                loc[2 * li[k]] = v[gn[k]];
                loc[2 * li[k] + 1] = 0;
            }
            forRuns(blk, (from, to, model) -> applyParticles(sc, loc, blk, from, to, vol, s3));
            for (int k = 0; k < count; k++) {
                out[gn[k]] += loc[2 * li[k] + 1];
            }
        });
        nodeTasks(gridTasks, nodes, (a, b) -> {
            for (int i = a; i < b; i++) {
                out[i] = weight[i] > 0 ? out[i] + (1 - CONSISTENT) * reaction[i] * v[i] : 0;
            }
        });
    }

    /**
     * The particle part of the operator for particles [from, to) of block blk: gathers the value and gradient of
     * the vector in the local buffer's even slots, scatters the particle's reaction and flux to the odd slots.
     */
    private void applyParticles(Simulation.Scratch sc, double[] loc, int blk, int from, int to, double[] vol,
                                int s3) {
        double[] wx = sc.wx, wy = sc.wy, wz = sc.wz, dwx = sc.dwx, dwy = sc.dwy, dwz = sc.dwz;
        double[] cf = coef;
        // Constant trip counts for the quadratic stencil, so the compiler unrolls all 27 nodes; the branch is the
        // same for every particle.
        boolean quadratic = s3 == 3;
        for (int p = from; p < to; p++) {
            int base = axisWeights(sc, blk, p);
            double gx = 0, gy = 0, gz = 0, val = 0;
            for (int i = 0; quadratic ? i < 3 : i < s3; i++) {
                for (int j = 0; quadratic ? j < 3 : j < s3; j++) {
                    double wij = wx[i] * wy[j];
                    double gij = dwx[i] * wy[j], hij = wx[i] * dwy[j];
                    int o = 2 * (base + (i * L + j) * L);
                    double t0 = 0, t1 = 0;
                    for (int l = 0; quadratic ? l < 3 : l < s3; l++) {
                        double vi = loc[o + 2 * l];
                        t0 += wz[l] * vi;
                        t1 += dwz[l] * vi;
                    }
                    val += wij * t0;
                    gx += gij * t0;
                    gy += hij * t0;
                    gz += wij * t1;
                }
            }
            int c = C * p;
            double vp = vol[p];
            double rp = CONSISTENT * vp * cf[c] * val;
            double fx = vp * (cf[c + 2] * gx + cf[c + 5] * gy + cf[c + 6] * gz);
            double fy = vp * (cf[c + 5] * gx + cf[c + 3] * gy + cf[c + 7] * gz);
            double fz = vp * (cf[c + 6] * gx + cf[c + 7] * gy + cf[c + 4] * gz);
            for (int i = 0; quadratic ? i < 3 : i < s3; i++) {
                for (int j = 0; quadratic ? j < 3 : j < s3; j++) {
                    double wij = wx[i] * wy[j];
                    // Per node: w rp + (dw_x w_y w_z) fx + (w_x dw_y w_z) fy + (w_x w_y dw_z) fz.
                    double k0 = wij * rp + dwx[i] * wy[j] * fx + wx[i] * dwy[j] * fy;
                    double k1 = wij * fz;
                    int o = 2 * (base + (i * L + j) * L);
                    for (int l = 0; quadratic ? l < 3 : l < s3; l++) {
                        loc[o + 2 * l + 1] += wz[l] * k0 + dwz[l] * k1;
                    }
                }
            }
        }
    }

    // ------------------------------------------------------------------ block-local helpers

    /**
     * Lists the nodes that block blk's phase-field particles reach: local buffer index and grid node, in a fixed
     * order.
     *
     * @return number of nodes listed
     */
    private int nodesOf(int blk, int[] localOut, int[] nodeOut) {
        int s = sim.kernel.support();
        int[] rg = range;
        int k = 0;
        for (int i = rg[6 * blk], ie = rg[6 * blk + 3] + s; i < ie; i++) {
            for (int j = rg[6 * blk + 1], je = rg[6 * blk + 4] + s; j < je; j++) {
                for (int l = rg[6 * blk + 2], le = rg[6 * blk + 5] + s; l < le; l++) {
                    localOut[k] = (i * L + j) * L + l;
                    nodeOut[k++] = sim.node(blk, i, j, l);
                }
            }
        }
        return k;
    }

    /** Zeroes the first {@code fields} values of every node of block blk's range in the local buffer. */
    private void clear(double[] loc, int blk, int fields) {
        int s = sim.kernel.support();
        int[] rg = range;
        for (int i = rg[6 * blk], ie = rg[6 * blk + 3] + s; i < ie; i++) {
            for (int j = rg[6 * blk + 1], je = rg[6 * blk + 4] + s; j < je; j++) {
                int o = (i * L + j) * L;
                Arrays.fill(loc, fields * (o + rg[6 * blk + 2]), fields * (o + rg[6 * blk + 5] + s), 0.0);
            }
        }
    }

    /** Local stencil base of particle p in block blk, per axis, into out[0..2]. */
    private void localBase(int blk, int p, int[] out) {
        double[] pos = sim.store.position();
        long key = sim.blockKeys[blk];
        out[0] = sim.kernel.base((pos[3 * p] - sim.ox) * sim.invDx) - Simulation.localOrigin(SparseGrid.keyX(key));
        out[1] = sim.kernel.base((pos[3 * p + 1] - sim.oy) * sim.invDx) - Simulation.localOrigin(SparseGrid.keyY(key));
        out[2] = sim.kernel.base((pos[3 * p + 2] - sim.oz) * sim.invDx) - Simulation.localOrigin(SparseGrid.keyZ(key));
    }

    /**
     * Fills the scratch with particle p's weights and weight derivatives per axis (derivatives in 1/m).
     *
     * @return local index (i L + j) L + l of the particle's first stencil node in block blk's buffer
     */
    private int axisWeights(Simulation.Scratch sc, int blk, int p) {
        double[] pos = sim.store.position();
        long key = sim.blockKeys[blk];
        double xi = (pos[3 * p] - sim.ox) * sim.invDx, yi = (pos[3 * p + 1] - sim.oy) * sim.invDx;
        double zi = (pos[3 * p + 2] - sim.oz) * sim.invDx;
        int bx = sim.kernel.base(xi), by = sim.kernel.base(yi), bz = sim.kernel.base(zi);
        double fx = xi - bx, fy = yi - by, fz = zi - bz;
        sim.kernel.weights(fx, sc.wx, 0);
        sim.kernel.weights(fy, sc.wy, 0);
        sim.kernel.weights(fz, sc.wz, 0);
        sim.kernel.derivatives(fx, sc.dwx, 0);
        sim.kernel.derivatives(fy, sc.dwy, 0);
        sim.kernel.derivatives(fz, sc.dwz, 0);
        double inv = sim.invDx;
        for (int i = 0, s = sim.kernel.support(); i < s; i++) {
            sc.dwx[i] *= inv;
            sc.dwy[i] *= inv;
            sc.dwz[i] *= inv;
        }
        int lx = bx - Simulation.localOrigin(SparseGrid.keyX(key));
        int ly = by - Simulation.localOrigin(SparseGrid.keyY(key));
        int lz = bz - Simulation.localOrigin(SparseGrid.keyZ(key));
        return (lx * L + ly) * L + lz;
    }

    // ------------------------------------------------------------------ iteration helpers

    @FunctionalInterface
    private interface RunBody {
        void run(int from, int to, DamageModel model);
    }

    @FunctionalInterface
    private interface BlockBody {
        void run(int worker, int block);
    }

    @FunctionalInterface
    private interface RangeBody {
        void run(int from, int to);
    }

    @FunctionalInterface
    private interface DotBody {
        void run(int from, int to, double[] out);
    }

    /** Calls body for each run of consecutive particles of one phase-field body in particle block blk. */
    private void forRuns(int blk, RunBody body) {
        int start = sim.blockStart[blk];
        int end = sim.blockStart[blk + 1];
        int[] bodyOf = sim.store.body();
        for (int s = start; s < end; ) {
            int b = bodyOf[s];
            int e = s + 1;
            while (e < end && bodyOf[e] == b) {
                e++;
            }
            DamageModel m = sim.damage[b];
            if (m != null && m.usesPhaseField()) {
                body.run(s, e, m);
            }
            s = e;
        }
    }

    private void scatterPhases(BlockBody body) {
        for (int c = 0; c < 8; c++) {
            final int from = sim.colourStart[c];
            sim.workers.forEach(sim.colourStart[c + 1] - from,
                    (w, t) -> body.run(w, sim.colourBlocks[from + t]));
        }
    }

    private int gridTasks() {
        return (sim.grid.blockCount() + Simulation.GRID_TASK_BLOCKS - 1) / Simulation.GRID_TASK_BLOCKS;
    }

    private void nodeTasks(int tasks, int nodes, RangeBody body) {
        int per = Simulation.GRID_TASK_BLOCKS * SparseGrid.NODES_PER_BLOCK;
        sim.workers.forEach(tasks, (w, t) -> body.run(t * per, Math.min(nodes, (t + 1) * per)));
    }

    private double lastFirst;
    private double lastSecond;
    private double lastMax;

    /**
     * Two sums and a maximum over nodes, each formed per fixed task and combined in task order; returns the first
     * sum.
     */
    private double nodeDots(int tasks, int nodes, DotBody body) {
        int per = Simulation.GRID_TASK_BLOCKS * SparseGrid.NODES_PER_BLOCK;
        sim.workers.forEach(tasks, (w, t) -> {
            double[] out = sums[w];
            body.run(t * per, Math.min(nodes, (t + 1) * per), out);
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

package dev.fray.core.step;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.grid.Stencil;
import dev.fray.core.parallel.BlockSchedule;
import dev.fray.core.parallel.Reductions;
import dev.fray.core.parallel.Workers;
import dev.fray.core.parallel.Workspace;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.solve.LinearOperator;
import dev.fray.core.solve.PreconditionedCG;

import java.util.Arrays;

/**
 * The grid solve of phase-field damage: a d - div(D grad d) = b, with per-particle coefficients from the damage
 * models, discretised with the transfer's B-spline shape functions and particle quadrature (a blend of the
 * consistent and lumped reaction term, consistent diffusion term), solved matrix-free by
 * {@link PreconditionedCG} (Jacobi) warm-started from the particles' current damage, and interpolated back to the
 * particles. Scatters use the colour phases of the transfer and every dot product sums fixed grid-block tasks in
 * order, so the result does not depend on the thread count. One field is shared by all phase-field bodies.
 */
final class PhaseFieldSolve implements LinearOperator {
    private static final int C = DamageModel.COEFFICIENTS;
    /**
     * Weight of the consistent reaction term against the lumped one. Fully consistent is the most accurate (crack
     * band length within 0.3% at l = 2 dx, lumped: 3%) but nodes at a body's edge, reached by few particles, make
     * it nearly singular and conjugate gradients stall; the half-and-half blend keeps the matrix diagonally
     * dominant in the reaction part.
     */
    static final double CONSISTENT = 0.5;
    /** Values per node in the local buffer: the six assembled fields, or a gathered and a scattered vector. */
    private static final int FIELDS = 6;
    private static final int L = BlockLayout.LOCAL;
    /**
     * The solve is skipped while the field it would produce is below this fraction of the tolerance everywhere:
     * with no damage yet, the solution is bounded by the largest b / a (maximum principle of the reaction-diffusion
     * equation), so an intact body costs no grid solve.
     */
    private static final double SKIP_FRACTION = 1e-3;

    private final ParticleStore store;
    private final BlockLayout layout;
    private final SparseGrid grid;
    private final Workers workers;
    private final Stencil[] stencils;
    private final Workspace[] workspaces;
    private final DamageModel[] damage;
    private final double tolerance;
    private final int maxIterations;
    private final PreconditionedCG cg;
    private double[] coef = new double[0];
    private double[] reaction = new double[0];
    private double[] reactionDiag = new double[0];
    private double[] source = new double[0];
    private double[] diag = new double[0];
    private double[] x = new double[0];
    private double[] weight = new double[0];
    /** Per worker: block-local node buffer, {@link #FIELDS} values per node of the LOCAL^3 block neighbourhood. */
    private final double[][] local;
    /** Per worker: the nodes a block reaches, as local buffer indices and grid nodes (see nodesOf). */
    private final int[][] localIndex;
    private final int[][] gridNode;
    /** Per particle block: smallest and largest local stencil base of its phase-field particles (x, y, z). */
    private int[] range = new int[0];
    /** Per particle block: largest b / a of its phase-field particles, or +infinity if one is already damaged. */
    private double[] blockBound = new double[0];
    private int lastIterations;
    private double lastResidual;

    PhaseFieldSolve(StepContext ctx) {
        this.store = ctx.store();
        this.layout = ctx.layout();
        this.grid = ctx.grid();
        this.workers = ctx.workers();
        this.stencils = ctx.stencils();
        this.workspaces = ctx.workspaces();
        this.damage = ctx.damage();
        this.tolerance = ctx.scene().phaseFieldTolerance();
        this.maxIterations = ctx.scene().phaseFieldMaxIterations();
        this.cg = new PreconditionedCG(workers);
        int threads = workers.threads();
        this.local = new double[threads][FIELDS * L * L * L];
        this.localIndex = new int[threads][L * L * L];
        this.gridNode = new int[threads][L * L * L];
    }

    int lastIterations() {
        return lastIterations;
    }

    double lastResidual() {
        return lastResidual;
    }

    void solve(double h) {
        int n = store.size();
        if (coef.length < C * n) {
            coef = new double[C * n];
        }
        int gridBlocks = grid.blockCount();
        int nodes = grid.nodeCount();
        if (reaction.length < nodes) {
            int cap = Math.max(nodes, reaction.length + reaction.length / 2);
            reaction = new double[cap];
            reactionDiag = new double[cap];
            source = new double[cap];
            diag = new double[cap];
            x = new double[cap];
            weight = new double[cap];
        }
        Reductions.overNodes(workers, gridBlocks, (w, t, a, b) -> {
            for (double[] v : new double[][] {reaction, reactionDiag, source, diag, x, weight}) {
                Arrays.fill(v, a, b, 0.0);
            }
        });
        if (range.length < 6 * layout.blockCount()) {
            range = new int[6 * Math.max(layout.blockCount(), range.length / 3)];
            blockBound = new double[range.length / 6];
        }
        double[] dmg = store.channel(DamageModel.DAMAGE);
        double[] pos = store.position();
        // Coefficients per particle of phase-field bodies, and the node range each block's particles reach.
        workers.forEach(layout.blockCount(), (w, blk) -> {
            int[] rg = range;
            rg[6 * blk] = rg[6 * blk + 1] = rg[6 * blk + 2] = L;
            rg[6 * blk + 3] = rg[6 * blk + 4] = rg[6 * blk + 5] = -1;
            blockBound[blk] = 0;
            long key = layout.key(blk);
            forRuns(blk, (from, to, model) -> {
                double[] out = workspaces[w].get(Workspace.WORK, C * (to - from));
                model.phaseFieldCoefficients(store, from, to, h, out);
                System.arraycopy(out, 0, coef, C * from, C * (to - from));
                double bound = blockBound[blk];
                for (int p = from; p < to; p++) {
                    double a = coef[C * p], b = coef[C * p + 1];
                    // Written so that NaN, a damaged particle or a non-positive reaction force the solve.
                    double q = dmg[p] == 0 && a > 0 ? Math.abs(b) / a : Double.POSITIVE_INFINITY;
                    if (!(q <= bound)) {
                        bound = Double.isNaN(q) ? Double.POSITIVE_INFINITY : q;
                    }
                }
                blockBound[blk] = bound;
                Stencil st = stencils[w];
                for (int p = from; p < to; p++) {
                    int lb = st.localBase(pos, p, key);
                    int lx = lb / (L * L), ly = (lb / L) % L, lz = lb % L;
                    rg[6 * blk] = Math.min(rg[6 * blk], lx);
                    rg[6 * blk + 1] = Math.min(rg[6 * blk + 1], ly);
                    rg[6 * blk + 2] = Math.min(rg[6 * blk + 2], lz);
                    rg[6 * blk + 3] = Math.max(rg[6 * blk + 3], lx);
                    rg[6 * blk + 4] = Math.max(rg[6 * blk + 4], ly);
                    rg[6 * blk + 5] = Math.max(rg[6 * blk + 5], lz);
                }
            });
        });
        double bound = 0;
        for (int blk = 0; blk < layout.blockCount(); blk++) {
            bound = Math.max(bound, blockBound[blk]);
        }
        if (bound <= SKIP_FRACTION * tolerance) {
            lastIterations = 0;
            lastResidual = 0;
            return;
        }
        assemble(dmg);
        Reductions.overNodes(workers, gridBlocks, (w, t, a, b) -> {
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
        // The field is damage, between 0 and 1: the absolute stop is the tolerance in damage units.
        lastIterations = cg.solve(this, source, x, diag, weight, gridBlocks, tolerance, tolerance, maxIterations);
        lastResidual = cg.residual();
        interpolateBack();
    }

    /**
     * Assembly: source, the diagonals of the reaction and diffusion operators, and the warm start, summed per
     * block in its local buffer and then added to the grid.
     */
    private void assemble(double[] dmg) {
        double[] vol = store.volume();
        double[] pos = store.position();
        int s3 = stencils[0].support();
        BlockSchedule.byColour(workers, layout, (w, blk) -> {
            if (range[6 * blk + 3] < 0) {
                return;
            }
            Stencil sc = stencils[w];
            long key = layout.key(blk);
            double[] loc = local[w];
            clear(loc, blk, FIELDS, s3);
            forRuns(blk, (from, to, model) -> {
                for (int p = from; p < to; p++) {
                    int base = sc.locate(pos, p, key, Stencil.SPATIAL_DERIVATIVES);
                    double v = vol[p];
                    int c = C * p;
                    double aa = coef[c], bb = coef[c + 1];
                    double dxx = coef[c + 2], dyy = coef[c + 3], dzz = coef[c + 4];
                    double dxy = coef[c + 5], dxz = coef[c + 6], dyz = coef[c + 7];
                    double dp = dmg[p];
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
                                // applied after.
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
            for (int k = 0, count = nodesOf(blk, li, gn, s3); k < count; k++) {
                int f = FIELDS * li[k], node = gn[k];
                reaction[node] += loc[f];
                reactionDiag[node] += loc[f + 1];
                source[node] += loc[f + 2];
                weight[node] += loc[f + 3];
                x[node] += loc[f + 4];
                diag[node] += loc[f + 5];
            }
        });
    }

    /** Interpolates the solved field back to the particles and hands it to their damage models. */
    private void interpolateBack() {
        double[] pos = store.position();
        int s3 = stencils[0].support();
        workers.forEach(layout.blockCount(), (w, blk) -> {
            if (range[6 * blk + 3] < 0) {
                return;
            }
            Stencil sc = stencils[w];
            long key = layout.key(blk);
            double[] loc = local[w];
            double[] xs = x;
            int[] li = localIndex[w], gn = gridNode[w];
            for (int k = 0, count = nodesOf(blk, li, gn, s3); k < count; k++) {
                loc[li[k]] = xs[gn[k]];
            }
            forRuns(blk, (from, to, model) -> {
                double[] out = workspaces[w].get(Workspace.WORK, to - from);
                for (int p = from; p < to; p++) {
                    int base = sc.locate(pos, p, key, Stencil.SPATIAL_DERIVATIVES);
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

    /**
     * out = A v: reaction plus diffusion operator, matrix-free through the particles. Each particle block loads v
     * over its nodes into its local buffer; each particle gathers v and its gradient there and scatters its
     * reaction and flux back into the buffer at once, which is then added to out. Blocks run in the colour phases
     * of the transfer, so blocks running together touch disjoint nodes.
     */
    @Override
    public void apply(double[] v, double[] out) {
        double[] vol = store.volume();
        int s3 = stencils[0].support();
        int gridBlocks = grid.blockCount();
        Reductions.overNodes(workers, gridBlocks, (w, t, a, b) -> Arrays.fill(out, a, b, 0.0));
        // Consistent part of the reaction, sum_p V a w_i (sum_j w_j v_j), plus diffusion
        // sum_p grad w_i . (V D grad v); the lumped part of the reaction is added node by node after.
        BlockSchedule.byColour(workers, layout, (w, blk) -> {
            if (range[6 * blk + 3] < 0) {
                return;
            }
            double[] loc = local[w];
            int[] li = localIndex[w], gn = gridNode[w];
            int count = nodesOf(blk, li, gn, s3);
            // The listed nodes are exactly the block's range, so this also clears the scattered slots.
            for (int k = 0; k < count; k++) {
                loc[2 * li[k]] = v[gn[k]];
                loc[2 * li[k] + 1] = 0;
            }
            Stencil sc = stencils[w];
            forRuns(blk, (from, to, model) -> applyParticles(sc, loc, blk, from, to, vol, s3));
            for (int k = 0; k < count; k++) {
                out[gn[k]] += loc[2 * li[k] + 1];
            }
        });
        Reductions.overNodes(workers, gridBlocks, (w, t, a, b) -> {
            for (int i = a; i < b; i++) {
                out[i] = weight[i] > 0 ? out[i] + (1 - CONSISTENT) * reaction[i] * v[i] : 0;
            }
        });
    }

    /**
     * The particle part of the operator for particles [from, to) of block blk: gathers the value and gradient of
     * the vector in the local buffer's even slots, scatters the particle's reaction and flux to the odd slots.
     */
    private void applyParticles(Stencil sc, double[] loc, int blk, int from, int to, double[] vol, int s3) {
        double[] wx = sc.wx, wy = sc.wy, wz = sc.wz, dwx = sc.dwx, dwy = sc.dwy, dwz = sc.dwz;
        double[] cf = coef;
        double[] pos = store.position();
        long key = layout.key(blk);
        // Constant trip counts for the quadratic stencil, so the compiler unrolls all 27 nodes; the branch is the
        // same for every particle.
        boolean quadratic = s3 == 3;
        for (int p = from; p < to; p++) {
            int base = sc.locate(pos, p, key, Stencil.SPATIAL_DERIVATIVES);
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

    /**
     * Lists the nodes that block blk's phase-field particles reach: local buffer index and grid node, in a fixed
     * order.
     *
     * @return number of nodes listed
     */
    private int nodesOf(int blk, int[] localOut, int[] nodeOut, int s) {
        int[] rg = range;
        int k = 0;
        for (int i = rg[6 * blk], ie = rg[6 * blk + 3] + s; i < ie; i++) {
            for (int j = rg[6 * blk + 1], je = rg[6 * blk + 4] + s; j < je; j++) {
                for (int l = rg[6 * blk + 2], le = rg[6 * blk + 5] + s; l < le; l++) {
                    localOut[k] = (i * L + j) * L + l;
                    nodeOut[k++] = layout.node(blk, i, j, l);
                }
            }
        }
        return k;
    }

    /** Zeroes the first {@code fields} values of every node of block blk's range in the local buffer. */
    private void clear(double[] loc, int blk, int fields, int s) {
        int[] rg = range;
        for (int i = rg[6 * blk], ie = rg[6 * blk + 3] + s; i < ie; i++) {
            for (int j = rg[6 * blk + 1], je = rg[6 * blk + 4] + s; j < je; j++) {
                int o = (i * L + j) * L;
                Arrays.fill(loc, fields * (o + rg[6 * blk + 2]), fields * (o + rg[6 * blk + 5] + s), 0.0);
            }
        }
    }

    @FunctionalInterface
    private interface RunBody {
        void run(int from, int to, DamageModel model);
    }

    /** Calls body for each run of consecutive particles of one phase-field body in particle block blk. */
    private void forRuns(int blk, RunBody body) {
        int start = layout.start(blk);
        int end = layout.end(blk);
        int[] bodyOf = store.body();
        for (int s = start; s < end; ) {
            int b = bodyOf[s];
            int e = s + 1;
            while (e < end && bodyOf[e] == b) {
                e++;
            }
            DamageModel m = damage[b];
            if (m != null && m.usesPhaseField()) {
                body.run(s, e, m);
            }
            s = e;
        }
    }
}

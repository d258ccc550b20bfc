package dev.fray.core.transfer;

import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.FieldSet;
import dev.fray.core.grid.Stencil;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.parallel.BlockSchedule;
import dev.fray.core.parallel.Workers;
import dev.fray.core.parallel.Workspace;
import dev.fray.core.particles.ParticleStore;

import java.util.Arrays;

/**
 * Particle-to-grid transfer (MLS-MPM with APIC, Hu et al. 2018; Jiang et al. 2015): scatters each particle's mass,
 * APIC momentum m (v + C (x_i - x_p)) and, when a stress source is given, the MLS force term
 * -dt V D^-1 tau (x_i - x_p) to the nodes of its stencil. Without a stress source (an implicit step) only mass and
 * momentum are scattered.
 *
 * <p>Blocks run in the 8 colour phases ({@link BlockSchedule}); each block scatters into a dense block-local buffer
 * and adds it to the grid once, so the inner loop needs no neighbour lookup and every node sum is formed in the
 * same order for any thread count. With several fields per node each particle is scattered alone and its values
 * moved to the field the {@link FieldRouting} names at each node.
 */
public final class ParticleToGrid {
    /** Kirchhoff stress of a run of particles of one body. */
    @FunctionalInterface
    public interface StressSource {
        /**
         * @param worker the worker (for its workspace)
         * @param body   body index of particles [from, to)
         * @param from   first particle
         * @param to     end particle, exclusive
         * @param h      time step, s
         * @param tau    (output) Kirchhoff stress, 9 per particle from index 0, Pa
         */
        void stress(int worker, int body, int from, int to, double h, double[] tau);
    }

    private static final int L = BlockLayout.LOCAL;
    private final ParticleStore store;
    private final BlockLayout layout;
    private final FieldSet fields;
    private final Stencil[] stencils;
    private final Workspace[] workspaces;
    private final Workers workers;
    private final Kernel kernel;
    private final double dx;
    private final double[][] local;
    private final long[] stressNanos;
    private final long[] scatterNanos;

    /**
     * @param store      the particles
     * @param layout     the particle blocks
     * @param fields     the velocity fields per node
     * @param stencils   one stencil per worker
     * @param workspaces one workspace per worker
     * @param workers    the workers
     * @param kernel     the interpolation kernel
     * @param dx         cell size, m
     */
    public ParticleToGrid(ParticleStore store, BlockLayout layout, FieldSet fields, Stencil[] stencils,
                          Workspace[] workspaces, Workers workers, Kernel kernel, double dx) {
        this.store = store;
        this.layout = layout;
        this.fields = fields;
        this.stencils = stencils;
        this.workspaces = workspaces;
        this.workers = workers;
        this.kernel = kernel;
        this.dx = dx;
        this.local = new double[workers.threads()][4 * L * L * L];
        this.stressNanos = new long[workers.threads()];
        this.scatterNanos = new long[workers.threads()];
    }

    /**
     * Scatters every particle to the grid fields (which must be zeroed).
     *
     * @param h        time step, s
     * @param stress   stress source, or null for mass and momentum only
     * @param routing  which field each particle feeds
     * @param gripTags grip tag per node, lowered to the smallest grip index of a gripped particle reaching it
     * @param gripOf   grip index per particle (-1 none), or null if the scene has no grip
     */
    public void scatter(double h, StressSource stress, FieldRouting routing, int[] gripTags, double[] gripOf) {
        BlockSchedule.byColour(workers, layout, (w, r) -> {
            long t0 = System.nanoTime();
            scatterBlock(w, r, h, stress, routing, gripTags, gripOf);
            scatterNanos[w] += System.nanoTime() - t0;
        });
    }

    private void scatterBlock(int w, int r, double h, StressSource stress, FieldRouting routing, int[] gripTags,
                              double[] gripOf) {
        int start = layout.start(r);
        int end = layout.end(r);
        int s = kernel.support();
        int[] body = store.body();
        double[] loc = local[w];
        clearLocal(loc, r, s);
        boolean single = routing.fieldCount() == 1;
        for (int runStart = start; runStart < end; ) {
            int b = body[runStart];
            int runEnd = runStart + 1;
            while (runEnd < end && body[runEnd] == b) {
                runEnd++;
            }
            double[] tau = workspaces[w].get(Workspace.TAU, 9 * (runEnd - runStart));
            if (stress != null) {
                long s0 = System.nanoTime();
                stress.stress(w, b, runStart, runEnd, h, tau);
                stressNanos[w] += System.nanoTime() - s0;
            } else {
                Arrays.fill(tau, 0, 9 * (runEnd - runStart), 0.0);
            }
            if (single) {
                scatterRange(w, r, h, tau, runStart, runStart, runEnd, gripTags, gripOf);
            } else {
                scatterRouted(w, r, h, tau, runStart, runEnd, routing, gripTags, gripOf);
            }
            runStart = runEnd;
        }
        if (single) {
            flushLocal(loc, r, s);
        }
    }

    /**
     * Scatters particles [from, to) of block r one at a time into the (zeroed) block-local buffer, then moves each
     * particle's node values to its field at each node and clears them again.
     */
    private void scatterRouted(int w, int r, double h, double[] tau, int from, int to, FieldRouting routing,
                               int[] gripTags, double[] gripOf) {
        double[] loc = local[w];
        Stencil st = stencils[w];
        long key = layout.key(r);
        double[] x = store.position();
        int n = st.support() * st.support() * st.support();
        for (int p = from; p < to; p++) {
            scatterRange(w, r, h, tau, from, p, p + 1, gripTags, gripOf);
            int lb = st.localBase(x, p, key);
            for (int k = 0; k < n; k++) {
                int node = st.node(layout, r, lb, k);
                int q = 4 * st.localIndex(lb, k);
                int f = routing.field(p, node);
                double[] m = fields.mass(f);
                double[] mv = fields.momentum(f);
                m[node] += loc[q];
                mv[3 * node] += loc[q + 1];
                mv[3 * node + 1] += loc[q + 2];
                mv[3 * node + 2] += loc[q + 3];
                loc[q] = 0;
                loc[q + 1] = 0;
                loc[q + 2] = 0;
                loc[q + 3] = 0;
            }
        }
    }

    /**
     * Adds the mass, APIC momentum and MLS force of particles [from, to) of block r to the block-local buffer.
     *
     * @param tau     Kirchhoff stress of particles from tauFrom on, 9 per particle
     * @param tauFrom particle whose stress sits at the start of tau
     */
    private void scatterRange(int w, int r, double h, double[] tau, int tauFrom, int from, int to, int[] gripTags,
                              double[] gripOf) {
        Stencil st = stencils[w];
        long key = layout.key(r);
        int s = kernel.support();
        double dinv = kernel.inverseInertia(dx);
        double[] x = store.position();
        double[] v = store.velocity();
        double[] cm = store.affine();
        double[] mass = store.mass();
        double[] vol = store.volume();
        double[] loc = local[w];
        double[] wx = st.wx, wy = st.wy, wz = st.wz;
        for (int p = from; p < to; p++) {
            int base = 4 * st.locate(x, p, key, Stencil.NO_DERIVATIVES);
            double fx = st.fx, fy = st.fy, fz = st.fz;
            double m = mass[p];
            int o = 9 * (p - tauFrom);
            double k = -h * vol[p] * dinv;
            int c9 = 9 * p;
            double a00 = m * cm[c9] + k * tau[o], a01 = m * cm[c9 + 1] + k * tau[o + 1];
            double a02 = m * cm[c9 + 2] + k * tau[o + 2];
            double a10 = m * cm[c9 + 3] + k * tau[o + 3], a11 = m * cm[c9 + 4] + k * tau[o + 4];
            double a12 = m * cm[c9 + 5] + k * tau[o + 5];
            double a20 = m * cm[c9 + 6] + k * tau[o + 6], a21 = m * cm[c9 + 7] + k * tau[o + 7];
            double a22 = m * cm[c9 + 8] + k * tau[o + 8];
            // Momentum at offset d from the particle is m v + A d; write d = (node - f) dx and expand.
            double ex = -fx * dx, ey = -fy * dx, ez = -fz * dx;
            double q0x = m * v[3 * p] + a00 * ex + a01 * ey + a02 * ez;
            double q0y = m * v[3 * p + 1] + a10 * ex + a11 * ey + a12 * ez;
            double q0z = m * v[3 * p + 2] + a20 * ex + a21 * ey + a22 * ez;
            double sx0 = a00 * dx, sx1 = a10 * dx, sx2 = a20 * dx;
            double sy0 = a01 * dx, sy1 = a11 * dx, sy2 = a21 * dx;
            double sz0 = a02 * dx, sz1 = a12 * dx, sz2 = a22 * dx;
            if (s == 3) {
                // Quadratic stencil with constant trip counts, so the compiler unrolls all 27 nodes.
                for (int i = 0; i < 3; i++) {
                    double wi = wx[i];
                    double qix = q0x + i * sx0, qiy = q0y + i * sx1, qiz = q0z + i * sx2;
                    int oi = base + i * (4 * L * L);
                    for (int j = 0; j < 3; j++) {
                        double wij = wi * wy[j];
                        double qjx = qix + j * sy0, qjy = qiy + j * sy1, qjz = qiz + j * sy2;
                        int oj = oi + j * (4 * L);
                        double w0 = wij * wz[0], w1 = wij * wz[1], w2 = wij * wz[2];
                        loc[oj] += w0 * m;
                        loc[oj + 1] += w0 * qjx;
                        loc[oj + 2] += w0 * qjy;
                        loc[oj + 3] += w0 * qjz;
                        loc[oj + 4] += w1 * m;
                        loc[oj + 5] += w1 * (qjx + sz0);
                        loc[oj + 6] += w1 * (qjy + sz1);
                        loc[oj + 7] += w1 * (qjz + sz2);
                        loc[oj + 8] += w2 * m;
                        loc[oj + 9] += w2 * (qjx + 2 * sz0);
                        loc[oj + 10] += w2 * (qjy + 2 * sz1);
                        loc[oj + 11] += w2 * (qjz + 2 * sz2);
                    }
                }
            } else {
                for (int i = 0; i < s; i++) {
                    for (int j = 0; j < s; j++) {
                        double wij = wx[i] * wy[j];
                        int oj = base + 4 * ((i * L + j) * L);
                        for (int l = 0; l < s; l++) {
                            double wt = wij * wz[l];
                            int q = oj + 4 * l;
                            loc[q] += wt * m;
                            loc[q + 1] += wt * (q0x + i * sx0 + j * sy0 + l * sz0);
                            loc[q + 2] += wt * (q0y + i * sx1 + j * sy1 + l * sz1);
                            loc[q + 3] += wt * (q0z + i * sx2 + j * sy2 + l * sz2);
                        }
                    }
                }
            }
            if (gripOf != null && gripOf[p] >= 0) {
                markGrip(r, (int) gripOf[p], base / 4, s, gripTags);
            }
        }
    }

    /** Tags the stencil nodes of a gripped particle with the smallest grip index touching them. */
    private void markGrip(int r, int g, int lb, int s, int[] gripTags) {
        int lx = lb / (L * L), ly = (lb / L) % L, lz = lb % L;
        for (int i = lx; i < lx + s; i++) {
            for (int j = ly; j < ly + s; j++) {
                for (int l = lz; l < lz + s; l++) {
                    int node = layout.node(r, i, j, l);
                    if (g < gripTags[node]) {
                        gripTags[node] = g;
                    }
                }
            }
        }
    }

    /** Zeroes the part of the block-local buffer that block r's stencils reach. */
    private void clearLocal(double[] loc, int r, int s) {
        int[] br = layout.ranges();
        int zFrom = br[6 * r + 2], zTo = br[6 * r + 5] + s;
        for (int i = br[6 * r], iEnd = br[6 * r + 3] + s; i < iEnd; i++) {
            for (int j = br[6 * r + 1], jEnd = br[6 * r + 4] + s; j < jEnd; j++) {
                int o = 4 * ((i * L + j) * L);
                Arrays.fill(loc, o + 4 * zFrom, o + 4 * zTo, 0.0);
            }
        }
    }

    /** Adds the block-local buffer to the grid nodes it covers (field 0). */
    private void flushLocal(double[] loc, int r, int s) {
        double[] gm = fields.mass(0);
        double[] gp = fields.momentum(0);
        int[] br = layout.ranges();
        for (int i = br[6 * r], iEnd = br[6 * r + 3] + s; i < iEnd; i++) {
            for (int j = br[6 * r + 1], jEnd = br[6 * r + 4] + s; j < jEnd; j++) {
                for (int l = br[6 * r + 2], lEnd = br[6 * r + 5] + s; l < lEnd; l++) {
                    int q = 4 * ((i * L + j) * L + l);
                    double m = loc[q];
                    if (m == 0) {
                        continue;
                    }
                    int node = layout.node(r, i, j, l);
                    gm[node] += m;
                    gp[3 * node] += loc[q + 1];
                    gp[3 * node + 1] += loc[q + 2];
                    gp[3 * node + 2] += loc[q + 3];
                }
            }
        }
    }

    /**
     * @return nanoseconds spent in the stress source and in the whole scatter, summed over workers: index 0 is
     *         the stress, 1 the scatter including it
     */
    public long[] cpuNanos() {
        long a = 0, b = 0;
        for (int w = 0; w < stressNanos.length; w++) {
            a += stressNanos[w];
            b += scatterNanos[w];
        }
        return new long[] {a, b};
    }
}

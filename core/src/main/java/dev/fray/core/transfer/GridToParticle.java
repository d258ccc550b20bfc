package dev.fray.core.transfer;

import dev.fray.core.boundary.ParticleObstacleContact;
import dev.fray.core.boundary.WallHold;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.FieldSet;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.grid.Stencil;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.particles.ParticleStore;

import java.util.Arrays;

/**
 * Grid-to-particle transfer (MLS-MPM with APIC, Hu et al. 2018; Jiang et al. 2015): gathers each particle's
 * velocity v = sum w_i v_i and affine matrix C = D^-1 sum w_i v_i (x_i - x_p)^T, moves it by dt v, updates
 * F &lt;- (I + dt C) F, and applies particle-level obstacle contact where a block reaches an obstacle.
 *
 * <p>Per particle block it also records, for the next step and for the divergence guard: the range of stencil
 * bases its particles will have (a particle outside its block's reach asks for a sort), the fastest particle and
 * the first particle with a non-finite velocity or deformation. Blocks are independent, so they may run on any
 * worker in any order.
 */
public final class GridToParticle {
    private static final int L = BlockLayout.LOCAL;
    private final ParticleStore store;
    private final BlockLayout layout;
    private final FieldSet fields;
    private final Stencil[] stencils;
    private final Kernel kernel;
    private final double dx, invDx, ox, oy, oz;
    private final ParticleObstacleContact contact;
    private final WallHold hold;
    private final double[][] local;
    private final double[][] normal;
    /** Per worker: lowest and highest stencil base (x, y, z) of the block so far, fastest particle, first bad. */
    private final int[][] running;
    private final double[] runningFastest;
    private final double[] runningWork;
    private final double[][] runningImpulse;
    private double[] blockMaxSpeed = new double[64];
    private int[] blockFastest = new int[64];
    private int[] blockBad = new int[64];
    private double[] blockContactWork = new double[64];
    private double[] blockImpulse = new double[0];

    /**
     * @param store    the particles
     * @param layout   the particle blocks
     * @param fields   the velocity fields per node (velocities, after the grid update)
     * @param stencils one stencil per worker
     * @param threads  number of workers
     * @param kernel   the interpolation kernel
     * @param origin   grid origin (x, y, z), m
     * @param dx       cell size, m
     * @param contact  particle-level obstacle contact
     * @param hold     walls that hold material once it has reached them
     */
    public GridToParticle(ParticleStore store, BlockLayout layout, FieldSet fields, Stencil[] stencils, int threads,
                          Kernel kernel, double[] origin, double dx, ParticleObstacleContact contact,
                          WallHold hold) {
        this.store = store;
        this.layout = layout;
        this.fields = fields;
        this.stencils = stencils;
        this.kernel = kernel;
        this.dx = dx;
        this.invDx = 1.0 / dx;
        this.ox = origin[0];
        this.oy = origin[1];
        this.oz = origin[2];
        this.contact = contact;
        this.hold = hold;
        this.local = new double[threads][4 * L * L * L];
        this.normal = new double[threads][9];
        this.running = new int[threads][8];
        this.runningFastest = new double[threads];
        this.runningWork = new double[threads];
        this.runningImpulse = new double[threads][4 * contact.obstacleCount()];
    }

    /** Sizes the per-block results to the layout (call once per step before the blocks run). */
    public void prepare() {
        int cap = layout.capacity();
        if (blockMaxSpeed.length < cap) {
            blockMaxSpeed = new double[cap];
            blockFastest = new int[cap];
            blockBad = new int[cap];
            blockContactWork = new double[cap];
        }
        int per = 4 * contact.obstacleCount();
        if (blockImpulse.length < per * cap) {
            blockImpulse = new double[per * cap];
        }
    }

    /**
     * Gathers, moves and updates the particles of block r.
     *
     * @param w       the worker
     * @param r       the particle block
     * @param h       time step, s
     * @param routing which field each particle reads
     */
    public void gatherBlock(int w, int r, double h, FieldRouting routing) {
        int start = layout.start(r);
        int end = layout.end(r);
        int[] acc = running[w];
        acc[0] = L;
        acc[1] = L;
        acc[2] = L;
        acc[3] = -1;
        acc[4] = -1;
        acc[5] = -1;
        acc[6] = start;
        acc[7] = -1;
        runningFastest[w] = 0;
        runningWork[w] = 0;
        double[] imp = runningImpulse[w];
        Arrays.fill(imp, 0.0);
        if (routing.fieldCount() == 1) {
            loadLocal(local[w], r, kernel.support());
            gatherRange(w, r, h, start, end);
        } else {
            gatherRouted(w, r, h, routing);
        }
        blockContactWork[r] = runningWork[w];
        System.arraycopy(imp, 0, blockImpulse, imp.length * r, imp.length);
        blockMaxSpeed[r] = Math.sqrt(runningFastest[w]);
        blockFastest[r] = acc[6];
        blockBad[r] = acc[7];
        layout.markLeft(r, !layout.setRange(r, acc[0], acc[1], acc[2], acc[3], acc[4], acc[5]));
    }

    /**
     * Gathers block r one particle at a time: writes the velocities of the particle's own fields into the
     * block-local buffer at its stencil nodes, then gathers it.
     */
    private void gatherRouted(int w, int r, double h, FieldRouting routing) {
        double[] loc = local[w];
        Stencil st = stencils[w];
        long key = layout.key(r);
        double[] x = store.position();
        int n = st.support() * st.support() * st.support();
        for (int p = layout.start(r), end = layout.end(r); p < end; p++) {
            int lb = st.localBase(x, p, key);
            for (int k = 0; k < n; k++) {
                int node = st.node(layout, r, lb, k);
                int q = 4 * st.localIndex(lb, k);
                double[] v = fields.momentum(routing.field(p, node));
                loc[q + 1] = v[3 * node];
                loc[q + 2] = v[3 * node + 1];
                loc[q + 3] = v[3 * node + 2];
            }
            gatherRange(w, r, h, p, p + 1);
        }
    }

    /**
     * Gathers velocity and affine matrix of particles [from, to) of block r from the block-local buffer, moves
     * them and updates F. Folds their stencil range, speed and health into the worker's running block totals.
     */
    private void gatherRange(int w, int r, double h, int from, int to) {
        Stencil st = stencils[w];
        long key = layout.key(r);
        int baseX = BlockLayout.localOrigin(SparseGrid.keyX(key));
        int baseY = BlockLayout.localOrigin(SparseGrid.keyY(key));
        int baseZ = BlockLayout.localOrigin(SparseGrid.keyZ(key));
        int s = kernel.support();
        double dinv = kernel.inverseInertia(dx);
        double[] x = store.position();
        double[] v = store.velocity();
        double[] cm = store.affine();
        double[] f = store.deformation();
        double[] mass = store.mass();
        double[] wx = st.wx, wy = st.wy, wz = st.wz;
        double[] loc = local[w];
        double[] nrm = normal[w];
        double[] imp = runningImpulse[w];
        int[] acc = running[w];
        int loX = acc[0], loY = acc[1], loZ = acc[2], hiX = acc[3], hiY = acc[4], hiZ = acc[5];
        double fastest = runningFastest[w];
        int fastestP = acc[6];
        int bad = acc[7];
        boolean touch = contact.touches(r);
        boolean held = hold.any();
        for (int p = from; p < to; p++) {
            int base = 4 * st.locate(x, p, key, Stencil.NO_DERIVATIVES);
            double fx = st.fx, fy = st.fy, fz = st.fz;
            // Accumulate sum w v and sum w v (node index)^T; the offsets from the particle follow afterwards.
            double vx = 0, vy = 0, vz = 0;
            double b00 = 0, b01 = 0, b02 = 0, b10 = 0, b11 = 0, b12 = 0, b20 = 0, b21 = 0, b22 = 0;
            boolean quadratic = s == 3;
            // Constant trip counts for the quadratic stencil, so the compiler unrolls all 27 nodes; the branch
            // is the same for every particle.
            for (int i = 0; quadratic ? i < 3 : i < s; i++) {
                double wi = wx[i];
                int oi = base + i * (4 * L * L);
                for (int j = 0; quadratic ? j < 3 : j < s; j++) {
                    double wij = wi * wy[j];
                    int oj = oi + j * (4 * L);
                    double sx = 0, sy = 0, sz = 0, tx = 0, ty = 0, tz = 0;
                    if (quadratic) {
                        double w1 = wz[1], w2 = wz[2], w0 = wz[0];
                        double u1x = w1 * loc[oj + 5], u1y = w1 * loc[oj + 6], u1z = w1 * loc[oj + 7];
                        double u2x = w2 * loc[oj + 9], u2y = w2 * loc[oj + 10], u2z = w2 * loc[oj + 11];
                        sx = w0 * loc[oj + 1] + u1x + u2x;
                        sy = w0 * loc[oj + 2] + u1y + u2y;
                        sz = w0 * loc[oj + 3] + u1z + u2z;
                        tx = u1x + 2 * u2x;
                        ty = u1y + 2 * u2y;
                        tz = u1z + 2 * u2z;
                    } else {
                        for (int l = 0; l < s; l++) {
                            double wgt = wz[l];
                            int q = oj + 4 * l;
                            double ux = wgt * loc[q + 1], uy = wgt * loc[q + 2], uz = wgt * loc[q + 3];
                            sx += ux;
                            sy += uy;
                            sz += uz;
                            tx += l * ux;
                            ty += l * uy;
                            tz += l * uz;
                        }
                    }
                    sx *= wij;
                    sy *= wij;
                    sz *= wij;
                    vx += sx;
                    vy += sy;
                    vz += sz;
                    b00 += i * sx;
                    b01 += j * sx;
                    b02 += wij * tx;
                    b10 += i * sy;
                    b11 += j * sy;
                    b12 += wij * ty;
                    b20 += i * sz;
                    b21 += j * sz;
                    b22 += wij * tz;
                }
            }
            // B = sum w v (d)^T with d = (node - f) dx.
            b00 = (b00 - fx * vx) * dx;
            b01 = (b01 - fy * vx) * dx;
            b02 = (b02 - fz * vx) * dx;
            b10 = (b10 - fx * vy) * dx;
            b11 = (b11 - fy * vy) * dx;
            b12 = (b12 - fz * vy) * dx;
            b20 = (b20 - fx * vz) * dx;
            b21 = (b21 - fy * vz) * dx;
            b22 = (b22 - fz * vz) * dx;
            v[3 * p] = vx;
            v[3 * p + 1] = vy;
            v[3 * p + 2] = vz;
            if (held) {
                hold.hold(x, v, p);
                vx = v[3 * p];
                vy = v[3 * p + 1];
                vz = v[3 * p + 2];
            }
            double nx = x[3 * p] + h * vx, ny = x[3 * p + 1] + h * vy, nz = x[3 * p + 2] + h * vz;
            x[3 * p] = nx;
            x[3 * p + 1] = ny;
            x[3 * p + 2] = nz;
            if (touch) {
                runningWork[w] += contact.touch(x, v, mass, p, nrm, imp);
                vx = v[3 * p];
                vy = v[3 * p + 1];
                vz = v[3 * p + 2];
                nx = x[3 * p];
                ny = x[3 * p + 1];
                nz = x[3 * p + 2];
            }
            // Where the next step's stencil starts, to keep the block's node range and see if a sort is due.
            int sx = kernel.base((nx - ox) * invDx) - baseX;
            int sy = kernel.base((ny - oy) * invDx) - baseY;
            int sz = kernel.base((nz - oz) * invDx) - baseZ;
            loX = Math.min(loX, sx);
            loY = Math.min(loY, sy);
            loZ = Math.min(loZ, sz);
            hiX = Math.max(hiX, sx);
            hiY = Math.max(hiY, sy);
            hiZ = Math.max(hiZ, sz);
            int c9 = 9 * p;
            double c00 = dinv * b00, c01 = dinv * b01, c02 = dinv * b02;
            double c10 = dinv * b10, c11 = dinv * b11, c12 = dinv * b12;
            double c20 = dinv * b20, c21 = dinv * b21, c22 = dinv * b22;
            cm[c9] = c00;
            cm[c9 + 1] = c01;
            cm[c9 + 2] = c02;
            cm[c9 + 3] = c10;
            cm[c9 + 4] = c11;
            cm[c9 + 5] = c12;
            cm[c9 + 6] = c20;
            cm[c9 + 7] = c21;
            cm[c9 + 8] = c22;
            // F <- (I + h C) F
            double f00 = f[c9], f01 = f[c9 + 1], f02 = f[c9 + 2];
            double f10 = f[c9 + 3], f11 = f[c9 + 4], f12 = f[c9 + 5];
            double f20 = f[c9 + 6], f21 = f[c9 + 7], f22 = f[c9 + 8];
            f[c9] = f00 + h * (c00 * f00 + c01 * f10 + c02 * f20);
            f[c9 + 1] = f01 + h * (c00 * f01 + c01 * f11 + c02 * f21);
            f[c9 + 2] = f02 + h * (c00 * f02 + c01 * f12 + c02 * f22);
            f[c9 + 3] = f10 + h * (c10 * f00 + c11 * f10 + c12 * f20);
            f[c9 + 4] = f11 + h * (c10 * f01 + c11 * f11 + c12 * f21);
            f[c9 + 5] = f12 + h * (c10 * f02 + c11 * f12 + c12 * f22);
            f[c9 + 6] = f20 + h * (c20 * f00 + c21 * f10 + c22 * f20);
            f[c9 + 7] = f21 + h * (c20 * f01 + c21 * f11 + c22 * f21);
            f[c9 + 8] = f22 + h * (c20 * f02 + c21 * f12 + c22 * f22);
            double speed2 = vx * vx + vy * vy + vz * vz;
            if (!(speed2 <= Double.MAX_VALUE) || !Double.isFinite(f[c9] + f[c9 + 4] + f[c9 + 8])) {
                if (bad < 0) {
                    bad = p;
                }
            } else if (speed2 > fastest) {
                fastest = speed2;
                fastestP = p;
            }
        }
        acc[0] = loX;
        acc[1] = loY;
        acc[2] = loZ;
        acc[3] = hiX;
        acc[4] = hiY;
        acc[5] = hiZ;
        acc[6] = fastestP;
        acc[7] = bad;
        runningFastest[w] = fastest;
    }

    /** Copies the grid velocities a block's stencils reach into the block-local buffer (field 0). */
    private void loadLocal(double[] loc, int r, int s) {
        double[] gv = fields.momentum(0);
        int[] br = layout.ranges();
        for (int i = br[6 * r], iEnd = br[6 * r + 3] + s; i < iEnd; i++) {
            for (int j = br[6 * r + 1], jEnd = br[6 * r + 4] + s; j < jEnd; j++) {
                for (int l = br[6 * r + 2], lEnd = br[6 * r + 5] + s; l < lEnd; l++) {
                    int q = 4 * ((i * L + j) * L + l);
                    int node = layout.node(r, i, j, l);
                    loc[q + 1] = gv[3 * node];
                    loc[q + 2] = gv[3 * node + 1];
                    loc[q + 3] = gv[3 * node + 2];
                }
            }
        }
    }

    /** @return largest particle speed of block r in the last gather, m/s */
    public double blockMaxSpeed(int r) {
        return blockMaxSpeed[r];
    }

    /** @return the fastest particle of block r in the last gather */
    public int blockFastest(int r) {
        return blockFastest[r];
    }

    /**
     * Marks block r as failed at particle p when nothing earlier in the block failed (a return mapping that could
     * not finish reports here, so the divergence check names the particle in the same step).
     *
     * @param r the particle block
     * @param p the failed particle, or -1 for none
     */
    public void flagFailure(int r, int p) {
        if (p >= 0 && blockBad[r] < 0) {
            blockBad[r] = p;
        }
    }

    /** @return the first particle of block r with a non-finite velocity or deformation, or -1 */
    public int blockBad(int r) {
        return blockBad[r];
    }

    /** @return work done by obstacles on block r's particles in the last gather, J */
    public double blockContactWork(int r) {
        return blockContactWork[r];
    }

    /** @return per block r and obstacle o, impulse x, y, z (N s) and work (J) at (r obstacles + o) 4 (live) */
    public double[] blockImpulses() {
        return blockImpulse;
    }
}

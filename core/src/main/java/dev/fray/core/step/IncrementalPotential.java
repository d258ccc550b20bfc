package dev.fray.core.step;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.Stencil;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;
import dev.fray.core.parallel.BlockSchedule;
import dev.fray.core.parallel.Reductions;
import dev.fray.core.parallel.Workers;
import dev.fray.core.particles.ParticleStore;

/**
 * The incremental potential of backward Euler on grid velocities (Gast, Schroeder, Stomakhin, Jiang and Teran,
 * IEEE TVCG 21(10), 2015):
 * <pre>
 *   E(v) = sum_i m_i |v_i - v*_i|^2 / 2 + sum_p V_p psi_p(F_p(v)),    F_p(v) = (I + dt sum_i v_i grad w_ip^T) F_p^n
 * </pre>
 * with the MLS gradient grad w_ip = w_ip D^-1 (x_i - x_p) of the transfer, so the velocity gradient and the force
 * are those of the explicit step. Its gradient and its Hessian-vector products (matrix-free, from each law's
 * stress differential projected to positive semi-definite per particle) drive the Newton solve of
 * {@link ImplicitStep}. Damage is held fixed: psi = g psi_degraded + psi_kept with g from the step's start.
 *
 * <p>Determinism: per-particle work is independent; scatters to nodes run in the colour phases of
 * {@link BlockSchedule} in particle order, and energy sums are formed per particle block and added in block order,
 * so results do not depend on the thread count.
 */
final class IncrementalPotential {
    private static final int DS = MaterialLaw.DIFFERENTIAL_SIZE;
    private final StepContext ctx;
    private final ParticleStore store;
    private final BlockLayout layout;
    private final Workers workers;
    private final MaterialLaw[] laws;
    private final DamageModel[] damage;
    private final int support;
    private final int nodesPer;
    private final TrialState trial;
    private double h;
    private int[] nodeOf = new int[0];
    private double[] grad = new double[0];
    private double[] incr = new double[0];
    private double[] trialF = new double[0];
    private double[] force = new double[0];
    private double[] kmat = new double[0];
    private double[] degradation = new double[0];
    private double[] blockSum = new double[0];
    private boolean[] blockBad = new boolean[0];
    private final double[][] scratchA;
    private final double[][] scratchB;
    private final double[][] scratchC;
    private final double[][] scratchD;
    private final double[][] scratchE;

    /** F of trial velocities, with the store's channels. */
    private final class TrialState implements MaterialState {
        @Override
        public double[] deformation() {
            return trialF;
        }

        @Override
        public double[] channel(String name) {
            return store.channel(name);
        }
    }

    IncrementalPotential(StepContext ctx) {
        this.ctx = ctx;
        this.store = ctx.store();
        this.layout = ctx.layout();
        this.workers = ctx.workers();
        this.laws = ctx.laws();
        this.damage = ctx.damage();
        this.support = ctx.scene().kernel().support();
        this.nodesPer = support * support * support;
        this.trial = new TrialState();
        int t = workers.threads();
        scratchA = new double[t][0];
        scratchB = new double[t][0];
        scratchC = new double[t][0];
        scratchD = new double[t][0];
        scratchE = new double[t][0];
    }

    private static double[] grow(double[][] s, int w, int size) {
        if (s[w].length < size) {
            s[w] = new double[Math.max(size, 2 * s[w].length)];
        }
        return s[w];
    }

    /**
     * Locates every particle's stencil nodes and MLS weight gradients, and reads the degradation of damaged
     * particles. Run after the particle-to-grid transfer (so the layout is current).
     *
     * @param step the time step, s
     */
    void prepare(double step) {
        this.h = step;
        int n = store.size();
        if (nodeOf.length < nodesPer * n) {
            int cap = Math.max(nodesPer * n, nodeOf.length + nodeOf.length / 2);
            nodeOf = new int[cap];
            grad = new double[3 * cap];
        }
        if (incr.length < 9 * n) {
            int cap = Math.max(9 * n, incr.length + incr.length / 2);
            incr = new double[cap];
            trialF = new double[cap];
            force = new double[cap];
            kmat = new double[9 * cap];
            degradation = new double[cap / 9];
        }
        if (blockSum.length < layout.blockCount()) {
            blockSum = new double[Math.max(layout.blockCount(), 2 * blockSum.length)];
            blockBad = new boolean[blockSum.length];
        }
        double dx = ctx.scene().cellSize();
        double dinv = ctx.scene().kernel().inverseInertia(dx);
        double[] x = store.position();
        int[] body = store.body();
        workers.forEach(layout.blockCount(), (w, r) -> {
            Stencil st = ctx.stencils()[w];
            long key = layout.key(r);
            for (int p = layout.start(r); p < layout.end(r); p++) {
                int lb = st.locate(x, p, key, Stencil.NO_DERIVATIVES);
                int k = 0;
                for (int i = 0; i < support; i++) {
                    for (int j = 0; j < support; j++) {
                        for (int l = 0; l < support; l++) {
                            double wt = st.wx[i] * st.wy[j] * st.wz[l] * dinv * dx;
                            int q = nodesPer * p + k;
                            nodeOf[q] = st.node(layout, r, lb, k);
                            grad[3 * q] = wt * (i - st.fx);
                            grad[3 * q + 1] = wt * (j - st.fy);
                            grad[3 * q + 2] = wt * (l - st.fz);
                            k++;
                        }
                    }
                }
            }
            forRuns(r, (from, to, b) -> {
                if (damage[b] == null) {
                    java.util.Arrays.fill(degradation, from, to, 1.0);
                } else {
                    double[] g = grow(scratchA, w, to - from);
                    damage[b].degradation(store, from, to, g);
                    System.arraycopy(g, 0, degradation, from, to - from);
                }
            });
        });
    }

    @FunctionalInterface
    private interface Run {
        void run(int from, int to, int body);
    }

    private void forRuns(int r, Run run) {
        int[] body = store.body();
        int end = layout.end(r);
        for (int from = layout.start(r); from < end; ) {
            int b = body[from];
            int to = from + 1;
            while (to < end && body[to] == b) {
                to++;
            }
            run.run(from, to, b);
            from = to;
        }
    }

    /**
     * Sets the trial deformation F(v) of every particle and returns the incremental potential E(v).
     *
     * @param v     node velocities, 3 per node, m/s
     * @param vStar the explicit (momentum and body force) velocities, 3 per node, m/s
     * @param mass  node masses, kg
     * @return E(v), J; +infinity if some particle would be inverted or its energy is not finite
     */
    double energy(double[] v, double[] vStar, double[] mass) {
        double[] fn = store.deformation();
        double[] vol = store.volume();
        workers.forEach(layout.blockCount(), (w, r) -> {
            boolean bad = false;
            for (int p = layout.start(r); p < layout.end(r); p++) {
                double g00 = 0, g01 = 0, g02 = 0, g10 = 0, g11 = 0, g12 = 0, g20 = 0, g21 = 0, g22 = 0;
                int q0 = nodesPer * p;
                for (int k = 0; k < nodesPer; k++) {
                    int q = q0 + k;
                    int n3 = 3 * nodeOf[q];
                    double a = grad[3 * q], b = grad[3 * q + 1], c = grad[3 * q + 2];
                    double vx = v[n3], vy = v[n3 + 1], vz = v[n3 + 2];
                    g00 += vx * a;
                    g01 += vx * b;
                    g02 += vx * c;
                    g10 += vy * a;
                    g11 += vy * b;
                    g12 += vy * c;
                    g20 += vz * a;
                    g21 += vz * b;
                    g22 += vz * c;
                }
                int o = 9 * p;
                double[] l = incr;
                l[o] = 1 + h * g00;
                l[o + 1] = h * g01;
                l[o + 2] = h * g02;
                l[o + 3] = h * g10;
                l[o + 4] = 1 + h * g11;
                l[o + 5] = h * g12;
                l[o + 6] = h * g20;
                l[o + 7] = h * g21;
                l[o + 8] = 1 + h * g22;
                for (int rr = 0; rr < 3; rr++) {
                    for (int cc = 0; cc < 3; cc++) {
                        trialF[o + 3 * rr + cc] = l[o + 3 * rr] * fn[o + cc] + l[o + 3 * rr + 1] * fn[o + 3 + cc]
                                + l[o + 3 * rr + 2] * fn[o + 6 + cc];
                    }
                }
                bad |= !(det(l, o) > 0);
            }
            double[] sum = {0};
            forRuns(r, (from, to, b) -> {
                double[] psi = grow(scratchA, w, to - from);
                energyDensity(w, b, from, to, psi);
                for (int p = from; p < to; p++) {
                    sum[0] += vol[p] * psi[p - from];
                }
            });
            blockSum[r] = sum[0];
            blockBad[r] = bad || !Double.isFinite(sum[0]);
        });
        double e = 0;
        for (int r = 0; r < layout.blockCount(); r++) {
            if (blockBad[r]) {
                return Double.POSITIVE_INFINITY;
            }
            e += blockSum[r];
        }
        return e + kinetic(v, vStar, mass);
    }

    private double kinetic(double[] v, double[] vStar, double[] mass) {
        int gb = ctx.grid().blockCount();
        int tasks = Reductions.gridTasks(gb);
        double[] part = new double[tasks];
        Reductions.overNodes(workers, gb, (w, t, s, e) -> {
            double sum = 0;
            for (int i = s; i < e; i++) {
                if (mass[i] > 0) {
                    double dx = v[3 * i] - vStar[3 * i], dy = v[3 * i + 1] - vStar[3 * i + 1];
                    double dz = v[3 * i + 2] - vStar[3 * i + 2];
                    sum += 0.5 * mass[i] * (dx * dx + dy * dy + dz * dz);
                }
            }
            part[t] = sum;
        });
        return Reductions.sum(part, tasks);
    }

    private void energyDensity(int w, int b, int from, int to, double[] psi) {
        int n = to - from;
        if (damage[b] == null) {
            laws[b].energyDensity(trial, from, to, psi);
            return;
        }
        double[] tauD = grow(scratchB, w, 9 * n), tauK = grow(scratchC, w, 9 * n);
        double[] psiD = grow(scratchD, w, n), psiK = grow(scratchE, w, n);
        laws[b].splitKirchhoffStress(damage[b].tensionSplit(), trial, from, to, tauD, tauK, psiD, psiK);
        for (int i = 0; i < n; i++) {
            psi[i] = degradation[from + i] * psiD[i] + psiK[i];
        }
    }

    /**
     * The gradient dE/dv at the velocities of the last {@link #energy} call:
     * m_i (v_i - v*_i) + dt sum_p V_p P_p F_p^n^T grad w_ip, with P F^n^T = tau (I + dt grad v)^-T.
     *
     * @param v     node velocities, 3 per node
     * @param vStar explicit velocities, 3 per node
     * @param mass  node masses
     * @param out   (output) the gradient, 3 per node, N s
     */
    void gradient(double[] v, double[] vStar, double[] mass, double[] out) {
        double[] vol = store.volume();
        workers.forEach(layout.blockCount(), (w, r) -> forRuns(r, (from, to, b) -> {
            int n = to - from;
            double[] tau = grow(scratchA, w, 9 * n);
            if (damage[b] == null) {
                laws[b].kirchhoffStress(trial, from, to, tau);
            } else {
                double[] tauK = grow(scratchC, w, 9 * n);
                laws[b].splitKirchhoffStress(damage[b].tensionSplit(), trial, from, to, tau, tauK,
                        grow(scratchD, w, n), grow(scratchE, w, n));
                for (int i = 0; i < n; i++) {
                    double g = degradation[from + i];
                    for (int k = 0; k < 9; k++) {
                        tau[9 * i + k] = g * tau[9 * i + k] + tauK[9 * i + k];
                    }
                }
            }
            for (int p = from; p < to; p++) {
                // force matrix V tau L^-T, L = I + dt grad v; L^-T = cof(L) / det L
                int o = 9 * p, t = 9 * (p - from);
                double[] l = incr;
                double c00 = l[o + 4] * l[o + 8] - l[o + 5] * l[o + 7];
                double c01 = l[o + 5] * l[o + 6] - l[o + 3] * l[o + 8];
                double c02 = l[o + 3] * l[o + 7] - l[o + 4] * l[o + 6];
                double c10 = l[o + 2] * l[o + 7] - l[o + 1] * l[o + 8];
                double c11 = l[o] * l[o + 8] - l[o + 2] * l[o + 6];
                double c12 = l[o + 1] * l[o + 6] - l[o] * l[o + 7];
                double c20 = l[o + 1] * l[o + 5] - l[o + 2] * l[o + 4];
                double c21 = l[o + 2] * l[o + 3] - l[o] * l[o + 5];
                double c22 = l[o] * l[o + 4] - l[o + 1] * l[o + 3];
                double s = h * vol[p] / (l[o] * c00 + l[o + 1] * c01 + l[o + 2] * c02);
                for (int a = 0; a < 3; a++) {
                    double t0 = tau[t + 3 * a], t1 = tau[t + 3 * a + 1], t2 = tau[t + 3 * a + 2];
                    // (tau cof(L))_ab = sum_k tau_ak cof_kb
                    force[o + 3 * a] = s * (t0 * c00 + t1 * c10 + t2 * c20);
                    force[o + 3 * a + 1] = s * (t0 * c01 + t1 * c11 + t2 * c21);
                    force[o + 3 * a + 2] = s * (t0 * c02 + t1 * c12 + t2 * c22);
                }
            }
        }));
        nodeTerm(v, vStar, mass, out, 1.0);
        BlockSchedule.byColour(workers, layout, (w, r) -> {
            for (int p = layout.start(r); p < layout.end(r); p++) {
                scatter(force, 9 * p, p, out);
            }
        });
    }

    /** out = c m (a - b) at every node (b may be null for zero). */
    private void nodeTerm(double[] a, double[] b, double[] mass, double[] out, double c) {
        Reductions.overNodes(workers, ctx.grid().blockCount(), (w, t, s, e) -> {
            for (int i = s; i < e; i++) {
                double m = c * mass[i];
                for (int k = 3 * i; k < 3 * i + 3; k++) {
                    out[k] = m > 0 ? m * (a[k] - (b == null ? 0 : b[k])) : 0;
                }
            }
        });
    }

    /** out_i += M grad w_ip for the 3x3 matrix M at mat[o]. */
    private void scatter(double[] mat, int o, int p, double[] out) {
        int q0 = nodesPer * p;
        for (int k = 0; k < nodesPer; k++) {
            int q = q0 + k;
            int n3 = 3 * nodeOf[q];
            double a = grad[3 * q], b = grad[3 * q + 1], c = grad[3 * q + 2];
            out[n3] += mat[o] * a + mat[o + 1] * b + mat[o + 2] * c;
            out[n3 + 1] += mat[o + 3] * a + mat[o + 4] * b + mat[o + 5] * c;
            out[n3 + 2] += mat[o + 6] * a + mat[o + 7] * b + mat[o + 8] * c;
        }
    }

    /**
     * Stress differentials at the velocities of the last {@link #energy} call, projected to positive semi-definite,
     * turned into the per-particle map K (grad v increment to force matrix, scaled by V dt^2), and the 3x3 diagonal
     * blocks of the Hessian m I + sum_p grad w^T K grad w, inverted for the block-Jacobi preconditioner.
     *
     * @param mass       node masses
     * @param inverseDiag (output) inverse diagonal block per node, 9 per node
     */
    void tangents(double[] mass, double[] inverseDiag) {
        double[] fn = store.deformation();
        double[] vol = store.volume();
        workers.forEach(layout.blockCount(), (w, r) -> forRuns(r, (from, to, b) -> {
            int n = to - from;
            double[] a = grow(scratchB, w, DS * n);
            double[] g = null;
            if (damage[b] != null) {
                g = grow(scratchA, w, n);
                System.arraycopy(degradation, from, g, 0, n);
            }
            laws[b].stressDifferential(trial, from, to, damage[b] == null ? null : damage[b].tensionSplit(), g,
                    true, a);
            for (int p = from; p < to; p++) {
                conjugate(a, DS * (p - from), fn, 9 * p, h * h * vol[p], kmat, DS * p, grow(scratchD, w, 81));
            }
        }));
        Reductions.overNodes(workers, ctx.grid().blockCount(), (w, t, s, e) ->
                java.util.Arrays.fill(inverseDiag, 9 * s, 9 * e, 0.0));
        BlockSchedule.byColour(workers, layout, (w, r) -> {
            for (int p = layout.start(r); p < layout.end(r); p++) {
                int q0 = nodesPer * p, ko = DS * p;
                for (int k = 0; k < nodesPer; k++) {
                    int q = q0 + k;
                    int n9 = 9 * nodeOf[q];
                    double y0 = grad[3 * q], y1 = grad[3 * q + 1], y2 = grad[3 * q + 2];
                    for (int aa = 0; aa < 3; aa++) {
                        for (int cc = 0; cc < 3; cc++) {
                            int row = ko + 27 * aa + 3 * cc;
                            double s = y0 * (kmat[row] * y0 + kmat[row + 1] * y1 + kmat[row + 2] * y2)
                                    + y1 * (kmat[row + 9] * y0 + kmat[row + 10] * y1 + kmat[row + 11] * y2)
                                    + y2 * (kmat[row + 18] * y0 + kmat[row + 19] * y1 + kmat[row + 20] * y2);
                            inverseDiag[n9 + 3 * aa + cc] += s;
                        }
                    }
                }
            }
        });
        Reductions.overNodes(workers, ctx.grid().blockCount(), (w, t, s, e) -> {
            for (int i = s; i < e; i++) {
                if (mass[i] > 0) {
                    int o = 9 * i;
                    inverseDiag[o] += mass[i];
                    inverseDiag[o + 4] += mass[i];
                    inverseDiag[o + 8] += mass[i];
                    invertInPlace(inverseDiag, o);
                }
            }
        });
    }

    /** K_(ab'),(cd') = s sum_(b,d) Fn_b'b A_(ab),(cd) Fn_d'd at out[ko]. */
    private static void conjugate(double[] a, int ao, double[] fn, int fo, double s, double[] out, int ko,
                                  double[] t1) {
        for (int aa = 0; aa < 3; aa++) {
            for (int b1 = 0; b1 < 3; b1++) {
                for (int cd = 0; cd < 9; cd++) {
                    double v = 0;
                    for (int b = 0; b < 3; b++) {
                        v += fn[fo + 3 * b1 + b] * a[ao + 9 * (3 * aa + b) + cd];
                    }
                    t1[9 * (3 * aa + b1) + cd] = v;
                }
            }
        }
        for (int row = 0; row < 9; row++) {
            for (int c = 0; c < 3; c++) {
                for (int d1 = 0; d1 < 3; d1++) {
                    int base = 9 * row + 3 * c;
                    out[ko + base + d1] = s * (t1[base] * fn[fo + 3 * d1] + t1[base + 1] * fn[fo + 3 * d1 + 1]
                            + t1[base + 2] * fn[fo + 3 * d1 + 2]);
                }
            }
        }
    }

    /**
     * out = H dv: m dv at the nodes plus sum_p (K_p : (sum_j dv_j grad w_jp^T)) grad w_ip.
     *
     * @param mass node masses
     * @param dv   (input) increment, 3 per node
     * @param out  (output) product, 3 per node
     */
    void apply(double[] mass, double[] dv, double[] out) {
        nodeTerm(dv, null, mass, out, 1.0);
        BlockSchedule.byColour(workers, layout, (w, r) -> {
            double[] q = grow(scratchD, w, 9);
            double[] gm = grow(scratchE, w, 9);
            for (int p = layout.start(r); p < layout.end(r); p++) {
                java.util.Arrays.fill(gm, 0, 9, 0.0);
                int q0 = nodesPer * p;
                for (int k = 0; k < nodesPer; k++) {
                    int qq = q0 + k;
                    int n3 = 3 * nodeOf[qq];
                    double a = grad[3 * qq], b = grad[3 * qq + 1], c = grad[3 * qq + 2];
                    double vx = dv[n3], vy = dv[n3 + 1], vz = dv[n3 + 2];
                    gm[0] += vx * a;
                    gm[1] += vx * b;
                    gm[2] += vx * c;
                    gm[3] += vy * a;
                    gm[4] += vy * b;
                    gm[5] += vy * c;
                    gm[6] += vz * a;
                    gm[7] += vz * b;
                    gm[8] += vz * c;
                }
                int ko = DS * p;
                for (int row = 0; row < 9; row++) {
                    int o = ko + 9 * row;
                    q[row] = kmat[o] * gm[0] + kmat[o + 1] * gm[1] + kmat[o + 2] * gm[2] + kmat[o + 3] * gm[3]
                            + kmat[o + 4] * gm[4] + kmat[o + 5] * gm[5] + kmat[o + 6] * gm[6] + kmat[o + 7] * gm[7]
                            + kmat[o + 8] * gm[8];
                }
                scatter(q, 0, p, out);
            }
        });
        // massless nodes carry no unknown
        Reductions.overNodes(workers, ctx.grid().blockCount(), (w, t, s, e) -> {
            for (int i = s; i < e; i++) {
                if (!(mass[i] > 0)) {
                    out[3 * i] = 0;
                    out[3 * i + 1] = 0;
                    out[3 * i + 2] = 0;
                }
            }
        });
    }

    private static double det(double[] l, int o) {
        return l[o] * (l[o + 4] * l[o + 8] - l[o + 5] * l[o + 7]) + l[o + 1] * (l[o + 5] * l[o + 6] - l[o + 3] * l[o + 8])
                + l[o + 2] * (l[o + 3] * l[o + 7] - l[o + 4] * l[o + 6]);
    }

    /** Inverts the symmetric positive definite 3x3 block at m[o] in place (cofactors over the determinant). */
    private static void invertInPlace(double[] m, int o) {
        double a = m[o], b = m[o + 1], c = m[o + 2], d = m[o + 3], e = m[o + 4], f = m[o + 5], g = m[o + 6],
                hh = m[o + 7], i = m[o + 8];
        double c00 = e * i - f * hh, c01 = f * g - d * i, c02 = d * hh - e * g;
        double det = a * c00 + b * c01 + c * c02;
        double inv = 1.0 / det;
        m[o] = c00 * inv;
        m[o + 1] = (c * hh - b * i) * inv;
        m[o + 2] = (b * f - c * e) * inv;
        m[o + 3] = c01 * inv;
        m[o + 4] = (a * i - c * g) * inv;
        m[o + 5] = (c * d - a * f) * inv;
        m[o + 6] = c02 * inv;
        m[o + 7] = (b * g - a * hh) * inv;
        m[o + 8] = (a * e - b * d) * inv;
    }
}

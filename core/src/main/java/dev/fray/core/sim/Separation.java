package dev.fray.core.sim;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.particles.ParticleStore;

import java.util.Arrays;

/**
 * Damage-field-gradient partitioning: grid nodes near a crack carry two velocity fields, one for the material on
 * each side, in frictional contact, so the faces of a crack part instead of staying joined through the shared
 * nodes. The method is that of Homel and Herbold, "Field-gradient partitioning for fracture and frictional contact
 * in the material point method", IJNME 109 (2017); the contact between the two fields is the multi-field contact
 * of Bardenhagen, Brackbill and Sulsky (CMAME 187, 2000) and Bardenhagen et al. (CMES 2, 2001).
 *
 * <p>Each step, before the scatter (w_ip the B-spline weight of node i at particle p, m_p mass, D_p damage, x_p
 * position; sums over the particles whose stencil holds node i):
 * <ol>
 *   <li>Grid damage D_i = sum_p w_ip m_p D_p / sum_p w_ip m_p, the largest damage D_i^max = max_p D_p, and the
 *       damage centroid c_i = sum_p m_p D_p x_p / sum_p m_p D_p, which lies on the crack. The centroid is not
 *       weighted by w_ip: that would pull it towards the node, off the crack's mid-plane.</li>
 *   <li>Particle damage gradient g_p = sum_i D_i grad w_ip (1/m), pointing across the crack.</li>
 *   <li>Node normal n_i: the g_p of largest magnitude among the particles reaching node i (the first in the fixed
 *       scatter order on a tie), at nodes with D_i^max &gt;= the scene's threshold; n_i = 0 elsewhere.</li>
 *   <li>At node i, particle p belongs to field B if (x_p - c_i) . n_i &gt; 0 and to field A otherwise: the two
 *       sides of the crack plane through c_i. Where n_i = 0 every particle is in field A, which is then the one
 *       field of the ordinary solver.</li>
 * </ol>
 * The damage-gradient normal and the partition of each node's particles into two fields are Homel and Herbold's.
 * Three details are Fray's choices: the normal comes from the node's steepest particle, since the grid gradient
 * of D vanishes on the mid-plane of a crack, where the partition matters most; the side is taken against the damage
 * centroid rather than against the sign of g_p, so that particles too far from the crack to feel its gradient
 * still land on their own side; and a node splits only near damage of at least the threshold.
 *
 * <p>The scatter then sends each particle's mass, APIC momentum and MLS force to its field at each node; each field
 * gets its velocity, gravity, damping, grips, walls and obstacles as the single field does. Then, with
 * n = n_i / |n_i| (pointing from field A towards field B), v_cm = (m_A v_A + m_B v_B) / (m_A + m_B) and
 * d = v_A - v_cm: if the fields approach, (v_A - v_B) . n &gt; 0, the normal part of d is removed and its tangential
 * part t = d - (d . n) n is reduced by Coulomb friction to t max(0, 1 - mu (d . n) / |t|); v_A = v_cm + t',
 * v_B = v_cm - (m_A / m_B) t', which keeps the node's momentum. Fields that separate are left free. The gather
 * reads, at each node, the field the particle belongs to.
 *
 * <p>Every sum runs in the solver's fixed order (8 colour phases of particle blocks, particles in sorted order),
 * so results are bitwise identical for any thread count. Nothing here is run state: the partition is rebuilt
 * each step from positions and damage. Memory: 15 doubles per grid node and 3 per particle, only when the scene
 * asks for separation.
 */
final class Separation {
    private final Simulation sim;
    private final double threshold;
    private final double friction;
    /** Damage gradient of each particle, 3 per particle, 1/m. */
    private final double[] gradient;
    /** Field B: node mass (kg) and momentum, then velocity (3 per node). */
    private double[] massB = new double[0];
    private double[] momentumB = new double[0];
    /** Sum w m and sum w m D per node, the latter turned into D_i. */
    private double[] weight = new double[0];
    private double[] nodeDamage = new double[0];
    private double[] maxDamage = new double[0];
    /** Damage centroid c_i, 3 per node, m, and its weight sum m_p D_p. */
    private double[] centroid = new double[0];
    private double[] centroidWeight = new double[0];
    /** Reference gradient n_i (3 per node, 1/m) and its squared length. */
    private double[] reference = new double[0];
    private double[] reference2 = new double[0];

    Separation(Simulation sim) {
        this.sim = sim;
        this.threshold = sim.scene.separationThreshold();
        this.friction = sim.scene.separationFriction();
        this.gradient = new double[3 * sim.store.size()];
    }

    /** @return node masses of field B, kg (live array) */
    double[] massB() {
        return massB;
    }

    /** @return node momenta of field B, turned into velocities by the grid update (live array) */
    double[] momentumB() {
        return momentumB;
    }

    /** Grows the node arrays to hold this many nodes; reallocates only when the grid has grown. */
    void ensureNodes(int nodes) {
        if (massB.length < nodes) {
            int cap = Math.max(nodes, massB.length + massB.length / 2);
            massB = new double[cap];
            momentumB = new double[3 * cap];
            weight = new double[cap];
            nodeDamage = new double[cap];
            maxDamage = new double[cap];
            centroid = new double[3 * cap];
            centroidWeight = new double[cap];
            reference = new double[3 * cap];
            reference2 = new double[cap];
        }
    }

    /** Zeroes the node data of grid blocks [from, to). */
    void zero(int from, int to) {
        int a = from * SparseGrid.NODES_PER_BLOCK;
        int b = to * SparseGrid.NODES_PER_BLOCK;
        Arrays.fill(massB, a, b, 0.0);
        Arrays.fill(momentumB, 3 * a, 3 * b, 0.0);
        Arrays.fill(weight, a, b, 0.0);
        Arrays.fill(nodeDamage, a, b, 0.0);
        Arrays.fill(maxDamage, a, b, 0.0);
        Arrays.fill(centroid, 3 * a, 3 * b, 0.0);
        Arrays.fill(centroidWeight, a, b, 0.0);
        Arrays.fill(reference, 3 * a, 3 * b, 0.0);
        Arrays.fill(reference2, a, b, 0.0);
    }

    /** Builds the partition of this step (steps 1 to 3 of the class comment), before the scatter. */
    void partition() {
        ParticleStore store = sim.store;
        if (store.spec(DamageModel.DAMAGE) == null) {
            // No body can break: every reference stays 0 and every node carries one field.
            return;
        }
        double[] d = store.channel(DamageModel.DAMAGE);
        double[] mass = store.mass();
        double[] x = store.position();
        colourPhases((sc, r) -> {
            for (int p = sim.blockStart[r], end = sim.blockStart[r + 1]; p < end; p++) {
                int lb = stencil(sc, r, p, false);
                int s = sim.kernel.support();
                double m = mass[p], dp = d[p];
                double px = x[3 * p], py = x[3 * p + 1], pz = x[3 * p + 2];
                double md = m * dp;
                for (int k = 0, n = s * s * s; k < n; k++) {
                    int node = stencilNode(r, lb, k, s);
                    double wm = sc.w[k] * m;
                    weight[node] += wm;
                    nodeDamage[node] += wm * dp;
                    centroidWeight[node] += md;
                    centroid[3 * node] += md * px;
                    centroid[3 * node + 1] += md * py;
                    centroid[3 * node + 2] += md * pz;
                    if (dp > maxDamage[node]) {
                        maxDamage[node] = dp;
                    }
                }
            }
        });
        int nodes = sim.grid.blockCount() * SparseGrid.NODES_PER_BLOCK;
        int per = Simulation.GRID_TASK_BLOCKS * SparseGrid.NODES_PER_BLOCK;
        sim.workers.forEach((nodes + per - 1) / per, (w, t) -> {
            for (int i = t * per, e = Math.min(nodes, i + per); i < e; i++) {
                if (centroidWeight[i] > 0) {
                    double inv = 1 / centroidWeight[i];
                    centroid[3 * i] *= inv;
                    centroid[3 * i + 1] *= inv;
                    centroid[3 * i + 2] *= inv;
                    nodeDamage[i] /= weight[i];
                }
            }
        });
        sim.workers.forEach(sim.blockCount, (w, r) -> {
            Simulation.Scratch sc = sim.scratch[w];
            int s = sim.kernel.support();
            for (int p = sim.blockStart[r], end = sim.blockStart[r + 1]; p < end; p++) {
                int lb = stencil(sc, r, p, true);
                double gx = 0, gy = 0, gz = 0;
                for (int k = 0, n = s * s * s; k < n; k++) {
                    double di = nodeDamage[stencilNode(r, lb, k, s)];
                    gx += di * sc.gx[k];
                    gy += di * sc.gy[k];
                    gz += di * sc.gz[k];
                }
                gradient[3 * p] = gx;
                gradient[3 * p + 1] = gy;
                gradient[3 * p + 2] = gz;
            }
        });
        colourPhases((sc, r) -> {
            int s = sim.kernel.support();
            for (int p = sim.blockStart[r], end = sim.blockStart[r + 1]; p < end; p++) {
                int lb = localBase(r, p);
                double gx = gradient[3 * p], gy = gradient[3 * p + 1], gz = gradient[3 * p + 2];
                double g2 = gx * gx + gy * gy + gz * gz;
                for (int k = 0, n = s * s * s; k < n; k++) {
                    int node = stencilNode(r, lb, k, s);
                    if (maxDamage[node] >= threshold && g2 > reference2[node]) {
                        reference2[node] = g2;
                        reference[3 * node] = gx;
                        reference[3 * node + 1] = gy;
                        reference[3 * node + 2] = gz;
                    }
                }
            }
        });
    }

    /**
     * Scatters particles [from, to) of block r one at a time through the solver's own scatter into the (zeroed)
     * block-local buffer, then moves each particle's node values to its field at each node and clears them again.
     */
    void scatterRun(Simulation.Scratch sc, int r, double h, double[] tau, int from, int to) {
        double[] loc = sc.local;
        double[] gm = sim.grid.mass();
        double[] gp = sim.grid.momentum();
        int s = sim.kernel.support();
        for (int p = from; p < to; p++) {
            sim.scatterRange(sc, r, h, tau, from, p, p + 1);
            int lb = localBase(r, p);
            for (int k = 0, n = s * s * s; k < n; k++) {
                int node = stencilNode(r, lb, k, s);
                int q = 4 * localIndex(lb, k, s);
                boolean b = inFieldB(p, node);
                double[] m = b ? massB : gm;
                double[] mv = b ? momentumB : gp;
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
     * Gathers block r one particle at a time: writes the velocities of the particle's own fields into the
     * block-local buffer at its stencil nodes, then runs the solver's own gather for it.
     */
    void gatherBlock(Simulation.Scratch sc, int r, double h) {
        double[] loc = sc.local;
        double[] gv = sim.grid.momentum();
        int s = sim.kernel.support();
        for (int p = sim.blockStart[r], end = sim.blockStart[r + 1]; p < end; p++) {
            int lb = localBase(r, p);
            for (int k = 0, n = s * s * s; k < n; k++) {
                int node = stencilNode(r, lb, k, s);
                int q = 4 * localIndex(lb, k, s);
                double[] v = inFieldB(p, node) ? momentumB : gv;
                loc[q + 1] = v[3 * node];
                loc[q + 2] = v[3 * node + 1];
                loc[q + 3] = v[3 * node + 2];
            }
            sim.gatherRange(sc, r, h, p, p + 1);
        }
    }

    /** Frictional contact between the two fields on grid blocks [b0, b1), after each field's own update. */
    void contact(int b0, int b1) {
        double[] ma = sim.grid.mass();
        double[] va = sim.grid.momentum();
        for (int node = b0 * SparseGrid.NODES_PER_BLOCK, e = b1 * SparseGrid.NODES_PER_BLOCK; node < e; node++) {
            double mA = ma[node], mB = massB[node];
            if (mA <= 0 || mB <= 0 || reference2[node] == 0) {
                continue;
            }
            int n3 = 3 * node;
            double len = 1 / Math.sqrt(reference2[node]);
            double nx = reference[n3] * len, ny = reference[n3 + 1] * len, nz = reference[n3 + 2] * len;
            double approach = (va[n3] - momentumB[n3]) * nx + (va[n3 + 1] - momentumB[n3 + 1]) * ny
                    + (va[n3 + 2] - momentumB[n3 + 2]) * nz;
            if (!(approach > 0)) {
                continue;
            }
            double total = mA + mB;
            double cx = (mA * va[n3] + mB * momentumB[n3]) / total;
            double cy = (mA * va[n3 + 1] + mB * momentumB[n3 + 1]) / total;
            double cz = (mA * va[n3 + 2] + mB * momentumB[n3 + 2]) / total;
            double dx = va[n3] - cx, dy = va[n3 + 1] - cy, dz = va[n3 + 2] - cz;
            double dn = dx * nx + dy * ny + dz * nz;
            double tx = dx - dn * nx, ty = dy - dn * ny, tz = dz - dn * nz;
            double t = Math.sqrt(tx * tx + ty * ty + tz * tz);
            // Coulomb: the tangential slip shrinks by mu times the normal velocity jump removed, not past zero.
            double keep = t > friction * dn ? 1 - friction * dn / t : 0;
            tx *= keep;
            ty *= keep;
            tz *= keep;
            double ratio = mA / mB;
            va[n3] = cx + tx;
            va[n3 + 1] = cy + ty;
            va[n3 + 2] = cz + tz;
            momentumB[n3] = cx - ratio * tx;
            momentumB[n3 + 1] = cy - ratio * ty;
            momentumB[n3 + 2] = cz - ratio * tz;
        }
    }

    /** @return whether particle p, before this step's move, is on the B side of node's crack plane */
    private boolean inFieldB(int p, int node) {
        double[] x = sim.store.position();
        int p3 = 3 * p, n3 = 3 * node;
        return (x[p3] - centroid[n3]) * reference[n3] + (x[p3 + 1] - centroid[n3 + 1]) * reference[n3 + 1]
                + (x[p3 + 2] - centroid[n3 + 2]) * reference[n3 + 2] > 0;
    }

    /** Particle p's first stencil node in block r's local coordinates, packed as 64 x + 8 y + z. */
    private int localBase(int r, int p) {
        double[] x = sim.store.position();
        long key = sim.blockKeys[r];
        int lx = sim.kernel.base((x[3 * p] - sim.ox) * sim.invDx) - Simulation.localOrigin(SparseGrid.keyX(key));
        int ly = sim.kernel.base((x[3 * p + 1] - sim.oy) * sim.invDx)
                - Simulation.localOrigin(SparseGrid.keyY(key));
        int lz = sim.kernel.base((x[3 * p + 2] - sim.oz) * sim.invDx)
                - Simulation.localOrigin(SparseGrid.keyZ(key));
        return (lx * Simulation.LOCAL + ly) * Simulation.LOCAL + lz;
    }

    /** Block-local index of stencil node k (x slowest) from packed base lb. */
    private static int localIndex(int lb, int k, int s) {
        return lb + ((k / (s * s)) * Simulation.LOCAL + (k / s) % s) * Simulation.LOCAL + k % s;
    }

    /** Grid node of stencil node k (x slowest) from packed local base lb of block r. */
    private int stencilNode(int r, int lb, int k, int s) {
        int l = Simulation.LOCAL;
        return sim.node(r, lb / (l * l) + k / (s * s), (lb / l) % l + (k / s) % s, lb % l + k % s);
    }

    /**
     * Fills the scratch with particle p's stencil weights (and weight gradients, 1/m, if asked), x slowest.
     *
     * @return the packed local base, as {@link #localBase}
     */
    private int stencil(Simulation.Scratch sc, int r, int p, boolean gradients) {
        double[] x = sim.store.position();
        double xi = (x[3 * p] - sim.ox) * sim.invDx, yi = (x[3 * p + 1] - sim.oy) * sim.invDx;
        double zi = (x[3 * p + 2] - sim.oz) * sim.invDx;
        double fx = xi - sim.kernel.base(xi), fy = yi - sim.kernel.base(yi), fz = zi - sim.kernel.base(zi);
        sim.kernel.weights(fx, sc.wx, 0);
        sim.kernel.weights(fy, sc.wy, 0);
        sim.kernel.weights(fz, sc.wz, 0);
        if (gradients) {
            sim.kernel.derivatives(fx, sc.dwx, 0);
            sim.kernel.derivatives(fy, sc.dwy, 0);
            sim.kernel.derivatives(fz, sc.dwz, 0);
        }
        int s = sim.kernel.support();
        int k = 0;
        for (int i = 0; i < s; i++) {
            for (int j = 0; j < s; j++) {
                for (int l = 0; l < s; l++) {
                    sc.w[k] = sc.wx[i] * sc.wy[j] * sc.wz[l];
                    if (gradients) {
                        sc.gx[k] = sc.dwx[i] * sc.wy[j] * sc.wz[l] * sim.invDx;
                        sc.gy[k] = sc.wx[i] * sc.dwy[j] * sc.wz[l] * sim.invDx;
                        sc.gz[k] = sc.wx[i] * sc.wy[j] * sc.dwz[l] * sim.invDx;
                    }
                    k++;
                }
            }
        }
        return localBase(r, p);
    }

    @FunctionalInterface
    private interface BlockTask {
        void run(Simulation.Scratch sc, int block);
    }

    /** Runs a task on every particle block in the 8 colour phases, so no two threads write the same node. */
    private void colourPhases(BlockTask task) {
        for (int c = 0; c < 8; c++) {
            final int from = sim.colourStart[c];
            sim.workers.forEach(sim.colourStart[c + 1] - from,
                    (w, t) -> task.run(sim.scratch[w], sim.colourBlocks[from + t]));
        }
    }
}

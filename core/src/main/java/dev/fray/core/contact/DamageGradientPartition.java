package dev.fray.core.contact;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.grid.Stencil;
import dev.fray.core.parallel.BlockSchedule;
import dev.fray.core.parallel.Reductions;
import dev.fray.core.parallel.Workers;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.transfer.FieldRouting;

import java.util.Arrays;

/**
 * Damage-field-gradient partitioning: grid nodes near a crack carry two velocity fields, one for the material on
 * each side, so the faces of a crack part instead of staying joined through the shared nodes. The method is that
 * of Homel and Herbold, "Field-gradient partitioning for fracture and frictional contact in the material point
 * method", IJNME 109 (2017); the two fields then meet in {@link FieldContact}.
 *
 * <p>Each step, before the scatter (w_ip the B-spline weight of node i at particle p, m_p mass, D_p damage, x_p
 * position; sums over the particles whose stencil holds node i):
 * <ol>
 *   <li>Grid damage D_i = sum_p w_ip m_p D_p / sum_p w_ip m_p, the largest damage D_i^max = max_p D_p, and the
 *       damage centroid c_i = sum_p m_p D_p x_p / sum_p m_p D_p, which lies on the crack. The centroid is not
 *       weighted by w_ip: that would pull it towards the node, off the crack's mid-plane.</li>
 *   <li>Particle damage gradient g_p = sum_i D_i grad w_ip (1/m), pointing across the crack.</li>
 *   <li>Node normal n_i: the g_p of largest magnitude among the particles reaching node i (the first in the fixed
 *       scatter order on a tie), at nodes with D_i^max &gt;= the threshold; n_i = 0 elsewhere.</li>
 *   <li>At node i, particle p feeds field 1 if (x_p - c_i) . n_i &gt; 0 and field 0 otherwise: the two sides of the
 *       crack plane through c_i. Where n_i = 0 every particle feeds field 0, which is then the one field of the
 *       ordinary solver.</li>
 * </ol>
 * The damage-gradient normal and the partition of each node's particles into two fields are Homel and Herbold's.
 * Three details are Fray's choices: the normal comes from the node's steepest particle, since the grid gradient
 * of D vanishes on the mid-plane of a crack, where the partition matters most; the side is taken against the damage
 * centroid rather than against the sign of g_p, so that particles too far from the crack to feel its gradient
 * still land on their own side; and a node splits only near damage of at least the threshold.
 *
 * <p>Every sum runs in the colour order of the scatter, so results are bitwise identical for any thread count.
 * Nothing here is run state: the partition is rebuilt each step from positions and damage. Memory: 12 doubles per
 * grid node and 3 per particle, besides the second field's 4.
 */
public final class DamageGradientPartition implements FieldRouting {
    private final ParticleStore store;
    private final BlockLayout layout;
    private final SparseGrid grid;
    private final Stencil[] stencils;
    private final Workers workers;
    private final double threshold;
    private double[] gradient = new double[0];
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

    /**
     * @param store     the particles
     * @param layout    the particle blocks
     * @param grid      the grid
     * @param stencils  one stencil per worker
     * @param workers   the workers
     * @param threshold damage at which a node splits, (0, 1]
     */
    public DamageGradientPartition(ParticleStore store, BlockLayout layout, SparseGrid grid, Stencil[] stencils,
                                   Workers workers, double threshold) {
        this.store = store;
        this.layout = layout;
        this.grid = grid;
        this.stencils = stencils;
        this.workers = workers;
        this.threshold = threshold;
    }

    /** {@inheritDoc} Two: the material on either side of a crack. */
    @Override
    public int fieldCount() {
        return 2;
    }

    /** {@inheritDoc} */
    @Override
    public void ensureNodes() {
        int nodes = grid.nodeCount();
        if (weight.length < nodes) {
            int cap = Math.max(nodes, weight.length + weight.length / 2);
            weight = new double[cap];
            nodeDamage = new double[cap];
            maxDamage = new double[cap];
            centroid = new double[3 * cap];
            centroidWeight = new double[cap];
            reference = new double[3 * cap];
            reference2 = new double[cap];
        }
        if (gradient.length < 3 * store.size()) {
            gradient = new double[3 * store.size()];
        }
    }

    /** {@inheritDoc} */
    @Override
    public void zeroNodes(int from, int to) {
        int a = from * SparseGrid.NODES_PER_BLOCK;
        int b = to * SparseGrid.NODES_PER_BLOCK;
        Arrays.fill(weight, a, b, 0.0);
        Arrays.fill(nodeDamage, a, b, 0.0);
        Arrays.fill(maxDamage, a, b, 0.0);
        Arrays.fill(centroid, 3 * a, 3 * b, 0.0);
        Arrays.fill(centroidWeight, a, b, 0.0);
        Arrays.fill(reference, 3 * a, 3 * b, 0.0);
        Arrays.fill(reference2, a, b, 0.0);
    }

    /** {@inheritDoc} Steps 1 to 3 of the class comment. */
    @Override
    public void partition() {
        if (store.spec(DamageModel.DAMAGE) == null) {
            // No body can break: every reference stays 0 and every node carries one field.
            return;
        }
        double[] d = store.channel(DamageModel.DAMAGE);
        double[] mass = store.mass();
        double[] x = store.position();
        BlockSchedule.byColour(workers, layout, (w, r) -> {
            Stencil st = stencils[w];
            long key = layout.key(r);
            int n = st.support() * st.support() * st.support();
            for (int p = layout.start(r), end = layout.end(r); p < end; p++) {
                int lb = st.locate(x, p, key, Stencil.NO_DERIVATIVES);
                st.products(false);
                double m = mass[p], dp = d[p];
                double px = x[3 * p], py = x[3 * p + 1], pz = x[3 * p + 2];
                double md = m * dp;
                for (int k = 0; k < n; k++) {
                    int node = st.node(layout, r, lb, k);
                    double wm = st.w[k] * m;
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
        Reductions.overNodes(workers, grid.blockCount(), (w, t, a, b) -> {
            for (int i = a; i < b; i++) {
                if (centroidWeight[i] > 0) {
                    double inv = 1 / centroidWeight[i];
                    centroid[3 * i] *= inv;
                    centroid[3 * i + 1] *= inv;
                    centroid[3 * i + 2] *= inv;
                    nodeDamage[i] /= weight[i];
                }
            }
        });
        workers.forEach(layout.blockCount(), (w, r) -> {
            Stencil st = stencils[w];
            long key = layout.key(r);
            int n = st.support() * st.support() * st.support();
            for (int p = layout.start(r), end = layout.end(r); p < end; p++) {
                int lb = st.locate(x, p, key, Stencil.RAW_DERIVATIVES);
                st.products(true);
                double gx = 0, gy = 0, gz = 0;
                for (int k = 0; k < n; k++) {
                    double di = nodeDamage[st.node(layout, r, lb, k)];
                    gx += di * st.gx[k];
                    gy += di * st.gy[k];
                    gz += di * st.gz[k];
                }
                gradient[3 * p] = gx;
                gradient[3 * p + 1] = gy;
                gradient[3 * p + 2] = gz;
            }
        });
        BlockSchedule.byColour(workers, layout, (w, r) -> {
            Stencil st = stencils[w];
            long key = layout.key(r);
            int n = st.support() * st.support() * st.support();
            for (int p = layout.start(r), end = layout.end(r); p < end; p++) {
                int lb = st.localBase(x, p, key);
                double gx = gradient[3 * p], gy = gradient[3 * p + 1], gz = gradient[3 * p + 2];
                double g2 = gx * gx + gy * gy + gz * gz;
                for (int k = 0; k < n; k++) {
                    int node = st.node(layout, r, lb, k);
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

    /** {@inheritDoc} Field 1 on the positive side of the node's crack plane, before this step's move. */
    @Override
    public int field(int p, int node) {
        double[] x = store.position();
        int p3 = 3 * p, n3 = 3 * node;
        return (x[p3] - centroid[n3]) * reference[n3] + (x[p3 + 1] - centroid[n3 + 1]) * reference[n3 + 1]
                + (x[p3 + 2] - centroid[n3 + 2]) * reference[n3 + 2] > 0 ? 1 : 0;
    }

    /** {@inheritDoc} The reference gradients n_i, 1/m. */
    @Override
    public double[] normals() {
        return reference;
    }

    /** {@inheritDoc} */
    @Override
    public double[] normalLengths2() {
        return reference2;
    }

    /** {@inheritDoc} */
    @Override
    public long memoryBytes() {
        return 8L * (weight.length + nodeDamage.length + maxDamage.length + centroid.length
                + centroidWeight.length + reference.length + reference2.length + gradient.length);
    }
}

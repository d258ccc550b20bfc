package dev.fray.core.contact;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.Stencil;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.GridFixture;
import org.junit.jupiter.api.Test;

import java.util.Arrays;

/**
 * Damage-field-gradient partitioning (Homel and Herbold, IJNME 109, 2017) on a slab of particles with a fully
 * damaged band of two particle layers around the plane x = 0.5 m: at every node near the band the particles on
 * either side of the plane feed different fields, the node normal lies across the plane, and nodes that no
 * damaged particle reaches carry one field.
 */
class DamageGradientPartitionTest extends FrayTestBase {
    private static final double DX = 0.05;
    private static final double SPACING = DX / 2;
    private static final double PLANE = 0.5;

    @Test
    void particlesOnEitherSideOfADamagedPlaneFeedDifferentFields() {
        try (GridFixture fx = slab(2)) {
            DamageGradientPartition part = partition(fx);
            int nodes = fx.grid.nodeCount();
            double[] n = part.normals();
            double[] len2 = part.normalLengths2();
            int[] left = new int[nodes];
            int[] right = new int[nodes];
            Arrays.fill(left, -1);
            Arrays.fill(right, -1);
            double[] x = fx.store.position();
            Stencil st = fx.stencils[0];
            int s = fx.kernel.support();
            for (int r = 0; r < fx.layout.blockCount(); r++) {
                for (int p = fx.layout.start(r); p < fx.layout.end(r); p++) {
                    int lb = st.locate(x, p, fx.layout.key(r), Stencil.NO_DERIVATIVES);
                    int[] side = x[3 * p] < PLANE ? left : right;
                    for (int k = 0; k < s * s * s; k++) {
                        int node = st.node(fx.layout, r, lb, k);
                        int f = part.field(p, node);
                        if (len2[node] == 0 && f != 0) {
                            fail("node " + node + " has one field, but particle " + p + " feeds field " + f);
                        }
                        if (side[node] >= 0 && side[node] != f) {
                            fail("particles on one side of the plane feed both fields at node " + node);
                        }
                        side[node] = f;
                    }
                }
            }
            int split = 0;
            double[] at = new double[3];
            for (int i = 0; i < nodes; i++) {
                fx.nodePosition(i, at);
                // Particles reach nodes within 1.5 dx; the damaged layers sit 0.5 spacing either side of the plane.
                boolean nearBand = Math.abs(at[0] - PLANE) < 1.5 * DX - SPACING / 2 - 1e-9;
                if (left[i] < 0 || right[i] < 0) {
                    continue;
                }
                assertEquals(nearBand, len2[i] > 0, "node at x = " + at[0] + " splits iff damaged particles reach it");
                if (len2[i] > 0) {
                    split++;
                    assertTrue(left[i] != right[i], "the two sides feed different fields at node " + i);
                    assertTrue(Math.abs(n[3 * i]) > 0.999 * Math.sqrt(len2[i]), "normal across the plane at node " + i);
                }
            }
            assertTrue(split > 50, "nodes split: " + split);
        }
    }

    /** The partition's normals are the same bits with 1 and 2 workers (DESIGN.md section 3). */
    @Test
    void partitionDoesNotDependOnThreads() {
        try (GridFixture one = slab(1); GridFixture two = slab(2)) {
            DamageGradientPartition a = partition(one);
            DamageGradientPartition b = partition(two);
            int nodes = one.grid.nodeCount();
            assertEquals(nodes, two.grid.nodeCount());
            assertArrayEquals(Arrays.copyOf(a.normals(), 3 * nodes), Arrays.copyOf(b.normals(), 3 * nodes), 0.0);
        }
    }

    /** A slab [0.3, 0.7] x [0.35, 0.65]^2 m on a lattice of half a cell; damage 1 in the two layers at the plane. */
    private static GridFixture slab(int threads) {
        int nx = 16;
        int ny = 12;
        ParticleStore store = new ParticleStore(nx * ny * ny);
        store.declare(new ChannelSpec(DamageModel.DAMAGE, 1, 0, "1", "damage"));
        double[] x = store.position();
        double[] d = store.channel(DamageModel.DAMAGE);
        int p = 0;
        for (int i = 0; i < nx; i++) {
            for (int j = 0; j < ny; j++) {
                for (int k = 0; k < ny; k++) {
                    x[3 * p] = 0.3 + (i + 0.5) * SPACING;
                    x[3 * p + 1] = 0.35 + (j + 0.5) * SPACING;
                    x[3 * p + 2] = 0.35 + (k + 0.5) * SPACING;
                    store.mass()[p] = 1000 * SPACING * SPACING * SPACING;
                    d[p] = Math.abs(x[3 * p] - PLANE) < SPACING ? 1 : 0;
                    p++;
                }
            }
        }
        return new GridFixture(store, Kernel.QUADRATIC, new double[3], DX, threads);
    }

    private static DamageGradientPartition partition(GridFixture fx) {
        DamageGradientPartition part = new DamageGradientPartition(fx.store, fx.layout, fx.grid, fx.stencils,
                fx.workers, 0.5);
        assertEquals(2, part.fieldCount());
        part.ensureNodes();
        part.zeroNodes(0, fx.grid.blockCount());
        part.partition();
        return part;
    }
}

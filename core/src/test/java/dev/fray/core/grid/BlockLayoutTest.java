package dev.fray.core.grid;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import dev.fray.core.kernel.Kernel;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.GridFixture;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

import java.util.Arrays;
import java.util.Random;

/**
 * The block layout after {@link BlockLayout#prepare}: sorted particles, active blocks, the block-local node map and
 * the colour classes, each checked against plain integer arithmetic on node coordinates (common practice, no
 * source: the sparse blocked grid and colour-phased scatter of DESIGN.md sections 2 and 3).
 */
class BlockLayoutTest extends FrayTestBase {
    private static final double DX = 0.05;
    private static final double[] ORIGIN = {-0.3, 0.1, 0.0};
    private static final int N = 2000;
    private static final int L = BlockLayout.LOCAL;

    /**
     * Particles are grouped by the block of their first stencil node, blocks in increasing key order, and keep
     * their original order within a block (a stable sort); every channel moved with them.
     */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void sortGroupsParticlesByBlockStably(Kernel kernel) {
        ParticleStore store = scattered(new Random(SEED));
        double[] original = store.position().clone();
        try (GridFixture fx = new GridFixture(store, kernel, ORIGIN, DX, 2)) {
            BlockLayout layout = fx.layout;
            assertFalse(layout.sortNeeded());
            int[] id = store.id();
            double[] x = store.position();
            assertEquals(0, layout.start(0));
            assertEquals(N, layout.end(layout.blockCount() - 1));
            for (int r = 0; r < layout.blockCount(); r++) {
                if (r > 0) {
                    assertTrue(layout.key(r) > layout.key(r - 1), "block keys increase");
                    assertEquals(layout.end(r - 1), layout.start(r), "blocks are contiguous");
                }
                assertTrue(layout.end(r) > layout.start(r), "no empty particle block");
                for (int p = layout.start(r); p < layout.end(r); p++) {
                    int[] first = firstNode(kernel, x, p);
                    long key = SparseGrid.key(Math.floorDiv(first[0], 4), Math.floorDiv(first[1], 4),
                            Math.floorDiv(first[2], 4));
                    assertEquals(key, layout.key(r), "particle " + p + " sits in its block");
                    if (p > layout.start(r)) {
                        assertTrue(id[p] > id[p - 1], "particles keep their order within block " + r);
                    }
                    for (int k = 0; k < 3; k++) {
                        assertEquals(original[3 * id[p] + k], x[3 * p + k], "position moved with its particle");
                    }
                }
            }
            layout.requestSort();
            assertTrue(layout.sortNeeded());
        }
    }

    /**
     * Every node of every particle's stencil lies in an active block, and both {@link Stencil#node} and
     * {@link BlockLayout#node} name the node that {@link SparseGrid#find} gives for the node's block:
     * 64 block + 16 (i mod 4) + 4 (j mod 4) + (k mod 4). Each particle's first node lies in its block's range.
     */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void stencilNodesAreActiveAndMapToTheGrid(Kernel kernel) {
        try (GridFixture fx = new GridFixture(scattered(rand), kernel, ORIGIN, DX, 2)) {
            BlockLayout layout = fx.layout;
            Stencil st = fx.stencils[0];
            int s = kernel.support();
            double[] x = fx.store.position();
            int[] ranges = layout.ranges();
            for (int r = 0; r < layout.blockCount(); r++) {
                long key = layout.key(r);
                int[] o = {localOriginOf(SparseGrid.keyX(key)), localOriginOf(SparseGrid.keyY(key)),
                    localOriginOf(SparseGrid.keyZ(key))};
                for (int p = layout.start(r); p < layout.end(r); p++) {
                    int lb = st.locate(x, p, key, Stencil.NO_DERIVATIVES);
                    int[] first = firstNode(kernel, x, p);
                    for (int a = 0; a < 3; a++) {
                        int local = first[a] - o[a];
                        assertTrue(local >= ranges[6 * r + a] && local <= ranges[6 * r + 3 + a],
                                "first node of particle " + p + " inside its block's range, axis " + a);
                    }
                    for (int k = 0; k < s * s * s; k++) {
                        int expected = gridNode(fx.grid, first[0] + k / (s * s), first[1] + (k / s) % s,
                                first[2] + k % s);
                        int actual = st.node(layout, r, lb, k);
                        if (expected < 0 || actual != expected) {
                            fail("stencil node " + k + " of particle " + p + ": grid node " + expected
                                    + " (-1: block not active), Stencil.node gives " + actual);
                        }
                    }
                }
                for (int lx = 0; lx < L; lx++) {
                    for (int ly = 0; ly < L; ly++) {
                        for (int lz = 0; lz < L; lz++) {
                            int expected = gridNode(fx.grid, o[0] + lx, o[1] + ly, o[2] + lz);
                            int actual = layout.node(r, lx, ly, lz);
                            if (expected < 0 || actual != expected) {
                                fail("buffer node (" + lx + ", " + ly + ", " + lz + ") of block " + r + ": grid node "
                                        + expected + " (-1: block not active), BlockLayout.node gives " + actual);
                            }
                        }
                    }
                }
            }
        }
    }

    /**
     * The colour classes partition the particle blocks by coordinate parity, and the whole block-local buffers of
     * the blocks of one colour share no node: the race freedom the colour loop relies on.
     */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void blocksOfOneColourWriteDisjointNodes(Kernel kernel) {
        try (GridFixture fx = new GridFixture(scattered(rand), kernel, ORIGIN, DX, 2)) {
            BlockLayout layout = fx.layout;
            int nb = layout.blockCount();
            int[] blocks = layout.colourBlocks();
            assertEquals(0, layout.colourStart(0));
            assertEquals(nb, layout.colourStart(8));
            boolean[] seen = new boolean[nb];
            int[] owner = new int[fx.grid.nodeCount()];
            for (int c = 0; c < 8; c++) {
                Arrays.fill(owner, -1);
                for (int i = layout.colourStart(c); i < layout.colourStart(c + 1); i++) {
                    int r = blocks[i];
                    assertFalse(seen[r], "block " + r + " listed once");
                    seen[r] = true;
                    long key = layout.key(r);
                    int parity = (Math.floorMod(SparseGrid.keyX(key), 2) << 2)
                            | (Math.floorMod(SparseGrid.keyY(key), 2) << 1) | Math.floorMod(SparseGrid.keyZ(key), 2);
                    assertEquals(c, parity, "colour of block " + r);
                    for (int l = 0; l < L * L * L; l++) {
                        int node = layout.node(r, l / (L * L), (l / L) % L, l % L);
                        if (owner[node] >= 0 && owner[node] != r) {
                            fail("blocks " + owner[node] + " and " + r + " of colour " + c + " share node " + node);
                        }
                        owner[node] = r;
                    }
                }
            }
            for (int r = 0; r < nb; r++) {
                assertTrue(seen[r], "block " + r + " has a colour");
            }
        }
    }

    /** The sorted order and the block table do not depend on the number of threads (DESIGN.md section 3). */
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void layoutDoesNotDependOnThreads(Kernel kernel) {
        try (GridFixture one = new GridFixture(scattered(new Random(SEED)), kernel, ORIGIN, DX, 1);
             GridFixture three = new GridFixture(scattered(new Random(SEED)), kernel, ORIGIN, DX, 3)) {
            assertArrayEquals(one.layout.keysCopy(), three.layout.keysCopy());
            assertArrayEquals(one.layout.startsCopy(), three.layout.startsCopy());
            assertArrayEquals(one.store.id(), three.store.id());
        }
    }

    /**
     * Random particles: a dense clump, a sparse cloud and a few strays, some on negative block coordinates, so that
     * there are blocks of every colour with and without neighbours.
     */
    private static ParticleStore scattered(Random r) {
        ParticleStore s = GridFixture.randomParticles(r, N, -0.6, 1.4);
        double[] x = s.position();
        for (int p = 0; p < N / 2; p++) {
            for (int k = 0; k < 3; k++) {
                x[3 * p + k] = 0.3 + 0.2 * r.nextDouble();
            }
        }
        return s;
    }

    /** First stencil node per axis: floor(x / dx - 0.5) for the quadratic, floor(x / dx - 1) for the cubic B-spline. */
    static int[] firstNode(Kernel kernel, double[] x, int p) {
        double shift = kernel == Kernel.QUADRATIC ? 0.5 : 1.0;
        int[] n = new int[3];
        for (int a = 0; a < 3; a++) {
            n[a] = (int) Math.floor((x[3 * p + a] - ORIGIN[a]) / DX - shift);
        }
        return n;
    }

    /** Grid node coordinate of local coordinate 0 of a block's buffer: one node below the block's first node. */
    private static int localOriginOf(int blockCoord) {
        return 4 * blockCoord - 1;
    }

    /** @return the grid node at lattice coordinates (i, j, k), or -1 if its block is not active */
    static int gridNode(SparseGrid grid, int i, int j, int k) {
        int b = grid.find(SparseGrid.key(Math.floorDiv(i, 4), Math.floorDiv(j, 4), Math.floorDiv(k, 4)));
        return b < 0 ? -1 : 64 * b + 16 * Math.floorMod(i, 4) + 4 * Math.floorMod(j, 4) + Math.floorMod(k, 4);
    }
}

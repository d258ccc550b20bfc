package dev.fray.core.grid;

import dev.fray.core.kernel.Kernel;
import dev.fray.core.parallel.Workers;
import dev.fray.core.particles.ParticleStore;

import java.util.Arrays;

/**
 * Which grid blocks the particles occupy and in what order the solver walks them: particles sorted by block
 * (stable counting sort on packed block keys), the grid blocks their stencils reach activated in the
 * {@link SparseGrid}, each particle block's 27 neighbour blocks, the range of stencil bases of its particles, and
 * the 8 colour classes by block-coordinate parity that let blocks of one colour scatter in parallel without two
 * threads writing one node.
 *
 * <p>Each particle block owns a dense block-local node buffer of {@link #LOCAL}<sup>3</sup> nodes starting
 * {@link #MARGIN} node below the block; {@link #node} maps its local coordinates to grid nodes. Particles are
 * sorted again only when one leaves the reach of its block's buffer ({@link #markLeft}); moving every particle
 * array costs as much as a scatter. Not thread-safe to rebuild; per-block queries may run from any worker.
 */
public final class BlockLayout {
    /**
     * How far, in nodes, a particle's first stencil node may lie outside its block before the particles are sorted
     * again. With the block-local buffer of {@link #LOCAL} nodes starting one node below the block, blocks of one
     * colour (8 nodes apart) still write disjoint nodes.
     */
    public static final int MARGIN = 1;
    /** Edge of the block-local node buffer: a block's 4 nodes plus the stencil's reach into the next block. */
    public static final int LOCAL = 8;
    /** Neighbour blocks held per particle block. */
    public static final int NEIGHBOURS = 27;
    /** Particles per task of particle-wise parallel loops (a fixed partition, whatever the thread count). */
    public static final int PARTICLE_CHUNK = 4096;

    private final SparseGrid grid;
    private final Kernel kernel;
    private final double ox, oy, oz, invDx;
    private long[] keys = new long[0];
    private int[] order = new int[0];
    private int[] ints = new int[0];
    private final KeyIndex lookup = new KeyIndex();
    private int blockCount;
    private long[] blockKeys = new long[64];
    private int[] blockStart = new int[65];
    private int[] blockCounts = new int[64];
    private int[] blockRank = new int[64];
    /** Grid block of each of the 27 blocks around a particle block (offsets -1, 0, 1 per axis, x slowest). */
    private int[] neighbours = new int[64 * NEIGHBOURS];
    /** Per particle block: smallest and largest local stencil base of its particles (x, y, z). */
    private int[] blockRange = new int[64 * 6];
    private boolean[] blockLeft = new boolean[64];
    private final int[] colourStart = new int[9];
    private final int[] colourCursor = new int[9];
    private int[] colourBlocks = new int[64];
    private boolean sortNeeded = true;

    /**
     * @param grid   the grid whose blocks this layout activates
     * @param kernel interpolation kernel (sets the stencil)
     * @param ox     grid origin x, m
     * @param oy     grid origin y, m
     * @param oz     grid origin z, m
     * @param dx     cell size, m
     */
    public BlockLayout(SparseGrid grid, Kernel kernel, double ox, double oy, double oz, double dx) {
        this.grid = grid;
        this.kernel = kernel;
        this.ox = ox;
        this.oy = oy;
        this.oz = oz;
        this.invDx = 1.0 / dx;
    }

    /** @return local coordinate (0 to LOCAL - 1) of block-relative node coordinate 0: the buffer starts MARGIN below */
    public static int localOrigin(int blockCoord) {
        return 4 * blockCoord - MARGIN;
    }

    /** @return the colour (0 to 7) of a block: the parity of its coordinates */
    public static int colour(long key) {
        return ((SparseGrid.keyX(key) & 1) << 2) | ((SparseGrid.keyY(key) & 1) << 1) | (SparseGrid.keyZ(key) & 1);
    }

    private int blockOf(double xi) {
        return kernel.base(xi) >> 2;
    }

    /** @return whether the particles must be sorted before the next step */
    public boolean sortNeeded() {
        return sortNeeded;
    }

    /** Asks for a sort before the next step (after particles were replaced or restored). */
    public void requestSort() {
        sortNeeded = true;
    }

    /**
     * Sorts the particles by block if a sort is due, then activates the blocks their stencils reach.
     *
     * @param store   the particles, permuted in place
     * @param workers the workers
     */
    public void prepare(ParticleStore store, Workers workers) {
        if (sortNeeded) {
            sort(store, workers);
            activate(store, workers);
            sortNeeded = false;
        }
    }

    /**
     * Sorts the particles by block: counting sort on the block of each particle's first stencil node, stable so
     * that particles keep their order within a block.
     */
    private void sort(ParticleStore store, Workers workers) {
        int n = store.size();
        if (keys.length < n) {
            keys = new long[n];
            order = new int[n];
            ints = new int[n];
        }
        double[] x = store.position();
        int tasks = (n + PARTICLE_CHUNK - 1) / PARTICLE_CHUNK;
        workers.forEach(tasks, (w, t) -> {
            int a = t * PARTICLE_CHUNK;
            int b = Math.min(n, a + PARTICLE_CHUNK);
            for (int p = a; p < b; p++) {
                keys[p] = SparseGrid.key(blockOf((x[3 * p] - ox) * invDx), blockOf((x[3 * p + 1] - oy) * invDx),
                        blockOf((x[3 * p + 2] - oz) * invDx));
            }
        });
        // Dense ids in first-appearance order, then ranks by key so blocks are in key order.
        lookup.clear();
        int[] ids = ints;
        long lastKey = Long.MIN_VALUE;
        int lastId = -1;
        for (int p = 0; p < n; p++) {
            long k = keys[p];
            if (k != lastKey) {
                lastId = lookup.id(k);
                lastKey = k;
            }
            ids[p] = lastId;
        }
        blockCount = lookup.size();
        ensureBlockCapacity(blockCount);
        long[] uniq = lookup.keys();
        System.arraycopy(uniq, 0, blockKeys, 0, blockCount);
        Arrays.sort(blockKeys, 0, blockCount);
        for (int i = 0; i < blockCount; i++) {
            blockRank[i] = Arrays.binarySearch(blockKeys, 0, blockCount, uniq[i]);
        }
        Arrays.fill(blockCounts, 0, blockCount, 0);
        for (int p = 0; p < n; p++) {
            blockCounts[blockRank[ids[p]]]++;
        }
        blockStart[0] = 0;
        for (int r = 0; r < blockCount; r++) {
            blockStart[r + 1] = blockStart[r] + blockCounts[r];
        }
        System.arraycopy(blockStart, 0, blockCounts, 0, blockCount);
        for (int p = 0; p < n; p++) {
            order[blockCounts[blockRank[ids[p]]]++] = p;
        }
        store.permute(order, workers);
    }

    /**
     * From the particle blocks (keys and starts): activates the grid blocks their stencils reach (each particle
     * block and its 26 neighbours, since particles may drift {@link #MARGIN} node beyond their block), sorts the
     * blocks into colour classes, and finds each block's range of stencil bases.
     *
     * @return false if some particle lies beyond the reach of its block (the table does not fit the particles)
     */
    private boolean activate(ParticleStore store, Workers workers) {
        grid.clear();
        for (int r = 0; r < blockCount; r++) {
            long k = blockKeys[r];
            int bx = SparseGrid.keyX(k), by = SparseGrid.keyY(k), bz = SparseGrid.keyZ(k);
            for (int nbr = 0; nbr < NEIGHBOURS; nbr++) {
                neighbours[NEIGHBOURS * r + nbr] = grid.activate(SparseGrid.key(bx + nbr / 9 - 1,
                        by + (nbr / 3) % 3 - 1, bz + nbr % 3 - 1));
            }
        }
        grid.allocateNodes();
        double[] x = store.position();
        workers.forEach(blockCount, (w, r) -> blockLeft[r] = !measure(x, r));
        boolean fits = true;
        for (int r = 0; r < blockCount; r++) {
            fits &= !blockLeft[r];
        }
        int[] cc = colourCursor;
        Arrays.fill(cc, 0);
        for (int r = 0; r < blockCount; r++) {
            cc[colour(blockKeys[r]) + 1]++;
        }
        for (int c = 0; c < 8; c++) {
            cc[c + 1] += cc[c];
        }
        System.arraycopy(cc, 0, colourStart, 0, 9);
        for (int r = 0; r < blockCount; r++) {
            colourBlocks[cc[colour(blockKeys[r])]++] = r;
        }
        return fits;
    }

    /** Records the range of local stencil bases of block r's particles; false if one lies beyond its reach. */
    private boolean measure(double[] x, int r) {
        long key = blockKeys[r];
        int baseX = localOrigin(SparseGrid.keyX(key)), baseY = localOrigin(SparseGrid.keyY(key));
        int baseZ = localOrigin(SparseGrid.keyZ(key));
        int loX = LOCAL, loY = LOCAL, loZ = LOCAL, hiX = -1, hiY = -1, hiZ = -1;
        for (int p = blockStart[r]; p < blockStart[r + 1]; p++) {
            int bx = kernel.base((x[3 * p] - ox) * invDx) - baseX;
            int by = kernel.base((x[3 * p + 1] - oy) * invDx) - baseY;
            int bz = kernel.base((x[3 * p + 2] - oz) * invDx) - baseZ;
            loX = Math.min(loX, bx);
            loY = Math.min(loY, by);
            loZ = Math.min(loZ, bz);
            hiX = Math.max(hiX, bx);
            hiY = Math.max(hiY, by);
            hiZ = Math.max(hiZ, bz);
        }
        return setRange(r, loX, loY, loZ, hiX, hiY, hiZ);
    }

    /**
     * Sets block r's range of local stencil bases for the next step (clipped to what its buffer holds).
     *
     * @return false if a base lies beyond the block's reach, so the particles must be sorted again
     */
    public boolean setRange(int r, int loX, int loY, int loZ, int hiX, int hiY, int hiZ) {
        int top = LOCAL - kernel.support();
        boolean fits = loX >= 0 && loY >= 0 && loZ >= 0 && hiX <= top && hiY <= top && hiZ <= top;
        int[] br = blockRange;
        br[6 * r] = Math.max(0, loX);
        br[6 * r + 1] = Math.max(0, loY);
        br[6 * r + 2] = Math.max(0, loZ);
        br[6 * r + 3] = Math.min(top, hiX);
        br[6 * r + 4] = Math.min(top, hiY);
        br[6 * r + 5] = Math.min(top, hiZ);
        return fits;
    }

    /** Records whether a particle of block r left its reach in this step (read by {@link #collectLeft}). */
    public void markLeft(int r, boolean left) {
        blockLeft[r] = left;
    }

    /** Folds the blocks' {@link #markLeft} flags into the sort decision of the next step. */
    public void collectLeft() {
        for (int r = 0; r < blockCount; r++) {
            sortNeeded |= blockLeft[r];
        }
    }

    private void ensureBlockCapacity(int nb) {
        if (blockKeys.length < nb) {
            int cap = Math.max(nb, blockKeys.length * 2);
            blockKeys = new long[cap];
            blockStart = new int[cap + 1];
            blockCounts = new int[cap];
            blockRank = new int[cap];
            neighbours = new int[NEIGHBOURS * cap];
            blockRange = new int[6 * cap];
            blockLeft = new boolean[cap];
            colourBlocks = new int[cap];
        }
    }

    /** @return how many particle blocks the per-block arrays hold now; rooms size their own per-block arrays to it */
    public int capacity() {
        return blockKeys.length;
    }

    /**
     * Grid node at local coordinates (lx, ly, lz), each in [0, LOCAL), of particle block r's buffer.
     *
     * @return the node index in the {@link SparseGrid}
     */
    public int node(int r, int lx, int ly, int lz) {
        int gx = lx - MARGIN, gy = ly - MARGIN, gz = lz - MARGIN;
        int nbr = 9 * ((gx >> 2) + 1) + 3 * ((gy >> 2) + 1) + (gz >> 2) + 1;
        return (neighbours[NEIGHBOURS * r + nbr] << 6) + ((gx & 3) << 4) + ((gy & 3) << 2) + (gz & 3);
    }

    /** @return number of particle blocks */
    public int blockCount() {
        return blockCount;
    }

    /** @return packed key of particle block r */
    public long key(int r) {
        return blockKeys[r];
    }

    /** @return first particle of block r */
    public int start(int r) {
        return blockStart[r];
    }

    /** @return end (exclusive) of block r's particles */
    public int end(int r) {
        return blockStart[r + 1];
    }

    /** @return block r's range of local stencil bases: lo x, y, z then hi x, y, z at 6 r (live array, read only) */
    public int[] ranges() {
        return blockRange;
    }

    /** @return the first block index of colour c's list in {@link #colourBlocks()}, c in 0..8 */
    public int colourStart(int c) {
        return colourStart[c];
    }

    /** @return the particle blocks ordered by colour (live array, read only) */
    public int[] colourBlocks() {
        return colourBlocks;
    }

    /** @return the particle blocks in storage order as keys (a copy), for checkpoints */
    public long[] keysCopy() {
        return Arrays.copyOf(blockKeys, blockCount);
    }

    /** @return first particle of each block plus the particle count (a copy), for checkpoints */
    public int[] startsCopy() {
        return Arrays.copyOf(blockStart, blockCount + 1);
    }

    /**
     * Installs a saved block table and activates its blocks.
     *
     * @return false if the table does not fit the particles (the next step then sorts afresh)
     */
    public boolean restore(long[] keysIn, int[] startsIn, ParticleStore store, Workers workers) {
        int nb = keysIn.length;
        boolean ok = startsIn.length == nb + 1 && nb > 0 && startsIn[0] == 0 && startsIn[nb] == store.size();
        for (int r = 0; ok && r < nb; r++) {
            ok = startsIn[r + 1] > startsIn[r] && (r == 0 || keysIn[r] > keysIn[r - 1]);
        }
        if (ok) {
            ensureBlockCapacity(nb);
            blockCount = nb;
            System.arraycopy(keysIn, 0, blockKeys, 0, nb);
            System.arraycopy(startsIn, 0, blockStart, 0, nb + 1);
            ok = activate(store, workers);
        }
        sortNeeded = !ok;
        return ok;
    }
}

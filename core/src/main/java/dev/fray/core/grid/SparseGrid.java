package dev.fray.core.grid;

import java.util.Arrays;

/**
 * Sparse blocked background grid. Nodes are grouped in blocks of 4x4x4; only blocks that particles touch are
 * stored, found through a hash of their integer block coordinates, so memory grows with the occupied blocks and
 * not with the domain's bounding box. Node (i, j, k) of the integer lattice sits at origin + (i, j, k) dx.
 *
 * <p>Node data are flat arrays indexed by {@code 64 * block + 16 * lx + 4 * ly + lz}: mass (kg) and velocity or
 * momentum (3 per node, m/s or kg m/s). Further velocity fields per node live in a {@link FieldSet}. Not
 * thread-safe to rebuild; the solver fills disjoint node ranges from several threads.
 */
public final class SparseGrid {
    /** Nodes per block edge. */
    public static final int BLOCK = 4;
    /** Nodes per block. */
    public static final int NODES_PER_BLOCK = BLOCK * BLOCK * BLOCK;
    private static final int COORD_BITS = 21;
    private static final int COORD_OFFSET = 1 << (COORD_BITS - 1);
    private static final long COORD_MASK = (1L << COORD_BITS) - 1;

    private final BlockMap map = new BlockMap(1024);
    private int blocks;
    private int[] blockCoords = new int[3 * 256];
    private double[] mass = new double[0];
    private double[] momentum = new double[0];
    private long peakBytes;

    /**
     * Packs integer block coordinates into a key; keys sort in x-major, then y, then z order.
     *
     * @param bx block x, |bx| &lt; 2^20
     * @param by block y
     * @param bz block z
     * @return the key
     */
    public static long key(int bx, int by, int bz) {
        return ((long) (bx + COORD_OFFSET) << (2 * COORD_BITS)) | ((long) (by + COORD_OFFSET) << COORD_BITS)
                | (bz + COORD_OFFSET);
    }

    /** @return block x of a key */
    public static int keyX(long key) {
        return (int) ((key >>> (2 * COORD_BITS)) & COORD_MASK) - COORD_OFFSET;
    }

    /** @return block y of a key */
    public static int keyY(long key) {
        return (int) ((key >>> COORD_BITS) & COORD_MASK) - COORD_OFFSET;
    }

    /** @return block z of a key */
    public static int keyZ(long key) {
        return (int) (key & COORD_MASK) - COORD_OFFSET;
    }

    /** Forgets all blocks (keeps the storage for reuse). */
    public void clear() {
        map.clear();
        blocks = 0;
    }

    /**
     * Activates a block if it is not active yet.
     *
     * @param key packed block coordinates
     * @return the block's index
     */
    public int activate(long key) {
        int before = map.size();
        int b = map.getOrInsert(key);
        if (map.size() != before) {
            if (3 * (b + 1) > blockCoords.length) {
                blockCoords = Arrays.copyOf(blockCoords, blockCoords.length * 2);
            }
            blockCoords[3 * b] = keyX(key);
            blockCoords[3 * b + 1] = keyY(key);
            blockCoords[3 * b + 2] = keyZ(key);
            blocks = b + 1;
        }
        return b;
    }

    /**
     * @param key packed block coordinates
     * @return the block's index or -1 if not active
     */
    public int find(long key) {
        return map.get(key);
    }

    /**
     * Sizes the node arrays for the active blocks (growing only). Call after activation. Arrays that are reused keep
     * their old values, so the caller zeroes the nodes ({@link #zero}) before scattering into them.
     */
    public void allocateNodes() {
        int nodes = blocks * NODES_PER_BLOCK;
        if (mass.length < nodes) {
            int cap = Math.max(nodes, mass.length + mass.length / 2);
            mass = new double[cap];
            momentum = new double[3 * cap];
        }
        long bytes = mass.length * (8L + 24L) + map.memoryBytes() + blockCoords.length * 4L;
        peakBytes = Math.max(peakBytes, bytes);
    }

    /**
     * Zeroes the node data of blocks [from, to).
     *
     * @param from first block
     * @param to   end block, exclusive
     */
    public void zero(int from, int to) {
        int a = from * NODES_PER_BLOCK;
        int b = to * NODES_PER_BLOCK;
        Arrays.fill(mass, a, b, 0.0);
        Arrays.fill(momentum, 3 * a, 3 * b, 0.0);
    }

    /** @return number of active blocks */
    public int blockCount() {
        return blocks;
    }

    /** @return block coordinates, 3 per block (live array, do not modify) */
    public int[] blockCoords() {
        return blockCoords;
    }

    /** @return node masses in kg (live array) */
    public double[] mass() {
        return mass;
    }

    /** @return node momenta in kg m/s, turned into velocities in m/s by the grid update (live array) */
    public double[] momentum() {
        return momentum;
    }

    /** @return nodes in the active blocks */
    public int nodeCount() {
        return blocks * NODES_PER_BLOCK;
    }

    /** @return bytes held by the grid's arrays now */
    public long memoryBytes() {
        return mass.length * (8L + 24L) + map.memoryBytes() + blockCoords.length * 4L;
    }

    /** @return the largest {@link #memoryBytes()} seen since creation */
    public long peakMemoryBytes() {
        return peakBytes;
    }
}

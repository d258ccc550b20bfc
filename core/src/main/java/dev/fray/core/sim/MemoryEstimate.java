package dev.fray.core.sim;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.particles.ParticleSampler;

import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * What a simulation of a scene will hold in memory, worked out before anything is allocated: the particles from
 * the lattice counts (computed in floating point, so no count wraps around) and the share of each body's bounds
 * that its shape fills, the particle channels the laws and damage models declare, and the grid blocks the bodies
 * cover at the start. {@link Simulation} refuses a scene whose {@link #peakBytes()} exceeds the heap the JVM may
 * use, so that a run that cannot fit ends at once with advice instead of running out of memory later.
 *
 * <p>The figures are estimates: the grid grows when bodies spread, and arrays grow by doubling. The bench command
 * ({@code fray bench --particles N}) prints this estimate beside the heap a run retains.
 */
public final class MemoryEstimate {
    /** Bytes per particle besides the channels: body and id (4 + 4), the block sort's key and two indices (16). */
    static final long PARTICLE_OVERHEAD = 24;
    /** Bytes per grid node: mass and momentum (32), hash map and block tables (about 8), grown by doubling. */
    static final long NODE_BYTES = 48;
    /** Extra bytes per node of each additional velocity field and the crack partition's node arrays. */
    static final long SEPARATION_NODE_BYTES = 32 + 88;
    /** Extra bytes per node of the phase-field solve: its eight node arrays and the four CG vectors. */
    static final long PHASE_FIELD_NODE_BYTES = 12 * 8;
    /** Points per axis of the coarse lattice that measures how much of a body's bounds its shape fills. */
    private static final int PROBE = 24;

    private final long particles;
    private final int doublesPerParticle;
    private final long blocks;
    private final long particleBytes;
    private final long gridBytes;

    private MemoryEstimate(long particles, int doublesPerParticle, long blocks, long particleBytes, long gridBytes) {
        this.particles = particles;
        this.doublesPerParticle = doublesPerParticle;
        this.blocks = blocks;
        this.particleBytes = particleBytes;
        this.gridBytes = gridBytes;
    }

    /**
     * Estimates the memory of a simulation of a scene. Evaluates each body's shape at no more than 24^3 points.
     *
     * @param scene the scene (input, not modified)
     * @return the estimate
     * @throws InvalidInputException if a body's lattice would hold more than
     *                               {@link ParticleSampler#MAX_LATTICE_POINTS} points
     */
    public static MemoryEstimate of(Scene scene) {
        double dx = scene.cellSize();
        double count = 0;
        double blockCount = 0;
        boolean phaseField = false;
        Map<String, Integer> widths = new HashMap<>();
        for (ChannelSpec c : List.of(ChannelSpec.of("position", 3, "m"), ChannelSpec.of("velocity", 3, "m/s"),
                ChannelSpec.of("affine", 9, "1/s"), ChannelSpec.of("deformation", 9, "1"),
                ChannelSpec.of("mass", 1, "kg"), ChannelSpec.of("volume", 1, "m^3"))) {
            widths.put(c.name(), c.width());
        }
        if (!scene.grips().isEmpty()) {
            widths.put(ParticleSampler.GRIP_CHANNEL, 1);
        }
        double blockSize = SparseGrid.BLOCK * dx;
        for (Body body : scene.bodies()) {
            double s = ParticleSampler.spacing(body, dx);
            double[] n = ParticleSampler.latticeCounts(body, s);
            double points = n[0] * n[1] * n[2];
            double inside = points <= PROBE * PROBE * PROBE ? points : points * filledShare(body, n, s);
            count += inside;
            Bounds bb = body.shape().bounds();
            double boxBlocks = (Math.ceil((bb.maxX() - bb.minX()) / blockSize) + 1)
                    * (Math.ceil((bb.maxY() - bb.minY()) / blockSize) + 1)
                    * (Math.ceil((bb.maxZ() - bb.minZ()) / blockSize) + 1);
            // A particle's stencil touches at most 8 blocks; the bounds overstate thin slanted shapes.
            blockCount += Math.min(boxBlocks, 8 * Math.max(1, inside));
            for (ChannelSpec c : body.material().channels()) {
                widths.put(c.name(), c.width());
            }
            if (body.damage() != null) {
                DamageModel d = body.damage().resolvedFor(dx);
                phaseField |= d.usesPhaseField();
                for (ChannelSpec c : d.channels()) {
                    widths.put(c.name(), c.width());
                }
            }
        }
        int doubles = 0;
        for (int w : widths.values()) {
            doubles += w;
        }
        long np = Math.round(Math.min(count, Long.MAX_VALUE / 1024.0));
        long nb = Math.round(Math.min(blockCount, Long.MAX_VALUE / 1024.0 / SparseGrid.NODES_PER_BLOCK));
        long perNode = NODE_BYTES + (scene.separates() ? SEPARATION_NODE_BYTES + 24 : 0)
                + (phaseField ? PHASE_FIELD_NODE_BYTES : 0);
        // The phase-field solve keeps its coefficients per particle; separation keeps a damage gradient.
        long perParticle = PARTICLE_OVERHEAD + 8L * doubles + (scene.separates() ? 24 : 0)
                + (phaseField ? 8L * DamageModel.COEFFICIENTS : 0);
        return new MemoryEstimate(np, doubles, nb, saturatingProduct(np, perParticle),
                saturatingProduct(nb * SparseGrid.NODES_PER_BLOCK, perNode));
    }

    /** Share of a body's lattice inside its shape, from a coarse lattice over the same bounds. */
    private static double filledShare(Body body, double[] n, double s) {
        Bounds bb = body.shape().bounds();
        double[] lo = {bb.minX(), bb.minY(), bb.minZ()};
        double[] hi = {bb.maxX(), bb.maxY(), bb.maxZ()};
        int[] m = new int[3];
        double[] step = new double[3];
        double[] start = new double[3];
        for (int a = 0; a < 3; a++) {
            m[a] = (int) Math.min(PROBE, n[a]);
            double mid = 0.5 * (lo[a] + hi[a]);
            double span = n[a] * s;   // the lattice's cells, centred like the sampler's points
            step[a] = span / m[a];
            start[a] = mid - 0.5 * span + 0.5 * step[a];   // the midpoint of each coarse cell
        }
        int in = 0;
        for (int i = 0; i < m[0]; i++) {
            for (int j = 0; j < m[1]; j++) {
                for (int k = 0; k < m[2]; k++) {
                    if (body.shape().distance(start[0] + i * step[0], start[1] + j * step[1],
                            start[2] + k * step[2]) <= 0) {
                        in++;
                    }
                }
            }
        }
        return (double) in / ((long) m[0] * m[1] * m[2]);
    }

    private static long saturatingProduct(long a, long b) {
        long hi = Math.multiplyHigh(a, b);
        long lo = a * b;
        return hi != 0 || lo < 0 ? Long.MAX_VALUE : lo;
    }

    /** @return particles the bodies will hold, about */
    public long particles() {
        return particles;
    }

    /** @return doubles each particle carries over all its channels */
    public int doublesPerParticle() {
        return doublesPerParticle;
    }

    /** @return grid blocks of 4^3 nodes the bodies cover at the start, about */
    public long gridBlocks() {
        return blocks;
    }

    /** @return bytes of the particle arrays and their sort tables */
    public long particleBytes() {
        return particleBytes;
    }

    /** @return bytes of the grid at the start (nodes, extra velocity fields, phase-field arrays) */
    public long gridBytes() {
        return gridBytes;
    }

    /** @return bytes a run retains while it steps, about: particles plus grid */
    public long bytes() {
        return Math.addExact(Math.min(particleBytes, Long.MAX_VALUE / 4), Math.min(gridBytes, Long.MAX_VALUE / 4));
    }

    /**
     * The most a run holds at once: {@link #bytes()} plus one more copy of the particle arrays (the sampler's
     * positions while the store fills, a checkpoint's copy of every channel while it is written).
     *
     * @return bytes
     */
    public long peakBytes() {
        return bytes() + Math.min(particleBytes, Long.MAX_VALUE / 4);
    }

    /**
     * Refuses a scene that would not fit.
     *
     * @param heapBytes the heap the JVM may use ({@link Runtime#maxMemory()})
     * @throws InvalidInputException naming the estimate, the heap and what to change, if {@link #peakBytes()}
     *                               exceeds heapBytes
     */
    public void requireFits(long heapBytes) {
        if (peakBytes() > heapBytes) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "memory", String.format(Locale.ROOT,
                    "the scene needs about %s at its peak (%s: %d particles of %d numbers each, %d grid blocks) "
                    + "but Java may use at most %s; use fewer particles (a larger spacing or cellSize, smaller "
                    + "bodies) or give Java more heap (for example java -Xmx%dg)", bytesText(peakBytes()), this,
                    particles, doublesPerParticle, blocks, bytesText(heapBytes),
                    Math.max(1, (long) Math.ceil(peakBytes() * 1.25 / (1L << 30)))));
        }
    }

    /**
     * @param b a byte count
     * @return it in B, KiB, MiB or GiB
     */
    public static String bytesText(long b) {
        if (b < 1 << 10) {
            return b + " B";
        }
        if (b < 1 << 20) {
            return String.format(Locale.ROOT, "%.1f KiB", b / 1024.0);
        }
        if (b < 1L << 30) {
            return String.format(Locale.ROOT, "%.1f MiB", b / (1024.0 * 1024));
        }
        return String.format(Locale.ROOT, "%.3g GiB", b / (1024.0 * 1024 * 1024));
    }

    /** @return "particles X, grid Y" */
    @Override
    public String toString() {
        return "particles " + bytesText(particleBytes) + ", grid " + bytesText(gridBytes);
    }
}

package dev.fray.io.result;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.SimulationView;

import java.util.Arrays;

/**
 * How wide the band of partly damaged material around the cracks is: the volume of material with
 * {@value #LOW} &lt; d &lt; {@value #HIGH} divided by the area of the crack surface. A clean crack has a band
 * about as wide as its damage model's closed-form profile (see {@code CrackDensity.bandWidth}: AT1 about 3.0 l,
 * AT2 about 5.9 l); damage smeared through the body shows as a much wider band.
 *
 * <p>Band volume: the sum of the current volumes V0 det F of the particles in the band, m^3.
 *
 * <p>Crack area (our estimate, m^2): the particles' volume-weighted mean damage per grid cell (cells of the scene's
 * cell size on its grid) gives a cell field D; the area of its level set D = 1/2 is counted on the lines through
 * neighbouring cell centres (both cells holding material): a plane with unit normal n is crossed by the lines
 * along axis a |n_a|/dx^2 times per unit area (a Cartesian line count in the manner of Crofton's formula), so each
 * crossing along axis a adds dx^2 |n_a| (the three axes' counts weighted by n_a^2, which sum to one), with n along
 * the gradient of D there. The weight keeps crossings that sampling noise makes along a direction the surface
 * barely faces from counting. A crack has material on
 * both sides, so its level set is two sheets: the crack area is half the level-set area. Damage that nowhere
 * reaches 1/2 has no crack surface; the width is then NaN (while the band volume still says how much is damaged).
 * The estimate is exact for planar cracks through cells aligned or not (tested within 5% at random orientations)
 * and counts a crack that ends inside a cell only in part.
 *
 * <p>Reuses its work arrays between calls; not thread-safe. Allocation only when the particle count grows.
 */
public final class CrackBand {
    /** Lower damage bound of the band (exclusive). */
    public static final double LOW = 0.05;
    /** Upper damage bound of the band (exclusive). */
    public static final double HIGH = 0.95;
    /** Damage level whose surface is the crack surface (two sheets per crack). */
    public static final double LEVEL = 0.5;

    /**
     * One measurement.
     *
     * @param bandVolume volume of particles with {@value #LOW} &lt; d &lt; {@value #HIGH}, m^3
     * @param crackArea  estimated crack surface area, m^2 (0 if no damage reaches {@value #LEVEL})
     * @param width      bandVolume / crackArea, m; NaN when there is no crack surface
     */
    public record Measure(double bandVolume, double crackArea, double width) {
        /** The measure of a run without damage: nothing in the band, no crack, width NaN. */
        public static final Measure NONE = new Measure(0, 0, Double.NaN);
    }

    private double[] x = new double[0];
    private double[] f = new double[0];
    private double[] v0 = new double[0];
    private double[] d = new double[0];
    private long[] keys = new long[0];
    private int[] slots = new int[0];
    private long[] cellKey = new long[0];
    private double[] cellDamage = new double[0];
    private double[] cellVolume = new double[0];

    /** Creates a measurer with empty work arrays. */
    public CrackBand() {
    }

    /**
     * Measures the band of a simulation on its own grid (cell size and domain origin of its scene).
     *
     * @param view the simulation (input)
     * @return the measure; {@link Measure#NONE} if no body has a damage channel
     */
    public Measure measure(SimulationView view) {
        Bounds b = view.scene().domain();
        return measure(view.particles(), view.scene().cellSize(), b.minX(), b.minY(), b.minZ());
    }

    /**
     * Measures the band of a set of particles on a grid of the given cell size and origin.
     *
     * @param particles the particles (input): position, deformation, volume and, if present, damage
     * @param cellSize  cell size dx, m, &gt; 0
     * @param ox        grid origin x, m
     * @param oy        grid origin y, m
     * @param oz        grid origin z, m
     * @return the measure; {@link Measure#NONE} without a damage channel
     */
    public Measure measure(ParticleView particles, double cellSize, double ox, double oy, double oz) {
        Checks.positive("cellSize (m)", cellSize);
        if (!particles.channelNames().contains(DamageModel.DAMAGE)) {
            return Measure.NONE;
        }
        int n = particles.size();
        grow(n);
        particles.copyById(ParticleStore.POSITION, x, 0);
        particles.copyById(ParticleStore.DEFORMATION, f, 0);
        particles.copyById(ParticleStore.VOLUME, v0, 0);
        particles.copyById(DamageModel.DAMAGE, d, 0);
        double band = 0;
        Arrays.fill(slots, -1);
        int cells = 0;
        double inv = 1.0 / cellSize;
        for (int p = 0; p < n; p++) {
            int o = 9 * p;
            double j = f[o] * (f[o + 4] * f[o + 8] - f[o + 5] * f[o + 7])
                    + f[o + 1] * (f[o + 5] * f[o + 6] - f[o + 3] * f[o + 8])
                    + f[o + 2] * (f[o + 3] * f[o + 7] - f[o + 4] * f[o + 6]);
            double v = v0[p] * Math.abs(j);
            double dp = d[p];
            if (dp > LOW && dp < HIGH) {
                band += v;
            }
            long key = key((int) Math.floor((x[3 * p] - ox) * inv), (int) Math.floor((x[3 * p + 1] - oy) * inv),
                    (int) Math.floor((x[3 * p + 2] - oz) * inv));
            int c = find(key);
            if (c < 0) {
                c = cells++;
                insert(key, c);
                cellKey[c] = key;
                cellDamage[c] = 0;
                cellVolume[c] = 0;
            }
            cellDamage[c] += v * dp;
            cellVolume[c] += v;
        }
        for (int c = 0; c < cells; c++) {
            cellDamage[c] = cellVolume[c] > 0 ? cellDamage[c] / cellVolume[c] : 0;
        }
        double levelArea = 0;
        double[] g = new double[3];
        for (int c = 0; c < cells; c++) {
            long key = cellKey[c];
            boolean above = cellDamage[c] >= LEVEL;
            for (int axis = 0; axis < 3; axis++) {
                int nb = find(neighbour(key, axis, 1));
                if (nb < 0 || (cellDamage[nb] >= LEVEL) == above) {
                    continue;
                }
                // Gradient at the face: along the axis from the two cells, across it the mean of their central
                // differences.
                for (int a = 0; a < 3; a++) {
                    g[a] = a == axis ? cellDamage[nb] - cellDamage[c]
                            : 0.5 * (centralDifference(key, a) + centralDifference(cellKey[nb], a));
                }
                double norm = Math.sqrt(g[0] * g[0] + g[1] * g[1] + g[2] * g[2]);
                levelArea += cellSize * cellSize * Math.abs(g[axis]) / norm;
            }
        }
        double area = 0.5 * levelArea;
        return new Measure(band, area, area > 0 ? band / area : Double.NaN);
    }

    /** D(c + e_a) - D(c - e_a) over two cells, one-sided where one neighbour is empty, 0 if both are. */
    private double centralDifference(long key, int axis) {
        int up = find(neighbour(key, axis, 1));
        int down = find(neighbour(key, axis, -1));
        int self = find(key);
        if (up >= 0 && down >= 0) {
            return 0.5 * (cellDamage[up] - cellDamage[down]);
        }
        if (up >= 0) {
            return cellDamage[up] - cellDamage[self];
        }
        if (down >= 0) {
            return cellDamage[self] - cellDamage[down];
        }
        return 0;
    }

    private void grow(int n) {
        if (x.length < 3 * n) {
            x = new double[3 * n];
            f = new double[9 * n];
            v0 = new double[n];
            d = new double[n];
            cellKey = new long[n];
            cellDamage = new double[n];
            cellVolume = new double[n];
            int cap = Integer.highestOneBit(Math.max(16, 2 * n)) << 1;
            keys = new long[cap];
            slots = new int[cap];
        }
    }

    /** Packs cell coordinates (each in +-2^20) into one key. */
    private static long key(int i, int j, int k) {
        return ((long) (i & 0x1FFFFF) << 42) | ((long) (j & 0x1FFFFF) << 21) | (k & 0x1FFFFF);
    }

    /** The key of the cell delta steps along an axis (0 = x, 1 = y, 2 = z). */
    private static long neighbour(long key, int axis, int delta) {
        int i = (int) (key >>> 42) << 11 >> 11;
        int j = (int) ((key >>> 21) & 0x1FFFFF) << 11 >> 11;
        int k = (int) (key & 0x1FFFFF) << 11 >> 11;
        return key(axis == 0 ? i + delta : i, axis == 1 ? j + delta : j, axis == 2 ? k + delta : k);
    }

    private int hash(long key) {
        long h = key * 0x9E3779B97F4A7C15L;
        return (int) (h >>> 32) & (slots.length - 1);
    }

    private int find(long key) {
        for (int s = hash(key); ; s = (s + 1) & (slots.length - 1)) {
            if (slots[s] < 0) {
                return -1;
            }
            if (keys[s] == key) {
                return slots[s];
            }
        }
    }

    private void insert(long key, int cell) {
        int s = hash(key);
        while (slots[s] >= 0) {
            s = (s + 1) & (slots.length - 1);
        }
        keys[s] = key;
        slots[s] = cell;
    }
}

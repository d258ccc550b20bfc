package dev.fray.core.particles;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialState;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The particles of one simulation as structure-of-arrays channels: each channel is one {@code double[]} holding
 * {@code width} interleaved components per particle. Built-in channels: position (3, m), velocity (3, m/s),
 * affine (9, APIC matrix C, 1/s), deformation (9, F, row-major), mass (1, kg), volume (1, initial volume m^3);
 * plugins add their own. Also an int body index and an int stable id (creation order) per particle.
 *
 * <p>Owned by one simulation. Particles are reordered (sorted by grid block) during a run; ids are stable.
 */
public final class ParticleStore implements MaterialState {
    /** Name of the position channel (m). */
    public static final String POSITION = "position";
    /** Name of the velocity channel (m/s). */
    public static final String VELOCITY = "velocity";
    /** Name of the APIC affine matrix channel (1/s). */
    public static final String AFFINE = "affine";
    /** Name of the deformation gradient channel (dimensionless). */
    public static final String DEFORMATION = "deformation";
    /** Name of the mass channel (kg). */
    public static final String MASS = "mass";
    /** Name of the initial volume channel (m^3). */
    public static final String VOLUME = "volume";

    private final int size;
    private final Map<String, ChannelSpec> specs = new LinkedHashMap<>();
    private final Map<String, double[]> data = new LinkedHashMap<>();
    private final List<String> names = new ArrayList<>();
    private double[][] arrays = new double[0][];
    private int[] widths = new int[0];
    private int[] body;
    private int[] id;

    /**
     * @param size number of particles
     */
    public ParticleStore(int size) {
        this.size = size;
        body = new int[size];
        id = new int[size];
        for (int p = 0; p < size; p++) {
            id[p] = p;
        }
        declare(new ChannelSpec(POSITION, 3, 0, "m", "particle position"));
        declare(new ChannelSpec(VELOCITY, 3, 0, "m/s", "particle velocity"));
        declare(new ChannelSpec(AFFINE, 9, 0, "1/s", "APIC affine velocity matrix C, row-major"));
        declare(new ChannelSpec(DEFORMATION, 9, 0, "1", "deformation gradient F, row-major"));
        declare(new ChannelSpec(MASS, 1, 0, "kg", "particle mass"));
        declare(new ChannelSpec(VOLUME, 1, 0, "m^3", "particle volume in the reference configuration"));
        double[] f = data.get(DEFORMATION);
        for (int p = 0; p < size; p++) {
            f[9 * p] = 1;
            f[9 * p + 4] = 1;
            f[9 * p + 8] = 1;
        }
    }

    /**
     * Adds a channel filled with its initial value. Declaring the same name twice with the same width is allowed
     * (two plugins sharing a channel); a different width is an error.
     *
     * @param spec the declaration
     */
    public void declare(ChannelSpec spec) {
        ChannelSpec old = specs.get(spec.name());
        if (old != null) {
            if (old.width() != spec.width()) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, "channel \"" + spec.name() + "\"",
                        "declared with width " + old.width() + " and again with width " + spec.width());
            }
            return;
        }
        double[] a = new double[size * spec.width()];
        if (spec.initial() != 0) {
            Arrays.fill(a, spec.initial());
        }
        specs.put(spec.name(), spec);
        data.put(spec.name(), a);
        names.add(spec.name());
        arrays = Arrays.copyOf(arrays, arrays.length + 1);
        arrays[arrays.length - 1] = a;
        widths = Arrays.copyOf(widths, widths.length + 1);
        widths[widths.length - 1] = spec.width();
    }

    /** @return number of particles */
    public int size() {
        return size;
    }

    /** @return channel names in declaration order */
    public List<String> channelNames() {
        return Collections.unmodifiableList(names);
    }

    /**
     * @param name channel name
     * @return its declaration, or null
     */
    public ChannelSpec spec(String name) {
        return specs.get(name);
    }

    @Override
    public double[] deformation() {
        return arrays[3];
    }

    /** @return positions, 3 per particle, m (live array) */
    public double[] position() {
        return arrays[0];
    }

    /** @return velocities, 3 per particle, m/s (live array) */
    public double[] velocity() {
        return arrays[1];
    }

    /** @return APIC affine matrices C, 9 per particle, 1/s (live array) */
    public double[] affine() {
        return arrays[2];
    }

    /** @return masses, kg (live array) */
    public double[] mass() {
        return arrays[4];
    }

    /** @return reference volumes, m^3 (live array) */
    public double[] volume() {
        return arrays[5];
    }

    /** @return body index of each particle (live array) */
    public int[] body() {
        return body;
    }

    /** @return stable id of each particle (live array) */
    public int[] id() {
        return id;
    }

    @Override
    public double[] channel(String name) {
        double[] a = data.get(name);
        if (a == null) {
            throw new IllegalArgumentException("no particle channel \"" + name + "\"; have " + names);
        }
        return a;
    }

    /** @return total bytes held by the particle arrays */
    public long memoryBytes() {
        long b = 8L * size; // body and id
        for (double[] a : arrays) {
            b += 8L * a.length;
        }
        return b;
    }

    /**
     * Reorders every channel so that new particle i is old particle order[i].
     *
     * @param order   permutation, size() entries
     * @param scratch per-width scratch arrays, indexed by width (grown as needed, swapped with channel arrays)
     * @param ints    scratch of size() ints, taken over by the store; get a free one back from
     *                {@link #freedScratch()}
     * @param workers threads for the copy; each channel is copied in fixed chunks
     */
    public void permute(int[] order, double[][] scratch, int[] ints, dev.fray.core.parallel.Workers workers) {
        final int chunk = 8192;
        int tasks = (size + chunk - 1) / chunk;
        for (int c = 0; c < arrays.length; c++) {
            int w = widths[c];
            double[] src = arrays[c];
            double[] dst = scratch[w];
            if (dst == null || dst.length != src.length) {
                dst = new double[src.length];
            }
            final double[] to = dst;
            workers.forEach(tasks, (worker, t) -> {
                int a = t * chunk;
                int b = Math.min(size, a + chunk);
                if (w == 1) {
                    for (int i = a; i < b; i++) {
                        to[i] = src[order[i]];
                    }
                } else if (w == 3) {
                    for (int i = a; i < b; i++) {
                        int s3 = 3 * order[i];
                        int d = 3 * i;
                        to[d] = src[s3];
                        to[d + 1] = src[s3 + 1];
                        to[d + 2] = src[s3 + 2];
                    }
                } else {
                    for (int i = a; i < b; i++) {
                        System.arraycopy(src, w * order[i], to, w * i, w);
                    }
                }
            });
            arrays[c] = dst;
            data.put(names.get(c), dst);
            scratch[w] = src;
        }
        for (int i = 0; i < size; i++) {
            ints[i] = body[order[i]];
        }
        int[] oldBody = body;
        body = ints;
        for (int i = 0; i < size; i++) {
            oldBody[i] = id[order[i]];
        }
        int[] oldId = id;
        id = oldBody;
        // The freed array becomes the caller's next scratch.
        lastFreed = oldId;
    }

    private int[] lastFreed;

    /** @return the int array freed by the last {@link #permute}, to be passed as {@code ints} next time */
    public int[] freedScratch() {
        return lastFreed;
    }

    /**
     * Overwrites the particle arrays with saved values (for resuming). Names, widths and the particle count must
     * match this store.
     *
     * @param values every channel by name
     * @param bodyOf body index per particle
     * @param ids    stable id per particle
     * @throws InvalidInputException naming the first mismatch
     */
    public void restore(Map<String, double[]> values, int[] bodyOf, int[] ids) {
        if (bodyOf.length != size || ids.length != size) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "saved particle count",
                    "saved state has " + ids.length + " particles, the scene makes " + size);
        }
        if (!values.keySet().equals(data.keySet())) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "saved channels",
                    "saved state has " + values.keySet() + ", the scene declares " + data.keySet());
        }
        for (int c = 0; c < names.size(); c++) {
            double[] v = values.get(names.get(c));
            if (v.length != arrays[c].length) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, "saved channel \"" + names.get(c) + "\"",
                        "has " + v.length + " values, expected " + arrays[c].length);
            }
            System.arraycopy(v, 0, arrays[c], 0, v.length);
        }
        boolean[] seen = new boolean[size];
        for (int p = 0; p < size; p++) {
            int i = ids[p];
            if (i < 0 || i >= size || seen[i]) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, "saved particle ids",
                        "id " + i + " at index " + p + " is out of range or repeated");
            }
            seen[i] = true;
        }
        System.arraycopy(bodyOf, 0, body, 0, size);
        System.arraycopy(ids, 0, id, 0, size);
    }
}

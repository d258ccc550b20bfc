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
     * Reorders every channel in place so that new particle i is old particle order[i], following the cycles of
     * the permutation: no second copy of the particle arrays is needed. Channels are independent tasks, so the
     * result does not depend on the thread count.
     *
     * @param order   permutation, size() entries (input, not modified)
     * @param workers threads; each channel (and the body and id arrays) is one task
     */
    public void permute(int[] order, dev.fray.core.parallel.Workers workers) {
        int words = (size + 63) >>> 6;
        if (visited == null || visited.length != workers.threads() || visited[0].length < words) {
            visited = new long[workers.threads()][words];
        }
        workers.forEach(arrays.length + 2, (worker, c) -> {
            long[] seen = visited[worker];
            java.util.Arrays.fill(seen, 0, words, 0L);
            if (c < arrays.length) {
                permuteInPlace(arrays[c], widths[c], order, seen);
            } else {
                permuteInPlace(c == arrays.length ? body : id, order, seen);
            }
        });
    }

    private long[][] visited;

    private void permuteInPlace(double[] a, int w, int[] order, long[] seen) {
        double[] tmp = new double[w];
        for (int start = 0; start < size; start++) {
            if (order[start] == start || (seen[start >>> 6] & (1L << start)) != 0) {
                continue;
            }
            System.arraycopy(a, w * start, tmp, 0, w);
            int i = start;
            while (true) {
                seen[i >>> 6] |= 1L << i;
                int j = order[i];
                if (j == start) {
                    System.arraycopy(tmp, 0, a, w * i, w);
                    break;
                }
                System.arraycopy(a, w * j, a, w * i, w);
                i = j;
            }
        }
    }

    private void permuteInPlace(int[] a, int[] order, long[] seen) {
        for (int start = 0; start < size; start++) {
            if (order[start] == start || (seen[start >>> 6] & (1L << start)) != 0) {
                continue;
            }
            int tmp = a[start];
            int i = start;
            while (true) {
                seen[i >>> 6] |= 1L << i;
                int j = order[i];
                if (j == start) {
                    a[i] = tmp;
                    break;
                }
                a[i] = a[j];
                i = j;
            }
        }
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

package dev.fray.core.grid;

import java.util.Arrays;

/**
 * N velocity fields per grid node: field 0 is the {@link SparseGrid}'s own mass and momentum, fields 1 to N - 1
 * are extra arrays of the same layout, allocated only when N &gt; 1 (bodies in contact, the two sides of a crack).
 * A node where one field lives costs nothing extra beyond the arrays' memory. Momenta are turned into velocities
 * in place by the grid update.
 */
public final class FieldSet {
    private final SparseGrid grid;
    private final int count;
    private final double[][] mass;
    private final double[][] momentum;

    /**
     * @param grid  the grid (field 0)
     * @param count number of fields, &gt;= 1
     */
    public FieldSet(SparseGrid grid, int count) {
        if (count < 1) {
            throw new IllegalArgumentException("field count " + count + " must be >= 1");
        }
        this.grid = grid;
        this.count = count;
        this.mass = new double[count - 1][0];
        this.momentum = new double[count - 1][0];
    }

    /** @return number of fields */
    public int count() {
        return count;
    }

    /** @return node masses of field k, kg (live array) */
    public double[] mass(int k) {
        return k == 0 ? grid.mass() : mass[k - 1];
    }

    /** @return node momenta of field k, kg m/s, or velocities m/s after the grid update (live array) */
    public double[] momentum(int k) {
        return k == 0 ? grid.momentum() : momentum[k - 1];
    }

    /** Grows the extra fields to hold the grid's active nodes; reallocates only when the grid has grown. */
    public void ensureNodes() {
        int nodes = grid.blockCount() * SparseGrid.NODES_PER_BLOCK;
        for (int k = 0; k < count - 1; k++) {
            if (mass[k].length < nodes) {
                int cap = Math.max(nodes, mass[k].length + mass[k].length / 2);
                mass[k] = new double[cap];
                momentum[k] = new double[3 * cap];
            }
        }
    }

    /** Zeroes every field on grid blocks [from, to). */
    public void zero(int from, int to) {
        grid.zero(from, to);
        int a = from * SparseGrid.NODES_PER_BLOCK;
        int b = to * SparseGrid.NODES_PER_BLOCK;
        for (int k = 0; k < count - 1; k++) {
            Arrays.fill(mass[k], a, b, 0.0);
            Arrays.fill(momentum[k], 3 * a, 3 * b, 0.0);
        }
    }

    /** @return bytes held by the extra fields (field 0 is counted by the grid) */
    public long extraBytes() {
        long b = 0;
        for (int k = 0; k < count - 1; k++) {
            b += 8L * (mass[k].length + momentum[k].length);
        }
        return b;
    }
}

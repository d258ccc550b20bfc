package dev.fray.core.sim;

import dev.fray.core.grid.FieldSet;
import dev.fray.core.grid.SparseGrid;

/** The {@link GridView} over the simulation's grid and velocity fields. */
final class FieldGridView implements GridView {
    private final SparseGrid grid;
    private final FieldSet fields;
    private final double ox, oy, oz, dx;

    FieldGridView(SparseGrid grid, FieldSet fields, double[] origin, double dx) {
        this.grid = grid;
        this.fields = fields;
        this.ox = origin[0];
        this.oy = origin[1];
        this.oz = origin[2];
        this.dx = dx;
    }

    @Override
    public double cellSize() {
        return dx;
    }

    @Override
    public int nodeCount() {
        return grid.nodeCount();
    }

    @Override
    public int fieldCount() {
        return fields.count();
    }

    @Override
    public void position(int node, double[] out) {
        check(node);
        int b = node >> 6, l = node & 63;
        int[] c = grid.blockCoords();
        out[0] = ox + (4 * c[3 * b] + (l >> 4)) * dx;
        out[1] = oy + (4 * c[3 * b + 1] + ((l >> 2) & 3)) * dx;
        out[2] = oz + (4 * c[3 * b + 2] + (l & 3)) * dx;
    }

    @Override
    public double mass(int field, int node) {
        check(node);
        return fields.mass(field)[node];
    }

    @Override
    public void velocity(int field, int node, double[] out) {
        check(node);
        double[] v = fields.momentum(field);
        out[0] = v[3 * node];
        out[1] = v[3 * node + 1];
        out[2] = v[3 * node + 2];
    }

    private void check(int node) {
        if (node < 0 || node >= grid.nodeCount()) {
            throw new IndexOutOfBoundsException("grid node " + node + " outside 0.." + (grid.nodeCount() - 1));
        }
    }
}

package dev.fray.io.scene;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Shape;
import dev.fray.core.error.Checks;

import java.util.List;

/**
 * One layer of a layered body: its own shape minus the shapes of the layers listed before it in the same group,
 * so that nested meshes (a core inside a rind inside a skin) fill with particles once each. The core has no
 * layered body; a group is a set of ordinary bodies, each with its own material and damage, whose shapes are made
 * disjoint this way. Signed distance of the difference A \ B: max(d_A, -d_B), with B the union of the excluded
 * shapes (min of their distances); exact outside B, a bound near the seams, as usual for constructive shapes.
 *
 * @param own      the layer's own shape
 * @param excluded shapes of the earlier layers of the group (copied)
 */
public record LayeredShape(Shape own, List<Shape> excluded) implements Shape {
    /** Checks and freezes the fields. */
    public LayeredShape {
        Checks.notNull("layer shape", own);
        excluded = List.copyOf(Checks.notNull("earlier layers", excluded));
    }

    private double excludedDistance(double x, double y, double z, int[] which) {
        double best = Double.POSITIVE_INFINITY;
        for (int i = 0; i < excluded.size(); i++) {
            double d = excluded.get(i).distance(x, y, z);
            if (d < best) {
                best = d;
                which[0] = i;
            }
        }
        return best;
    }

    /** {@inheritDoc} */
    @Override
    public double distance(double x, double y, double z) {
        double own = this.own.distance(x, y, z);
        double best = Double.POSITIVE_INFINITY;
        for (Shape s : excluded) {
            best = Math.min(best, s.distance(x, y, z));
        }
        return Math.max(own, -best);
    }

    /** {@inheritDoc} */
    @Override
    public void normal(double x, double y, double z, double[] out, int off) {
        int[] which = {-1};
        double cut = -excludedDistance(x, y, z, which);
        if (which[0] < 0 || own.distance(x, y, z) >= cut) {
            own.normal(x, y, z, out, off);
            return;
        }
        // Inside the cut the surface is that of the excluded shape, facing the other way.
        excluded.get(which[0]).normal(x, y, z, out, off);
        out[off] = -out[off];
        out[off + 1] = -out[off + 1];
        out[off + 2] = -out[off + 2];
    }

    /** {@inheritDoc} The own shape's bounds (subtracting never grows a shape). */
    @Override
    public Bounds bounds() {
        return own.bounds();
    }
}

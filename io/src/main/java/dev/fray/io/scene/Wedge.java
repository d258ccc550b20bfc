package dev.fray.io.scene;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Shape;
import dev.fray.core.error.Checks;

/**
 * A splitting wedge: a prism along z whose cross-section in the x-y plane is an isosceles triangle with its edge
 * (apex) at (apexX, apexY), opening towards +x with the given half angle and cut off at the given depth behind the
 * edge. The signed distance is the largest of the distances to the three face planes, exact inside and on the
 * faces and a lower bound outside, which is what contact needs: the sign and the face normal near the surface.
 * Unbounded along z, so it serves obstacles, grip regions and initial-value regions, not bodies. Scene files
 * describe it as the shape type {@code "wedge"} with the keys {@code edgeX}, {@code edgeY}, {@code halfAngle} and
 * {@code depth}. Immutable. Lengths in m, angles in radians.
 *
 * @param apexX     x of the edge, m
 * @param apexY     y of the edge, m
 * @param halfAngle half opening angle, radians, in (0, pi/2)
 * @param depth     length from the edge to the back face along x, m, &gt; 0
 */
public record Wedge(double apexX, double apexY, double halfAngle, double depth) implements Shape {
    /** Checks the fields. */
    public Wedge {
        Checks.finite("wedge edge x (m)", apexX);
        Checks.finite("wedge edge y (m)", apexY);
        Checks.inRange("wedge half angle (rad)", halfAngle, 0.0, true, Math.PI / 2, true);
        Checks.positive("wedge depth (m)", depth);
    }

    @Override
    public double distance(double x, double y, double z) {
        double s = Math.sin(halfAngle), c = Math.cos(halfAngle);
        double upper = (y - apexY) * c - (x - apexX) * s;
        double lower = -(y - apexY) * c - (x - apexX) * s;
        double back = x - apexX - depth;
        return Math.max(upper, Math.max(lower, back));
    }

    @Override
    public void normal(double x, double y, double z, double[] out, int off) {
        double s = Math.sin(halfAngle), c = Math.cos(halfAngle);
        double upper = (y - apexY) * c - (x - apexX) * s;
        double lower = -(y - apexY) * c - (x - apexX) * s;
        double back = x - apexX - depth;
        // The face whose plane is farthest out is the nearest face from inside; its normal is the gradient.
        if (back >= upper && back >= lower) {
            out[off] = 1;
            out[off + 1] = 0;
        } else if (upper >= lower) {
            out[off] = -s;
            out[off + 1] = c;
        } else {
            out[off] = -s;
            out[off + 1] = -c;
        }
        out[off + 2] = 0;
    }

    @Override
    public Bounds bounds() {
        double h = depth * Math.tan(halfAngle);
        return new Bounds(apexX, apexY - h, Double.NEGATIVE_INFINITY, apexX + depth, apexY + h,
                Double.POSITIVE_INFINITY);
    }
}

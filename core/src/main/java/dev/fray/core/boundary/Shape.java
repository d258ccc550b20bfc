package dev.fray.core.boundary;

/**
 * A solid region described by its signed distance: negative inside, zero on the surface, positive outside (m).
 * Used for obstacles, grips and for filling bodies with particles. Implementations are immutable.
 */
public interface Shape {
    /**
     * @param x point x, m
     * @param y point y, m
     * @param z point z, m
     * @return signed distance to the surface, m, negative inside
     */
    double distance(double x, double y, double z);

    /**
     * Outward unit normal of the nearest surface point, the gradient of {@link #distance}.
     *
     * @param x   point x, m
     * @param y   point y, m
     * @param z   point z, m
     * @param out (output) the normal at out[off..off+2]
     * @param off offset into out
     */
    void normal(double x, double y, double z, double[] out, int off);

    /** @return an axis-aligned box containing the shape (infinite for unbounded shapes) */
    Bounds bounds();
}

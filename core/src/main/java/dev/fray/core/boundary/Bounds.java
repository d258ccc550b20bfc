package dev.fray.core.boundary;

/**
 * Axis-aligned box, m.
 *
 * @param minX smallest x
 * @param minY smallest y
 * @param minZ smallest z
 * @param maxX largest x
 * @param maxY largest y
 * @param maxZ largest z
 */
public record Bounds(double minX, double minY, double minZ, double maxX, double maxY, double maxZ) {
    /** The whole space. */
    public static final Bounds EVERYWHERE = new Bounds(Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY,
            Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY);

    /**
     * @param other another box
     * @return whether this box lies inside other (closed)
     */
    public boolean within(Bounds other) {
        return minX >= other.minX && minY >= other.minY && minZ >= other.minZ
                && maxX <= other.maxX && maxY <= other.maxY && maxZ <= other.maxZ;
    }

    /** @return whether all six numbers are finite */
    public boolean isFinite() {
        return Double.isFinite(minX) && Double.isFinite(minY) && Double.isFinite(minZ)
                && Double.isFinite(maxX) && Double.isFinite(maxY) && Double.isFinite(maxZ);
    }

    @Override
    public String toString() {
        return "[" + minX + ", " + maxX + "] x [" + minY + ", " + maxY + "] x [" + minZ + ", " + maxZ + "] m";
    }
}

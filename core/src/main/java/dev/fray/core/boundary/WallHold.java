package dev.fray.core.boundary;

import java.util.List;

/**
 * Holds material on the walls whose law stops normal motion both ways (slip and sticky): a particle that starts a
 * step within a cell of such a wall's plane keeps no normal velocity relative to the wall for that step, so
 * once material has reached the wall it stays on it (sliding along it under the grid's Coulomb friction for slip).
 * The grid alone cannot hold it: only the nodes on the wall's plane are constrained, and the next layer of nodes,
 * free, lets an elastic body spring off. Walls that only stop motion into them (separating) are not held.
 */
public final class WallHold {
    private final int[] face;
    private final double[] plane;
    private final double reach;

    /**
     * @param domain the domain box
     * @param walls  contact laws of the faces xMin, xMax, yMin, yMax, zMin, zMax
     * @param dx     cell size, m
     */
    public WallHold(Bounds domain, List<? extends ContactLaw> walls, double dx) {
        double[] at = {domain.minX(), domain.maxX(), domain.minY(), domain.maxY(), domain.minZ(), domain.maxZ()};
        int n = 0;
        for (ContactLaw c : walls) {
            n += c.holdsNormal() ? 1 : 0;
        }
        face = new int[n];
        plane = new double[n];
        int k = 0;
        for (int f = 0; f < 6; f++) {
            if (walls.get(f).holdsNormal()) {
                face[k] = f;
                plane[k++] = at[f];
            }
        }
        reach = dx;
    }

    /** @return whether any wall holds material (otherwise {@link #hold} does nothing) */
    public boolean any() {
        return face.length > 0;
    }

    /**
     * Removes the normal component of a particle's new velocity at every holding wall within a cell of its
     * position at the start of the step.
     *
     * @param x   positions, 3 per particle, m (start of step)
     * @param v   (input and output) the particle's new velocity at v[3 p..3 p + 2], m/s
     * @param p   the particle
     */
    public void hold(double[] x, double[] v, int p) {
        for (int k = 0; k < face.length; k++) {
            int f = face[k];
            int i = 3 * p + (f >> 1);
            double gap = (f & 1) == 0 ? x[i] - plane[k] : plane[k] - x[i];
            if (gap <= reach) {
                v[i] = 0;
            }
        }
    }
}

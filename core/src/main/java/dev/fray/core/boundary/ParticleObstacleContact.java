package dev.fray.core.boundary;

import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.SparseGrid;

import java.util.List;

/**
 * Particle-level obstacle contact: a particle that ends the step inside an obstacle (in its end-of-step pose) is
 * put back on the surface along the outward normal, and the obstacle's contact law is applied to its velocity as
 * to a node's. Grid-node contact alone lets particles pass between nodes where an obstacle is thinner than a cell
 * (a wedge's edge); the same body-collision step on particles after the grid update is published for MPM by
 * Stomakhin et al. (SIGGRAPH 2013, section 8; from memory).
 *
 * <p>{@link #prepare} finds the obstacles' end-of-step poses and world boxes and which particle blocks' buffers
 * reach one; the grid-to-particle transfer then calls {@link #touch} on the particles of those blocks.
 */
public final class ParticleObstacleContact {
    private final Obstacle[] obstacles;
    private final double ox, oy, oz, dx;
    /** Obstacle poses at the end of the step (12 per obstacle). */
    private final double[] poseEnd;
    /** World boxes (6 per obstacle) at the end of the step, m; a block whose buffer misses all skips the check. */
    private final double[] boxEnd;
    private final double[] scratchPose = new double[12];
    /** Mean velocity-schedule factor of each obstacle over the step. */
    private final double[] factor;
    private boolean[] blockTouches = new boolean[64];
    private boolean touching;

    /**
     * @param obstacles the obstacles
     * @param origin    grid origin (x, y, z), m
     * @param dx        cell size, m
     */
    public ParticleObstacleContact(List<Obstacle> obstacles, double[] origin, double dx) {
        this.obstacles = obstacles.toArray(new Obstacle[0]);
        this.ox = origin[0];
        this.oy = origin[1];
        this.oz = origin[2];
        this.dx = dx;
        this.poseEnd = new double[12 * this.obstacles.length];
        this.boxEnd = new double[6 * this.obstacles.length];
        this.factor = new double[this.obstacles.length];
    }

    /**
     * Poses and world boxes of the obstacles at time t + h, their schedule factors over the step, and which blocks'
     * buffers reach one.
     *
     * @param time   the step's start time t, s
     * @param h      the step, s
     * @param layout the particle blocks
     * @return whether any block reaches an obstacle
     */
    public boolean prepare(double time, double h, BlockLayout layout) {
        double endTime = time + h;
        touching = false;
        if (obstacles.length == 0) {
            return false;
        }
        for (int i = 0; i < obstacles.length; i++) {
            Obstacle ob = obstacles[i];
            ob.motion().pose(endTime, scratchPose);
            factor[i] = ob.motion().meanFactor(time, endTime);
            System.arraycopy(scratchPose, 0, poseEnd, 12 * i, 12);
            worldBox(ob, scratchPose, boxEnd, 6 * i);
        }
        if (blockTouches.length < layout.capacity()) {
            blockTouches = new boolean[layout.capacity()];
        }
        boolean any = false;
        double span = BlockLayout.LOCAL * dx;
        for (int r = 0; r < layout.blockCount(); r++) {
            long key = layout.key(r);
            double x0 = ox + BlockLayout.localOrigin(SparseGrid.keyX(key)) * dx;
            double y0 = oy + BlockLayout.localOrigin(SparseGrid.keyY(key)) * dx;
            double z0 = oz + BlockLayout.localOrigin(SparseGrid.keyZ(key)) * dx;
            boolean touches = false;
            for (int b = 0; b < boxEnd.length && !touches; b += 6) {
                touches = x0 <= boxEnd[b + 3] && x0 + span >= boxEnd[b]
                        && y0 <= boxEnd[b + 4] && y0 + span >= boxEnd[b + 1]
                        && z0 <= boxEnd[b + 5] && z0 + span >= boxEnd[b + 2];
            }
            blockTouches[r] = touches;
            any |= touches;
        }
        touching = any;
        return any;
    }

    /** @return whether this step's particles of block r are checked against the obstacles */
    public boolean touches(int r) {
        return touching && blockTouches[r];
    }

    /** @return number of obstacles */
    public int obstacleCount() {
        return obstacles.length;
    }

    /**
     * Pushes particle p out of any obstacle it ended the step in and applies the contact law to its velocity.
     *
     * @param x    positions, 3 per particle, m (modified)
     * @param v    velocities, 3 per particle, m/s (modified)
     * @param mass particle masses, kg
     * @param p    the particle
     * @param nrm  worker scratch, 9 values
     * @param acc  (input and output) per obstacle o: impulse x, y, z (N s) and work (J) at 4 o
     * @return work done on the particle by the obstacles, J
     */
    public double touch(double[] x, double[] v, double[] mass, int p, double[] nrm, double[] acc) {
        double work = 0;
        for (int o = 0; o < obstacles.length; o++) {
            Obstacle ob = obstacles[o];
            if (!ob.contact().acts()) {
                continue;
            }
            int b = 6 * o;
            double px = x[3 * p], py = x[3 * p + 1], pz = x[3 * p + 2];
            if (px < boxEnd[b] || py < boxEnd[b + 1] || pz < boxEnd[b + 2]
                    || px > boxEnd[b + 3] || py > boxEnd[b + 4] || pz > boxEnd[b + 5]) {
                continue;
            }
            double dist = GridBoundaries.obstacleContactFrame(ob, factor[o], poseEnd, 12 * o, px, py, pz, nrm);
            if (dist > 0) {
                continue;
            }
            x[3 * p] = px - dist * nrm[0];
            x[3 * p + 1] = py - dist * nrm[1];
            x[3 * p + 2] = pz - dist * nrm[2];
            double vx0 = v[3 * p], vy0 = v[3 * p + 1], vz0 = v[3 * p + 2];
            ob.contact().apply(v, 3 * p, nrm, 0, nrm[6], nrm[7], nrm[8]);
            double m = mass[p];
            double w = m * ((v[3 * p] - vx0) * nrm[6] + (v[3 * p + 1] - vy0) * nrm[7]
                    + (v[3 * p + 2] - vz0) * nrm[8]);
            work += w;
            acc[4 * o] += m * (v[3 * p] - vx0);
            acc[4 * o + 1] += m * (v[3 * p + 1] - vy0);
            acc[4 * o + 2] += m * (v[3 * p + 2] - vz0);
            acc[4 * o + 3] += w;
        }
        return work;
    }

    /** World box of an obstacle's shape in a pose (its corners moved and boxed; infinite stays infinite). */
    private static void worldBox(Obstacle ob, double[] pose, double[] out, int off) {
        Bounds b = ob.shape().bounds();
        Motion mo = ob.motion();
        if (!b.isFinite()) {
            for (int k = 0; k < 3; k++) {
                out[off + k] = Double.NEGATIVE_INFINITY;
                out[off + 3 + k] = Double.POSITIVE_INFINITY;
            }
            return;
        }
        for (int k = 0; k < 3; k++) {
            out[off + k] = Double.POSITIVE_INFINITY;
            out[off + 3 + k] = Double.NEGATIVE_INFINITY;
        }
        for (int c = 0; c < 8; c++) {
            // x = c(t) + R (x0 - c0), with R stored so that R^T maps world to body (see obstacleContactFrame).
            double ax = ((c & 1) == 0 ? b.minX() : b.maxX()) - mo.cx();
            double ay = ((c & 2) == 0 ? b.minY() : b.maxY()) - mo.cy();
            double az = ((c & 4) == 0 ? b.minZ() : b.maxZ()) - mo.cz();
            for (int k = 0; k < 3; k++) {
                double w = pose[9 + k] + pose[3 * k] * ax + pose[3 * k + 1] * ay + pose[3 * k + 2] * az;
                out[off + k] = Math.min(out[off + k], w);
                out[off + 3 + k] = Math.max(out[off + 3 + k], w);
            }
        }
    }
}

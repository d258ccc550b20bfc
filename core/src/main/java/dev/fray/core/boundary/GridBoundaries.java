package dev.fray.core.boundary;

import dev.fray.core.grid.SparseGrid;

import java.util.Arrays;
import java.util.List;

/**
 * Domain walls, obstacles and grips acting on grid node velocities. Each step {@link #begin} sets the poses of the
 * moving boundaries; the grid update then calls {@link #applyNode} on every node with mass, which either drives a
 * gripped node at its grip's velocity or applies the walls and obstacles the node lies in. For an implicit solve,
 * {@link #projectIncrement} removes from a velocity increment the components the same boundaries constrain.
 *
 * <p>Accounting (per node, m the node mass, v before and v' after the boundary, u the boundary's velocity): the
 * impulse on the material m (v' - v), N s, summed per grip and per obstacle (force = impulse / dt); the work the
 * boundary does m (v' - v) . u, J (a still boundary does none); and the energy the boundary removes,
 * m (v' - v) . u - m (|v'|^2 - |v|^2) / 2, J, which is the Coulomb friction and inelastic normal impact of walls
 * and obstacles and the velocity jump a grip imposes. All sums run per fixed task and are combined in task order.
 *
 * <p>Nodes of a grip carry the smallest grip index of the gripped particles whose stencil reaches them
 * ({@link #gripTags()}, written by the particle-to-grid transfer).
 */
public final class GridBoundaries {
    /** Values accumulated per grip and per obstacle: impulse x, y, z (N s) and work (J). */
    public static final int PER_BOUNDARY = 4;

    private final double ox, oy, oz, dx;
    private final double tol;
    private final double[] wallAt;
    private final ContactLaw[] walls;
    private final Obstacle[] obstacles;
    private final Grip[] grips;
    private final double[] obstaclePose;
    private final double[] gripPose;
    private final double[] scratchPose = new double[12];
    /** Mean velocity-schedule factor of each grip, then each obstacle, over the current step. */
    private final double[] factor;
    private int[] gripTags = new int[0];

    /**
     * @param domain    the domain box (walls on its faces)
     * @param walls     contact laws of the faces xMin, xMax, yMin, yMax, zMin, zMax
     * @param obstacles the obstacles
     * @param grips     the grips
     * @param origin    grid origin (x, y, z), m
     * @param dx        cell size, m
     */
    public GridBoundaries(Bounds domain, List<? extends ContactLaw> walls, List<Obstacle> obstacles,
                          List<Grip> grips, double[] origin, double dx) {
        this.ox = origin[0];
        this.oy = origin[1];
        this.oz = origin[2];
        this.dx = dx;
        this.tol = 1e-6 * dx;
        this.wallAt = new double[] {domain.minX(), domain.maxX(), domain.minY(), domain.maxY(), domain.minZ(),
                domain.maxZ()};
        this.walls = walls.toArray(new ContactLaw[0]);
        this.obstacles = obstacles.toArray(new Obstacle[0]);
        this.grips = grips.toArray(new Grip[0]);
        this.obstaclePose = new double[12 * this.obstacles.length];
        this.gripPose = new double[12 * this.grips.length];
        this.factor = new double[this.grips.length + this.obstacles.length];
    }

    /** @return number of grips */
    public int gripCount() {
        return grips.length;
    }

    /** @return number of obstacles */
    public int obstacleCount() {
        return obstacles.length;
    }

    /** @return values per task of the accumulator {@link #applyNode} adds to: grips, obstacles, then the loss */
    public int accumulatorLength() {
        return PER_BOUNDARY * (grips.length + obstacles.length) + 1;
    }

    /** @return offset in the accumulator of grip g's values */
    public int gripSlot(int g) {
        return PER_BOUNDARY * g;
    }

    /** @return offset in the accumulator of obstacle o's values */
    public int obstacleSlot(int o) {
        return PER_BOUNDARY * (grips.length + o);
    }

    /** @return offset in the accumulator of the energy removed by all boundaries, J */
    public int lossSlot() {
        return PER_BOUNDARY * (grips.length + obstacles.length);
    }

    /**
     * Poses of the grips and obstacles at the start of the step, and the factor their velocity schedules give over
     * the step: the mean (S(t + h) - S(t)) / h, so that a driven node moves exactly as the schedule's integral says.
     *
     * @param time the step's start time, s
     * @param h    the step, s
     */
    public void begin(double time, double h) {
        for (int i = 0; i < obstacles.length; i++) {
            obstacles[i].motion().pose(time, scratchPose);
            System.arraycopy(scratchPose, 0, obstaclePose, 12 * i, 12);
            factor[grips.length + i] = obstacles[i].motion().meanFactor(time, time + h);
        }
        for (int i = 0; i < grips.length; i++) {
            grips[i].motion().pose(time, scratchPose);
            System.arraycopy(scratchPose, 0, gripPose, 12 * i, 12);
            factor[i] = grips[i].motion().meanFactor(time, time + h);
        }
    }

    /** Sizes the grip tags to the grid's active nodes (growing only). */
    public void ensureNodes(SparseGrid grid) {
        int nodes = grid.nodeCount();
        if (gripTags.length < nodes) {
            gripTags = new int[Math.max(nodes, gripTags.length + gripTags.length / 2)];
        }
    }

    /** Clears the grip tags of grid blocks [from, to). */
    public void clearTags(int from, int to) {
        Arrays.fill(gripTags, from * SparseGrid.NODES_PER_BLOCK, to * SparseGrid.NODES_PER_BLOCK,
                Integer.MAX_VALUE);
    }

    /** @return smallest grip index touching each node, {@link Integer#MAX_VALUE} for none (live array) */
    public int[] gripTags() {
        return gripTags;
    }

    /** @return bytes held by the grip tags */
    public long memoryBytes() {
        return 4L * gripTags.length;
    }

    /**
     * Applies the boundaries to one node's velocity.
     *
     * @param node grid node (block 64 + local index)
     * @param bx   node lattice x of the node's block origin (4 times the block coordinate)
     * @param by   node lattice y of the block origin
     * @param bz   node lattice z of the block origin
     * @param m    node mass of the field, kg
     * @param gv   (input and output) the field's node velocities, m/s
     * @param nrm  worker scratch, 9 values
     * @param acc  (input and output) accumulators (see {@link #accumulatorLength()})
     * @param accOff offset of the task's accumulator in acc
     * @return work done on the node by grips and moving obstacles, J
     */
    public double applyNode(int node, int bx, int by, int bz, double m, double[] gv, double[] nrm, double[] acc,
                            int accOff) {
        int l = node & 63;
        int n3 = 3 * node;
        double px = ox + (bx + (l >> 4)) * dx;
        double py = oy + (by + ((l >> 2) & 3)) * dx;
        double pz = oz + (bz + (l & 3)) * dx;
        double vx0 = gv[n3], vy0 = gv[n3 + 1], vz0 = gv[n3 + 2];
        int grip = gripTags[node];
        double work;
        if (grip != Integer.MAX_VALUE) {
            frameVelocity(grips[grip].motion(), factor[grip], gripPose, 12 * grip, px, py, pz, gv, n3);
            // Work of the grip: its impulse on the node times the velocity it imposes.
            work = m * ((gv[n3] - vx0) * gv[n3] + (gv[n3 + 1] - vy0) * gv[n3 + 1]
                    + (gv[n3 + 2] - vz0) * gv[n3 + 2]);
            int s = accOff + gripSlot(grip);
            acc[s] += m * (gv[n3] - vx0);
            acc[s + 1] += m * (gv[n3 + 1] - vy0);
            acc[s + 2] += m * (gv[n3 + 2] - vz0);
            acc[s + 3] += work;
        } else {
            work = m * wallsAndObstacles(px, py, pz, gv, n3, nrm, m, acc, accOff);
        }
        double vx = gv[n3], vy = gv[n3 + 1], vz = gv[n3 + 2];
        if (vx != vx0 || vy != vy0 || vz != vz0) {
            acc[accOff + lossSlot()] += work - 0.5 * m * ((vx * vx + vy * vy + vz * vz)
                    - (vx0 * vx0 + vy0 * vy0 + vz0 * vz0));
        }
        return work;
    }

    /** @return work per unit node mass done by moving obstacles: velocity change . obstacle velocity, m^2/s^2 */
    private double wallsAndObstacles(double px, double py, double pz, double[] gv, int n3, double[] nrm, double m,
                                     double[] acc, int accOff) {
        for (int f = 0; f < 6; f++) {
            ContactLaw c = walls[f];
            if (!c.acts()) {
                continue;
            }
            if (onWall(f, px, py, pz)) {
                wallNormal(f, nrm);
                c.apply(gv, n3, nrm, 0, 0, 0, 0);
            }
        }
        double work = 0;
        for (int o = 0; o < obstacles.length; o++) {
            Obstacle ob = obstacles[o];
            if (obstacleContactFrame(ob, factor[grips.length + o], obstaclePose, 12 * o, px, py, pz, nrm) > 0) {
                continue;
            }
            double vx0 = gv[n3], vy0 = gv[n3 + 1], vz0 = gv[n3 + 2];
            ob.contact().apply(gv, n3, nrm, 0, nrm[6], nrm[7], nrm[8]);
            // Power of the contact force is its impulse times the obstacle's velocity; a still obstacle does none.
            double w = (gv[n3] - vx0) * nrm[6] + (gv[n3 + 1] - vy0) * nrm[7] + (gv[n3 + 2] - vz0) * nrm[8];
            work += w;
            int s = accOff + obstacleSlot(o);
            acc[s] += m * (gv[n3] - vx0);
            acc[s + 1] += m * (gv[n3 + 1] - vy0);
            acc[s + 2] += m * (gv[n3 + 2] - vz0);
            acc[s + 3] += m * w;
        }
        return work;
    }

    private boolean onWall(int f, double px, double py, double pz) {
        int axis = f >> 1;
        double coord = axis == 0 ? px : axis == 1 ? py : pz;
        return (f & 1) == 0 ? coord - wallAt[f] <= tol : wallAt[f] - coord <= tol;
    }

    private static void wallNormal(int f, double[] nrm) {
        nrm[0] = 0;
        nrm[1] = 0;
        nrm[2] = 0;
        nrm[f >> 1] = (f & 1) == 0 ? 1 : -1;
    }

    /**
     * Removes from a velocity increment at a node the components that the boundaries there constrain: all of them
     * at a gripped node or a sticky wall or obstacle, the normal component at a slip or separating one (the
     * separating contact treated as active, as an implicit solve linearises it).
     *
     * @param node grid node
     * @param bx   node lattice x of the block origin
     * @param by   node lattice y of the block origin
     * @param bz   node lattice z of the block origin
     * @param dv   (input and output) increments, 3 per node, m/s
     * @param nrm  worker scratch, 9 values
     * @return whether any boundary acts at the node
     */
    public boolean projectIncrement(int node, int bx, int by, int bz, double[] dv, double[] nrm) {
        return projectIncrement(node, bx, by, bz, dv, nrm, null);
    }

    /**
     * {@link #projectIncrement(int, int, int, int, double[], double[])} with the contact state known: a separating
     * wall or obstacle constrains the node only where the node's velocity (after {@link #applyNode}) does not leave
     * it, i.e. its normal velocity relative to the boundary is not positive. A node already leaving is free, since
     * holding its normal velocity fixed would let the boundary drive it and do work.
     *
     * @param node     grid node
     * @param bx       node lattice x of the block origin
     * @param by       node lattice y of the block origin
     * @param bz       node lattice z of the block origin
     * @param dv       (input and output) increments, 3 per node, m/s
     * @param nrm      worker scratch, 9 values
     * @param velocity node velocities after the boundaries, 3 per node, m/s; null to treat every contact as active
     * @return whether any boundary acts at the node
     */
    public boolean projectIncrement(int node, int bx, int by, int bz, double[] dv, double[] nrm, double[] velocity) {
        int l = node & 63;
        int n3 = 3 * node;
        if (gripTags.length > node && gripTags[node] != Integer.MAX_VALUE) {
            dv[n3] = 0;
            dv[n3 + 1] = 0;
            dv[n3 + 2] = 0;
            return true;
        }
        double px = ox + (bx + (l >> 4)) * dx;
        double py = oy + (by + ((l >> 2) & 3)) * dx;
        double pz = oz + (bz + (l & 3)) * dx;
        boolean any = false;
        for (int f = 0; f < 6; f++) {
            if (walls[f].acts() && onWall(f, px, py, pz)) {
                wallNormal(f, nrm);
                if (leaving(walls[f], velocity, n3, nrm, 0, 0, 0)) {
                    continue;
                }
                removeConstrained(walls[f], dv, n3, nrm);
                any = true;
            }
        }
        for (int o = 0; o < obstacles.length; o++) {
            Obstacle ob = obstacles[o];
            if (ob.contact().acts()
                    && obstacleContactFrame(ob, factor[grips.length + o], obstaclePose, 12 * o, px, py, pz, nrm) <= 0
                    && !leaving(ob.contact(), velocity, n3, nrm, nrm[6], nrm[7], nrm[8])) {
                removeConstrained(ob.contact(), dv, n3, nrm);
                any = true;
            }
        }
        return any;
    }

    /** Whether a separating law lets a node go: its velocity relative to the boundary leaves along the normal. */
    private static boolean leaving(ContactLaw law, double[] v, int n3, double[] nrm, double ux, double uy,
                                  double uz) {
        if (v == null || law.holdsNormal()) {
            return false;
        }
        double rx = v[n3] - ux, ry = v[n3 + 1] - uy, rz = v[n3 + 2] - uz;
        double vn = rx * nrm[0] + ry * nrm[1] + rz * nrm[2];
        return vn > 1e-12 * Math.sqrt(rx * rx + ry * ry + rz * rz);
    }

    private static void removeConstrained(ContactLaw law, double[] dv, int n3, double[] nrm) {
        if (law.fixesAll()) {
            dv[n3] = 0;
            dv[n3 + 1] = 0;
            dv[n3 + 2] = 0;
            return;
        }
        double vn = dv[n3] * nrm[0] + dv[n3 + 1] * nrm[1] + dv[n3 + 2] * nrm[2];
        dv[n3] -= vn * nrm[0];
        dv[n3 + 1] -= vn * nrm[1];
        dv[n3 + 2] -= vn * nrm[2];
    }

    /**
     * Signed distance of a point to an obstacle in the given pose; where it is not positive, also the obstacle's
     * outward normal (world frame, nrm[0..2]) and its velocity at the point (nrm[6..8]).
     *
     * @param factor the obstacle's velocity-schedule factor over the step
     * @param pose   poses, 12 per obstacle (rotation row-major, then the pivot's position)
     * @param q      offset of the obstacle's pose
     * @return signed distance, m
     */
    static double obstacleContactFrame(Obstacle ob, double factor, double[] pose, int q, double px, double py,
                                       double pz, double[] nrm) {
        Motion mo = ob.motion();
        // Point in the obstacle's frame at time 0: x0 = c0 + R^T (x - c(t)).
        double rx = px - pose[q + 9], ry = py - pose[q + 10], rz = pz - pose[q + 11];
        double lx = mo.cx() + pose[q] * rx + pose[q + 3] * ry + pose[q + 6] * rz;
        double ly = mo.cy() + pose[q + 1] * rx + pose[q + 4] * ry + pose[q + 7] * rz;
        double lz = mo.cz() + pose[q + 2] * rx + pose[q + 5] * ry + pose[q + 8] * rz;
        double dist = ob.shape().distance(lx, ly, lz);
        if (dist > 0) {
            return dist;
        }
        ob.shape().normal(lx, ly, lz, nrm, 3);
        nrm[0] = pose[q] * nrm[3] + pose[q + 1] * nrm[4] + pose[q + 2] * nrm[5];
        nrm[1] = pose[q + 3] * nrm[3] + pose[q + 4] * nrm[4] + pose[q + 5] * nrm[5];
        nrm[2] = pose[q + 6] * nrm[3] + pose[q + 7] * nrm[4] + pose[q + 8] * nrm[5];
        frameVelocity(mo, factor, pose, q, px, py, pz, nrm, 6);
        return dist;
    }

    /** Velocity of a moving frame at a point: s (v + w x (x - c(t))), s the schedule's factor over the step. */
    static void frameVelocity(Motion mo, double s, double[] pose, int q, double px, double py, double pz,
                              double[] out, int off) {
        double rx = px - pose[q + 9], ry = py - pose[q + 10], rz = pz - pose[q + 11];
        out[off] = s * (mo.vx() + mo.wy() * rz - mo.wz() * ry);
        out[off + 1] = s * (mo.vy() + mo.wz() * rx - mo.wx() * rz);
        out[off + 2] = s * (mo.vz() + mo.wx() * ry - mo.wy() * rx);
    }
}

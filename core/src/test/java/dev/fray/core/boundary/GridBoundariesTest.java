package dev.fray.core.boundary;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.grid.SparseGrid;
import dev.fray.core.testing.FrayTestBase;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

/**
 * Walls, obstacles and grips on single grid nodes. The node is local node 10 of block (0, 0, 0) with dx = 0.1 m:
 * lattice (0, 2, 2), at (0, 0.2, 0.2) m, on the xMin face of the unit domain (outward normal of the wall +x).
 * Contact laws: sticky, slip and separating contact with Coulomb friction, whose tangential impulse is at most mu
 * times the normal impulse and never reverses the sliding (Coulomb friction, any mechanics text).
 */
class GridBoundariesTest extends FrayTestBase {
    private static final double DX = 0.1;
    private static final int NODE = 10;
    private static final double[] AT = {0, 0.2, 0.2};
    private static final double M = 0.003;
    private static final double TOL = 1e-14;

    /** A separating wall removes the normal velocity of a node moving into it and leaves a node moving away alone. */
    @Test
    void separatingWallRemovesOnlyApproachingNormalVelocity() {
        GridBoundaries gb = boundaries(Contact.separating(0), List.of(), List.of());
        double[] acc = new double[gb.accumulatorLength()];
        assertArrayEquals(new double[] {0, 0.3, -0.2}, apply(gb, new double[] {-1, 0.3, -0.2}, acc), TOL);
        // The normal impact takes m vn^2 / 2 of kinetic energy; a still wall does no work.
        assertEquals(0.5 * M * 1.0, acc[gb.lossSlot()], TOL);
        assertArrayEquals(new double[] {1, 0.3, -0.2}, apply(gb, new double[] {1, 0.3, -0.2}, acc), 0.0);
    }

    /** A slip wall removes the normal velocity in both directions and keeps the tangential one without friction. */
    @Test
    void slipWallRemovesNormalVelocityBothWays() {
        GridBoundaries gb = boundaries(Contact.slip(0), List.of(), List.of());
        double[] acc = new double[gb.accumulatorLength()];
        assertArrayEquals(new double[] {0, 0.3, -0.2}, apply(gb, new double[] {-1, 0.3, -0.2}, acc), TOL);
        assertArrayEquals(new double[] {0, 0.3, -0.2}, apply(gb, new double[] {1, 0.3, -0.2}, acc), TOL);
    }

    /** A sticky wall stops the node; a sticky moving obstacle gives it the obstacle's velocity v + w x (x - c(t)). */
    @Test
    void stickyContactSetsTheBoundaryVelocity() {
        GridBoundaries wall = boundaries(Contact.sticky(), List.of(), List.of());
        assertArrayEquals(new double[3], apply(wall, new double[] {-1, 0.3, -0.2},
                new double[wall.accumulatorLength()]), 0.0);
        Motion motion = Motion.linear(0.2, -0.1, 0.05).withRotation(0.5, -1, 2, 0.4, 0.5, 0.6);
        Obstacle block = new Obstacle("block", Shapes.box(-1, -1, -1, 1, 1, 1), Contact.sticky(), motion);
        GridBoundaries gb = boundaries(Contact.open(), List.of(block), List.of());
        double[] expected = rigidVelocity(motion, 1.0, new double[] {0.4, 0.5, 0.6});
        assertArrayEquals(expected, apply(gb, new double[] {-1, 0.3, -0.2}, new double[gb.accumulatorLength()]), TOL);
    }

    /**
     * Coulomb friction lowers the tangential speed by mu |vn| and keeps its direction; where mu |vn| exceeds the
     * tangential speed the node stops sliding instead of sliding backwards. Slip contact applies the same friction
     * with the normal velocity it removes in either direction.
     */
    @Test
    void coulombFrictionReducesTangentialSpeedNeverPastZero() {
        double mu = 0.3;
        GridBoundaries gb = boundaries(Contact.separating(mu), List.of(), List.of());
        double[] acc = new double[gb.accumulatorLength()];
        double c = Math.cos(0.7), s = Math.sin(0.7);
        double[] sliding = apply(gb, new double[] {-1, 2 * c, 2 * s}, acc);
        assertArrayEquals(new double[] {0, (2 - mu) * c, (2 - mu) * s}, sliding, TOL);
        double[] stuck = apply(gb, new double[] {-1, 0.2, 0.1}, acc);
        assertArrayEquals(new double[3], stuck, TOL, "mu |vn| = 0.3 > |vt| = 0.22: the node stops");
        GridBoundaries slip = boundaries(Contact.slip(mu), List.of(), List.of());
        assertArrayEquals(new double[] {0, 2 - 2 * mu, 0}, apply(slip, new double[] {2, 2, 0},
                new double[slip.accumulatorLength()]), TOL, "slip: friction from the normal velocity leaving");
    }

    /**
     * A gripped node takes the grip's velocity, the mean schedule factor over the step times v + w x (x - c(t)); the
     * accumulated impulse is m (v' - v) and the grip's work m (v' - v) . v'. Ramp to full speed over 0.1 s, step
     * [0.02, 0.03] s: mean factor 0.25 (the factor at the midpoint of a linear ramp), S(0.02) = 0.02^2 / 0.2 = 0.002 s
     * (elementary calculus, no source).
     */
    @Test
    void grippedNodeTakesTheGripVelocityAndTalliesImpulseAndWork() {
        Motion motion = Motion.linear(0.1, 0, -0.05).withRotation(0, 0, 2, 0.5, 0.5, 0.5)
                .withSchedule(VelocitySchedule.ramp(0.1));
        Grip grip = new Grip("tab", "strip", Shapes.box(-1, -1, -1, 1, 1, 1), motion);
        GridBoundaries gb = boundaries(Contact.sticky(), List.of(), List.of(grip), 0.02, 0.01);
        gb.gripTags()[NODE] = 0;
        double[] v = {-1, 0.3, -0.2};
        double[] acc = new double[gb.accumulatorLength()];
        double[] gv = node(v);
        double work = gb.applyNode(NODE, 0, 0, 0, M, gv, new double[9], acc, 0);
        double[] pivot = {0.5 + 0.1 * 0.002, 0.5, 0.5 - 0.05 * 0.002};
        double[] expected = rigidVelocity(motion, 0.25, pivot);
        double[] after = {gv[3 * NODE], gv[3 * NODE + 1], gv[3 * NODE + 2]};
        assertArrayEquals(expected, after, TOL, "grip velocity (the sticky wall is overruled)");
        int slot = gb.gripSlot(0);
        double expectedWork = 0;
        for (int k = 0; k < 3; k++) {
            assertEquals(M * (expected[k] - v[k]), acc[slot + k], TOL, "impulse " + k);
            expectedWork += M * (expected[k] - v[k]) * expected[k];
        }
        assertEquals(expectedWork, acc[slot + 3], TOL, "tallied work");
        assertEquals(expectedWork, work, TOL, "returned work");
        double dke = 0.5 * M * (dot(expected, expected) - dot(v, v));
        assertEquals(expectedWork - dke, acc[gb.lossSlot()], TOL, "loss = work - change of kinetic energy");
    }

    /**
     * A separating obstacle moving up at u = (0, 0.5, 0) (solid below y = 0.25 m) takes the node's approaching
     * relative normal velocity; its impulse m (v' - v) does the work m (v' - v) . u.
     */
    @Test
    void movingObstacleDoesWork() {
        Obstacle floor = new Obstacle("floor", Shapes.halfSpace(0.5, 0.25, 0.5, 0, 1, 0), Contact.separating(0),
                Motion.linear(0, 0.5, 0));
        GridBoundaries gb = boundaries(Contact.open(), List.of(floor), List.of());
        double[] acc = new double[gb.accumulatorLength()];
        double[] gv = node(new double[] {0.1, -0.3, 0.2});
        double work = gb.applyNode(NODE, 0, 0, 0, M, gv, new double[9], acc, 0);
        assertArrayEquals(new double[] {0.1, 0.5, 0.2}, new double[] {gv[3 * NODE], gv[3 * NODE + 1],
            gv[3 * NODE + 2]}, TOL);
        int slot = gb.obstacleSlot(0);
        assertArrayEquals(new double[] {0, M * 0.8, 0, M * 0.8 * 0.5}, new double[] {acc[slot], acc[slot + 1],
            acc[slot + 2], acc[slot + 3]}, TOL, "impulse and work");
        assertEquals(M * 0.4, work, TOL);
    }

    /**
     * For an implicit solve, an increment loses every component at a gripped node or a sticky wall, and its normal
     * component at a slip or separating wall; an open face constrains nothing.
     */
    @Test
    void projectIncrementRemovesTheConstrainedComponents() {
        double[] dv = {-1, 0.3, -0.2};
        double[] nrm = new double[9];
        GridBoundaries sticky = boundaries(Contact.sticky(), List.of(), List.of());
        double[] inc = node(dv);
        assertTrue(sticky.projectIncrement(NODE, 0, 0, 0, inc, nrm));
        assertArrayEquals(new double[3], at(inc), 0.0, "sticky");
        for (Contact c : new Contact[] {Contact.slip(0.4), Contact.separating(0.4)}) {
            inc = node(dv);
            assertTrue(boundaries(c, List.of(), List.of()).projectIncrement(NODE, 0, 0, 0, inc, nrm));
            assertArrayEquals(new double[] {0, 0.3, -0.2}, at(inc), 0.0, c.type().toString());
        }
        GridBoundaries open = boundaries(Contact.open(), List.of(), List.of(
                new Grip("tab", "strip", Shapes.box(0, 0, 0, 1, 1, 1), Motion.linear(1, 0, 0))));
        inc = node(dv);
        assertFalse(open.projectIncrement(NODE, 0, 0, 0, inc, nrm));
        assertArrayEquals(dv, at(inc), 0.0, "open face, node not gripped");
        open.gripTags()[NODE] = 0;
        assertTrue(open.projectIncrement(NODE, 0, 0, 0, inc, nrm));
        assertArrayEquals(new double[3], at(inc), 0.0, "gripped");
    }

    private static GridBoundaries boundaries(Contact xMin, List<Obstacle> obstacles, List<Grip> grips) {
        return boundaries(xMin, obstacles, grips, 0, 1e-3);
    }

    /** Boundaries on the unit domain with the given xMin face (other faces open), sized for one block, at time t. */
    private static GridBoundaries boundaries(Contact xMin, List<Obstacle> obstacles, List<Grip> grips, double t,
                                             double h) {
        List<Contact> walls = new ArrayList<>(Collections.nCopies(6, Contact.open()));
        walls.set(0, xMin);
        GridBoundaries gb = new GridBoundaries(new Bounds(0, 0, 0, 1, 1, 1), walls, obstacles, grips, new double[3],
                DX);
        SparseGrid grid = new SparseGrid();
        grid.activate(SparseGrid.key(0, 0, 0));
        grid.allocateNodes();
        gb.ensureNodes(grid);
        gb.clearTags(0, 1);
        gb.begin(t, h);
        return gb;
    }

    /** Applies the boundaries to the test node with velocity v; returns the new velocity. */
    private static double[] apply(GridBoundaries gb, double[] v, double[] acc) {
        double[] gv = node(v);
        gb.applyNode(NODE, 0, 0, 0, M, gv, new double[9], acc, 0);
        return at(gv);
    }

    private static double[] node(double[] v) {
        double[] gv = new double[3 * SparseGrid.NODES_PER_BLOCK];
        System.arraycopy(v, 0, gv, 3 * NODE, 3);
        return gv;
    }

    private static double[] at(double[] gv) {
        return new double[] {gv[3 * NODE], gv[3 * NODE + 1], gv[3 * NODE + 2]};
    }

    /** s (v + w x (x - c)) at the test node. */
    private static double[] rigidVelocity(Motion m, double s, double[] c) {
        double rx = AT[0] - c[0], ry = AT[1] - c[1], rz = AT[2] - c[2];
        return new double[] {s * (m.vx() + m.wy() * rz - m.wz() * ry), s * (m.vy() + m.wz() * rx - m.wx() * rz),
            s * (m.vz() + m.wx() * ry - m.wy() * rx)};
    }

    private static double dot(double[] a, double[] b) {
        return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    }
}

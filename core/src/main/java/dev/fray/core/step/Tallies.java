package dev.fray.core.step;

import java.util.Arrays;

/**
 * Running sums of a run's energy exchanges, and the forces boundaries exerted in the last step. Each is formed from
 * fixed-order partial sums, so the tallies are bitwise identical for any thread count, and they are part of the
 * run state (checkpoints carry them).
 *
 * <ul>
 *   <li>Boundary work W, J: sum over steps and nodes of the impulse a grip or moving obstacle imposes times its
 *       velocity (and the same for particle-level obstacle contact).</li>
 *   <li>Damping loss, J: the kinetic energy the grid velocity damping removes, sum m |u|^2 (1 - e^{-2 c dt}) / 2
 *       over nodes, u the node velocity before damping.</li>
 *   <li>Contact loss, J: the energy walls, obstacles and grips remove at nodes (impulse . boundary velocity minus
 *       the kinetic energy change: Coulomb friction, inelastic normal impact, a grip's imposed velocity jump), plus
 *       what contact between velocity fields removes.</li>
 *   <li>Per grip and per obstacle: impulse on the material in the last step (N s, 3 components) and its total
 *       work (J).</li>
 * </ul>
 */
public final class Tallies {
    private final int grips;
    private final int obstacles;
    double boundaryWork;
    double initialEnergy;
    double dampingLoss;
    double contactLoss;
    /** Per grip then obstacle: impulse x, y, z of the last step (N s) and work since the start (J). */
    final double[] perBoundary;

    Tallies(int grips, int obstacles) {
        this.grips = grips;
        this.obstacles = obstacles;
        this.perBoundary = new double[4 * (grips + obstacles)];
    }

    /** @return number of grips */
    public int grips() {
        return grips;
    }

    /** @return number of obstacles */
    public int obstacles() {
        return obstacles;
    }

    /** @return work done on the material by grips and moving obstacles since the start, J */
    public double boundaryWork() {
        return boundaryWork;
    }

    /** @return kinetic + elastic + potential energy when the simulation was created, J */
    public double initialEnergy() {
        return initialEnergy;
    }

    /**
     * Sets the initial energy (once, when the simulation is created).
     *
     * @param e J
     */
    public void setInitialEnergy(double e) {
        initialEnergy = e;
    }

    /** @return kinetic energy removed by velocity damping since the start, J */
    public double dampingLoss() {
        return dampingLoss;
    }

    /** @return energy removed by boundary contact and contact between fields since the start, J */
    public double contactLoss() {
        return contactLoss;
    }

    /**
     * @param i grip index, or the number of grips plus an obstacle index
     * @param k 0, 1, 2 for the impulse of the last step (N s) along x, y, z; 3 for the work since the start (J)
     * @return the value
     */
    public double boundary(int i, int k) {
        return perBoundary[4 * i + k];
    }

    /**
     * @return every value in a fixed order (boundary work, damping loss, contact loss, initial energy, then per
     *         boundary), for checkpoints
     */
    public double[] toArray() {
        double[] a = new double[4 + perBoundary.length];
        a[0] = boundaryWork;
        a[1] = dampingLoss;
        a[2] = contactLoss;
        a[3] = initialEnergy;
        System.arraycopy(perBoundary, 0, a, 4, perBoundary.length);
        return a;
    }

    /**
     * Restores values written by {@link #toArray()}; a shorter array (from an older checkpoint) leaves the rest 0.
     *
     * @param a the values
     */
    public void restore(double[] a) {
        boundaryWork = a.length > 0 ? a[0] : 0;
        dampingLoss = a.length > 1 ? a[1] : 0;
        contactLoss = a.length > 2 ? a[2] : 0;
        if (a.length > 3) {
            initialEnergy = a[3];
        }
        Arrays.fill(perBoundary, 0);
        if (a.length > 4) {
            System.arraycopy(a, 4, perBoundary, 0, Math.min(perBoundary.length, a.length - 4));
        }
    }
}

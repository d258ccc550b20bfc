package dev.fray.core.sim;

import java.util.ArrayList;
import java.util.List;

/**
 * Whole-scene quantities at one instant, computed over the particles with a fixed partition so the values are
 * bitwise the same for every thread count.
 *
 * <p>Energy balance: kinetic (translational and affine) + elastic + potential + damping loss + contact loss + damage released = initial
 * energy + boundary work + residual. The residual is what no column accounts for: the transfers' own dissipation
 * (grid-to-particle averaging at impacts, a real effect of the method) and time-integration error.
 *
 * @param step            steps taken
 * @param time            simulated time, s
 * @param dt              last time step, s (0 before the first step)
 * @param kineticEnergy   sum m |v|^2 / 2 (translational), J
 * @param elasticEnergy   sum V0 psi(F), J (psi degraded by damage: g psi_degraded + psi_kept)
 * @param momentumX       linear momentum x, kg m/s
 * @param momentumY       linear momentum y, kg m/s
 * @param momentumZ       linear momentum z, kg m/s
 * @param angularX        angular momentum about the origin x, including the APIC affine spin, kg m^2/s
 * @param angularY        angular momentum y
 * @param angularZ        angular momentum z
 * @param maxSpeed        largest particle speed, m/s
 * @param potentialEnergy gravitational potential energy -sum m g . x (zero at the origin), J
 * @param affineEnergy    the affine (APIC) part of the kinetic energy, sum m D |C|^2 / 2 with D the kernel's
 *                        inertia scale (dx^2 / 4 for the quadratic B-spline) and |C| the Frobenius norm of the affine
 *                        matrix: with it the kinetic energy is that of the velocity field the particles scatter to
 *                        the grid (Jiang et al. 2015), J
 * @param boundaryWork    work done on the material by grips and moving obstacles since the start (impulse on
 *                        each grid node times the velocity the boundary imposes there), J; still walls and
 *                        obstacles do none, friction only dissipates
 * @param dampingLoss     kinetic energy removed by velocity damping since the start: sum over steps and nodes of
 *                        m |u|^2 (1 - e^{-2 c dt}) / 2, u the node velocity before damping, J
 * @param contactLoss     energy removed by walls, obstacles and grips at grid nodes since the start (impulse .
 *                        boundary velocity minus the node's kinetic energy change: Coulomb friction, inelastic
 *                        normal impact, the jump a grip imposes) plus that removed by contact between velocity
 *                        fields, J
 * @param damageReleased  elastic energy damage has taken out of the current state, sum V0 (1 - g) psi_degraded, J
 * @param initialEnergy   kinetic + elastic + potential energy when the simulation was created, J
 * @param damagedFraction fraction of the initial volume whose damage exceeds 0.5 (0 without damage)
 * @param maxDamage       largest damage of any particle (0 without damage)
 * @param loads           per grip, then per obstacle, in scene order: force in the last step and work
 */
public record Diagnostics(long step, double time, double dt, double kineticEnergy, double elasticEnergy,
                          double momentumX, double momentumY, double momentumZ,
                          double angularX, double angularY, double angularZ, double maxSpeed,
                          double potentialEnergy, double affineEnergy, double boundaryWork, double dampingLoss,
                          double contactLoss,
                          double damageReleased, double initialEnergy, double damagedFraction, double maxDamage,
                          List<BoundaryLoad> loads) {
    /** Column names of the scene-independent values for tabular output, in {@link #values()} order, SI units. */
    public static final String[] COLUMNS = {"step", "time_s", "dt_s", "kinetic_energy_J", "elastic_energy_J",
        "momentum_x_kg_m_per_s", "momentum_y_kg_m_per_s", "momentum_z_kg_m_per_s",
        "angular_momentum_x_kg_m2_per_s", "angular_momentum_y_kg_m2_per_s", "angular_momentum_z_kg_m2_per_s",
        "max_speed_m_per_s", "potential_energy_J", "affine_kinetic_energy_J", "boundary_work_J", "damping_loss_J", "contact_loss_J",
        "damage_released_J", "energy_residual_J", "damaged_volume_fraction", "max_damage"};

    /** Freezes the loads. */
    public Diagnostics {
        loads = loads == null ? List.of() : List.copyOf(loads);
    }

    /** @return kinetic (translational and affine) + elastic + potential energy, J */
    public double totalEnergy() {
        return kineticEnergy + affineEnergy + elasticEnergy + potentialEnergy;
    }

    /**
     * @return the energy no column accounts for: total + damping loss + contact loss + damage released - initial
     *         energy - boundary work, J
     */
    public double energyResidual() {
        return totalEnergy() + dampingLoss + contactLoss + damageReleased - initialEnergy - boundaryWork;
    }

    /**
     * @return {@link #COLUMNS} followed by four columns per load: {@code PREFIX_force_x_N}, {@code _y_N},
     *         {@code _z_N} and {@code PREFIX_work_J} with the prefix of {@link BoundaryLoad#columnPrefix()}
     */
    public String[] columns() {
        List<String> c = new ArrayList<>(List.of(COLUMNS));
        for (BoundaryLoad l : loads) {
            String p = l.columnPrefix();
            c.add(p + "_force_x_N");
            c.add(p + "_force_y_N");
            c.add(p + "_force_z_N");
            c.add(p + "_work_J");
        }
        return c.toArray(new String[0]);
    }

    /** @return the values in {@link #columns()} order */
    public double[] values() {
        double[] fixed = {step, time, dt, kineticEnergy, elasticEnergy, momentumX, momentumY, momentumZ,
            angularX, angularY, angularZ, maxSpeed, potentialEnergy, affineEnergy, boundaryWork, dampingLoss, contactLoss,
            damageReleased, energyResidual(), damagedFraction, maxDamage};
        double[] v = new double[fixed.length + 4 * loads.size()];
        System.arraycopy(fixed, 0, v, 0, fixed.length);
        int k = fixed.length;
        for (BoundaryLoad l : loads) {
            v[k++] = l.forceX();
            v[k++] = l.forceY();
            v[k++] = l.forceZ();
            v[k++] = l.work();
        }
        return v;
    }
}

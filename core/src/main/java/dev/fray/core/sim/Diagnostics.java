package dev.fray.core.sim;

/**
 * Whole-scene quantities at one instant, computed over the particles with a fixed partition so the values are
 * bitwise the same for every thread count.
 *
 * @param step            steps taken
 * @param time            simulated time, s
 * @param dt              last time step, s (0 before the first step)
 * @param kineticEnergy   sum m |v|^2 / 2 (translational; the affine part is in the angular momentum only), J
 * @param elasticEnergy   sum V0 psi(F), J
 * @param momentumX       linear momentum x, kg m/s
 * @param momentumY       linear momentum y, kg m/s
 * @param momentumZ       linear momentum z, kg m/s
 * @param angularX        angular momentum about the origin x, including the APIC affine spin, kg m^2/s
 * @param angularY        angular momentum y
 * @param angularZ        angular momentum z
 * @param maxSpeed        largest particle speed, m/s
 * @param potentialEnergy gravitational potential energy -sum m g . x (zero at the origin), J
 * @param boundaryWork    work done on the material by grips and moving obstacles since the start (impulse on
 *                        each grid node times the velocity the boundary imposes there), J; still walls and
 *                        obstacles do none, friction only dissipates
 */
public record Diagnostics(long step, double time, double dt, double kineticEnergy, double elasticEnergy,
                          double momentumX, double momentumY, double momentumZ,
                          double angularX, double angularY, double angularZ, double maxSpeed,
                          double potentialEnergy, double boundaryWork) {
    /** Column names for tabular output, in record order, with SI units. */
    public static final String[] COLUMNS = {"step", "time_s", "dt_s", "kinetic_energy_J", "elastic_energy_J",
        "momentum_x_kg_m_per_s", "momentum_y_kg_m_per_s", "momentum_z_kg_m_per_s",
        "angular_momentum_x_kg_m2_per_s", "angular_momentum_y_kg_m2_per_s", "angular_momentum_z_kg_m2_per_s",
        "max_speed_m_per_s", "potential_energy_J", "boundary_work_J"};

    /** @return kinetic + elastic + potential energy, J */
    public double totalEnergy() {
        return kineticEnergy + elasticEnergy + potentialEnergy;
    }

    /** @return the values in {@link #COLUMNS} order */
    public double[] values() {
        return new double[] {step, time, dt, kineticEnergy, elasticEnergy, momentumX, momentumY, momentumZ,
            angularX, angularY, angularZ, maxSpeed, potentialEnergy, boundaryWork};
    }
}

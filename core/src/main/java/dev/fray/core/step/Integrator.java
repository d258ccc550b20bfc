package dev.fray.core.step;

/**
 * Advances the particles by one time step: the time integration scheme of a simulation. Implementations share the
 * rooms of the step (layout, transfers, boundaries, constitutive update) through the {@link StepContext}, and
 * advance its clock only through the simulation.
 */
public interface Integrator {
    /**
     * Takes one step.
     *
     * @param h the time step, s, &gt; 0
     * @throws dev.fray.core.error.SimulationDivergedException if the state becomes non-finite or runs away
     */
    void step(double h);

    /** @return the largest particle speed after the last step, m/s (sets the next adaptive step) */
    double maxSpeed();

    /**
     * Sets the largest particle speed (when a run is restored).
     *
     * @param speed m/s
     */
    void setMaxSpeed(double speed);

    /**
     * @return wall time per phase since creation, s, in step order (names are the integrator's own)
     */
    java.util.Map<String, Double> phaseSeconds();

    /** @return the stress and energy of the particles (for diagnostics) */
    ConstitutiveUpdate constitutive();

    /** @return conjugate-gradient iterations of the last phase-field solve (0 without phase-field damage) */
    int phaseFieldIterations();

    /** @return relative residual reached by the last phase-field solve (0 without phase-field damage) */
    double phaseFieldResidual();

    /** @return the implicit solver's counts, or null for an explicit integrator */
    default ImplicitStatistics statistics() {
        return null;
    }
}

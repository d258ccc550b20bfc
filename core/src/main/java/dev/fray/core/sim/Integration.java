package dev.fray.core.sim;

/** How a scene integrates in time. Scene-file values: {@code explicit}, {@code implicit}, {@code auto}. */
public enum Integration {
    /** Explicit MLS-MPM: cheap steps, limited by the elastic wave, dt &lt;= CFL dx / (speed + wave speed). */
    EXPLICIT,
    /**
     * Backward Euler on grid velocities (Gast et al. 2015): a Newton solve per step, steps limited by how fast the
     * material moves (CFL dx / speed), so stiff solids take steps hundreds of times longer.
     */
    IMPLICIT,
    /**
     * Implicit when every body can run implicitly and the elastic step limit is well below the motion limit (see
     * {@link dev.fray.core.step.TimeStepPolicy#prefersImplicit}), explicit otherwise.
     */
    AUTO;

    /** @return the scene-file value, lower case */
    public String key() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}

package dev.fray.damage.fracture;

import dev.fray.core.damage.DamageModel;

/**
 * Isotropic AT2 phase-field fracture (published: Bourdin, Francfort and Marigo, J. Mech. Phys. Solids 48, 2000,
 * and J. Elasticity 91, 2008) with the history field and viscous regularisation of Miehe, Hofacker and
 * Welschinger (CMAME 199, 2010) and Miehe, Welschinger and Hofacker (IJNME 83, 2010).
 *
 * <p>Crack surface density gamma(d) = d^2/(2l) + l/2 |grad d|^2 ({@link CrackDensity#AT2}) and degradation
 * g(d) = (1 - d)^2 (1 - k) + k. The damage solves, each step, the backward-Euler form of
 * <pre>
 *   (Gc/l) (d - l^2 lap d) + eta d_dot = 2 (1 - d) H,     H = max over time of psi_degraded
 * </pre>
 * that is a d - div(D grad d) = b with
 * <pre>
 *   a = Gc/l + 2H + eta/dt,   b = 2H + (eta/dt) d_old,   D = Gc l I.
 * </pre>
 * psi_degraded is the degradable (tensile) energy density of the material law's split, J/m^3 of reference volume.
 * The solved field is clamped to [0, 1] and never decreases. For homogeneous states and eta = 0 this gives
 * d = H / (H + Gc/(2l)): AT2 damages under any load and has no elastic stage; {@link PhaseFieldAT1} has one.
 *
 * <p>Channels: {@value DamageModel#DAMAGE} (d, dimensionless) and {@value #HISTORY} (H, J/m^3).
 * Immutable and thread-safe; build with {@link dev.fray.damage.Fracture#phaseField()}.
 */
public final class PhaseFieldAT2 extends IsotropicPhaseField {
    /** Registry name. */
    public static final String NAME = "phase-field-at2";
    /** Default residual stiffness k (dimensionless): keeps a broken particle's stiffness matrix regular. */
    public static final double DEFAULT_RESIDUAL_STIFFNESS = 1e-6;
    /** Largest residual stiffness accepted (dimensionless); more would leave broken material carrying load. */
    public static final double MAX_RESIDUAL_STIFFNESS = 0.1;
    /** Default length scale in cells when none is given: two cells resolve the profile on quadratic B-splines. */
    public static final double DEFAULT_LENGTH_CELLS = 2.0;

    PhaseFieldAT2(PhaseFieldSupport.Settings settings) {
        super(settings);
    }

    /**
     * @return a builder with the defaults: no length scale (two cells), no viscosity, k = 1e-6, the law's own
     *         split
     */
    public static Builder builder() {
        return new Builder(CrackDensity.AT2);
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }
}

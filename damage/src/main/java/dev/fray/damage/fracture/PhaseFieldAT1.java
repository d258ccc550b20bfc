package dev.fray.damage.fracture;

import dev.fray.core.damage.DamageModel;

/**
 * Isotropic AT1 phase-field fracture (published: Pham, Amor, Marigo and Maurini, Int. J. Damage Mech. 20, 2011;
 * Tanne, Li, Bourdin, Marigo and Maurini, J. Mech. Phys. Solids 110, 2018), with the history field of Miehe,
 * Hofacker and Welschinger (CMAME 199, 2010) and optional viscous regularisation.
 *
 * <p>Crack surface density gamma(d) = 3/8 (d/l + l |grad d|^2) ({@link CrackDensity#AT1}) and degradation
 * g(d) = (1 - d)^2 (1 - k) + k. Because the local term is linear in d, the material is elastic until the
 * driving energy reaches 3 Gc/(16 l): in uniaxial stress no damage below sigma_c = sqrt(3 E Gc/(8 l)), which is
 * also the peak stress, and homogeneous damage d = 1 - 3 Gc/(16 l H) above it. A fully developed crack has the
 * compact profile d = (1 - |x|/(2l))^2: material farther than 2 l from it stays intact, so cracks are narrower
 * than with {@link PhaseFieldAT2} at the same length scale (band 0.05 &lt; d &lt; 0.95 about 3.0 l wide against
 * 5.9 l). The grid problem needs the bound d &gt;= d_old; how it is enforced (a penalty with a lagged active set)
 * is described in {@link PhaseFieldSupport}.
 *
 * <p>Channels: {@value DamageModel#DAMAGE}, {@value #HISTORY} (J/m^3) and {@value PhaseFieldSupport#TRIAL} (the
 * last solved field before the bounds). Immutable and thread-safe; build with
 * {@link dev.fray.damage.Fracture#phaseFieldAT1()}.
 */
public final class PhaseFieldAT1 extends IsotropicPhaseField {
    /** Registry name. */
    public static final String NAME = "phase-field-at1";

    PhaseFieldAT1(PhaseFieldSupport.Settings settings) {
        super(settings);
    }

    /**
     * @return a builder with the defaults: no length scale (two cells), no viscosity, k = 1e-6, the law's own
     *         split
     */
    public static Builder builder() {
        return new Builder(CrackDensity.AT1);
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }
}

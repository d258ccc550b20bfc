package dev.fray.damage;

import dev.fray.core.material.TensionSplit;
import dev.fray.damage.fracture.AnisotropicPhaseField;
import dev.fray.damage.fracture.PhaseFieldAT2;
import dev.fray.damage.fracture.RankineDamage;

/**
 * Static factories for the damage models that make bodies crack. Each returns a builder whose {@code build()}
 * validates the parameters and names the field, its unit and the allowed range when one is bad. Every builder also
 * takes {@code tensionSplit}: the {@link TensionSplit} the model asks of the material law, whose degradable part
 * damage takes away (default {@link TensionSplit#LAW_DEFAULT}, the law's own split); a body whose law does not
 * offer the split is rejected when it is built.
 *
 * <pre>
 *   DamageModel brittle = Fracture.phaseField().fractureEnergy(10).lengthScale(0.01).build();
 *   DamageModel wood = Fracture.anisotropicPhaseField().fractureEnergy(50).fiberStrengths(20).build();
 *   DamageModel chalk = Fracture.rankine().criticalStress(2e5).fractureEnergy(5, 1e8).build();
 *   DamageModel glass = Fracture.phaseField().fractureEnergy(4).tensionSplit(TensionSplit.SPECTRAL).build();
 * </pre>
 */
public final class Fracture {
    private Fracture() {
    }

    /**
     * Local damage by the Rankine maximum principal stress criterion with exponential softening (see
     * {@link RankineDamage}). Required: {@code criticalStress} (Pa), and either {@code softeningStress} (Pa) or
     * {@code fractureEnergy} (J/m^2, with Young's modulus in Pa). Optional: {@code bandWidth} (m, default one cell),
     * {@code viscosity} (relaxation time, s, default 0), {@code degradation} (default linear),
     * {@code residualStiffness} (default 1e-6).
     *
     * @return a builder of a model named "rankine"
     */
    public static RankineDamage.Builder rankine() {
        return RankineDamage.builder();
    }

    /**
     * Isotropic AT2 phase-field fracture with history field and optional viscous regularisation (see
     * {@link PhaseFieldAT2}). Required: {@code fractureEnergy} (J/m^2). Optional: {@code lengthScale} (m, default
     * two cells, at least one), {@code viscosity} (Pa s, default 0), {@code residualStiffness} (in [0, 0.1],
     * default 1e-6).
     *
     * @return a builder of a model named "phase-field-at2"
     */
    public static PhaseFieldAT2.Builder phaseField() {
        return PhaseFieldAT2.builder();
    }

    /**
     * Anisotropic AT2 phase-field fracture with a structural tensor of one to three fiber families (see
     * {@link AnisotropicPhaseField}). Required: {@code fractureEnergy} (J/m^2) and {@code fiberStrengths} (one
     * alpha &gt;= 0 per family). Optional: as {@link #phaseField()}, plus {@code stressDriving} with the critical
     * stresses along and across the fibers (Pa) and its {@code stressDrivingSlope}.
     *
     * @return a builder of a model named "phase-field-anisotropic"
     */
    public static AnisotropicPhaseField.Builder anisotropicPhaseField() {
        return AnisotropicPhaseField.builder();
    }
}

package dev.fray.damage;

import dev.fray.core.material.TensionSplit;
import dev.fray.damage.fracture.AnisotropicPhaseField;
import dev.fray.damage.fracture.IsotropicPhaseField;
import dev.fray.damage.fracture.PhaseFieldAT1;
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
 *   DamageModel gel = Fracture.phaseFieldAT1().strength(2e4, 2e5).build();  // 20 kPa for E = 200 kPa
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
     * {@link PhaseFieldAT2}): damages under any load. Required: {@code fractureEnergy} (J/m^2), or {@code strength}
     * (Pa, with Young's modulus) to solve for it at the length scale. Optional: {@code lengthScale} (m, default
     * two cells, at least one), {@code viscosity} (Pa s, default 0), {@code residualStiffness} (in [0, 0.1],
     * default 1e-6).
     *
     * @return a builder of a model named "phase-field-at2"
     */
    public static IsotropicPhaseField.Builder phaseField() {
        return PhaseFieldAT2.builder();
    }

    /**
     * Isotropic AT1 phase-field fracture: elastic up to its strength, then a crack in a band of finite width (see
     * {@link PhaseFieldAT1}). Required: {@code fractureEnergy} (J/m^2), or {@code strength} (Pa, with Young's
     * modulus) to solve for it at the length scale. Optional: as {@link #phaseField()}.
     *
     * @return a builder of a model named "phase-field-at1"
     */
    public static IsotropicPhaseField.Builder phaseFieldAT1() {
        return PhaseFieldAT1.builder();
    }

    /**
     * Anisotropic AT2 (or, with {@code crackDensity}, AT1) phase-field fracture with a structural tensor of one to three fiber families (see
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

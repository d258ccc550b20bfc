package dev.fray.damage.plugin;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.plugin.DamageModelProvider;
import dev.fray.core.plugin.Parameters;
import dev.fray.damage.Fracture;
import dev.fray.damage.fracture.AnisotropicPhaseField;
import dev.fray.damage.fracture.PhaseFieldAT2;

/**
 * Registry entry "phase-field-anisotropic": {@link AnisotropicPhaseField} from named parameters fractureEnergy
 * (J/m^2), lengthScale (m), viscosity (Pa s), residualStiffness, fiberStrength1 (required), fiberStrength2 and
 * fiberStrength3 (one per further family), and for the stress-based driving force criticalStressAlong and
 * criticalStressAcross (Pa, both or neither) with stressDrivingSlope, and split (tension-compression split:
 * law-default, volumetric-deviatoric, spectral or none).
 */
public final class AnisotropicPhaseFieldDamageProvider implements DamageModelProvider {
    /** Creates the provider (called by {@link java.util.ServiceLoader}). */
    public AnisotropicPhaseFieldDamageProvider() {
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return AnisotropicPhaseField.NAME;
    }

    /** {@inheritDoc} */
    @Override
    public String description() {
        return "AT2 phase-field fracture along fibers: fractureEnergy (J/m^2), lengthScale (m, default two cells),"
                + " viscosity (Pa s), residualStiffness, fiberStrength1..3 (anisotropy alpha per fiber family,"
                + " channels fiber-1..3), optional criticalStressAlong and criticalStressAcross (Pa) for a"
                + " stress-based driving force with stressDrivingSlope (default 1), " + SplitParameter.DESCRIPTION;
    }

    /**
     * {@inheritDoc}
     *
     * @throws InvalidInputException with key UNKNOWN_NAME for a parameter no one reads (with a did-you-mean
     *                               suggestion) or an unknown split, MISSING for a required one, INCONSISTENT
     *                               for a family number given without the ones before it or one critical stress
     *                               without the other
     */
    @Override
    public DamageModel create(Parameters params) {
        double gc = params.number("fractureEnergy", Double.NaN);
        double l = params.number("lengthScale", Double.NaN);
        double eta = params.number("viscosity", 0.0);
        double k = params.number("residualStiffness", PhaseFieldAT2.DEFAULT_RESIDUAL_STIFFNESS);
        double[] alpha = {params.number("fiberStrength1", Double.NaN), params.number("fiberStrength2", Double.NaN),
            params.number("fiberStrength3", Double.NaN)};
        double along = params.number("criticalStressAlong", Double.NaN);
        double across = params.number("criticalStressAcross", Double.NaN);
        double zeta = params.number("stressDrivingSlope", AnisotropicPhaseField.DEFAULT_STRESS_DRIVING_SLOPE);
        TensionSplit split = SplitParameter.read(params);
        params.requireAllUsed();
        if (Double.isNaN(gc)) {
            throw new InvalidInputException(FrayMessage.MISSING, params.where() + ".fractureEnergy");
        }
        int families = 0;
        for (int f = 0; f < alpha.length; f++) {
            if (!Double.isNaN(alpha[f])) {
                if (families != f) {
                    throw new InvalidInputException(FrayMessage.INCONSISTENT, params.where() + ".fiberStrength"
                            + (f + 1), "fiber families are numbered from 1; give fiberStrength" + (families + 1)
                            + " first");
                }
                families++;
            }
        }
        if (families == 0) {
            throw new InvalidInputException(FrayMessage.MISSING, params.where() + ".fiberStrength1");
        }
        AnisotropicPhaseField.Builder b = Fracture.anisotropicPhaseField().fractureEnergy(gc).lengthScale(l)
                .viscosity(eta).residualStiffness(k).fiberStrengths(java.util.Arrays.copyOf(alpha, families))
                .stressDrivingSlope(zeta).tensionSplit(split);
        if (Double.isNaN(along) != Double.isNaN(across)) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, params.where() + ".criticalStressAlong and"
                    + " criticalStressAcross", "give both for the stress-based driving force, or neither");
        }
        if (!Double.isNaN(along)) {
            b.stressDriving(along, across);
        }
        return b.build();
    }
}

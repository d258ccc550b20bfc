package dev.fray.damage.plugin;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.DamageModelProvider;
import dev.fray.core.plugin.Parameters;
import dev.fray.damage.Fracture;
import dev.fray.core.plugin.Suggest;
import dev.fray.damage.fracture.AnisotropicPhaseField;
import dev.fray.damage.fracture.CrackDensity;

import java.util.Arrays;
import java.util.List;

/**
 * Registry entry "phase-field-anisotropic": {@link AnisotropicPhaseField} from named parameters fractureEnergy
 * (J/m^2) or strength (Pa) with youngsModulus (Pa), crackDensity ("at2", the default, or "at1"), lengthScale (m),
 * viscosity (Pa s), residualStiffness, fiberStrength1 (required), fiberStrength2 and
 * fiberStrength3 (one per further family), and for the stress-based driving force criticalStressAlong and
 * criticalStressAcross (Pa, both or neither) with stressDrivingSlope, and split (tension-compression split:
 * law-default, volumetric-deviatoric, spectral or none).
 */
public final class AnisotropicPhaseFieldDamageProvider implements DamageModelProvider {
    private static final List<String> DENSITIES = Arrays.stream(CrackDensity.values()).map(CrackDensity::key)
            .toList();

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
        return "phase-field fracture along fibers: crackDensity (at2 or at1, default at2), fiberStrength1..3"
                + " (anisotropy alpha per fiber family, channels fiber-1..3), optional criticalStressAlong and"
                + " criticalStressAcross (Pa) for a stress-based driving force with stressDrivingSlope (default 1), "
                + PhaseFieldParameters.DESCRIPTION;
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
        double[] alpha = {params.number("fiberStrength1", Double.NaN), params.number("fiberStrength2", Double.NaN),
            params.number("fiberStrength3", Double.NaN)};
        double along = params.number("criticalStressAlong", Double.NaN);
        double across = params.number("criticalStressAcross", Double.NaN);
        double zeta = params.number("stressDrivingSlope", AnisotropicPhaseField.DEFAULT_STRESS_DRIVING_SLOPE);
        String density = params.string("crackDensity", CrackDensity.AT2.key());
        AnisotropicPhaseField.Builder b = PhaseFieldParameters.read(params, Fracture.anisotropicPhaseField());
        params.requireAllUsed();
        CrackDensity cd = CrackDensity.ofKey(density);
        if (cd == null) {
            String best = Suggest.closest(density, DENSITIES);
            throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "crackDensity in " + params.where(), density,
                    best == null ? DENSITIES : "did you mean \"" + best + "\"? all: " + DENSITIES);
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
        b.crackDensity(cd).fiberStrengths(Arrays.copyOf(alpha, families)).stressDrivingSlope(zeta);
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

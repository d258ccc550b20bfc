package dev.fray.damage.plugin;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.plugin.DamageModelProvider;
import dev.fray.core.plugin.Parameters;
import dev.fray.damage.Fracture;
import dev.fray.damage.fracture.RankineDamage;

import java.util.List;
import java.util.Locale;

/**
 * Registry entry "rankine": {@link RankineDamage} from named parameters criticalStress (Pa), softeningStress (Pa)
 * or fractureEnergy (J/m^2) with youngsModulus (Pa), bandWidth (m), viscosity (s), degradation ("linear" or
 * "quadratic"), residualStiffness and split (tension-compression split: law-default, volumetric-deviatoric,
 * spectral or none).
 */
public final class RankineDamageProvider implements DamageModelProvider {
    private static final List<String> DEGRADATIONS = List.of("linear", "quadratic");

    /** Creates the provider (called by {@link java.util.ServiceLoader}). */
    public RankineDamageProvider() {
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return RankineDamage.NAME;
    }

    /** {@inheritDoc} */
    @Override
    public String description() {
        return "Rankine maximum principal stress damage with exponential softening: criticalStress (Pa), and"
                + " softeningStress (Pa) or fractureEnergy (J/m^2) with youngsModulus (Pa) and bandWidth (m, default"
                + " one cell); viscosity (relaxation time, s, default 0), degradation (linear or quadratic),"
                + " residualStiffness (default 1e-6), " + SplitParameter.DESCRIPTION;
    }

    /**
     * {@inheritDoc}
     *
     * @throws InvalidInputException with key UNKNOWN_NAME for a parameter no one reads (with a did-you-mean
     *                               suggestion), an unknown degradation or split, MISSING for a required one,
     *                               OUT_OF_RANGE for a bad value
     */
    @Override
    public DamageModel create(Parameters params) {
        double sigmaC = params.number("criticalStress", Double.NaN);
        double soft = params.number("softeningStress", Double.NaN);
        double gf = params.number("fractureEnergy", Double.NaN);
        double e = params.number("youngsModulus", Double.NaN);
        double h = params.number("bandWidth", Double.NaN);
        double tau = params.number("viscosity", 0.0);
        String deg = params.string("degradation", "linear");
        double k = params.number("residualStiffness", RankineDamage.DEFAULT_RESIDUAL_STIFFNESS);
        TensionSplit split = SplitParameter.read(params);
        params.requireAllUsed();
        if (Double.isNaN(sigmaC)) {
            throw new InvalidInputException(FrayMessage.MISSING, params.where() + ".criticalStress");
        }
        int d = DEGRADATIONS.indexOf(deg.toLowerCase(Locale.ROOT));
        if (d < 0) {
            throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "degradation in " + params.where(), deg,
                    DEGRADATIONS);
        }
        RankineDamage.Builder b = Fracture.rankine().criticalStress(sigmaC).viscosity(tau).residualStiffness(k)
                .degradation(d == 0 ? RankineDamage.Degradation.LINEAR : RankineDamage.Degradation.QUADRATIC)
                .bandWidth(h).tensionSplit(split);
        if (!Double.isNaN(soft)) {
            b.softeningStress(soft);
        }
        if (!Double.isNaN(gf)) {
            if (Double.isNaN(e)) {
                throw new InvalidInputException(FrayMessage.MISSING, params.where() + ".youngsModulus");
            }
            b.fractureEnergy(gf, e);
        } else if (!Double.isNaN(e)) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, params.where() + ".youngsModulus",
                    "is used only with fractureEnergy");
        }
        return b.build();
    }
}

package dev.fray.damage.plugin;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.Parameters;
import dev.fray.damage.fracture.PhaseFieldAT2;
import dev.fray.damage.fracture.PhaseFieldBuilder;

/**
 * The parameters every phase-field provider reads: fractureEnergy (J/m^2) or strength (Pa) with youngsModulus
 * (Pa), lengthScale (m), viscosity (Pa s), residualStiffness and split. Shared by the providers; stateless.
 */
final class PhaseFieldParameters {
    /** Description of the shared parameters for provider descriptions. */
    static final String DESCRIPTION = "fractureEnergy (J/m^2), or strength (Pa) with youngsModulus (Pa) to solve"
            + " for it, lengthScale (m, default two cells), viscosity (Pa s, default 0), residualStiffness (in [0,"
            + " 0.1], default 1e-6), " + SplitParameter.DESCRIPTION;

    private PhaseFieldParameters() {
    }

    /**
     * Reads the shared parameters into a builder, marking them used.
     *
     * @param params  the provider's parameters (input)
     * @param builder the builder to fill (output)
     * @param <B>     the builder type
     * @return the builder
     * @throws InvalidInputException with key MISSING for a missing fractureEnergy (or strength) or a strength
     *                               without youngsModulus, INCONSISTENT for a youngsModulus without strength
     */
    static <B extends PhaseFieldBuilder<B>> B read(Parameters params, B builder) {
        double gc = params.number("fractureEnergy", Double.NaN);
        double strength = params.number("strength", Double.NaN);
        double e = params.number("youngsModulus", Double.NaN);
        builder.lengthScale(params.number("lengthScale", Double.NaN))
                .viscosity(params.number("viscosity", 0.0))
                .residualStiffness(params.number("residualStiffness", PhaseFieldAT2.DEFAULT_RESIDUAL_STIFFNESS))
                .tensionSplit(SplitParameter.read(params));
        if (Double.isNaN(gc) && Double.isNaN(strength)) {
            throw new InvalidInputException(FrayMessage.MISSING, params.where() + ".fractureEnergy");
        }
        if (!Double.isNaN(strength) && Double.isNaN(e)) {
            throw new InvalidInputException(FrayMessage.MISSING, params.where() + ".youngsModulus");
        }
        if (Double.isNaN(strength) && !Double.isNaN(e)) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, params.where() + ".youngsModulus",
                    "is used only with strength");
        }
        if (!Double.isNaN(gc)) {
            builder.fractureEnergy(gc);
        }
        if (!Double.isNaN(strength)) {
            builder.strength(strength, e);
        }
        return builder;
    }
}

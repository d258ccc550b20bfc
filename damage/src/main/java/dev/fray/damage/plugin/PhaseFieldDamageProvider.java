package dev.fray.damage.plugin;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.plugin.DamageModelProvider;
import dev.fray.core.plugin.Parameters;
import dev.fray.damage.Fracture;
import dev.fray.damage.fracture.PhaseFieldAT2;

/**
 * Registry entry "phase-field-at2": {@link PhaseFieldAT2} from named parameters fractureEnergy (J/m^2),
 * lengthScale (m), viscosity (Pa s), residualStiffness and split (tension-compression split: law-default,
 * volumetric-deviatoric, spectral or none).
 */
public final class PhaseFieldDamageProvider implements DamageModelProvider {
    /** Creates the provider (called by {@link java.util.ServiceLoader}). */
    public PhaseFieldDamageProvider() {
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return PhaseFieldAT2.NAME;
    }

    /** {@inheritDoc} */
    @Override
    public String description() {
        return "AT2 phase-field fracture with history field: fractureEnergy (J/m^2), lengthScale (m, default two"
                + " cells), viscosity (Pa s, default 0), residualStiffness (in [0, 0.1], default 1e-6), "
                + SplitParameter.DESCRIPTION;
    }

    /**
     * {@inheritDoc}
     *
     * @throws InvalidInputException with key UNKNOWN_NAME for a parameter no one reads (with a did-you-mean
     *                               suggestion) or an unknown split, MISSING for fractureEnergy, OUT_OF_RANGE for a
     *                               bad value
     */
    @Override
    public DamageModel create(Parameters params) {
        double gc = params.number("fractureEnergy", Double.NaN);
        double l = params.number("lengthScale", Double.NaN);
        double eta = params.number("viscosity", 0.0);
        double k = params.number("residualStiffness", PhaseFieldAT2.DEFAULT_RESIDUAL_STIFFNESS);
        TensionSplit split = SplitParameter.read(params);
        params.requireAllUsed();
        if (Double.isNaN(gc)) {
            throw new InvalidInputException(FrayMessage.MISSING, params.where() + ".fractureEnergy");
        }
        return Fracture.phaseField().fractureEnergy(gc).lengthScale(l).viscosity(eta).residualStiffness(k)
                .tensionSplit(split).build();
    }
}

package dev.fray.damage.plugin;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.DamageModelProvider;
import dev.fray.core.plugin.Parameters;
import dev.fray.damage.Fracture;
import dev.fray.damage.fracture.IsotropicPhaseField;
import dev.fray.damage.fracture.PhaseFieldAT1;
import dev.fray.damage.fracture.PhaseFieldAT2;

/**
 * Registry entries "phase-field-at2" ({@link PhaseFieldAT2}) and, as {@link AT1}, "phase-field-at1"
 * ({@link PhaseFieldAT1}), from named parameters fractureEnergy (J/m^2) or strength (Pa) with youngsModulus (Pa),
 * lengthScale (m), viscosity (Pa s), residualStiffness and split (tension-compression split: law-default,
 * volumetric-deviatoric, spectral or none).
 */
public class PhaseFieldDamageProvider implements DamageModelProvider {
    /** Creates the AT2 provider (called by {@link java.util.ServiceLoader}). */
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
        return "AT2 phase-field fracture with history field (damages under any load): "
                + PhaseFieldParameters.DESCRIPTION;
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
        IsotropicPhaseField.Builder b = PhaseFieldParameters.read(params, Fracture.phaseField());
        params.requireAllUsed();
        return b.build();
    }

    /** Registry entry "phase-field-at1". */
    public static final class AT1 extends PhaseFieldDamageProvider {
        /** Creates the provider (called by {@link java.util.ServiceLoader}). */
        public AT1() {
        }

        /** {@inheritDoc} */
        @Override
        public String name() {
            return PhaseFieldAT1.NAME;
        }

        /** {@inheritDoc} */
        @Override
        public String description() {
            return "AT1 phase-field fracture with history field (elastic up to sqrt(3 E Gc/(8 l)), band of"
                    + " half-width 2 l): " + PhaseFieldParameters.DESCRIPTION;
        }

        /** {@inheritDoc} */
        @Override
        public DamageModel create(Parameters params) {
            IsotropicPhaseField.Builder b = PhaseFieldParameters.read(params, Fracture.phaseFieldAT1());
            params.requireAllUsed();
            return b.build();
        }
    }
}

package dev.fray.examples.plugin;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.plugin.DamageModelProvider;
import dev.fray.core.plugin.Parameters;

/**
 * Makes {@link MaxStrainDamage} from named parameters. Listed in
 * {@code META-INF/services/dev.fray.core.plugin.DamageModelProvider} of the test resources, exactly as a
 * third-party jar would list it, so {@link dev.fray.core.plugin.PluginRegistry#load()} finds it.
 */
public final class MaxStrainDamageProvider implements DamageModelProvider {
    /** Default failure strain as a multiple of the critical strain. */
    public static final double DEFAULT_FAILURE_RATIO = 2;
    /** Default residual stiffness, dimensionless. */
    public static final double DEFAULT_RESIDUAL_STIFFNESS = 1e-6;

    /** Created by {@link java.util.ServiceLoader}. */
    public MaxStrainDamageProvider() {
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return MaxStrainDamage.NAME;
    }

    /** {@inheritDoc} */
    @Override
    public String description() {
        return "maximum principal strain with linear softening: criticalStrain (required), failureStrain (default "
                + DEFAULT_FAILURE_RATIO + " x critical), residualStiffness (default " + DEFAULT_RESIDUAL_STIFFNESS
                + "); all dimensionless";
    }

    /** {@inheritDoc} */
    @Override
    public DamageModel create(Parameters params) {
        double critical = params.number("criticalStrain");
        double failure = params.number("failureStrain", DEFAULT_FAILURE_RATIO * critical);
        double residual = params.number("residualStiffness", DEFAULT_RESIDUAL_STIFFNESS);
        params.requireAllUsed();
        return new MaxStrainDamage(critical, failure, residual);
    }
}

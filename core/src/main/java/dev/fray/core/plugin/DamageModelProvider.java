package dev.fray.core.plugin;

import dev.fray.core.damage.DamageModel;

/**
 * Makes a damage model from named parameters. Implementations are listed in
 * {@code META-INF/services/dev.fray.core.plugin.DamageModelProvider} of their jar and found by
 * {@link PluginRegistry}; a third-party model is registered exactly like a built-in one.
 */
public interface DamageModelProvider {
    /** @return the model's name as used in scene files, e.g. "rankine" */
    String name();

    /** @return one line for humans: what the model does and its parameters with units */
    String description();

    /**
     * @param params the parameters; the provider must call {@link Parameters#requireAllUsed()}
     * @return the model
     */
    DamageModel create(Parameters params);
}

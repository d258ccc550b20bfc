package dev.fray.core.plugin;

import dev.fray.core.material.MaterialLaw;

/**
 * Makes a material law from named parameters; registered in
 * {@code META-INF/services/dev.fray.core.plugin.MaterialLawProvider} and found by {@link PluginRegistry}.
 */
public interface MaterialLawProvider {
    /** @return the law's name as used in scene files, e.g. "neo-hookean" */
    String name();

    /** @return one line for humans: the law and its parameters with units */
    String description();

    /**
     * @param params the parameters; the provider must call {@link Parameters#requireAllUsed()}
     * @return the law
     */
    MaterialLaw create(Parameters params);
}

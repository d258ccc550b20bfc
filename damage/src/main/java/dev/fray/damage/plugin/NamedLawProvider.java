package dev.fray.damage.plugin;

import dev.fray.core.plugin.MaterialLawProvider;

/** What the built-in material-law providers share: a fixed name and a one-line description. */
abstract class NamedLawProvider implements MaterialLawProvider {
    private final String name;
    private final String description;

    /**
     * @param name        the registry name
     * @param description the law and its parameters with units
     */
    NamedLawProvider(String name, String description) {
        this.name = name;
        this.description = description;
    }

    @Override
    public final String name() {
        return name;
    }

    @Override
    public final String description() {
        return description;
    }
}

package dev.fray.core.plugin;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.ServiceLoader;

/**
 * The material laws and damage models known to one host: those found through {@link ServiceLoader} on a class
 * loader, plus any registered by hand. An instance, never a global: two hosts in one JVM may see different sets.
 */
public final class PluginRegistry {
    private final Map<String, MaterialLawProvider> laws = new LinkedHashMap<>();
    private final Map<String, DamageModelProvider> models = new LinkedHashMap<>();

    /** Creates an empty registry. */
    public PluginRegistry() {
    }

    /**
     * @param loader class loader to search
     * @return a registry with every provider listed on that class path
     */
    public static PluginRegistry load(ClassLoader loader) {
        PluginRegistry r = new PluginRegistry();
        for (MaterialLawProvider p : ServiceLoader.load(MaterialLawProvider.class, loader)) {
            r.register(p);
        }
        for (DamageModelProvider p : ServiceLoader.load(DamageModelProvider.class, loader)) {
            r.register(p);
        }
        return r;
    }

    /** @return a registry of the providers visible to this class's loader */
    public static PluginRegistry load() {
        return load(PluginRegistry.class.getClassLoader());
    }

    /**
     * @param p provider; replaces an earlier one of the same name
     * @return this
     */
    public PluginRegistry register(MaterialLawProvider p) {
        laws.put(p.name(), p);
        return this;
    }

    /**
     * @param p provider; replaces an earlier one of the same name
     * @return this
     */
    public PluginRegistry register(DamageModelProvider p) {
        models.put(p.name(), p);
        return this;
    }

    /** @return the material law providers by name */
    public Map<String, MaterialLawProvider> materialLaws() {
        return Collections.unmodifiableMap(laws);
    }

    /** @return the damage model providers by name */
    public Map<String, DamageModelProvider> damageModels() {
        return Collections.unmodifiableMap(models);
    }

    /**
     * @param name   law name
     * @param params its parameters
     * @return the law
     */
    public MaterialLaw materialLaw(String name, Parameters params) {
        MaterialLawProvider p = laws.get(name);
        if (p == null) {
            throw unknown("material law", name, List.copyOf(laws.keySet()), params);
        }
        return p.create(params);
    }

    /**
     * @param name   model name
     * @param params its parameters
     * @return the model
     */
    public DamageModel damageModel(String name, Parameters params) {
        DamageModelProvider p = models.get(name);
        if (p == null) {
            throw unknown("damage model", name, List.copyOf(models.keySet()), params);
        }
        return p.create(params);
    }

    private static InvalidInputException unknown(String kind, String name, List<String> known, Parameters params) {
        String best = Suggest.closest(name, known);
        String hint = best == null ? known.toString() : "did you mean \"" + best + "\"? all: " + known;
        return new InvalidInputException(FrayMessage.UNKNOWN_NAME, kind + " in " + params.where(), name, hint);
    }
}

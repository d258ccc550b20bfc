package dev.fray.io.scene;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.particles.ChannelField;
import dev.fray.core.plugin.Parameters;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.plugin.Suggest;
import dev.fray.damage.fiber.FiberFields;

import dev.fray.io.mesh.MeshDirectionField;
import dev.fray.io.mesh.MeshShape;

import java.nio.file.Path;
import java.util.Collections;
import java.util.IdentityHashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * What a {@link dev.fray.core.sim.Scene} cannot say about itself but a scene file must: how each material law,
 * damage model and fiber direction field was made (its name and parameters, as a {@link ModelDescription}), and
 * which bodies are layers of one group. It sits beside the scene, keyed by the identity of the model objects, so
 * the core stays free of file concerns.
 *
 * <p>A scene read from a file comes with a complete description. A host that builds a scene in Java and wants to
 * write it makes its models here ({@link #materialLaw}, {@link #damageModel}, {@link #fiberField}), or attaches a
 * description to a model it made itself ({@link #describe}). A third-party law registered in the
 * {@link PluginRegistry} is written like a built-in one; a law made without the registry and without a description
 * cannot be written, and {@link SceneWriter} says which body holds it. Built-in elastic laws made with
 * {@code dev.fray.damage.Elastic} are recognised without a description, and fiber-reinforced laws are written from
 * their families plus the description of their base law.
 *
 * <p>Not thread-safe; fill it while building the scene, then only read it.
 */
public final class SceneDescription {
    /** Fiber direction field kinds {@link #fiberField} accepts. */
    public static final List<String> FIBER_FIELDS = List.of("uniform", "circumferential", "radial", "helical");

    private final PluginRegistry registry;
    private final Map<Object, ModelDescription> described = new IdentityHashMap<>();
    private final Map<String, String> groups = new LinkedHashMap<>();
    private String text = "";
    private final Map<String, Path> files = new LinkedHashMap<>();

    /**
     * @param registry the material laws and damage models available by name
     */
    public SceneDescription(PluginRegistry registry) {
        this.registry = Checks.notNull("plugin registry", registry);
    }

    /** @return the registry models are made from */
    public PluginRegistry registry() {
        return registry;
    }

    /**
     * Makes a material law by registry name and remembers how.
     *
     * @param name       registry name, e.g. "neo-hookean"
     * @param parameters its parameters in SI units, e.g. youngsModulus (Pa), poissonRatio, density (kg/m^3)
     * @return the law
     * @throws InvalidInputException UNKNOWN_NAME for an unknown law or parameter, or the provider's error
     */
    public MaterialLaw materialLaw(String name, Map<String, ?> parameters) {
        ModelDescription d = ModelDescription.of(name, parameters);
        return describe(registry.materialLaw(name, d.toParameters("material \"" + name + "\"")), d);
    }

    /**
     * Makes a damage model by registry name and remembers how.
     *
     * @param name       registry name, e.g. "phase-field-at2"
     * @param parameters its parameters in SI units, e.g. fractureEnergy (J/m^2), lengthScale (m)
     * @return the model
     * @throws InvalidInputException UNKNOWN_NAME for an unknown model or parameter, or the provider's error
     */
    public DamageModel damageModel(String name, Map<String, ?> parameters) {
        ModelDescription d = ModelDescription.of(name, parameters);
        return describe(registry.damageModel(name, d.toParameters("damage \"" + name + "\"")), d);
    }

    /**
     * Makes a fiber direction field for a "fiber-k" channel and remembers how. Kinds and parameters:
     * "uniform" (direction [3]); "circumferential" and "radial" (point [3] m, axis [3]); "helical" (point, axis,
     * pitchAngle in rad, [-pi/2, pi/2]).
     *
     * @param type       one of {@link #FIBER_FIELDS}
     * @param parameters the parameters
     * @return the field
     * @throws InvalidInputException UNKNOWN_NAME for an unknown kind or parameter, MISSING or OUT_OF_RANGE for bad
     *         values
     */
    public ChannelField fiberField(String type, Map<String, ?> parameters) {
        ModelDescription d = ModelDescription.of(type, parameters);
        return describe(makeFiberField(d, "fiber directions \"" + type + "\""), d);
    }

    /**
     * Reads a mesh file as a shape (a closed surface, see {@link MeshShape}) and remembers how: scaled about the
     * origin by scale, then moved by offset.
     *
     * @param file      an OBJ, STL or PLY file (the name is written to scene files as given)
     * @param scale     uniform scale factor, &gt; 0
     * @param offset    offset after scaling, m, 3 values
     * @param allowOpen whether to accept a surface with holes or bad edges
     * @return the shape
     * @throws InvalidInputException FILE_ERROR for an unreadable or malformed file, or the shape's error for an
     *         open surface
     */
    public MeshShape mesh(Path file, double scale, double[] offset, boolean allowOpen) {
        MeshShape shape = MeshSupport.shape(file, scale, offset, allowOpen);
        file(file.toString(), file.toAbsolutePath().normalize());
        return describe(shape, new MeshSupport.Request(file.toString(), scale, offset.clone(), allowOpen).describe());
    }

    /**
     * Fiber directions from a width-3 vertex attribute of a body's mesh (see {@link MeshDirectionField}), for a
     * "fiber-k" channel, remembered as {"type": "mesh", "attribute": ...}. The field belongs to the body whose
     * shape is this mesh.
     *
     * @param shape     the body's mesh shape
     * @param attribute vertex attribute name, e.g. "f" for the fx fy fz properties of a PLY file
     * @return the field
     */
    public ChannelField meshFiberField(MeshShape shape, String attribute) {
        return describe(MeshDirectionField.of(shape, attribute),
                new ModelDescription("mesh", Map.of("attribute", attribute)));
    }

    /**
     * Records a file the scene refers to (a mesh), so that a checkpoint can carry it.
     *
     * @param asWritten the name as the scene file gives it
     * @param resolved  where it was found, or null if it came from an embedded copy
     * @return this
     */
    public SceneDescription file(String asWritten, Path resolved) {
        files.put(Checks.notNull("file name", asWritten), resolved);
        return this;
    }

    /** @return the files the scene refers to: name as written to where it was found (null if embedded) */
    public Map<String, Path> files() {
        return Collections.unmodifiableMap(files);
    }

    /**
     * Attaches a description to a model made elsewhere (a law built by hand, a mesh shape, a custom field).
     *
     * @param instance    the model object
     * @param description how to write it
     * @param <T>         its type
     * @return instance, for chaining
     */
    public <T> T describe(T instance, ModelDescription description) {
        Checks.notNull("described object", instance);
        described.put(instance, Checks.notNull("description", description));
        return instance;
    }

    /**
     * @param instance a model object
     * @return its description, if one was made or attached here
     */
    public Optional<ModelDescription> of(Object instance) {
        return Optional.ofNullable(described.get(instance));
    }

    /**
     * Marks a body as a layer of a group: in a group, each body fills its shape only where no earlier body of the
     * group does (see {@link LayeredShape}).
     *
     * @param body  body name
     * @param group group name
     * @return this
     */
    public SceneDescription group(String body, String group) {
        groups.put(Checks.notNull("body name", body), Checks.notNull("group name", group));
        return this;
    }

    /**
     * @param body a body name
     * @return its group, if it is a layer of one
     */
    public Optional<String> groupOf(String body) {
        return Optional.ofNullable(groups.get(body));
    }

    /** @return body name to group name, in the order marked (unmodifiable) */
    public Map<String, String> groups() {
        return Collections.unmodifiableMap(groups);
    }

    /**
     * @param description free text saying what the scene is, written to the file's "description" key
     * @return this
     */
    public SceneDescription text(String description) {
        this.text = Checks.notNull("scene description text", description);
        return this;
    }

    /** @return the free-text description of the scene, "" if none */
    public String text() {
        return text;
    }

    /** Builds a fiber field from its description; where prefixes parameter errors. */
    static ChannelField makeFiberField(ModelDescription d, String where) {
        if (!FIBER_FIELDS.contains(d.name())) {
            String best = Suggest.closest(d.name(), FIBER_FIELDS);
            throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "fiber direction type in " + where, d.name(),
                    best == null ? FIBER_FIELDS : "did you mean \"" + best + "\"? all: " + FIBER_FIELDS);
        }
        Parameters p = d.toParameters(where);
        // Read everything first, so a misspelt name is reported as unknown (with a suggestion), not as missing.
        boolean uniform = d.name().equals("uniform");
        double[] dir = uniform ? p.vector("direction", null) : null;
        double[] point = uniform ? null : p.vector("point", null);
        double[] axis = uniform ? null : p.vector("axis", null);
        double pitch = d.name().equals("helical") ? p.number("pitchAngle", Double.NaN) : 0;
        p.requireAllUsed();
        switch (d.name()) {
            case "uniform":
                required(where, "direction", dir);
                return FiberFields.uniform(dir[0], dir[1], dir[2]);
            case "radial":
                return FiberFields.radial(required(where, "point", point), required(where, "axis", axis));
            case "circumferential":
                return FiberFields.circumferential(required(where, "point", point), required(where, "axis", axis));
            default:
                required(where, "point", point);
                required(where, "axis", axis);
                if (Double.isNaN(pitch)) {
                    throw new InvalidInputException(FrayMessage.MISSING, where + ".pitchAngle");
                }
                return FiberFields.helical(point, axis, pitch);
        }
    }

    private static double[] required(String where, String name, double[] v) {
        if (v == null) {
            throw new InvalidInputException(FrayMessage.MISSING, where + "." + name);
        }
        return v;
    }
}

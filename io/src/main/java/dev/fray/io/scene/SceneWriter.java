package dev.fray.io.scene;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shape;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelField;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.damage.elastic.ElasticParameters;
import dev.fray.damage.elastic.FixedCorotated;
import dev.fray.damage.elastic.HenckyStVK;
import dev.fray.damage.elastic.NeoHookean;
import dev.fray.damage.fiber.FiberReinforced;
import dev.fray.damage.fracture.AnisotropicPhaseField;
import dev.fray.damage.fracture.CrackDensity;
import dev.fray.damage.fracture.IsotropicPhaseField;
import dev.fray.damage.fracture.PhaseFieldAT2;
import dev.fray.damage.fracture.RankineDamage;
import dev.fray.damage.plugin.ElasticLawProviders;
import dev.fray.damage.plugin.PlasticLawProviders;
import dev.fray.io.AtomicFiles;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.UnaryOperator;

/**
 * Writes scenes as scene files that {@link SceneReader} reads back to an equal scene: the same settings, shapes,
 * contacts, motions and bodies, and models made from the same names and parameters. Analytic shapes, contacts,
 * motions, grips, {@link Wedge} shapes and {@link RegionField} initial values are written from their own records;
 * material laws, damage models, fiber direction fields and meshes from their {@link SceneDescription}. Without a
 * description, the built-in elastic laws, fiber-reinforced laws and the damage models of
 * {@code dev.fray.damage.Fracture} are written from their public parameters; a damage model that asks for a
 * tension-compression split other than the law's default gets a {@code "split"} parameter. Doubles are written so
 * that they read back to the same bits; a cylinder axis or plane normal is written normalised, as the core keeps
 * it.
 *
 * <p>Mesh shapes are written with their file name as the scene gave it; {@link #toJson(LoadedScene, Path)} and
 * {@link #write} rewrite relative names for the folder the text goes to.
 *
 * <p>What cannot be written, and is reported as {@link InvalidInputException} naming the body: a law or model
 * with no description, a body
 * with an initial velocity field (a Java function), and initial channels other than described fiber directions and
 * {@link RegionField}s of scalar channels. Stateless and thread-safe.
 */
public final class SceneWriter {
    private SceneWriter() {
    }

    /**
     * @param loaded a scene with its settings and description
     * @return the scene file text (UTF-8 when encoded), ending with a newline
     * @throws InvalidInputException if some part of the scene cannot be described (see the class comment)
     */
    public static String toJson(LoadedScene loaded) {
        return toJson(loaded.scene(), loaded.output(), loaded.description(), name -> name);
    }

    /**
     * Writes a scene for another place: relative file names (meshes) are resolved against the scene's own folder
     * and written relative to folder, or absolute when folder is null (the form a checkpoint embeds).
     *
     * @param loaded a scene with its settings and description
     * @param folder folder the text will live in, or null for absolute file names
     * @return the scene file text, ending with a newline
     * @throws InvalidInputException if some part of the scene cannot be described (see the class comment)
     */
    public static String toJson(LoadedScene loaded, Path folder) {
        Path base = loaded.baseDir() == null ? Path.of("").toAbsolutePath() : loaded.baseDir();
        return toJson(loaded.scene(), loaded.output(), loaded.description(), name -> {
            Path abs = base.resolve(name).toAbsolutePath().normalize();
            if (folder == null) {
                return abs.toString();
            }
            Path dir = folder.toAbsolutePath().normalize();
            try {
                return dir.relativize(abs).toString().replace('\\', '/');
            } catch (IllegalArgumentException e) {
                return abs.toString(); // another drive or root: no relative form
            }
        });
    }

    /**
     * @param scene       the scene
     * @param output      what a run of it writes
     * @param description how its models were made
     * @return the scene file text, ending with a newline
     * @throws InvalidInputException if some part of the scene cannot be described (see the class comment)
     */
    public static String toJson(Scene scene, OutputSettings output, SceneDescription description) {
        return toJson(scene, output, description, name -> name);
    }

    private static String toJson(Scene scene, OutputSettings output, SceneDescription description,
                                 UnaryOperator<String> files) {
        Checks.notNull("scene", scene);
        Checks.notNull("output settings", output);
        Checks.notNull("scene description", description);
        Map<String, Object> root = new LinkedHashMap<>();
        root.put("format", SceneReader.FORMAT);
        if (!description.text().isEmpty()) {
            root.put("description", description.text());
        }
        Bounds d = scene.domain();
        root.put("domain", map("min", new double[] {d.minX(), d.minY(), d.minZ()},
                "max", new double[] {d.maxX(), d.maxY(), d.maxZ()}));
        root.put("gravity", scene.gravity());
        root.put("walls", walls(scene.walls()));
        root.put("run", run(scene));
        root.put("output", output(output));
        List<Object> bodies = new ArrayList<>();
        for (Body b : scene.bodies()) {
            bodies.add(body(b, description, files));
        }
        root.put("bodies", bodies);
        if (!scene.obstacles().isEmpty()) {
            List<Object> obstacles = new ArrayList<>();
            for (Obstacle o : scene.obstacles()) {
                Map<String, Object> m = map("name", o.name(), "shape", shape(o.shape(), description,
                        "obstacle \"" + o.name() + "\"", files), "contact", contact(o.contact()));
                if (!o.motion().equals(Motion.STILL)) {
                    m.put("motion", motion(o.motion()));
                }
                obstacles.add(m);
            }
            root.put("obstacles", obstacles);
        }
        if (!scene.grips().isEmpty()) {
            List<Object> grips = new ArrayList<>();
            for (Grip g : scene.grips()) {
                Map<String, Object> m = map("name", g.name(), "body", g.body(), "region",
                        shape(g.region(), description, "grip \"" + g.name() + "\"", files));
                if (!g.motion().equals(Motion.STILL)) {
                    m.put("motion", motion(g.motion()));
                }
                grips.add(m);
            }
            root.put("grips", grips);
        }
        return JsonOut.write(root);
    }

    /**
     * Writes a scene file atomically (see {@link AtomicFiles}).
     *
     * @param target the .json file; its folder must exist
     * @param loaded the scene with its settings and description
     * @throws InvalidInputException if the scene cannot be described, or FILE_ERROR if the file cannot be written
     */
    public static void write(Path target, LoadedScene loaded) {
        byte[] bytes = toJson(loaded, target.toAbsolutePath().getParent()).getBytes(StandardCharsets.UTF_8);
        AtomicFiles.write(target, out -> out.write(bytes));
    }

    private static Map<String, Object> walls(List<Contact> walls) {
        // The most common law as "all", then the faces that differ.
        Contact common = walls.get(0);
        int best = 0;
        for (Contact c : walls) {
            int n = (int) walls.stream().filter(c::equals).count();
            if (n > best) {
                best = n;
                common = c;
            }
        }
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("all", contact(common));
        for (int i = 0; i < walls.size(); i++) {
            if (!walls.get(i).equals(common)) {
                m.put(Scene.WALL_FACES.get(i), contact(walls.get(i)));
            }
        }
        return m;
    }

    private static Map<String, Object> contact(Contact c) {
        Map<String, Object> m = map("type", c.type().name().toLowerCase(Locale.ROOT));
        if (c.friction() != 0) {
            m.put("friction", c.friction());
        }
        return m;
    }

    private static Map<String, Object> motion(Motion m) {
        Map<String, Object> out = map("velocity", new double[] {m.vx(), m.vy(), m.vz()},
                "angularVelocity", new double[] {m.wx(), m.wy(), m.wz()},
                "pivot", new double[] {m.cx(), m.cy(), m.cz()});
        ScheduleField.write(m.schedule(), out);
        return out;
    }

    private static Map<String, Object> run(Scene s) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("cellSize", s.cellSize());
        m.put("frameRate", s.frameRate());
        m.put("cfl", s.cfl());
        m.put("damping", s.damping());
        m.put("threads", s.threads());
        if (!Double.isNaN(s.fixedTimeStep())) {
            m.put("fixedTimeStep", s.fixedTimeStep());
        }
        if (s.maxTimeStep() != Double.POSITIVE_INFINITY) {
            m.put("maxTimeStep", s.maxTimeStep());
        }
        if (!Double.isNaN(s.speedLimit())) {
            m.put("speedLimit", s.speedLimit());
        }
        m.put("kernel", s.kernel() == Kernel.CUBIC ? "cubic" : "quadratic");
        m.put("phaseFieldSolver", map("tolerance", s.phaseFieldTolerance(),
                "maxIterations", (long) s.phaseFieldMaxIterations()));
        if (s.integration() != dev.fray.core.sim.Integration.EXPLICIT) {
            // explicit is the default, so scene files written before integration existed stay as they were
            m.put("integration", s.integration().key());
            m.put("implicitSolver", map("tolerance", s.implicitTolerance(),
                    "maxIterations", (long) s.implicitMaxIterations()));
        }
        if (s.separates()) {
            m.put("separation", map("damageThreshold", s.separationThreshold(), "friction", s.separationFriction()));
        }
        return m;
    }

    private static Map<String, Object> output(OutputSettings o) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("frames", (long) o.frames());
        List<Object> formats = new ArrayList<>();
        for (OutputFormat f : o.formats()) {
            formats.add(f.fileName());
        }
        m.put("formats", formats);
        if (o.channels() != null) {
            m.put("channels", new ArrayList<Object>(o.channels()));
        }
        m.put("checkpointEvery", (long) o.checkpointEvery());
        m.put("keepCheckpoints", (long) o.keepCheckpoints());
        m.put("diagnosticsEvery", (long) o.diagnosticsEvery());
        return m;
    }

    private static Map<String, Object> body(Body b, SceneDescription description, UnaryOperator<String> files) {
        String who = "body \"" + b.name() + "\"";
        if (b.velocityField() != null) {
            throw cannot(who, "has an initial velocity field (a Java function), which a scene file cannot hold");
        }
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("name", b.name());
        description.groupOf(b.name()).ifPresent(g -> m.put("group", g));
        Shape s = b.shape();
        if (s instanceof LayeredShape layer) {
            // The exclusion is rebuilt from the group when the file is read.
            s = layer.own();
        }
        m.put("shape", shape(s, description, who, files));
        m.putAll(material(b.material(), description, who));
        if (b.damage() != null) {
            m.put("damage", model("model", b.damage(), description, who));
        }
        List<Object> fibers = new ArrayList<>();
        List<Object> values = new ArrayList<>();
        initialChannels(b, description, who, files, fibers, values);
        if (!fibers.isEmpty()) {
            m.put("fiberDirections", fibers);
        }
        if (!values.isEmpty()) {
            m.put("initialValues", values);
        }
        if (!Double.isNaN(b.spacing())) {
            m.put("spacing", b.spacing());
        }
        m.put("jitter", b.jitter());
        m.put("seed", b.seed());
        m.put("velocity", b.linearVelocity());
        m.put("angularVelocity", b.angularVelocity());
        return m;
    }

    private static Map<String, Object> material(MaterialLaw law, SceneDescription description, String who) {
        Map<String, Object> m;
        if (law instanceof FiberReinforced fr) {
            m = model("law", fr.base(), description, who);
            List<Object> terms = new ArrayList<>();
            for (FiberReinforced.Term t : fr.terms()) {
                if (t.kind() == FiberReinforced.Term.Kind.QUADRATIC) {
                    terms.add(map("type", "quadratic", "stiffness", t.stiffness()));
                } else {
                    terms.add(map("type", "exponential", "k1", t.stiffness(), "k2", t.exponent()));
                }
            }
            m.put("fibers", terms);
        } else {
            m = model("law", law, description, who);
        }
        return Map.of("material", m);
    }

    /** {"law" or "model": name, parameters...} from the description, or from a built-in elastic law. */
    private static Map<String, Object> model(String nameKey, Object model, SceneDescription description,
                                             String who) {
        ModelDescription d = description.of(model).orElseGet(() -> model instanceof DamageModel dm
                ? fracture(dm, who) : builtIn(model));
        if (d == null) {
            String kind = model instanceof DamageModel ? "damage model" : "material law";
            String name = model instanceof DamageModel dm ? dm.name() : ((MaterialLaw) model).name();
            throw cannot(who, "its " + kind + " \"" + name + "\" was not made by name; make it with "
                    + "SceneDescription." + (model instanceof DamageModel ? "damageModel" : "materialLaw")
                    + "(name, parameters) or attach a description with describe(...)");
        }
        Map<String, Object> m = new LinkedHashMap<>();
        m.put(nameKey, d.name());
        putParameters(m, d);
        if (model instanceof DamageModel dm && dm.tensionSplit() != TensionSplit.LAW_DEFAULT
                && !m.containsKey(SPLIT)) {
            m.put(SPLIT, dm.tensionSplit().key());
        }
        return m;
    }

    /** Parameter name of a damage model's tension-compression split. */
    static final String SPLIT = "split";

    /**
     * The registry parameters of a damage model made by the {@code Fracture} builders, read from its accessors;
     * parameters at their defaults are left out. Null for other models.
     */
    private static ModelDescription fracture(DamageModel model, String who) {
        Map<String, Object> p = new LinkedHashMap<>();
        if (model instanceof IsotropicPhaseField pf) {
            phaseField(p, pf.fractureEnergy(), pf.strength(), pf.strengthModulus(), pf.lengthScale(),
                    pf.viscosity(), pf.residualStiffness());
            return new ModelDescription(pf.name(), p);
        }
        if (model instanceof AnisotropicPhaseField af) {
            if (af.crackDensity() != CrackDensity.AT2) {
                p.put("crackDensity", af.crackDensity().key());
            }
            phaseField(p, af.fractureEnergy(), af.strength(), af.strengthModulus(), af.lengthScale(),
                    af.viscosity(), af.residualStiffness());
            for (int k = 1; k <= af.families(); k++) {
                p.put("fiberStrength" + k, af.fiberStrength(k));
            }
            if (af.stressDriven()) {
                p.put("criticalStressAlong", af.criticalStressAlong());
                p.put("criticalStressAcross", af.criticalStressAcross());
            }
            if (af.stressDrivingSlope() != AnisotropicPhaseField.DEFAULT_STRESS_DRIVING_SLOPE) {
                p.put("stressDrivingSlope", af.stressDrivingSlope());
            }
            return new ModelDescription(AnisotropicPhaseField.NAME, p);
        }
        if (model instanceof RankineDamage r) {
            p.put("criticalStress", r.criticalStress());
            if (Double.isNaN(r.fractureEnergy())) {
                p.put("softeningStress", r.softeningStress());
            } else {
                p.put("fractureEnergy", r.fractureEnergy());
                p.put("youngsModulus", r.youngsModulus());
            }
            putUnlessDefault(p, "bandWidth", r.bandWidth(), Double.NaN);
            putUnlessDefault(p, "viscosity", r.viscosity(), 0);
            if (r.degradationFunction() == RankineDamage.Degradation.QUADRATIC) {
                p.put("degradation", "quadratic");
            }
            putUnlessDefault(p, "residualStiffness", r.residualStiffness(), RankineDamage.DEFAULT_RESIDUAL_STIFFNESS);
            return new ModelDescription(RankineDamage.NAME, p);
        }
        return null;
    }

    private static void phaseField(Map<String, Object> p, double gc, double strength, double modulus,
                                   double length, double viscosity, double residual) {
        if (Double.isNaN(strength)) {
            p.put("fractureEnergy", gc);
        } else {
            // The user chose a strength: keep it, so the fracture energy follows the length scale on any grid.
            p.put("strength", strength);
            p.put("youngsModulus", modulus);
        }
        putUnlessDefault(p, "lengthScale", length, Double.NaN);
        putUnlessDefault(p, "viscosity", viscosity, 0);
        putUnlessDefault(p, "residualStiffness", residual, PhaseFieldAT2.DEFAULT_RESIDUAL_STIFFNESS);
    }

    /** Puts a value that differs from the default (compared by bits, so NaN matches NaN and -0.0 is kept). */
    private static void putUnlessDefault(Map<String, Object> p, String key, double value, double fallback) {
        if (Double.doubleToLongBits(value) != Double.doubleToLongBits(fallback)) {
            p.put(key, value);
        }
    }

    private static ModelDescription builtIn(Object model) {
        Map<String, Object> plastic = model instanceof MaterialLaw law ? PlasticLawProviders.parametersOf(law) : null;
        if (plastic != null) {
            return new ModelDescription(((MaterialLaw) model).name(), plastic);
        }
        ElasticParameters p;
        String name;
        if (model instanceof NeoHookean law) {
            p = law.parameters();
            name = NeoHookean.NAME;
        } else if (model instanceof FixedCorotated law) {
            p = law.parameters();
            name = FixedCorotated.NAME;
        } else if (model instanceof HenckyStVK law) {
            p = law.parameters();
            name = HenckyStVK.NAME;
        } else {
            return null;
        }
        Map<String, Object> params = new LinkedHashMap<>();
        params.put(ElasticLawProviders.YOUNGS_MODULUS, p.youngsModulus());
        params.put(ElasticLawProviders.POISSON_RATIO, p.poissonRatio());
        params.put(ElasticLawProviders.DENSITY, p.density());
        return new ModelDescription(name, params);
    }

    private static void putParameters(Map<String, Object> m, ModelDescription d) {
        for (Map.Entry<String, Object> e : d.parameters().entrySet()) {
            Object v = e.getValue();
            if (v instanceof List<?> list) {
                double[] a = new double[list.size()];
                for (int i = 0; i < a.length; i++) {
                    a[i] = (Double) list.get(i);
                }
                v = a;
            }
            m.put(e.getKey(), v);
        }
    }

    /** Fiber directions (fiber-1 up to fiber-3, in order) and initial-value regions of scalar channels. */
    private static void initialChannels(Body b, SceneDescription description, String who,
                                        UnaryOperator<String> files, List<Object> fibers, List<Object> values) {
        Map<String, ChannelField> ch = b.initialChannels();
        int families = 0;
        while (ch.containsKey("fiber-" + (families + 1))) {
            families++;
        }
        Object[] byFamily = new Object[families];
        for (Map.Entry<String, ChannelField> e : ch.entrySet()) {
            String name = e.getKey();
            ChannelField f = e.getValue();
            if (f instanceof RegionField rf && !name.matches("fiber-[0-9]+")) {
                for (RegionField.Region r : rf.regions()) {
                    values.add(map("channel", name, "region", shape(r.shape(), description, who, files),
                            "value", r.value()));
                }
                continue;
            }
            int k = name.matches("fiber-[1-3]") ? name.charAt(6) - '0' : 0;
            if (k == 0 || k > families) {
                throw cannot(who, "has the initial channel \"" + name + "\", which a scene file cannot hold; it "
                        + "holds fiber directions (fiber-1 up to fiber-3, in order) and RegionField values of other "
                        + "channels");
            }
            ModelDescription d = description.of(f).orElseThrow(() -> cannot(who, "its fiber directions of family "
                    + name + " were not made by SceneDescription.fiberField"));
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("type", d.name());
            putParameters(m, d);
            byFamily[k - 1] = m;
        }
        fibers.addAll(List.of(byFamily));
    }

    private static Map<String, Object> shape(Shape s, SceneDescription description, String who,
                                             UnaryOperator<String> files) {
        if (s instanceof Shapes.Box b) {
            return map("type", "box", "min", new double[] {b.minX(), b.minY(), b.minZ()},
                    "max", new double[] {b.maxX(), b.maxY(), b.maxZ()});
        }
        if (s instanceof Shapes.Sphere sp) {
            return map("type", "sphere", "center", new double[] {sp.cx(), sp.cy(), sp.cz()}, "radius", sp.radius());
        }
        if (s instanceof Shapes.Cylinder c) {
            return map("type", "cylinder", "center", new double[] {c.cx(), c.cy(), c.cz()},
                    "axis", new double[] {c.ax(), c.ay(), c.az()}, "radius", c.radius(), "halfLength", c.halfLength());
        }
        if (s instanceof Shapes.HalfSpace h) {
            return map("type", "halfSpace", "point", new double[] {h.px(), h.py(), h.pz()},
                    "normal", new double[] {h.nx(), h.ny(), h.nz()});
        }
        if (s instanceof Wedge w) {
            return map("type", "wedge", "edgeX", w.apexX(), "edgeY", w.apexY(), "halfAngle", w.halfAngle(),
                    "depth", w.depth());
        }
        ModelDescription d = description.of(s).orElseThrow(() -> cannot(who, "has a shape of type "
                + s.getClass().getSimpleName() + " that a scene file cannot describe; use box, sphere, cylinder, "
                + "halfSpace, wedge or a mesh file"));
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("type", d.name());
        putParameters(m, d);
        if (m.get("file") instanceof String name) {
            m.put("file", files.apply(name));
        }
        return m;
    }

    private static InvalidInputException cannot(String who, String why) {
        return new InvalidInputException(FrayMessage.INCONSISTENT, "cannot write " + who + " to a scene file", why);
    }

    private static Map<String, Object> map(Object... kv) {
        Map<String, Object> m = new LinkedHashMap<>();
        for (int i = 0; i < kv.length; i += 2) {
            m.put((String) kv[i], kv[i + 1]);
        }
        return m;
    }
}

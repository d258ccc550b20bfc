package dev.fray.io.scene;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shape;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.boundary.VelocitySchedule;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.particles.ChannelField;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.plugin.Suggest;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Integration;
import dev.fray.core.sim.Scene;
import dev.fray.damage.Fibers;
import dev.fray.io.scene.Fields.Range;
import dev.fray.io.scene.JsonTree.Arr;
import dev.fray.io.scene.JsonTree.Node;
import dev.fray.io.scene.JsonTree.Num;
import dev.fray.io.scene.JsonTree.Obj;
import dev.fray.io.scene.JsonTree.Str;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * Reads scene files: JSON in Fray's own versioned schema (documented in {@code docs/scene-format.md}), all
 * quantities in SI units. The reader checks everything it can before building the scene and reports every problem
 * it finds at once, each with the file, the JSON path, the line and column, and what is allowed: unknown keys (with
 * the closest allowed key), wrong types, values out of range, unknown model names, missing files. Material laws and
 * damage models are found by name in a {@link PluginRegistry}, so third-party models work like built-in ones.
 *
 * <p>Relative file names inside a scene (meshes) resolve against the folder of the scene file. The reader is
 * immutable and thread-safe; each call reads one file.
 */
public final class SceneReader {
    /** The format this reader reads, the value of the top-level {@code format} key. */
    public static final String FORMAT = "fray-scene/1";
    /** Largest scene file read, bytes; scene files are small, and this bounds the work on hostile input. */
    public static final int MAX_FILE_BYTES = 16 << 20;
    /** Most bodies, obstacles or grips in one scene. */
    static final int MAX_ITEMS = 10_000;

    static final List<String> TOP_KEYS = List.of("format", "description", "domain", "gravity", "walls", "run",
            "output", "bodies", "obstacles", "grips");
    static final List<String> RUN_KEYS = List.of("cellSize", "frameRate", "cfl", "damping", "threads",
            "fixedTimeStep", "maxTimeStep", "speedLimit", "kernel", "phaseFieldSolver", "separation", "integration",
            "implicitSolver");
    static final List<String> INTEGRATIONS = List.of("explicit", "implicit", "auto");
    static final List<String> SOLVER_KEYS = List.of("tolerance", "maxIterations");
    static final List<String> SEPARATION_KEYS = List.of("damageThreshold", "friction");
    static final List<String> OUTPUT_KEYS = List.of("frames", "formats", "channels", "checkpointEvery",
            "keepCheckpoints", "diagnosticsEvery");
    static final List<String> DOMAIN_KEYS = List.of("min", "max");
    static final List<String> WALL_KEYS;
    static final List<String> CONTACT_KEYS = List.of("type", "friction");
    static final List<String> CONTACT_TYPES = List.of("open", "sticky", "slip", "separating");
    static final List<String> BODY_KEYS = List.of("name", "group", "shape", "material", "damage",
            "fiberDirections", "initialValues", "spacing", "jitter", "seed", "velocity", "angularVelocity");
    static final List<String> SHAPE_TYPES = List.of("box", "sphere", "cylinder", "halfSpace", "wedge", "mesh");
    static final Map<String, List<String>> SHAPE_KEYS = Map.of(
            "box", List.of("type", "min", "max"),
            "sphere", List.of("type", "center", "radius"),
            "cylinder", List.of("type", "center", "axis", "radius", "halfLength"),
            "halfSpace", List.of("type", "point", "normal"),
            "wedge", List.of("type", "edgeX", "edgeY", "halfAngle", "depth"),
            "mesh", MeshSupport.KEYS);
    static final List<String> FIBER_TERM_TYPES = List.of("quadratic", "exponential");
    static final Map<String, List<String>> FIBER_TERM_KEYS = Map.of(
            "quadratic", List.of("type", "stiffness"),
            "exponential", List.of("type", "k1", "k2"));
    static final Map<String, List<String>> FIBER_FIELD_KEYS = Map.of(
            "uniform", List.of("type", "direction"),
            "circumferential", List.of("type", "point", "axis"),
            "radial", List.of("type", "point", "axis"),
            "helical", List.of("type", "point", "axis", "pitchAngle"),
            "mesh", List.of("type", "attribute"));
    static final List<String> FIBER_FIELD_TYPES = List.of("uniform", "circumferential", "radial", "helical",
            "mesh");
    static final List<String> INITIAL_VALUE_KEYS = List.of("channel", "region", "value");
    /** Most initial-value regions of one body. */
    static final int MAX_REGIONS = 1000;
    static final List<String> OBSTACLE_KEYS = List.of("name", "shape", "contact", "motion");
    static final List<String> MOTION_KEYS = List.of("velocity", "angularVelocity", "pivot", "schedule", "ramp");
    static final List<String> GRIP_KEYS = List.of("name", "body", "region", "motion");
    static final List<String> KERNELS = List.of("quadratic", "cubic");
    static final List<String> FORMATS = List.of("ply", "vtp", "csv");
    static final String CHANNEL_PATTERN = "[a-z][a-z0-9-]*";

    static {
        List<String> w = new ArrayList<>();
        w.add("all");
        w.addAll(Scene.WALL_FACES);
        WALL_KEYS = List.copyOf(w);
    }

    private final PluginRegistry registry;

    /**
     * @param registry material laws and damage models by name
     */
    public SceneReader(PluginRegistry registry) {
        this.registry = Checks.notNull("plugin registry", registry);
    }

    /** Creates a reader of the models visible on this class path (built-in and third-party). */
    public SceneReader() {
        this(PluginRegistry.load(SceneReader.class.getClassLoader()));
    }

    /**
     * Reads a scene file.
     *
     * @param file the .json file
     * @return the scene, its output settings and its description
     * @throws SceneFileException listing every problem found (file, JSON path, line, column, what is allowed)
     * @throws InvalidInputException with key FILE_ERROR if the file cannot be read
     */
    public LoadedScene read(Path file) {
        Checks.notNull("scene file", file);
        byte[] bytes;
        try (InputStream in = Files.newInputStream(file)) {
            bytes = in.readNBytes(MAX_FILE_BYTES + 1);
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "no such scene file");
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(),
                    "cannot read the scene file: " + e);
        }
        Path dir = file.toAbsolutePath().getParent();
        return read(bytes, file.toString(), dir);
    }

    /**
     * Reads a scene from bytes, e.g. the copy embedded in a checkpoint.
     *
     * @param content the JSON text
     * @param name    what to call the source in messages
     * @param baseDir folder relative file names resolve against, or null (relative names are then an error)
     * @return the scene, its output settings and its description
     * @throws SceneFileException listing every problem found
     */
    public LoadedScene read(byte[] content, String name, Path baseDir) {
        return read(content, name, baseDir, Map.of());
    }

    /**
     * Reads a scene from bytes, taking the files it names (meshes) from a map where present: the form in which a
     * checkpoint carries its scene.
     *
     * @param content the JSON text
     * @param name    what to call the source in messages
     * @param baseDir folder relative file names resolve against, or null
     * @param files   file contents by the name the scene gives them; names not in the map are read from disk
     * @return the scene, its output settings and its description
     * @throws SceneFileException listing every problem found
     */
    public LoadedScene read(byte[] content, String name, Path baseDir, Map<String, byte[]> files) {
        Checks.notNull("scene content", content);
        Checks.notNull("embedded files", files);
        Checks.notNull("scene name", name);
        Problems problems = new Problems(name);
        if (content.length > MAX_FILE_BYTES) {
            problems.at("", 0, 0, "the file is larger than " + MAX_FILE_BYTES + " bytes; scene files are small "
                    + "(meshes go in their own files)");
            problems.throwIfAny();
        }
        Node root;
        try {
            root = JsonTree.parse(content, (path, key, line, col) -> problems.at(JsonPaths.member(path, key),
                    line, col, "key \"" + key + "\" appears twice in the same object"));
        } catch (JsonTree.SyntaxError e) {
            problems.at("", e.line, e.column, e.getMessage());
            problems.throwIfAny();
            throw new IllegalStateException("unreachable");
        }
        Pass pass = new Pass(problems, registry, baseDir, files);
        LoadedScene loaded = pass.scene(root, name);
        problems.throwIfAny();
        return loaded;
    }

    /** One reading of one document. */
    private static final class Pass {
        private final Problems problems;
        private final PluginRegistry registry;
        private final Path baseDir;
        private final SceneDescription description;
        private double cellSize = Double.NaN;
        /** Number of entries in the bodies list, read or not. */
        private int bodyItems = -1;

        private final Map<String, byte[]> embedded;
        private final Map<String, dev.fray.io.mesh.MeshShape> meshes = new java.util.HashMap<>();

        Pass(Problems problems, PluginRegistry registry, Path baseDir, Map<String, byte[]> embedded) {
            this.embedded = embedded;
            this.problems = problems;
            this.registry = registry;
            this.baseDir = baseDir;
            this.description = new SceneDescription(registry);
        }

        LoadedScene scene(Node rootNode, String name) {
            if (!(rootNode instanceof Obj root)) {
                problems.at("", rootNode.line, rootNode.column, "a scene file holds one JSON object, got "
                        + rootNode.kind());
                return null;
            }
            Fields top = new Fields(problems, root, "", TOP_KEYS);
            format(top);
            Node text = top.node("description");
            if (text != null) {
                if (text instanceof Str str) {
                    description.text(str.value);
                } else {
                    top.error("description", "must be a string (free text), got " + text.kind());
                }
            }
            Scene.Builder b = Scene.builder();
            double[][] domain = domain(top);
            run(top, b);
            if (domain != null) {
                b.domain(domain[0][0], domain[0][1], domain[0][2], domain[1][0], domain[1][1], domain[1][2]);
                checkDomain(top, domain);
            }
            double[] g = top.vector("gravity", new double[] {0, -9.81, 0}, Range.closed(-1e6, 1e6, "m/s^2"),
                    "gravity, m/s^2");
            if (g != null) {
                b.gravity(g[0], g[1], g[2]);
            }
            walls(top, b);
            OutputSettings output = output(top);
            List<Body> bodies = bodies(top, domain);
            Set<String> bodyNames = new HashSet<>();
            for (Body body : bodies) {
                b.add(body);
                bodyNames.add(body.name());
            }
            obstacles(top, b);
            grips(top, b, bodyNames);
            if (!problems.isEmpty()) {
                return null;
            }
            Scene scene;
            try {
                scene = b.build();
            } catch (InvalidInputException e) {
                if (e.key() == dev.fray.core.error.FrayMessage.IMPLICIT_UNSUPPORTED) {
                    // a combination of settings, found only once the whole scene is known
                    problems.at("run.integration", 0, 0, e.getMessage());
                    return null;
                }
                // Everything the builder checks is checked above with a location; this is a safety net.
                problems.at("", 0, 0, e.getMessage());
                return null;
            }
            try {
                dev.fray.core.sim.MemoryEstimate.of(scene).requireFits(Runtime.getRuntime().maxMemory());
            } catch (InvalidInputException e) {
                Node list = top.node("bodies");
                problems.at("bodies", list.line, list.column, e.getMessage());
                return null;
            }
            return new LoadedScene(scene, output, description, name, baseDir);
        }

        private void format(Fields top) {
            Node n = top.node("format");
            if (n == null) {
                top.missing("format", "the scene format, \"" + FORMAT + "\"");
                return;
            }
            String f = top.string("format", null, null, "scene format");
            if (f == null || f.equals(FORMAT)) {
                return;
            }
            if (f.startsWith("fray-scene/")) {
                top.error("format", "\"" + f + "\" is a format version this reader does not know; it reads \""
                        + FORMAT + "\"");
            } else {
                top.error("format", "\"" + f + "\" is not a Fray scene format; expected \"" + FORMAT + "\"");
            }
        }

        private double[][] domain(Fields top) {
            Obj o = top.object("domain", true, "the simulation box, {\"min\": [x, y, z], \"max\": [x, y, z]} in m");
            if (o == null) {
                return null;
            }
            Fields f = new Fields(problems, o, "domain", DOMAIN_KEYS);
            double[] min = f.vector("min", null, Range.any("m"), "lowest corner, m");
            double[] max = f.vector("max", null, Range.any("m"), "highest corner, m");
            if (min == null || max == null) {
                return null;
            }
            boolean ok = true;
            for (int i = 0; i < 3; i++) {
                if (!(max[i] > min[i])) {
                    f.error("max", "each coordinate of max must exceed that of min; axis " + "xyz".charAt(i)
                            + ": " + min[i] + " to " + max[i] + " m");
                    ok = false;
                    break;
                }
            }
            return ok ? new double[][] {min, max} : null;
        }

        private void checkDomain(Fields top, double[][] d) {
            if (Double.isNaN(cellSize)) {
                return;
            }
            double minEdge = Double.POSITIVE_INFINITY;
            double maxEdge = 0;
            for (int i = 0; i < 3; i++) {
                minEdge = Math.min(minEdge, d[1][i] - d[0][i]);
                maxEdge = Math.max(maxEdge, d[1][i] - d[0][i]);
            }
            if (!(minEdge >= 2 * cellSize)) {
                top.error("domain", "the shortest edge (" + minEdge + " m) must be at least two cells (2 x "
                        + "run.cellSize = " + 2 * cellSize + " m)");
            }
            if (!(maxEdge / cellSize <= 2e6)) {
                top.error("domain", "the longest edge spans " + maxEdge / cellSize + " cells; at most 2e6 allowed"
                        + " (use a larger run.cellSize)");
            }
        }

        private void run(Fields top, Scene.Builder b) {
            Obj o = top.object("run", true, "solver settings, at least {\"cellSize\": m}");
            if (o == null) {
                return;
            }
            Fields f = new Fields(problems, o, "run", RUN_KEYS);
            Double dx = f.number("cellSize", null, Range.positive("m"), "grid cell size, m");
            if (dx != null) {
                cellSize = dx;
                b.cellSize(dx);
            }
            Double fps = f.number("frameRate", Scene.DEFAULT_FRAME_RATE, Range.closed(1e-6, 1e6, "1/s"),
                    "frames per second");
            if (fps != null) {
                b.frameRate(fps);
            }
            Double cfl = f.number("cfl", Scene.DEFAULT_CFL, new Range(0, true, 1, false, ""), "Courant number");
            if (cfl != null) {
                b.cfl(cfl);
            }
            Double damping = f.number("damping", 0.0, Range.nonNegative("1/s"), "velocity damping rate");
            if (damping != null) {
                b.damping(damping);
            }
            Long threads = f.integer("threads", (long) Math.min(1024, Runtime.getRuntime().availableProcessors()),
                    1, 1024, "worker threads");
            if (threads != null) {
                b.threads(threads.intValue());
            }
            Double fixed = f.number("fixedTimeStep", Double.NaN, Range.positive("s"), "fixed time step");
            if (fixed != null) {
                b.fixedTimeStep(fixed);
            }
            Double max = f.number("maxTimeStep", Double.POSITIVE_INFINITY, Range.positive("s"), "largest step");
            if (max != null) {
                b.maxTimeStep(max);
            }
            Double limit = f.number("speedLimit", Double.NaN, Range.positive("m/s"), "divergence speed");
            if (limit != null) {
                b.speedLimit(limit);
            }
            String kernel = f.string("kernel", "quadratic", KERNELS, "interpolation kernel");
            if (kernel != null) {
                b.kernel(kernel.equals("cubic") ? Kernel.CUBIC : Kernel.QUADRATIC);
            }
            Obj solver = f.object("phaseFieldSolver", false, "{\"tolerance\": ..., \"maxIterations\": ...}");
            if (solver != null) {
                Fields s = new Fields(problems, solver, "run.phaseFieldSolver", SOLVER_KEYS);
                Double tol = s.number("tolerance", 1e-6, new Range(0, true, 1, false, ""),
                        "relative residual");
                Long it = s.integer("maxIterations", 200L, 1, 100_000, "iteration cap per step");
                if (tol != null && it != null) {
                    b.phaseFieldSolver(tol, it.intValue());
                }
            }
            String integration = f.string("integration", "explicit", INTEGRATIONS, "time integration");
            if (integration != null) {
                b.integration(Integration.valueOf(integration.toUpperCase(java.util.Locale.ROOT)));
            }
            Obj implicitSolver = f.object("implicitSolver", false, "{\"tolerance\": ..., \"maxIterations\": ...}");
            if (implicitSolver != null) {
                Fields s = new Fields(problems, implicitSolver, "run.implicitSolver", SOLVER_KEYS);
                Double tol = s.number("tolerance", Scene.DEFAULT_IMPLICIT_TOLERANCE, new Range(0, true, 1, true, ""),
                        "Newton residual relative to its value at the step's start");
                Long it = s.integer("maxIterations", (long) Scene.DEFAULT_IMPLICIT_ITERATIONS, 1, 1000,
                        "Newton iterations before a step is halved");
                if (tol != null && it != null) {
                    b.implicitSolver(tol, it.intValue());
                }
            }
            Obj sep = f.object("separation", false, "{\"damageThreshold\": ..., \"friction\": ...}");
            if (sep != null) {
                Fields s = new Fields(problems, sep, "run.separation", SEPARATION_KEYS);
                Double threshold = s.number("damageThreshold", null, new Range(0, true, 1, false, ""),
                        "damage from which grid nodes carry two velocity fields");
                Double mu = s.number("friction", 0.0, Range.nonNegative(""), "Coulomb coefficient between the fields");
                if (threshold != null && mu != null) {
                    b.separation(threshold, mu);
                }
            }
        }

        private void walls(Fields top, Scene.Builder b) {
            Obj o = top.object("walls", false, "contact per domain face");
            if (o == null) {
                return;
            }
            Fields f = new Fields(problems, o, "walls", WALL_KEYS);
            if (f.has("all")) {
                Contact c = contact(f, "all", null);
                if (c != null) {
                    b.walls(c);
                }
            }
            for (String face : Scene.WALL_FACES) {
                if (f.has(face)) {
                    Contact c = contact(f, face, null);
                    if (c != null) {
                        b.wall(face, c);
                    }
                }
            }
        }

        /** A contact law: "type" or {"type": ..., "friction": ...}; fallback when absent. */
        private Contact contact(Fields parent, String key, Contact fallback) {
            Node n = parent.node(key);
            if (n == null) {
                return fallback;
            }
            String path = parent.pathOf(key);
            if (n instanceof Str) {
                String type = parent.string(n, path, CONTACT_TYPES);
                return type == null ? null : contact(type, 0);
            }
            if (!(n instanceof Obj o)) {
                problems.at(path, n.line, n.column, "must be a contact type (" + String.join(", ", CONTACT_TYPES)
                        + ") or an object {\"type\": ..., \"friction\": ...}, got " + n.kind());
                return null;
            }
            Fields f = new Fields(problems, o, path, CONTACT_KEYS);
            String type = f.string("type", null, CONTACT_TYPES, "contact type: " + String.join(", ",
                    CONTACT_TYPES));
            Double mu = f.number("friction", 0.0, Range.closed(0, 100, ""), "Coulomb friction coefficient");
            return type == null || mu == null ? null : contact(type, mu);
        }

        private static Contact contact(String type, double friction) {
            switch (type) {
                case "open":
                    return new Contact(Contact.Type.OPEN, friction);
                case "sticky":
                    return new Contact(Contact.Type.STICKY, friction);
                case "slip":
                    return Contact.slip(friction);
                default:
                    return Contact.separating(friction);
            }
        }

        private OutputSettings output(Fields top) {
            OutputSettings d = OutputSettings.defaults();
            Obj o = top.object("output", false, "what a run writes");
            if (o == null) {
                return d;
            }
            Fields f = new Fields(problems, o, "output", OUTPUT_KEYS);
            Long frames = f.integer("frames", (long) d.frames(), 1, OutputSettings.MAX_FRAMES, "frames to run");
            Set<OutputFormat> formats = d.formats();
            if (f.has("formats")) {
                List<String> names = f.strings("formats", FORMATS, null, FORMATS.size(), "output formats");
                if (names != null && names.isEmpty()) {
                    f.error("formats", "must name at least one of " + String.join(", ", FORMATS));
                    names = null;
                }
                if (names != null) {
                    formats = EnumSet.noneOf(OutputFormat.class);
                    for (String s : names) {
                        formats.add(OutputFormat.valueOf(s.toUpperCase(Locale.ROOT)));
                    }
                }
            }
            List<String> channels = f.strings("channels", null, CHANNEL_PATTERN, 1000, "channel names");
            if (channels != null) {
                for (String c : channels) {
                    if (c.equals("position") || c.equals("velocity")) {
                        f.error("channels", "\"" + c + "\" is always written; do not list it");
                    }
                }
            }
            Long every = f.integer("checkpointEvery", (long) d.checkpointEvery(), 0, OutputSettings.MAX_FRAMES,
                    "frames between checkpoints, 0 for none");
            Long keep = f.integer("keepCheckpoints", (long) d.keepCheckpoints(), 0, 1000,
                    "checkpoints kept, 0 for all");
            Long diag = f.integer("diagnosticsEvery", 1L, 1, 1_000_000_000, "steps between diagnostics rows");
            if (frames == null || every == null || keep == null || diag == null) {
                return d;
            }
            return new OutputSettings(frames.intValue(), formats, channels, every.intValue(), keep.intValue(),
                    diag.intValue());
        }

        // ------------------------------------------------------------------ bodies

        /** What is known of a body before groups are resolved. */
        private record Draft(String path, Fields fields, Body.Builder builder, Shape shape, String group) {
        }

        private List<Body> bodies(Fields top, double[][] domain) {
            List<Node> items = top.list("bodies", true, MAX_ITEMS, "the solid bodies, at least one");
            List<Body> out = new ArrayList<>();
            if (items == null) {
                return out;
            }
            if (items.isEmpty()) {
                top.error("bodies", "must hold at least one body");
                return out;
            }
            bodyItems = items.size();
            List<Draft> drafts = new ArrayList<>();
            Map<String, String> names = new LinkedHashMap<>();
            for (int i = 0; i < items.size(); i++) {
                String path = JsonPaths.index("bodies", i);
                Node n = items.get(i);
                if (!(n instanceof Obj o)) {
                    problems.at(path, n.line, n.column, "must be an object describing a body, got " + n.kind());
                    continue;
                }
                Draft d = body(new Fields(problems, o, path, BODY_KEYS), names, domain);
                if (d != null) {
                    drafts.add(d);
                }
            }
            // Layers: each body of a group fills its shape only where no earlier body of the group does.
            Map<String, List<Shape>> earlier = new LinkedHashMap<>();
            for (Draft d : drafts) {
                Shape s = d.shape();
                if (d.group() != null) {
                    List<Shape> before = earlier.computeIfAbsent(d.group(), k -> new ArrayList<>());
                    Shape own = s;
                    if (!before.isEmpty()) {
                        s = new LayeredShape(own, before);
                    }
                    before.add(own);
                }
                try {
                    Body body = d.builder().shape(s).build();
                    if (!Double.isNaN(cellSize)) {
                        // Counted before anything is sampled, so that a huge lattice is refused at once.
                        dev.fray.core.particles.ParticleSampler.latticeCounts(body,
                                dev.fray.core.particles.ParticleSampler.spacing(body, cellSize));
                    }
                    out.add(body);
                } catch (InvalidInputException e) {
                    problems.at(d.path(), d.fields().obj().line, d.fields().obj().column, e.getMessage());
                }
            }
            return out;
        }

        private Draft body(Fields f, Map<String, String> names, double[][] domain) {
            String path = f.path();
            String name = f.string("name", null, null, "unique body name");
            if (name != null) {
                String other = names.putIfAbsent(name, path);
                if (other != null) {
                    f.error("name", "\"" + name + "\" is already the name of " + other + "; names must be unique");
                    name = null;
                }
            }
            String group = f.has("group") ? f.string("group", null, null, "group name") : null;
            Shape shape = null;
            Obj shapeObj = f.object("shape", true, "the region the body fills");
            if (shapeObj != null) {
                shape = shape(shapeObj, f.pathOf("shape"), true);
                if (shape != null && domain != null) {
                    var bb = shape.bounds();
                    if (!(bb.minX() >= domain[0][0] && bb.minY() >= domain[0][1] && bb.minZ() >= domain[0][2]
                            && bb.maxX() <= domain[1][0] && bb.maxY() <= domain[1][1] && bb.maxZ() <= domain[1][2])) {
                        f.error("shape", "the shape's bounds " + bb + " do not lie inside the domain; enlarge the "
                                + "domain or move the body");
                    }
                }
            }
            Obj matObj = f.object("material", true, "{\"law\": name, parameters...}");
            MaterialLaw law = matObj == null ? null : material(matObj, f.pathOf("material"));
            DamageModel damage = null;
            boolean damageOk = true;
            Obj dmgObj = f.object("damage", false, "{\"model\": name, parameters...}");
            if (dmgObj != null) {
                damage = damage(dmgObj, f.pathOf("damage"));
                damageOk = damage != null;
            } else if (f.has("damage")) {
                damageOk = false;
            }
            Double spacing = f.number("spacing", Double.NaN, Range.positive("m"), "particle spacing");
            Double jitter = f.number("jitter", 0.0, new Range(0, false, 0.5, false, "of the spacing"),
                    "random offset");
            Long seed = f.integer("seed", 1L, Long.MIN_VALUE, Long.MAX_VALUE, "jitter seed");
            double[] v = f.vector("velocity", new double[3], Range.closed(-1e6, 1e6, "m/s"), "initial velocity");
            double[] w = f.vector("angularVelocity", new double[3], Range.closed(-1e6, 1e6, "rad/s"),
                    "initial angular velocity");
            Map<String, ChannelSpec> declared = declared(law, damage);
            Map<String, ChannelField> fibers = fiberDirections(f, law, declared.keySet(), shape);
            Map<String, ChannelField> values = initialValues(f, law, damageOk, declared);
            if (name == null || shape == null || law == null || !damageOk || spacing == null || jitter == null
                    || seed == null || v == null || w == null || fibers == null || values == null) {
                return null;
            }
            Body.Builder b = Body.named(name).material(law).damage(damage).spacing(spacing).jitter(jitter)
                    .seed(seed).velocity(v[0], v[1], v[2]).angularVelocity(w[0], w[1], w[2]);
            for (Map.Entry<String, ChannelField> e : fibers.entrySet()) {
                b.initialChannel(e.getKey(), e.getValue());
            }
            for (Map.Entry<String, ChannelField> e : values.entrySet()) {
                b.initialChannel(e.getKey(), e.getValue());
            }
            if (group != null) {
                description.group(name, group);
            }
            return new Draft(path, f, b, shape, group);
        }

        // ------------------------------------------------------------------ shapes

        private Shape shape(Obj o, String path, boolean bounded) {
            Fields probe = new Fields(problems, o, path, null);
            String type = probe.string("type", null, SHAPE_TYPES, "shape type: " + String.join(", ", SHAPE_TYPES));
            if (type == null) {
                return null;
            }
            Fields f = new Fields(problems, o, path, SHAPE_KEYS.get(type));
            Range metres = Range.any("m");
            Shape s = null;
            try {
                switch (type) {
                    case "box": {
                        double[] min = f.vector("min", null, metres, "lowest corner, m");
                        double[] max = f.vector("max", null, metres, "highest corner, m");
                        if (min != null && max != null) {
                            for (int i = 0; i < 3; i++) {
                                if (!(max[i] > min[i])) {
                                    f.error("max", "each coordinate of max must exceed that of min; axis "
                                            + "xyz".charAt(i) + ": " + min[i] + " to " + max[i] + " m");
                                    return null;
                                }
                            }
                            s = Shapes.box(min[0], min[1], min[2], max[0], max[1], max[2]);
                        }
                        break;
                    }
                    case "sphere": {
                        double[] c = f.vector("center", null, metres, "centre, m");
                        Double r = f.number("radius", null, Range.positive("m"), "radius");
                        if (c != null && r != null) {
                            s = Shapes.sphere(c[0], c[1], c[2], r);
                        }
                        break;
                    }
                    case "cylinder": {
                        double[] c = f.vector("center", null, metres, "centre of the axis, m");
                        double[] a = axis(f, "axis");
                        Double r = f.number("radius", null, Range.positive("m"), "radius");
                        Double h = f.number("halfLength", null, Range.positive("m"), "half the length");
                        if (c != null && a != null && r != null && h != null) {
                            s = Shapes.cylinder(c[0], c[1], c[2], a[0], a[1], a[2], r, h);
                        }
                        break;
                    }
                    case "wedge": {
                        Double ex = f.number("edgeX", null, metres, "x of the edge, m");
                        Double ey = f.number("edgeY", null, metres, "y of the edge, m");
                        Double half = f.number("halfAngle", null, new Range(0, true, 0.5 * Math.PI, true, "rad"),
                                "half the opening angle");
                        Double depth = f.number("depth", null, Range.positive("m"), "depth behind the edge");
                        if (ex != null && ey != null && half != null && depth != null) {
                            if (bounded) {
                                f.error("type", "a wedge is unbounded along z and cannot be filled with particles; "
                                        + "use it for obstacles, grip regions and initial-value regions");
                                return null;
                            }
                            s = new Wedge(ex, ey, half, depth);
                        }
                        break;
                    }
                    case "halfSpace": {
                        double[] p = f.vector("point", null, metres, "a point on the plane, m");
                        double[] n = axis(f, "normal");
                        if (p != null && n != null) {
                            if (bounded) {
                                f.error("type", "a half-space is unbounded and cannot be filled with particles; "
                                        + "use it for obstacles and grip regions");
                                return null;
                            }
                            s = Shapes.halfSpace(p[0], p[1], p[2], n[0], n[1], n[2]);
                        }
                        break;
                    }
                    default:
                        s = MeshSupport.shape(f, baseDir, embedded, meshes, description);
                        break;
                }
            } catch (InvalidInputException e) {
                problems.at(path, o.line, o.column, e.getMessage());
                return null;
            }
            return s;
        }

        private double[] axis(Fields f, String key) {
            double[] a = f.vector(key, null, Range.any(""), "direction, a non-zero vector");
            if (a != null && !(a[0] * a[0] + a[1] * a[1] + a[2] * a[2] > 0)) {
                f.error(key, "must be a non-zero vector");
                return null;
            }
            return a;
        }

        // ------------------------------------------------------------------ models

        private MaterialLaw material(Obj o, String path) {
            Fields f = new Fields(problems, o, path, null);
            String law = f.string("law", null, null, "material law name: " + known(registry.materialLaws().keySet()));
            Map<String, Object> params = parameters(f, List.of("law", "fibers"));
            List<Node> fibers = f.list("fibers", false, 3, "one to three fiber families");
            List<double[]> terms = fibers == null ? null : fiberTerms(fibers, f.pathOf("fibers"));
            if (law == null || params == null) {
                return null;
            }
            if (!registry.materialLaws().containsKey(law)) {
                unknownModel(f, "law", law, "material law", registry.materialLaws().keySet());
                return null;
            }
            ModelDescription d = new ModelDescription(law, params);
            MaterialLaw base = create(f, d, true);
            if (base == null || (f.has("fibers") && terms == null)) {
                return null;
            }
            description.describe(base, d);
            if (terms == null) {
                return base;
            }
            if (terms.isEmpty()) {
                f.error("fibers", "must hold one to three fiber families, or leave the key out");
                return null;
            }
            Fibers.Builder fb = Fibers.reinforce(base);
            for (double[] t : terms) {
                if (t[0] == 0) {
                    fb.quadratic(t[1]);
                } else {
                    fb.exponential(t[1], t[2]);
                }
            }
            try {
                return fb.build();
            } catch (InvalidInputException e) {
                f.error("fibers", e.getMessage());
                return null;
            }
        }

        /** Fiber families as {kind (0 quadratic, 1 exponential), k or k1, k2}; null after a problem. */
        private List<double[]> fiberTerms(List<Node> items, String path) {
            List<double[]> out = new ArrayList<>();
            boolean ok = true;
            for (int i = 0; i < items.size(); i++) {
                String at = JsonPaths.index(path, i);
                Obj o = item(items.get(i), at, "{\"type\": \"quadratic\", \"stiffness\": Pa} or {\"type\": "
                        + "\"exponential\", \"k1\": Pa, \"k2\": ...}");
                if (o == null) {
                    ok = false;
                    continue;
                }
                String type = new Fields(problems, o, at, null).string("type", null, FIBER_TERM_TYPES,
                        "fiber term: quadratic or exponential");
                if (type == null) {
                    ok = false;
                    continue;
                }
                Fields f = new Fields(problems, o, at, FIBER_TERM_KEYS.get(type));
                if (type.equals("quadratic")) {
                    Double k = f.number("stiffness", null, Range.positive("Pa"), "fiber stiffness k");
                    if (k == null) {
                        ok = false;
                    } else {
                        out.add(new double[] {0, k, 0});
                    }
                } else {
                    Double k1 = f.number("k1", null, Range.positive("Pa"), "fiber stiffness k1");
                    Double k2 = f.number("k2", null, Range.positive(""), "dimensionless exponent k2");
                    if (k1 == null || k2 == null) {
                        ok = false;
                    } else {
                        out.add(new double[] {1, k1, k2});
                    }
                }
            }
            return ok ? out : null;
        }

        private DamageModel damage(Obj o, String path) {
            Fields f = new Fields(problems, o, path, null);
            String model = f.string("model", null, null, "damage model name: "
                    + known(registry.damageModels().keySet()));
            Map<String, Object> params = parameters(f, List.of("model"));
            if (model == null || params == null) {
                return null;
            }
            if (!registry.damageModels().containsKey(model)) {
                unknownModel(f, "model", model, "damage model", registry.damageModels().keySet());
                return null;
            }
            ModelDescription d = new ModelDescription(model, params);
            DamageModel dm = create(f, d, false);
            if (dm == null) {
                return null;
            }
            if (!Double.isNaN(cellSize)) {
                try {
                    // Length scales too small for the grid fail here, with a location, not when the run starts.
                    dm.resolvedFor(cellSize);
                } catch (InvalidInputException e) {
                    report(f, e);
                    return null;
                }
            }
            return description.describe(dm, d);
        }

        private static String known(Set<String> names) {
            return names.isEmpty() ? "(none registered)" : String.join(", ", names);
        }

        private void unknownModel(Fields f, String key, String name, String kind, Set<String> known) {
            String best = Suggest.closest(name, known);
            f.error(key, "unknown " + kind + " \"" + name + "\"" + (best == null ? "" : "; did you mean \"" + best
                    + "\"?") + " known: " + known(known));
        }

        /** Parameters of a model: every key except the reserved ones; numbers, strings or 3-vectors. */
        private Map<String, Object> parameters(Fields f, List<String> reserved) {
            Map<String, Object> out = new LinkedHashMap<>();
            boolean ok = true;
            for (Map.Entry<String, Node> e : f.obj().members.entrySet()) {
                if (reserved.contains(e.getKey())) {
                    continue;
                }
                Node n = e.getValue();
                String at = f.pathOf(e.getKey());
                if (n instanceof Num) {
                    Double v = f.number(n, at, Range.any(""));
                    if (v == null) {
                        ok = false;
                    } else {
                        out.put(e.getKey(), v);
                    }
                } else if (n instanceof Str s) {
                    out.put(e.getKey(), s.value);
                } else if (n instanceof Arr) {
                    double[] v = f.vector(n, at, Range.any(""));
                    if (v == null) {
                        ok = false;
                    } else {
                        out.put(e.getKey(), v);
                    }
                } else {
                    problems.at(at, n.line, n.column, "a model parameter must be a number, a string or a list of "
                            + "three numbers, got " + n.kind());
                    ok = false;
                }
            }
            return ok ? out : null;
        }

        /**
         * Makes a law or model through the registry. The providers stop at the first unknown parameter, so an
         * unknown one is set aside and the provider asked again, to report every unknown parameter at once.
         */
        private <T> T create(Fields f, ModelDescription d, boolean law) {
            Map<String, Object> params = new LinkedHashMap<>(d.parameters());
            boolean unknownSeen = false;
            for (int attempt = 0; attempt <= d.parameters().size(); attempt++) {
                try {
                    var p = new ModelDescription(d.name(), params).toParameters(f.path());
                    @SuppressWarnings("unchecked")
                    T made = (T) (law ? registry.materialLaw(d.name(), p) : registry.damageModel(d.name(), p));
                    return unknownSeen ? null : made;
                } catch (InvalidInputException e) {
                    Object[] parts = e.parts();
                    if (e.key() == FrayMessage.UNKNOWN_NAME && parts.length == 3 && parts[1] instanceof String key
                            && params.containsKey(key) && String.valueOf(parts[0]).startsWith("parameter")) {
                        problems.at(f.pathOf(key), f.keyLine(key), f.keyColumn(key), "unknown parameter \"" + key
                                + "\" of " + (law ? "material law" : "damage model") + " \"" + d.name() + "\"; "
                                + parts[2]);
                        params.remove(key);
                        unknownSeen = true;
                        continue;
                    }
                    // After a misspelt name the provider's "missing" would only repeat it.
                    if (!(unknownSeen && e.key() == FrayMessage.MISSING)) {
                        report(f, e);
                    }
                    return null;
                } catch (RuntimeException e) {
                    f.error(law ? "law" : "model", "the provider of \"" + d.name() + "\" failed: " + e);
                    return null;
                }
            }
            return null;
        }

        /** Reports a provider's error at the key it names, if it names one of the object's keys. */
        private void report(Fields f, InvalidInputException e) {
            Object[] parts = e.parts();
            String field = parts.length > 0 ? String.valueOf(parts[0]) : "";
            // Providers name the field either as "where.key (unit)" or as "key (unit)".
            String prefix = f.path() + ".";
            int i = field.indexOf(prefix);
            String rest = i >= 0 ? field.substring(i + prefix.length()) : field;
            int end = 0;
            while (end < rest.length() && Character.isJavaIdentifierPart(rest.charAt(end))) {
                end++;
            }
            String key = rest.substring(0, end);
            if (!key.isEmpty() && f.has(key)) {
                // The problem's path already says where; drop the provider's own copy of it.
                String msg = e.getMessage();
                f.error(key, msg.startsWith(prefix + key) ? key + msg.substring(prefix.length() + key.length()) : msg);
            } else {
                problems.at(f.path(), f.obj().line, f.obj().column, e.getMessage());
            }
        }

        /** @return a list item as an object, or null after reporting that it must be one (what: its form) */
        private Obj item(Node n, String at, String what) {
            if (n instanceof Obj o) {
                return o;
            }
            problems.at(at, n.line, n.column, "must be an object " + what + ", got " + n.kind());
            return null;
        }

        /** The channels a body's law and damage model declare, by name; either may be null. */
        private static Map<String, ChannelSpec> declared(MaterialLaw law, DamageModel damage) {
            Map<String, ChannelSpec> out = new LinkedHashMap<>();
            if (law != null) {
                for (ChannelSpec s : law.channels()) {
                    out.put(s.name(), s);
                }
            }
            if (damage != null) {
                for (ChannelSpec s : damage.channels()) {
                    out.put(s.name(), s);
                }
            }
            return out;
        }

        /**
         * A body's {@code initialValues}: per scalar channel, the regions in list order as one {@link RegionField}.
         * Channel names are judged only once the law and the damage model were read.
         */
        private Map<String, ChannelField> initialValues(Fields body, MaterialLaw law, boolean damageOk,
                                                        Map<String, ChannelSpec> declared) {
            Map<String, ChannelField> out = new LinkedHashMap<>();
            List<Node> items = body.list("initialValues", false, MAX_REGIONS, "initial values of channels by region");
            if (items == null) {
                return body.has("initialValues") ? null : out;
            }
            List<String> scalars = new ArrayList<>();
            for (ChannelSpec s : declared.values()) {
                if (s.width() == 1) {
                    scalars.add(s.name());
                }
            }
            boolean judge = law != null && damageOk;
            boolean ok = true;
            for (int i = 0; i < items.size(); i++) {
                String at = JsonPaths.index(body.pathOf("initialValues"), i);
                Obj o = item(items.get(i), at, "{\"channel\": name, \"region\": shape, \"value\": number}");
                if (o == null) {
                    ok = false;
                    continue;
                }
                Fields f = new Fields(problems, o, at, INITIAL_VALUE_KEYS);
                String channel = f.string("channel", null, null, "a scalar channel of the body: "
                        + (scalars.isEmpty() ? "(none declared)" : String.join(", ", scalars)));
                ChannelSpec spec = channel == null ? null : declared.get(channel);
                if (channel != null && judge && (spec == null || spec.width() != 1)) {
                    String best = Suggest.closest(channel, scalars);
                    f.error("channel", (spec == null ? "the body has no channel \"" + channel + "\""
                            : "\"" + channel + "\" has " + spec.width() + " components; only scalar channels take "
                            + "initial values here (fiber directions go in fiberDirections)")
                            + "; scalar channels of its material and damage model: "
                            + (scalars.isEmpty() ? "(none)" : String.join(", ", scalars))
                            + (best == null || best.equals(channel) ? "" : "; did you mean \"" + best + "\"?"));
                    spec = null;
                }
                Obj ro = f.object("region", true, "the region whose particles take the value, any shape");
                Shape region = ro == null ? null : shape(ro, f.pathOf("region"), false);
                // Damage means 0 intact to 1 broken; other channels take any finite value in their own unit.
                Range range = DamageModel.DAMAGE.equals(channel) ? Range.closed(0, 1, "")
                        : Range.any(spec == null ? "" : spec.unit());
                Double value = f.number("value", null, range, "value inside the region");
                if (spec == null || region == null || value == null) {
                    ok = false;
                    continue;
                }
                ChannelField before = out.get(channel);
                out.put(channel, before == null ? RegionField.of(region, value)
                        : ((RegionField) before).then(region, value));
            }
            return ok ? out : null;
        }

        private Map<String, ChannelField> fiberDirections(Fields body, MaterialLaw law, Set<String> declared,
                                                          Shape shape) {
            Map<String, ChannelField> out = new LinkedHashMap<>();
            List<Node> items = body.list("fiberDirections", false, 3, "fiber directions of families 1 to 3");
            if (items == null) {
                return body.has("fiberDirections") ? null : out;
            }
            boolean ok = true;
            for (int i = 0; i < items.size(); i++) {
                String at = JsonPaths.index(body.pathOf("fiberDirections"), i);
                Node n = items.get(i);
                if (!(n instanceof Obj o)) {
                    problems.at(at, n.line, n.column, "must be an object {\"type\": ..., ...}, got " + n.kind());
                    ok = false;
                    continue;
                }
                List<String> types = FIBER_FIELD_TYPES;
                String type = new Fields(problems, o, at, null).string("type", null, types,
                        "direction field: " + String.join(", ", types));
                if (type == null) {
                    ok = false;
                    continue;
                }
                Fields f = new Fields(problems, o, at, FIBER_FIELD_KEYS.get(type));
                String channel = "fiber-" + (i + 1);
                if (type.equals("mesh")) {
                    ChannelField mf = meshFiberField(f, shape, law != null && !declared.contains(channel), i);
                    if (mf == null) {
                        ok = false;
                    } else {
                        out.put(channel, mf);
                    }
                    continue;
                }
                Map<String, Object> params = new LinkedHashMap<>();
                boolean good = true;
                List<String> wanted = new ArrayList<>(FIBER_FIELD_KEYS.get(type));
                wanted.remove("type");
                for (String key : o.members.keySet()) {
                    if (wanted.contains(key)) {
                        Object v = fiberParameter(f, key);
                        good &= v != null;
                        params.put(key, v);
                    }
                }
                for (String key : wanted) {
                    if (!o.members.containsKey(key)) {
                        fiberParameter(f, key);
                        good = false;
                    }
                }
                if (law != null && !declared.contains(channel)) {
                    problems.at(at, n.line, n.column, "family " + (i + 1) + " needs the channel \"" + channel
                            + "\", which neither the material nor the damage model declares; add fibers to the "
                            + "material (\"fibers\": [...]) or remove this entry");
                    good = false;
                }
                if (!good) {
                    ok = false;
                    continue;
                }
                ModelDescription d = new ModelDescription(type, params);
                try {
                    out.put(channel, description.describe(SceneDescription.makeFiberField(d, at), d));
                } catch (InvalidInputException e) {
                    problems.at(at, n.line, n.column, e.getMessage());
                    ok = false;
                }
            }
            return ok ? out : null;
        }

        private ChannelField meshFiberField(Fields f, Shape shape, boolean undeclared, int i) {
            String attribute = f.string("attribute", null, null, "name of a width-3 vertex attribute of the mesh");
            if (undeclared) {
                problems.at(f.path(), f.obj().line, f.obj().column, "family " + (i + 1) + " needs the channel "
                        + "\"fiber-" + (i + 1) + "\", which neither the material nor the damage model declares; add "
                        + "fibers to the material (\"fibers\": [...]) or remove this entry");
                return null;
            }
            if (attribute == null || shape == null) {
                return null;
            }
            if (!(shape instanceof dev.fray.io.mesh.MeshShape mesh)) {
                f.error("type", "directions of type \"mesh\" come from the body's own mesh, but its shape is not a "
                        + "mesh");
                return null;
            }
            try {
                return description.meshFiberField(mesh, attribute);
            } catch (InvalidInputException e) {
                f.error("attribute", e.getMessage() + "; the mesh has " + mesh.mesh().attributeNames());
                return null;
            }
        }

        private Object fiberParameter(Fields f, String key) {
            switch (key) {
                case "pitchAngle":
                    return f.number(key, null, Range.closed(-0.5 * Math.PI, 0.5 * Math.PI, "rad"), "pitch angle");
                case "point":
                    return f.vector(key, null, Range.any("m"), "a point on the axis, m");
                default:
                    return axis(f, key);
            }
        }

        // ------------------------------------------------------------------ obstacles and grips

        private void obstacles(Fields top, Scene.Builder b) {
            List<Node> items = top.list("obstacles", false, MAX_ITEMS, "rigid obstacles");
            if (items == null) {
                return;
            }
            Map<String, String> names = new LinkedHashMap<>();
            for (int i = 0; i < items.size(); i++) {
                String path = JsonPaths.index("obstacles", i);
                Node n = items.get(i);
                if (!(n instanceof Obj o)) {
                    problems.at(path, n.line, n.column, "must be an object describing an obstacle, got " + n.kind());
                    continue;
                }
                Fields f = new Fields(problems, o, path, OBSTACLE_KEYS);
                String name = uniqueName(f, names);
                Obj so = f.object("shape", true, "the obstacle's solid region");
                Shape shape = so == null ? null : shape(so, f.pathOf("shape"), false);
                Contact c = contact(f, "contact", Contact.separating(0));
                Motion m = motion(f);
                if (name != null && shape != null && c != null && m != null) {
                    b.add(new Obstacle(name, shape, c, m));
                }
            }
        }

        private String uniqueName(Fields f, Map<String, String> names) {
            String name = f.string("name", null, null, "unique name");
            if (name != null) {
                String other = names.putIfAbsent(name, f.path());
                if (other != null) {
                    f.error("name", "\"" + name + "\" is already the name of " + other + "; names must be unique");
                    return null;
                }
            }
            return name;
        }

        private Motion motion(Fields parent) {
            Obj o = parent.object("motion", false,
                    "{\"velocity\": ..., \"angularVelocity\": ..., \"pivot\": ..., \"schedule\": ...}");
            if (o == null) {
                return parent.has("motion") ? null : Motion.STILL;
            }
            Fields f = new Fields(problems, o, parent.pathOf("motion"), MOTION_KEYS);
            double[] v = f.vector("velocity", new double[3], Range.closed(-1e6, 1e6, "m/s"), "velocity");
            double[] w = f.vector("angularVelocity", new double[3], Range.closed(-1e6, 1e6, "rad/s"),
                    "angular velocity");
            double[] c = f.vector("pivot", new double[3], Range.any("m"), "pivot at time 0");
            VelocitySchedule s = ScheduleField.read(f);
            if (v == null || w == null || c == null || s == null) {
                return null;
            }
            return new Motion(v[0], v[1], v[2], w[0], w[1], w[2], c[0], c[1], c[2], s);
        }

        private void grips(Fields top, Scene.Builder b, Set<String> bodyNames) {
            List<Node> items = top.list("grips", false, MAX_ITEMS, "regions of bodies driven on a path");
            if (items == null) {
                return;
            }
            Map<String, String> names = new LinkedHashMap<>();
            for (int i = 0; i < items.size(); i++) {
                String path = JsonPaths.index("grips", i);
                Node n = items.get(i);
                if (!(n instanceof Obj o)) {
                    problems.at(path, n.line, n.column, "must be an object describing a grip, got " + n.kind());
                    continue;
                }
                Fields f = new Fields(problems, o, path, GRIP_KEYS);
                String name = uniqueName(f, names);
                String body = f.string("body", null, null, "name of the body gripped");
                // Only judge the body name when every body was read; otherwise it may just have failed.
                if (body != null && !bodyNames.contains(body) && bodyNames.size() == bodyItems) {
                    String best = Suggest.closest(body, bodyNames);
                    f.error("body", "no body is named \"" + body + "\"" + (best == null ? "" : "; did you mean \""
                            + best + "\"?") + " bodies: " + String.join(", ", bodyNames));
                    body = null;
                }
                Obj ro = f.object("region", true, "the region selecting gripped particles at time 0");
                Shape region = ro == null ? null : shape(ro, f.pathOf("region"), false);
                Motion m = motion(f);
                if (name != null && body != null && region != null && m != null) {
                    b.add(new Grip(name, body, region, m));
                }
            }
        }
    }
}

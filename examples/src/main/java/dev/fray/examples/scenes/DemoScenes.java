package dev.fray.examples.scenes;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.damage.Elastic;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.OutputSettings;
import dev.fray.io.scene.SceneDescription;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Built-in demo scenes of our own, small enough for a quick run: about 10 000 to 20 000 particles on a 1/48 m grid
 * in a unit box, {@link #DEFAULT_FRAMES} frames by default. The two without damage run at {@link #FRAME_RATE}
 * frames per second; the fracture demos set their own frame rate so that the default frames cover the break. All
 * values in SI units.
 *
 * <ul>
 *   <li>{@code soft-drop}: a soft rubbery slab (Neo-Hookean, E = 2e5 Pa, nu = 0.4, rho = 1000 kg/m^3) falls
 *       0.2 m onto a fixed ball (separating contact, friction 0.4), drapes over it off-centre and slides down
 *       onto a slip floor (friction 0.3).</li>
 *   <li>{@code spin-box}: a springy block (fixed corotated, E = 2e4 Pa, nu = 0.3, rho = 1000 kg/m^3) thrown
 *       sideways and upwards while spinning about a tilted axis, bouncing around a closed box whose walls are
 *       separating with friction 0.2.</li>
 *   <li>{@code board-split}: a softwood board (fiber-reinforced, grain along its length, anisotropic AT1
 *       phase-field damage with critical stresses along and across the grain; softened so that waves are slow)
 *       clamped at one end is split along the grain by a wedge driven at 0.5 m/s into a check in its other end;
 *       over 0.8 s the split runs from the check's tip about 0.25 m on toward the clamp. Gravity off.</li>
 *   <li>{@code slab-tear}: a soft gel slab (Neo-Hookean, E = 5e4 Pa, nu = 0.4, rho = 1000 kg/m^3; AT1 phase
 *       field, Gc = 30 J/m^2, so a strength of 3.7 kPa, crack-speed viscosity 5 Pa s) lying on a table is torn in
 *       two by grips pulling its ends apart at 0.12 m/s each, from a cut two fifths of the way into its front
 *       edge.</li>
 *   <li>{@code slab-tear-fast}, {@code slab-tear-slow}: the same with crack-speed viscosity 0 (the library
 *       default: the crack runs as fast as the material lets it) and 20 Pa s (the crack creeps).</li>
 *   <li>{@code slab-tear-soft}, {@code slab-tear-stiff}: the same with E = 1.25e4 Pa and 2e5 Pa at the same
 *       fracture energy: the stiffer slab needs more stress to break (about twice as much for four times the
 *       modulus) and its pieces ring faster.</li>
 *   <li>{@code sand-collapse}: a square column of dry sand (Drucker-Prager, friction angle 30 degrees, no
 *       cohesion) 0.2 m wide and 0.32 m tall collapses on a table (friction 0.4) and spreads into a low heap.</li>
 *   <li>{@code metal-tear}: a notched soft metal strip (von Mises with hardening; Rankine damage starting at 1.25
 *       times the yield stress) lying on a table is pulled apart by grips at 0.05 m/s each: the section at the
 *       notch yields, necks and tears across.</li>
 *   <li>{@code clay-cut}: a block of wet clay (non-associated Cam-Clay with Rankine damage) is cut in two by a
 *       wire 16 mm across drawn down through it at 0.3 m/s.</li>
 *   <li>{@code tile-strike}: a stiff brittle tile (E = 1 GPa, AT1 phase field, 1 MPa strength) across two soft
 *       rubber blocks, a soft gel cube on its end, broken by a ball driven down at 2 m/s; runs with the implicit
 *       integrator, at steps about 300 times the explicit limit (see {@link ImplicitDemos}).</li>
 * </ul>
 */
public final class DemoScenes {
    /** Frames of output a demo runs for by default. */
    public static final int DEFAULT_FRAMES = 48;
    /** Frames per second of the demos without damage, 1/s; the fracture demos set their own. */
    public static final double FRAME_RATE = 24;
    /** Grid cell size of every demo, m. */
    public static final double CELL_SIZE = 1.0 / 48;

    private static final Map<String, String> DESCRIPTIONS = new LinkedHashMap<>();

    static {
        DESCRIPTIONS.put("soft-drop", "a soft rubbery slab drops onto a fixed ball and slides off onto the floor");
        DESCRIPTIONS.put("spin-box", "a spinning springy block thrown around a closed box");
        DESCRIPTIONS.put("board-split", "a wedge driven into a clamped softwood board splits it along the grain");
        DESCRIPTIONS.put("slab-tear", "two grips tear a soft gel slab in two from a cut in its edge");
        DESCRIPTIONS.put("slab-tear-fast", "slab-tear with no crack-speed viscosity: the crack runs fastest");
        DESCRIPTIONS.put("slab-tear-slow", "slab-tear with a large crack-speed viscosity: the crack creeps");
        DESCRIPTIONS.put("slab-tear-soft", "slab-tear with a 4x softer gel: breaks at lower stress, rings slower");
        DESCRIPTIONS.put("slab-tear-stiff", "slab-tear with a 4x stiffer gel: needs more stress, rings faster");
        DESCRIPTIONS.put("sand-collapse", "a column of dry sand collapses on a table and spreads into a heap");
        DESCRIPTIONS.put("metal-tear", "grips pull a notched soft metal strip: it necks, then tears from the notch");
        DESCRIPTIONS.put("clay-cut", "a thin wire drawn down through a block of wet clay cuts it in two");
        DESCRIPTIONS.put("tile-strike", "a ball breaks a stiff tile lying on soft rubber blocks (implicit steps)");
    }

    private static final List<String> NAMES = List.copyOf(DESCRIPTIONS.keySet());

    private DemoScenes() {
    }

    /** @return the demo names, in a fixed order (unmodifiable) */
    public static List<String> names() {
        return NAMES;
    }

    /**
     * @param name a demo name
     * @return one line saying what happens in it
     * @throws InvalidInputException with key UNKNOWN_NAME (parts "demo scene", name, known names)
     */
    public static String description(String name) {
        check(name);
        return DESCRIPTIONS.get(name);
    }

    /**
     * Builds a demo scene.
     *
     * @param name    one of {@link #names()}
     * @param threads worker threads, 1 to 1024 (results do not depend on it)
     * @return the scene
     * @throws InvalidInputException with key UNKNOWN_NAME (parts "demo scene", name, known names) for an unknown
     *         name, OUT_OF_RANGE for a bad thread count
     */
    public static Scene build(String name, int threads) {
        return load(name, threads).scene();
    }

    /**
     * Builds a demo scene with what a scene file of it needs besides: how its models were made, a one-line
     * description, and output settings of {@link #DEFAULT_FRAMES} frames (PLY frames and the diagnostics CSV, a
     * checkpoint every 12 frames).
     *
     * @param name    one of {@link #names()}
     * @param threads worker threads, 1 to 1024 (results do not depend on it)
     * @return the scene with its output settings and description, named "demo NAME", with no folder
     * @throws InvalidInputException as {@link #build}
     */
    public static LoadedScene load(String name, int threads) {
        check(name);
        Checks.inRange("threads", threads, 1, 1024);
        SceneDescription d = new SceneDescription(PluginRegistry.load(DemoScenes.class.getClassLoader()))
                .text("The built-in demo " + name + ": " + DESCRIPTIONS.get(name) + ".");
        Scene.Builder b = switch (name) {
            case "soft-drop" -> softDrop();
            case "spin-box" -> spinBox();
            case "board-split" -> FractureDemos.boardSplit(0.8, d);
            case "slab-tear" -> FractureDemos.slabTear(FractureDemos.SLAB_E, FractureDemos.SLAB_VISCOSITY, 0.3);
            case "slab-tear-fast" -> FractureDemos.slabTear(FractureDemos.SLAB_E, 0, 0.3);
            case "slab-tear-slow" -> FractureDemos.slabTear(FractureDemos.SLAB_E, FractureDemos.SLAB_VISCOSITY_SLOW,
                    0.3);
            case "slab-tear-soft" -> FractureDemos.slabTear(FractureDemos.SLAB_E / 4, FractureDemos.SLAB_VISCOSITY,
                    0.5);
            case "slab-tear-stiff" -> FractureDemos.slabTear(4 * FractureDemos.SLAB_E, FractureDemos.SLAB_VISCOSITY,
                    0.2);
            case "sand-collapse" -> PlasticDemos.sandCollapse(0.75);
            case "metal-tear" -> PlasticDemos.stripTear(1.2);
            case "clay-cut" -> PlasticDemos.clayCut(1.0);
            case "tile-strike" -> ImplicitDemos.tileStrike(0.12);
            default -> throw new IllegalStateException("demo " + name + " listed but not built");
        };
        OutputSettings output = OutputSettings.defaults().withFrames(DEFAULT_FRAMES).withCheckpoints(12,
                OutputSettings.DEFAULT_KEEP_CHECKPOINTS);
        return new LoadedScene(b.threads(threads).build(), output, d, "demo " + name, null);
    }

    private static void check(String name) {
        Checks.notNull("demo scene name", name);
        if (!DESCRIPTIONS.containsKey(name)) {
            throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "demo scene", name, String.join(", ", NAMES));
        }
    }

    private static Scene.Builder base() {
        return Scene.builder()
                .domain(0, 0, 0, 1, 1, 1)
                .cellSize(CELL_SIZE)
                .gravity(0, -9.81, 0)
                .frameRate(FRAME_RATE);
    }

    private static Scene.Builder softDrop() {
        // Slab centre sits 0.05 m off the ball's axis so it drapes unevenly and slides off one side.
        return base()
                .walls(Contact.separating(0))
                .wall("yMin", Contact.slip(0.3))
                .add(new Obstacle("ball", Shapes.sphere(0.5, 0.25, 0.5, 0.15), Contact.separating(0.4), null))
                .add(Body.named("slab")
                        .shape(Shapes.box(0.27, 0.6, 0.32, 0.63, 0.78, 0.68))
                        .material(Elastic.neoHookean(2e5, 0.4, 1000))
                        .jitter(0.25)
                        .seed(11)
                        .build());
    }

    private static Scene.Builder spinBox() {
        return base()
                .walls(Contact.separating(0.2))
                .add(Body.named("block")
                        .shape(Shapes.box(0.17, 0.5, 0.35, 0.53, 0.7, 0.65))
                        .material(Elastic.fixedCorotated(2e4, 0.3, 1000))
                        .jitter(0.25)
                        .seed(12)
                        .velocity(2.0, 1.0, 0.6)
                        .angularVelocity(1.5, 4.0, 6.0)
                        .build());
    }
}

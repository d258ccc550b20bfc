package dev.fray.io.scene;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.boundary.VelocitySchedule;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import dev.fray.damage.fiber.FiberReinforced;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.EnumSet;
import java.util.List;
import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** A scene built in Java, written to JSON and read back, is the same scene, field by field. */
class SceneRoundTripTest extends FrayTestBase {
    private static final PluginRegistry REGISTRY = PluginRegistry.load();

    @TempDir
    Path tmp;

    /** Every kind of field the format holds, with values away from the defaults. */
    static LoadedScene everything() {
        SceneDescription d = new SceneDescription(REGISTRY).text("round-trip check: every field away from its default");
        MaterialLaw rubber = d.materialLaw("neo-hookean", Map.of("youngsModulus", 3e5, "poissonRatio", 0.35,
                "density", 1100.0));
        MaterialLaw stalk = Fibers.reinforce(Elastic.fixedCorotated(1e5, 0.3, 600)).quadratic(4e5)
                .exponential(1e5, 2.5).build();
        Body block = Body.named("block")
                .shape(Shapes.box(0.1, 0.2, 0.1, 0.3, 0.35, 0.3))
                .material(rubber)
                .damage(d.damageModel("phase-field-at2", Map.of("fractureEnergy", 12.0, "lengthScale", 0.06)))
                .spacing(0.025).jitter(0.3).seed(-7).velocity(0.5, -1, 0.25).angularVelocity(0, 2, -1)
                .build();
        Body inner = Body.named("pith")
                .shape(Shapes.cylinder(0.6, 0.4, 0.5, 0, 1, 0, 0.08, 0.2))
                .material(Elastic.henckyStVK(2e4, 0.2, 300))
                .build();
        Body outer = Body.named("rind")
                .shape(new LayeredShape(Shapes.cylinder(0.6, 0.4, 0.5, 0, 1, 0, 0.15, 0.2),
                        List.of(Shapes.cylinder(0.6, 0.4, 0.5, 0, 1, 0, 0.08, 0.2))))
                .material(stalk)
                .damage(d.damageModel("phase-field-anisotropic", Map.of("fractureEnergy", 30.0,
                        "fiberStrength1", 20.0, "fiberStrength2", 5.0)))
                .initialChannel("fiber-1", d.fiberField("helical", Map.of("point", new double[] {0.6, 0.4, 0.5},
                        "axis", new double[] {0, 1, 0}, "pitchAngle", 0.4)))
                .initialChannel("fiber-2", d.fiberField("uniform", Map.of("direction", new double[] {0, 1, 0})))
                .seed(3)
                .build();
        d.group("pith", "stalk").group("rind", "stalk");
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 0.8, 1.2)
                .cellSize(0.05)
                .gravity(0.1, -9.8, 0)
                .walls(Contact.separating(0.2))
                .wall("yMin", Contact.slip(0.5))
                .wall("xMax", Contact.sticky())
                .wall("zMin", Contact.open())
                .add(block).add(inner).add(outer)
                .add(new Obstacle("floor", Shapes.halfSpace(0, 0.05, 0, 0, 1, 0), Contact.slip(0.3), null))
                .add(new Obstacle("pusher", Shapes.sphere(0.8, 0.6, 0.2, 0.08), Contact.sticky(),
                        Motion.linear(-0.2, 0, 0.1).withRotation(0, 1, 0, 0.8, 0.6, 0.2)
                                .withSchedule(VelocitySchedule.ramp(0.25))))
                .add(new Grip("hold", "block", Shapes.box(0.1, 0.2, 0.1, 0.15, 0.35, 0.3), Motion.linear(0, 0.1, 0)
                        .withSchedule(VelocitySchedule.of(new double[] {0, 0.1, 2, 2.05},
                                new double[] {0, 1, 1, -0.0}))))
                .kernel(Kernel.CUBIC)
                .cfl(0.3)
                .damping(0.5)
                .maxTimeStep(1e-3)
                .fixedTimeStep(2.5e-4)
                .frameRate(30)
                .threads(3)
                .speedLimit(50)
                .phaseFieldSolver(1e-7, 321)
                .build();
        OutputSettings out = new OutputSettings(7, EnumSet.of(OutputFormat.PLY, OutputFormat.VTP),
                List.of("damage", "fiber-1"), 3, 4, 5);
        return new LoadedScene(scene, out, d, "built in Java", null);
    }

    @Test
    void javaSceneSurvivesJsonFieldByField() {
        LoadedScene original = everything();
        String json = SceneWriter.toJson(original);
        LoadedScene back = new SceneReader(REGISTRY).read(json.getBytes(StandardCharsets.UTF_8), "round.json", tmp);
        assertSameScene(original, back);
        assertEquals(json, SceneWriter.toJson(back), "writing the read scene gives the same text");
        assertTrue(json.contains("\"schedule\": [[0, 0], [0.1, 1], [2, 1], [2.05, -0.0]]"), json);
        assertTrue(json.contains("\"schedule\": [[0, 0], [0.25, 1]]"), json);
    }

    @Test
    void writtenFileReadsBackAndSamplesTheSameParticles() {
        LoadedScene original = everything();
        Path file = tmp.resolve("scene.json");
        SceneWriter.write(file, original);
        LoadedScene back = new SceneReader(REGISTRY).read(file);
        assertEquals(file.toString(), back.name());
        assertEquals(tmp.toAbsolutePath(), back.baseDir());
        // The strongest equality: both scenes make bit-identical particles, channels and fiber directions.
        try (Simulation a = new Simulation(original.scene()); Simulation b = new Simulation(back.scene())) {
            SimulationState sa = a.captureState();
            SimulationState sb = b.captureState();
            assertEquals(sa.channels().keySet(), sb.channels().keySet());
            for (String ch : sa.channels().keySet()) {
                assertArrayEquals(sa.channels().get(ch), sb.channels().get(ch), ch);
            }
            assertArrayEquals(sa.body(), sb.body());
            assertEquals(a.maxWaveSpeed(), b.maxWaveSpeed());
        }
    }

    @Test
    void unwritableScenesSayWhichBody() {
        SceneDescription d = new SceneDescription(REGISTRY);
        Scene withField = Scene.builder().add(Body.named("swirl").shape(Shapes.sphere(0.5, 0.5, 0.5, 0.1))
                .material(Elastic.neoHookean(1e5, 0.3, 1000))
                .velocityField((x, y, z, out) -> out[0] = y).build()).build();
        var e = assertThrows(dev.fray.core.error.InvalidInputException.class,
                () -> SceneWriter.toJson(withField, OutputSettings.defaults(), d));
        assertTrue(e.getMessage().contains("\"swirl\""), e.getMessage());

        MaterialLaw custom = Fibers.reinforce(new Undescribed()).quadratic(1e4).build();
        Scene withCustom = Scene.builder().add(Body.named("odd").shape(Shapes.sphere(0.5, 0.5, 0.5, 0.1))
                .material(custom).build()).build();
        e = assertThrows(dev.fray.core.error.InvalidInputException.class,
                () -> SceneWriter.toJson(withCustom, OutputSettings.defaults(), d));
        assertTrue(e.getMessage().contains("\"odd\"") && e.getMessage().contains("describe"), e.getMessage());
        // Attaching a description makes it writable.
        d.describe(((FiberReinforced) custom).base(), ModelDescription.of("my-law", Map.of("stiffness", 5)));
        String json = SceneWriter.toJson(withCustom, OutputSettings.defaults(), d);
        assertTrue(json.contains("\"law\": \"my-law\"") && json.contains("\"stiffness\": 5"), json);
    }

    /** A third-party-style law made without the registry. */
    private static final class Undescribed implements MaterialLaw {
        private final MaterialLaw inner = Elastic.neoHookean(1e5, 0.3, 1000);

        @Override
        public String name() {
            return "undescribed";
        }

        @Override
        public double density() {
            return inner.density();
        }

        @Override
        public double waveSpeed() {
            return inner.waveSpeed();
        }

        @Override
        public void energyDensity(dev.fray.core.material.MaterialState s, int from, int to, double[] out) {
            inner.energyDensity(s, from, to, out);
        }

        @Override
        public void firstPiolaKirchhoff(dev.fray.core.material.MaterialState s, int from, int to, double[] out) {
            inner.firstPiolaKirchhoff(s, from, to, out);
        }
    }

    static void assertSameScene(LoadedScene x, LoadedScene y) {
        Scene a = x.scene();
        Scene b = y.scene();
        assertEquals(a.domain(), b.domain());
        assertEquals(a.cellSize(), b.cellSize());
        assertArrayEquals(a.gravity(), b.gravity());
        assertEquals(a.walls(), b.walls());
        assertEquals(a.obstacles(), b.obstacles());
        assertEquals(a.grips(), b.grips());
        assertSame(a.kernel(), b.kernel());
        assertEquals(a.cfl(), b.cfl());
        assertEquals(a.damping(), b.damping());
        assertEquals(a.maxTimeStep(), b.maxTimeStep());
        assertEquals(a.fixedTimeStep(), b.fixedTimeStep());
        assertEquals(a.frameRate(), b.frameRate());
        assertEquals(a.threads(), b.threads());
        assertEquals(a.speedLimit(), b.speedLimit());
        assertEquals(a.phaseFieldTolerance(), b.phaseFieldTolerance());
        assertEquals(a.phaseFieldMaxIterations(), b.phaseFieldMaxIterations());
        assertEquals(x.output(), y.output());
        assertEquals(x.description().text(), y.description().text());
        assertEquals(x.description().groups(), y.description().groups());
        assertEquals(a.bodies().size(), b.bodies().size());
        for (int i = 0; i < a.bodies().size(); i++) {
            Body p = a.bodies().get(i);
            Body q = b.bodies().get(i);
            assertEquals(p.name(), q.name());
            assertEquals(p.shape(), q.shape(), p.name());
            assertEquals(p.spacing(), q.spacing());
            assertEquals(p.jitter(), q.jitter());
            assertEquals(p.seed(), q.seed());
            assertArrayEquals(p.linearVelocity(), q.linearVelocity());
            assertArrayEquals(p.angularVelocity(), q.angularVelocity());
            assertSameLaw(x.description(), p.material(), y.description(), q.material());
            assertEquals(p.damage() == null, q.damage() == null);
            if (p.damage() != null) {
                assertEquals(p.damage().name(), q.damage().name());
                assertEquals(x.description().of(p.damage()).orElseThrow(),
                        y.description().of(q.damage()).orElseThrow());
            }
            assertEquals(p.initialChannels().keySet(), q.initialChannels().keySet());
            for (String ch : p.initialChannels().keySet()) {
                assertEquals(x.description().of(p.initialChannels().get(ch)).orElseThrow(),
                        y.description().of(q.initialChannels().get(ch)).orElseThrow(), ch);
            }
        }
    }

    private static void assertSameLaw(SceneDescription dx, MaterialLaw p, SceneDescription dy, MaterialLaw q) {
        assertEquals(p.name(), q.name());
        assertEquals(p.density(), q.density());
        assertEquals(p.waveSpeed(), q.waveSpeed());
        if (p instanceof FiberReinforced fp) {
            FiberReinforced fq = assertInstanceOf(FiberReinforced.class, q);
            assertEquals(fp.terms(), fq.terms());
            p = fp.base();
            q = fq.base();
            assertEquals(p.name(), q.name());
        }
        var describedP = dx.of(p);
        if (describedP.isPresent()) {
            assertEquals(describedP.get(), dy.of(q).orElseThrow());
        }
        assertEquals(p.waveSpeed(), q.waveSpeed());
    }
}

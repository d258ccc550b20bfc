package dev.fray.io.scene;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import dev.fray.damage.Fracture;
import dev.fray.damage.fracture.AnisotropicPhaseField;
import dev.fray.damage.fracture.PhaseFieldAT2;
import dev.fray.damage.fracture.RankineDamage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Damage models made with the {@code Fracture} builders, wedge shapes and initial-value regions are written without
 * a description and read back to the same models, shapes and particles. Reference: docs/scene-format.md (the
 * damage model parameters, the "wedge" shape, "initialValues", and "Writing scenes from Java": reading a written
 * scene gives an equal scene).
 */
class FractureSceneWriteTest extends FrayTestBase {
    private static final PluginRegistry REGISTRY = PluginRegistry.load();

    @TempDir
    Path tmp;

    /** Every builder parameter away from its default, so that a parameter the writer drops is noticed. */
    static LoadedScene fractureScene() {
        SceneDescription d = new SceneDescription(REGISTRY);
        RegionField cut = RegionField.of(Shapes.box(0.28, 0.1, 0.1, 0.32, 0.4, 0.2), 1.0)
                .then(Shapes.sphere(0.2, 0.3, 0.3, 0.05), 0.5);
        Body plate = Body.named("plate")
                .shape(Shapes.box(0.1, 0.1, 0.1, 0.5, 0.4, 0.5))
                .material(Elastic.neoHookean(5e4, 0.4, 1000))
                .damage(Fracture.phaseField().fractureEnergy(8).lengthScale(0.1).viscosity(3).residualStiffness(1e-4)
                        .build())
                .initialChannel(DamageModel.DAMAGE, cut)
                .jitter(0.2).seed(5)
                .build();
        Body stalk = Body.named("stalk")
                .shape(Shapes.cylinder(0.7, 0.5, 0.5, 1, 0, 0, 0.08, 0.15))
                .material(Fibers.reinforce(Elastic.fixedCorotated(1e5, 0.3, 600)).quadratic(1e4).quadratic(2e4)
                        .build())
                .damage(Fracture.anisotropicPhaseField().fractureEnergy(20).viscosity(1).fiberStrengths(4, 2)
                        .stressDriving(1e3, 5e2).stressDrivingSlope(2).build())
                .initialChannel("fiber-1", d.fiberField("uniform", Map.of("direction", new double[] {1, 0, 0})))
                .initialChannel("fiber-2", d.fiberField("uniform", Map.of("direction", new double[] {0, 1, 0})))
                .initialChannel(DamageModel.DAMAGE, RegionField.of(new Wedge(0.75, 0.5, 0.3, 0.05), 1.0))
                .build();
        Body chalk = Body.named("chalk")
                .shape(Shapes.sphere(0.3, 0.75, 0.5, 0.1))
                .material(Elastic.henckyStVK(2e5, 0.2, 2000))
                .damage(Fracture.rankine().criticalStress(50).softeningStress(20).viscosity(0.01)
                        .degradation(RankineDamage.Degradation.QUADRATIC).residualStiffness(1e-3).build())
                .build();
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 1, 1)
                .cellSize(0.05)
                .add(plate).add(stalk).add(chalk)
                .add(new Obstacle("wedge", new Wedge(0.95, 0.5, 0.4, 0.04), Contact.separating(0.1),
                        Motion.linear(-0.3, 0, 0)))
                .add(new Grip("hold", "plate", new Wedge(0.15, 0.3, 1.2, 0.1), Motion.STILL))
                .threads(2)
                .build();
        return new LoadedScene(scene, OutputSettings.defaults(), d, "fracture scene", null);
    }

    @Test
    void fractureModelsWedgesAndRegionsRoundTrip() {
        LoadedScene original = fractureScene();
        String json = SceneWriter.toJson(original);
        for (String key : List.of("\"type\": \"wedge\"", "\"edgeX\": 0.95", "\"initialValues\"",
                "\"model\": \"phase-field-at2\"", "\"model\": \"phase-field-anisotropic\"", "\"model\": \"rankine\"",
                "\"degradation\": \"quadratic\"", "\"stressDrivingSlope\": 2")) {
            assertTrue(json.contains(key), key + " in\n" + json);
        }
        LoadedScene back = new SceneReader(REGISTRY).read(json.getBytes(StandardCharsets.UTF_8), "f.json", tmp);
        assertEquals(json, SceneWriter.toJson(back), "writing the read scene gives the same text");
        Scene a = original.scene();
        Scene b = back.scene();
        assertEquals(a.obstacles(), b.obstacles());
        assertEquals(a.grips(), b.grips());
        for (int i = 0; i < a.bodies().size(); i++) {
            assertEquals(a.bodies().get(i).shape(), b.bodies().get(i).shape());
            assertEquals(a.bodies().get(i).initialChannels().keySet(), b.bodies().get(i).initialChannels().keySet());
            assertEquals(a.bodies().get(i).initialChannels().get(DamageModel.DAMAGE),
                    b.bodies().get(i).initialChannels().get(DamageModel.DAMAGE), "regions compare by value");
        }

        PhaseFieldAT2 p = (PhaseFieldAT2) a.bodies().get(0).damage();
        PhaseFieldAT2 q = assertInstanceOf(PhaseFieldAT2.class, b.bodies().get(0).damage());
        assertArrayEquals(new double[] {p.fractureEnergy(), p.lengthScale(), p.viscosity(), p.residualStiffness()},
                new double[] {q.fractureEnergy(), q.lengthScale(), q.viscosity(), q.residualStiffness()});
        AnisotropicPhaseField ap = (AnisotropicPhaseField) a.bodies().get(1).damage();
        AnisotropicPhaseField aq = assertInstanceOf(AnisotropicPhaseField.class, b.bodies().get(1).damage());
        assertEquals(ap.toString(), aq.toString(), "every parameter, fiber strengths and stress driving included");
        assertEquals(ap.stressDrivingSlope(), aq.stressDrivingSlope());
        RankineDamage rp = (RankineDamage) a.bodies().get(2).damage();
        RankineDamage rq = assertInstanceOf(RankineDamage.class, b.bodies().get(2).damage());
        assertArrayEquals(new double[] {rp.criticalStress(), rp.softeningStress(), rp.viscosity(),
            rp.residualStiffness()}, new double[] {rq.criticalStress(), rq.softeningStress(), rq.viscosity(),
            rq.residualStiffness()});
        assertEquals(rp.degradationFunction(), rq.degradationFunction());

        // The strongest check: both scenes start with bit-identical particles and channels, pre-cut included.
        try (Simulation sa = new Simulation(a); Simulation sb = new Simulation(b)) {
            SimulationState x = sa.captureState();
            SimulationState y = sb.captureState();
            for (String ch : x.channels().keySet()) {
                assertArrayEquals(x.channels().get(ch), y.channels().get(ch), ch);
            }
            double[] damage = x.channels().get(DamageModel.DAMAGE);
            assertTrue(Arrays.stream(damage).anyMatch(v -> v == 1) && Arrays.stream(damage).anyMatch(v -> v == 0.5)
                    && Arrays.stream(damage).anyMatch(v -> v == 0), "both regions and the outside are sampled");
        }
    }

    @Test
    void regionsApplyInOrderAndLeaveTheOutsideAlone() {
        RegionField f = RegionField.of(Shapes.box(0, 0, 0, 1, 1, 1), 0.25).then(Shapes.sphere(0.5, 0.5, 0.5, 0.1), 1);
        double[] out = {0.75};
        f.value(2, 2, 2, out);
        assertEquals(0.75, out[0], "outside every region the preset value stays");
        f.value(0.9, 0.9, 0.9, out);
        assertEquals(0.25, out[0]);
        f.value(0.5, 0.5, 0.55, out);
        assertEquals(1.0, out[0], "the later region wins where they overlap");
        f.value(1, 0.5, 0.5, out);
        assertEquals(0.25, out[0], "the surface counts as inside, as when bodies are filled");
        assertThrows(InvalidInputException.class, () -> new RegionField(List.of()));
        assertThrows(InvalidInputException.class, () -> RegionField.of(Shapes.box(0, 0, 0, 1, 1, 1), Double.NaN));
    }

    @Test
    void rankineFromAFractureEnergyRoundTrips() {
        DamageModel rankine = Fracture.rankine().criticalStress(50).fractureEnergy(5, 1e5).build();
        String json = SceneWriter.toJson(sceneWith(rankine), OutputSettings.defaults(),
                new SceneDescription(REGISTRY));
        assertTrue(json.contains("\"youngsModulus\": 100000") && json.contains("\"fractureEnergy\": 5")
                && !json.contains("softeningStress"), json);
        RankineDamage back = assertInstanceOf(RankineDamage.class, readBack(json).scene().bodies().get(0).damage());
        assertArrayEquals(new double[] {50, 5, 1e5}, new double[] {back.criticalStress(), back.fractureEnergy(),
                back.youngsModulus()});
    }

    @Test
    void aChosenTensionSplitIsWrittenAndReadBack() {
        for (TensionSplit split : TensionSplit.values()) {
            DamageModel m = Fracture.phaseField().fractureEnergy(8).tensionSplit(split).build();
            String json = SceneWriter.toJson(sceneWith(m), OutputSettings.defaults(), new SceneDescription(REGISTRY));
            assertEquals(split != TensionSplit.LAW_DEFAULT, json.contains("\"split\""),
                    "only a split other than the law's default is written:\n" + json);
            assertEquals(split, readBack(json).scene().bodies().get(0).damage().tensionSplit());
        }
        // A host's own model that asks for a split is written with it too.
        DamageModel plain = Fracture.phaseField().fractureEnergy(8).build();
        DamageModel unsplit = new SplitChoice(plain, TensionSplit.NONE);
        SceneDescription d = new SceneDescription(REGISTRY);
        d.describe(unsplit, ModelDescription.of(PhaseFieldAT2.NAME, Map.of("fractureEnergy", 8)));
        assertTrue(SceneWriter.toJson(sceneWith(unsplit), OutputSettings.defaults(), d)
                .contains("\"split\": \"none\""));
    }

    private static Scene sceneWith(DamageModel m) {
        return Scene.builder().cellSize(0.05).add(Body.named("slab").shape(Shapes.box(0.4, 0.4, 0.4, 0.6, 0.6, 0.6))
                .material(Elastic.neoHookean(1e5, 0.3, 1000)).damage(m).build()).build();
    }

    private LoadedScene readBack(String json) {
        return new SceneReader(REGISTRY).read(json.getBytes(StandardCharsets.UTF_8), "f.json", tmp);
    }

    /** A model that asks for another split than the law's default, as a host's own model may. */
    private record SplitChoice(DamageModel inner, TensionSplit split) implements DamageModel {
        @Override
        public String name() {
            return inner.name();
        }

        @Override
        public TensionSplit tensionSplit() {
            return split;
        }

        @Override
        public List<ChannelSpec> channels() {
            return inner.channels();
        }

        @Override
        public void update(MaterialState state, int from, int to, double dt, double[] tauDegraded, double[] tauKept,
                           double[] psiDegraded, double[] g) {
            inner.update(state, from, to, dt, tauDegraded, tauKept, psiDegraded, g);
        }

        @Override
        public void degradation(MaterialState state, int from, int to, double[] g) {
            inner.degradation(state, from, to, g);
        }
    }
}

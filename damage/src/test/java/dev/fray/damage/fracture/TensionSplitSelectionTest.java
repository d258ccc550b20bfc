package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.plugin.Parameters;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import dev.fray.damage.Fracture;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The damage models choose the tension-compression split: from their builders and from the "split" parameter of
 * their providers; a body refuses a split its law does not offer; and a simulation with the spectral split cracks
 * deterministically.
 */
class TensionSplitSelectionTest extends FrayTestBase {
    private static final String WHERE = "test.json: bodies[0].damage";
    /** Scene-file names of the splits, in the order of {@link #SPLITS}. */
    private static final List<String> NAMES = List.of("law-default", "volumetric-deviatoric", "spectral", "none");
    private static final List<TensionSplit> SPLITS = List.of(TensionSplit.LAW_DEFAULT,
            TensionSplit.VOLUMETRIC_DEVIATORIC, TensionSplit.SPECTRAL, TensionSplit.NONE);
    private static final int STEPS = 40;

    /** Required parameters of each model, without a split. */
    private static Map<String, Map<String, Object>> required() {
        return Map.of(PhaseFieldAT2.NAME, Map.of("fractureEnergy", 10.0),
                AnisotropicPhaseField.NAME, Map.of("fractureEnergy", 10.0, "fiberStrength1", 4.0),
                RankineDamage.NAME, Map.of("criticalStress", 1e5, "softeningStress", 1e4));
    }

    private static DamageModel make(String model, String split) {
        Map<String, Object> values = new HashMap<>(required().get(model));
        if (split != null) {
            values.put("split", split);
        }
        return PluginRegistry.load().damageModel(model, new Parameters(WHERE, values));
    }

    @Test
    void providersReadTheSplitParameter() {
        // common practice, no source: a scene-file parameter reaches the model; the names are those of
        // docs/scene-format.md
        for (String model : required().keySet()) {
            assertEquals(TensionSplit.LAW_DEFAULT, make(model, null).tensionSplit(), model + " default");
            for (int i = 0; i < NAMES.size(); i++) {
                DamageModel m = make(model, NAMES.get(i));
                assertEquals(SPLITS.get(i), m.tensionSplit(), model + " " + NAMES.get(i));
                // the grid adaptation keeps the choice
                assertEquals(SPLITS.get(i), m.resolvedFor(0.01).tensionSplit(), model + " resolved");
            }
        }
        assertEquals(TensionSplit.SPECTRAL, make(PhaseFieldAT2.NAME, "spectral").tensionSplit());
    }

    @Test
    void anUnknownSplitNamesTheParameterAndTheAllowedValues() {
        // common practice, no source: a bad value is an input error naming the parameter, the value and the
        // allowed values, with a did-you-mean suggestion when one is close
        for (String model : required().keySet()) {
            InvalidInputException e = assertThrows(InvalidInputException.class, () -> make(model, "spectal"));
            assertEquals(FrayMessage.UNKNOWN_NAME, e.key());
            assertTrue(e.parts()[0].toString().startsWith("split"), e.getMessage());
            assertEquals("spectal", e.parts()[1]);
            assertTrue(e.parts()[2].toString().contains("did you mean \"spectral\""), e.getMessage());
            InvalidInputException far = assertThrows(InvalidInputException.class, () -> make(model, "tension"));
            for (String allowed : NAMES) {
                assertTrue(e.getMessage().contains(allowed), allowed + " listed: " + e.getMessage());
                assertTrue(far.getMessage().contains(allowed), allowed + " listed: " + far.getMessage());
            }
            assertFalse(far.getMessage().contains("did you mean"), far.getMessage());
        }
    }

    @Test
    void buildersDefaultToTheLawsSplit() {
        // common practice, no source: the documented default of every builder
        assertEquals(TensionSplit.LAW_DEFAULT, Fracture.phaseField().fractureEnergy(1).build().tensionSplit());
        assertEquals(TensionSplit.LAW_DEFAULT,
                Fracture.anisotropicPhaseField().fractureEnergy(1).fiberStrengths(1).build().tensionSplit());
        assertEquals(TensionSplit.LAW_DEFAULT,
                Fracture.rankine().criticalStress(1e5).softeningStress(1e4).build().tensionSplit());
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> Fracture.phaseField().fractureEnergy(1).tensionSplit(null).build());
        assertEquals(FrayMessage.MISSING, e.key());
    }

    /** A law with only the interface's default splits (law default and none), by delegation to Neo-Hookean. */
    private record DefaultSplitsOnly(MaterialLaw inner) implements MaterialLaw {
        @Override
        public String name() {
            return "default-splits-only";
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
        public void energyDensity(MaterialState state, int from, int to, double[] out) {
            inner.energyDensity(state, from, to, out);
        }

        @Override
        public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
            inner.firstPiolaKirchhoff(state, from, to, out);
        }
    }

    private static Body body(MaterialLaw law, DamageModel damage) {
        return Body.named("slab").shape(Shapes.box(0.4, 0.4, 0.4, 0.6, 0.6, 0.6)).material(law).damage(damage)
                .build();
    }

    @Test
    void aBodyRefusesASplitItsLawDoesNotOffer() {
        // common practice, no source: an unsupported combination is an input error when the body is built, naming
        // the split, not a failure mid-run
        MaterialLaw plain = new DefaultSplitsOnly(Elastic.neoHookean(1e5, 0.3, 1000));
        MaterialLaw fibrous = Fibers.reinforce(plain).quadratic(1e5).build();
        for (MaterialLaw law : new MaterialLaw[] {plain, fibrous}) {
            for (TensionSplit split : new TensionSplit[] {TensionSplit.SPECTRAL, TensionSplit.VOLUMETRIC_DEVIATORIC}) {
                DamageModel model = Fracture.phaseField().fractureEnergy(10).tensionSplit(split).build();
                InvalidInputException e = assertThrows(InvalidInputException.class, () -> body(law, model));
                assertEquals(FrayMessage.INCONSISTENT, e.key());
                assertTrue(e.getMessage().contains(split.toString()), e.getMessage());
            }
            body(law, Fracture.phaseField().fractureEnergy(10).tensionSplit(TensionSplit.NONE).build());
        }
        for (String name : Elastic.names()) {
            MaterialLaw law = Elastic.byName(name, 1e5, 0.3, 1000);
            for (TensionSplit split : SPLITS) {
                body(law, Fracture.rankine().criticalStress(1e5).softeningStress(1e4).tensionSplit(split).build());
                body(Fibers.reinforce(law).quadratic(1e5).build(),
                        Fracture.anisotropicPhaseField().fractureEnergy(10).fiberStrengths(2).tensionSplit(split)
                                .build());
            }
        }
    }

    /** A notched Neo-Hookean slab of a few hundred particles pulled apart by two grips. */
    private static Scene scene(int threads, TensionSplit split) {
        DamageModel at2 = Fracture.phaseField().fractureEnergy(5).tensionSplit(split).build();
        double y0 = 0.45;
        Body slab = Body.named("slab").shape(Shapes.box(0.35, y0, 0.47, 0.65, y0 + 0.1, 0.53))
                .material(Elastic.neoHookean(1e5, 0.3, 1000)).jitter(0.3).seed(7).damage(at2)
                .initialChannel(DamageModel.DAMAGE,
                        (x, y, z, out) -> out[0] = Math.abs(x - 0.5) < 0.02 && y < y0 + 0.035 ? 0.9 : 0.0)
                .build();
        return Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(1.0 / 32).gravity(0, 0, 0).threads(threads)
                .add(slab)
                .add(new Grip("left", "slab", Shapes.box(0.34, y0 - 0.01, 0.46, 0.39, y0 + 0.11, 0.54),
                        Motion.linear(-0.3, 0, 0)))
                .add(new Grip("right", "slab", Shapes.box(0.61, y0 - 0.01, 0.46, 0.66, y0 + 0.11, 0.54),
                        Motion.linear(0.3, 0, 0)))
                .build();
    }

    private static double[] damage(int threads, TensionSplit split) {
        try (Simulation sim = new Simulation(scene(threads, split))) {
            for (int i = 0; i < STEPS; i++) {
                sim.step();
            }
            ParticleView v = sim.particles();
            double[] d = new double[v.size()];
            v.copyById(DamageModel.DAMAGE, d, 0);
            return d;
        }
    }

    @Test
    void spectralSplitRunIsBitwiseIdenticalForOneAndTwoThreads() {
        // common practice, no source: results do not depend on the thread count (DESIGN.md section 3)
        double[] one = damage(1, TensionSplit.SPECTRAL);
        assertTrue(one.length >= 200 && one.length <= 1000, "a few hundred particles: " + one.length);
        int grown = 0;
        for (double d : one) {
            if (d > 0.1 && d < 0.9) {
                grown++;
            }
        }
        // the pull must make the phase field grow outside the notch, or the comparison would be of zeros
        assertTrue(grown > 10, "particles with growing damage: " + grown);
        assertArrayEquals(one, damage(2, TensionSplit.SPECTRAL), 0.0, "damage with 2 threads");
        // and the choice reaches the solver: the volumetric-deviatoric split drives the crack differently
        assertFalse(java.util.Arrays.equals(one, damage(1, TensionSplit.VOLUMETRIC_DEVIATORIC)),
                "spectral and volumetric-deviatoric runs differ");
    }
}

package dev.fray.examples.scenes;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.damage.fracture.IsotropicPhaseField;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/** Every built-in demo builds, describes itself and takes a few sound steps. */
class DemoScenesTest {
    private static final List<String> FRACTURE = List.of("board-split", "slab-tear", "slab-tear-fast",
            "slab-tear-slow", "slab-tear-soft", "slab-tear-stiff");

    static List<String> demos() {
        return DemoScenes.names();
    }

    private static final List<String> PLASTIC = List.of("sand-collapse", "metal-tear", "clay-cut");
    /** The plastic demos that also break. */
    private static final List<String> PLASTIC_DAMAGE = List.of("metal-tear", "clay-cut");
    /** The demos that run with the implicit integrator (last in the list). */
    private static final List<String> IMPLICIT = List.of("tile-strike");

    @Test
    void listsTheFractureDemosThenThePlasticOnesAfterTheOthers() {
        assertEquals(List.of("soft-drop", "spin-box"), DemoScenes.names().subList(0, 2));
        assertEquals(FRACTURE, DemoScenes.names().subList(2, 2 + FRACTURE.size()));
        int plasticEnd = 2 + FRACTURE.size() + PLASTIC.size();
        assertEquals(PLASTIC, DemoScenes.names().subList(2 + FRACTURE.size(), plasticEnd));
        assertEquals(IMPLICIT, DemoScenes.names().subList(plasticEnd, DemoScenes.names().size()));
        assertThrows(UnsupportedOperationException.class, () -> DemoScenes.names().add("x"));
    }

    @ParameterizedTest
    @MethodSource("demos")
    void buildsAndSteps(String name) {
        String line = DemoScenes.description(name);
        assertFalse(line.isBlank() || line.contains("\n"), "one line: " + line);
        Scene scene = DemoScenes.build(name, 2);
        assertEquals(2, scene.threads());
        try (Simulation sim = new Simulation(scene)) {
            int n = sim.particles().size();
            // Large enough to look like something, small enough for a quick default run.
            assertTrue(n >= 5_000 && n <= 40_000, name + ": " + n + " particles");
            boolean breaks = sim.particles().channelNames().contains(DamageModel.DAMAGE);
            assertEquals(FRACTURE.contains(name) || PLASTIC_DAMAGE.contains(name) || IMPLICIT.contains(name), breaks,
                    name + " has damage");
            assertEquals(IMPLICIT.contains(name), sim.implicit(), name + " integrates implicitly");
            assertEquals(PLASTIC.contains(name), sim.particles().channelNames().contains("plastic-strain"),
                    name + " has a plastic law");
            for (int i = 0; i < 3; i++) {
                sim.step();
            }
            Diagnostics d = sim.diagnostics();
            assertEquals(3, d.step());
            assertTrue(Double.isFinite(d.kineticEnergy() + d.elasticEnergy()) && d.maxSpeed() < 10,
                    name + ": " + d);
        }
    }

    @Test
    void slabTearVariantsShareTheSlabAndOrderTheirParameters() {
        int n = -1;
        for (String name : FRACTURE.subList(1, FRACTURE.size())) {
            try (Simulation sim = new Simulation(DemoScenes.build(name, 1))) {
                n = n < 0 ? sim.particles().size() : n;
                assertEquals(n, sim.particles().size(), name);
            }
        }
        assertEquals(0.0, viscosity("slab-tear-fast"), "fast uses the library default");
        assertTrue(viscosity("slab-tear") > 0 && viscosity("slab-tear-slow") > viscosity("slab-tear"));
        assertTrue(waveSpeed("slab-tear-soft") < waveSpeed("slab-tear")
                && waveSpeed("slab-tear") < waveSpeed("slab-tear-stiff"));
    }

    private static double viscosity(String demo) {
        return ((IsotropicPhaseField) DemoScenes.build(demo, 1).bodies().get(0).damage()).viscosity();
    }

    private static double waveSpeed(String demo) {
        return DemoScenes.build(demo, 1).bodies().get(0).material().waveSpeed();
    }

    @Test
    void unknownNameIsBadInput() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> DemoScenes.build("slab-teer", 2));
        assertEquals(FrayMessage.UNKNOWN_NAME, e.key());
        assertTrue(e.getMessage().contains("slab-tear"), e.getMessage());
    }
}

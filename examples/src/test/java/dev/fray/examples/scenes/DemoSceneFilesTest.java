package dev.fray.examples.scenes;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.SceneReader;
import dev.fray.io.scene.SceneWriter;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.FieldSource;

/**
 * The fracture demos shipped as scene files are exactly the Java demos: the files are SceneWriter's text of the
 * demos, and a scene read from a file runs bit for bit like the demo. Reference: docs/scene-format.md, which says
 * that reading a written scene gives an equal scene (section "Writing scenes from Java").
 */
class DemoSceneFilesTest {
    static final java.util.List<String> GENERATED = DemoSceneFiles.GENERATED;

    private static Path file(String name) {
        return Path.of("scenes", name + ".json");
    }

    /** The demos that start with a cut: a broken sheet of particles. */
    private static final java.util.List<String> PRE_CUT = java.util.List.of("board-split", "slab-tear",
            "slab-tear-fast", "slab-tear-slow", "slab-tear-soft", "slab-tear-stiff", "metal-tear");

    @Test
    void everyFractureAndPlasticDemoIsShipped() {
        // The fracture and plastic demos are those after the first two (see DemoScenesTest).
        assertEquals(DemoScenes.names().subList(2, DemoScenes.names().size()), GENERATED);
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> DemoSceneFiles.text("soft-drop"));
        assertEquals(FrayMessage.UNKNOWN_NAME, e.key());
    }

    @ParameterizedTest
    @FieldSource("GENERATED")
    void shippedFileIsTheWrittenDemo(String name) throws IOException {
        String shipped = Files.readString(file(name));
        assertEquals(shipped, DemoSceneFiles.text(name), "regenerate with DemoSceneFiles (see its class comment)");
        // Reading and writing again changes nothing: the reader's descriptions match what the writer derived.
        assertEquals(shipped, SceneWriter.toJson(new SceneReader().read(file(name))));
    }

    @ParameterizedTest
    @FieldSource("GENERATED")
    void shippedFileRunsLikeTheJavaDemo(String name) {
        LoadedScene read = new SceneReader().read(file(name)).withThreads(2);
        try (Simulation a = new Simulation(DemoScenes.build(name, 2)); Simulation b = new Simulation(read.scene())) {
            SimulationState start = a.captureState();
            // The pre-cut is there: some particles start fully broken, most intact.
            double[] d0 = start.channels().get(DamageModel.DAMAGE);
            if (PRE_CUT.contains(name)) {
                long broken = Arrays.stream(d0).filter(v -> v == 1).count();
                assertTrue(broken > 0 && broken < d0.length / 10, name + ": " + broken + " of " + d0.length);
            }
            for (int i = 0; i < 3; i++) {
                a.step();
                b.step();
            }
            SimulationState sa = a.captureState();
            SimulationState sb = b.captureState();
            assertEquals(3, sa.step());
            assertEquals(sa.channels().keySet(), sb.channels().keySet());
            assertTrue(sa.channels().containsKey("position"), "positions are among the channels compared");
            assertArrayEquals(sa.id(), sb.id());
            for (String ch : sa.channels().keySet()) {
                assertArrayEquals(sa.channels().get(ch), sb.channels().get(ch), name + ": " + ch);
            }
            assertEquals(sa.time(), sb.time());
        }
    }
}

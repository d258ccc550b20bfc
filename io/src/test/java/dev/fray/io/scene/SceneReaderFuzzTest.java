package dev.fray.io.scene;

import com.code_intelligence.jazzer.junit.FuzzTest;
import org.junit.jupiter.api.BeforeAll;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.PluginRegistry;

import static org.junit.jupiter.api.Assertions.assertFalse;

/**
 * Fuzzes the scene reader with arbitrary bytes: it must return a scene or throw {@link InvalidInputException},
 * nothing else. In every build this runs the committed seed corpus in {@code SceneReaderFuzzTestInputs/readsAnyBytes}
 * (regression mode); with {@code JAZZER_FUZZ=1} it fuzzes for {@code maxDuration}.
 */
class SceneReaderFuzzTest {
    private static final SceneReader READER = new SceneReader(PluginRegistry.load());

    @BeforeAll
    static void setUp() {
        FuzzSetup.regressionModeWithoutHooks();
    }

    @FuzzTest(maxDuration = "60s")
    void readsAnyBytes(byte[] data) {
        try {
            READER.read(data, "fuzz.json", null);
        } catch (SceneFileException e) {
            assertFalse(e.problems().isEmpty());
        } catch (InvalidInputException expected) {
            // a clean rejection
        }
    }
}

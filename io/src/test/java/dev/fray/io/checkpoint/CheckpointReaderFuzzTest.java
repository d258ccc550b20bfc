package dev.fray.io.checkpoint;

import com.code_intelligence.jazzer.junit.FuzzTest;
import org.junit.jupiter.api.BeforeAll;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.io.scene.FuzzSetup;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Fuzzes the checkpoint reader with arbitrary bytes: it must return a fully validated checkpoint or throw
 * {@link InvalidInputException} with key FILE_ERROR, nothing else. In every build this runs the committed seed
 * corpus in {@code CheckpointReaderFuzzTestInputs/readsAnyBytes} (regression mode).
 */
class CheckpointReaderFuzzTest {
    @BeforeAll
    static void setUp() {
        FuzzSetup.regressionModeWithoutHooks();
    }

    @FuzzTest(maxDuration = "60s")
    void readsAnyBytes(byte[] data) {
        try {
            Checkpoint c = CheckpointReader.read(data, "fuzz.fcp");
            assertTrue(c.state().size() > 0);
        } catch (InvalidInputException e) {
            assertEquals(FrayMessage.FILE_ERROR, e.key());
        }
    }
}

package dev.fray.io.checkpoint;

import dev.fray.core.error.Checks;
import dev.fray.core.sim.SimulationState;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Everything needed to resume a run: the scene file text it was made from, the captured {@link SimulationState},
 * and named attachments (other files whose content belongs to the run so far, such as the diagnostics table).
 *
 * @param sceneJson   the scene as a scene file (UTF-8 JSON, see {@link dev.fray.io.scene.SceneReader})
 * @param state       the run state between two steps
 * @param attachments named byte contents, in order (names 1 to 255 UTF-8 bytes; copied, arrays not cloned)
 */
public record Checkpoint(String sceneJson, SimulationState state, Map<String, byte[]> attachments) {
    /** Checks and freezes the fields. */
    public Checkpoint {
        Checks.notNull("checkpoint scene", sceneJson);
        Checks.notNull("checkpoint state", state);
        attachments = Collections.unmodifiableMap(new LinkedHashMap<>(
                Checks.notNull("checkpoint attachments", attachments)));
    }
}

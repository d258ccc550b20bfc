package dev.fray.io.scene;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The scene option run.separation is written, read back and checked like every other run setting. */
class SeparationSceneTest extends FrayTestBase {
    private static final PluginRegistry REGISTRY = PluginRegistry.load();

    @TempDir
    Path tmp;

    private static LoadedScene scene(boolean separation) {
        Scene.Builder b = Scene.builder().cellSize(0.05).add(Body.named("cube")
                .shape(Shapes.box(0.4, 0.4, 0.4, 0.6, 0.6, 0.6)).material(Elastic.neoHookean(1e5, 0.3, 1000)).build());
        if (separation) {
            b.separation(0.8, 0.35);
        }
        return new LoadedScene(b.build(), OutputSettings.defaults(), new SceneDescription(REGISTRY), "java", null);
    }

    private LoadedScene readBack(String json) {
        return new SceneReader(REGISTRY).read(json.getBytes(StandardCharsets.UTF_8), "separation.json", tmp);
    }

    @Test
    void separationSurvivesJson() {
        String json = SceneWriter.toJson(scene(true));
        Scene back = readBack(json).scene();
        assertTrue(back.separates());
        assertEquals(0.8, back.separationThreshold());
        assertEquals(0.35, back.separationFriction());
        assertEquals(json, SceneWriter.toJson(readBack(json)));
    }

    @Test
    void separationIsOffUnlessWritten() {
        String json = SceneWriter.toJson(scene(false));
        assertFalse(json.contains("separation"), json);
        assertFalse(readBack(json).scene().separates());
    }

    @Test
    void thresholdOutsideItsRangeNamesThePath() {
        String json = SceneWriter.toJson(scene(true)).replace("\"damageThreshold\": 0.8", "\"damageThreshold\": 1.5");
        SceneFileException e = assertThrows(SceneFileException.class, () -> readBack(json));
        assertTrue(e.problems().stream().anyMatch(p -> p.path().equals("run.separation.damageThreshold")),
                e.getMessage());
    }
}

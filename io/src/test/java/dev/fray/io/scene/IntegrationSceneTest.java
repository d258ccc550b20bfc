package dev.fray.io.scene;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Integration;
import dev.fray.core.sim.Scene;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The scene options run.integration and run.implicitSolver are written, read back and checked. */
class IntegrationSceneTest extends FrayTestBase {
    private static final PluginRegistry REGISTRY = PluginRegistry.load();

    @TempDir
    Path tmp;

    private static LoadedScene scene(Integration mode) {
        Scene scene = Scene.builder().cellSize(0.05).integration(mode).implicitSolver(1e-4, 12)
                .add(Body.named("plate").shape(Shapes.box(0.4, 0.4, 0.4, 0.6, 0.6, 0.6))
                        .material(Elastic.fixedCorotated(7e10, 0.22, 2500)).build())
                .build();
        return new LoadedScene(scene, OutputSettings.defaults(), new SceneDescription(REGISTRY), "java", null);
    }

    private LoadedScene readBack(String json) {
        return new SceneReader(REGISTRY).read(json.getBytes(StandardCharsets.UTF_8), "integration.json", tmp);
    }

    @Test
    void integrationSurvivesJson() {
        for (Integration mode : Integration.values()) {
            String json = SceneWriter.toJson(scene(mode));
            Scene back = readBack(json).scene();
            assertEquals(mode, back.integration());
            assertEquals(json, SceneWriter.toJson(readBack(json)));
            if (mode != Integration.EXPLICIT) {
                assertEquals(1e-4, back.implicitTolerance());
                assertEquals(12, back.implicitMaxIterations());
            }
        }
    }

    @Test
    void unknownModeAndUnsupportedCombinationsNameThePath() {
        String json = SceneWriter.toJson(scene(Integration.IMPLICIT));
        SceneFileException bad = assertThrows(SceneFileException.class,
                () -> readBack(json.replace("\"integration\": \"implicit\"", "\"integration\": \"backward\"")));
        assertTrue(bad.problems().stream().anyMatch(p -> p.path().equals("run.integration")), bad.getMessage());
        String plastic = json.replace("\"implicitSolver\"", "\"separation\": {\"damageThreshold\": 0.5}, "
                + "\"implicitSolver\"");
        SceneFileException refused = assertThrows(SceneFileException.class, () -> readBack(plastic));
        assertTrue(refused.problems().stream().anyMatch(p -> p.path().equals("run.integration")
                && p.message().contains("explicit")), refused.getMessage());
    }
}

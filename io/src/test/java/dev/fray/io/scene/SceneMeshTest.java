package dev.fray.io.scene;

import dev.fray.core.particles.ParticleStore;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.io.mesh.MeshShape;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Mesh shapes, layered bodies and mesh fiber directions in scene files, and how their file names travel. */
class SceneMeshTest extends FrayTestBase {
    private static final SceneReader READER = new SceneReader(PluginRegistry.load());

    @TempDir
    Path tmp;

    /** A closed, outward-oriented unit cube centred on the origin, as an ASCII PLY with fiber directions fx fy fz. */
    static String cubePly() {
        double[][] v = {{-.5, -.5, -.5}, {.5, -.5, -.5}, {.5, .5, -.5}, {-.5, .5, -.5},
            {-.5, -.5, .5}, {.5, -.5, .5}, {.5, .5, .5}, {-.5, .5, .5}};
        int[][] f = {{0, 3, 2}, {0, 2, 1}, {4, 5, 6}, {4, 6, 7}, {0, 1, 5}, {0, 5, 4}, {2, 3, 7}, {2, 7, 6},
            {1, 2, 6}, {1, 6, 5}, {0, 4, 7}, {0, 7, 3}};
        StringBuilder b = new StringBuilder("ply\nformat ascii 1.0\nelement vertex 8\nproperty float x\n"
                + "property float y\nproperty float z\nproperty float fx\nproperty float fy\nproperty float fz\n"
                + "element face 12\nproperty list uchar int vertex_indices\nend_header\n");
        for (double[] p : v) {
            b.append(p[0]).append(' ').append(p[1]).append(' ').append(p[2]).append(" 0 0 1\n");
        }
        for (int[] t : f) {
            b.append("3 ").append(t[0]).append(' ').append(t[1]).append(' ').append(t[2]).append('\n');
        }
        return b.toString();
    }

    private static String scene(String meshFile) {
        return String.join("\n",
                "{",
                "  \"format\": \"fray-scene/1\",",
                "  \"domain\": {\"min\": [0, 0, 0], \"max\": [1, 1, 1]},",
                "  \"run\": {\"cellSize\": 0.05, \"threads\": 1},",
                "  \"bodies\": [",
                "    {\"name\": \"core\", \"group\": \"fruit\", \"shape\": {\"type\": \"mesh\", \"file\": \"" + meshFile
                        + "\", \"scale\": 0.2, \"offset\": [0.5, 0.5, 0.5]},",
                "     \"material\": {\"law\": \"neo-hookean\", \"youngsModulus\": 1e4, \"poissonRatio\": 0.3, "
                        + "\"density\": 900}},",
                "    {\"name\": \"rind\", \"group\": \"fruit\", \"shape\": {\"type\": \"mesh\", \"file\": \"" + meshFile
                        + "\", \"scale\": 0.4, \"offset\": [0.5, 0.5, 0.5]},",
                "     \"material\": {\"law\": \"fixed-corotated\", \"youngsModulus\": 1e5, \"poissonRatio\": 0.3, "
                        + "\"density\": 1000, \"fibers\": [{\"type\": \"quadratic\", \"stiffness\": 1e5}]},",
                "     \"fiberDirections\": [{\"type\": \"mesh\", \"attribute\": \"f\"}]}",
                "  ],",
                "  \"obstacles\": [{\"name\": \"block\", \"shape\": {\"type\": \"mesh\", \"file\": \"" + meshFile
                        + "\", \"scale\": 0.1, \"offset\": [0.1, 0.1, 0.1]}}]",
                "}", "");
    }

    @Test
    void layersFillTheirShellsOnceAndMeshFibersReadTheAttribute() throws IOException {
        Path dir = Files.createDirectories(tmp.resolve("models"));
        Files.writeString(dir.resolve("cube.ply"), cubePly());
        Path file = tmp.resolve("fruit.json");
        Files.writeString(file, scene("models/cube.ply"));
        LoadedScene s = READER.read(file);
        assertInstanceOf(MeshShape.class, s.scene().bodies().get(0).shape());
        LayeredShape rind = assertInstanceOf(LayeredShape.class, s.scene().bodies().get(1).shape());
        assertEquals(1, rind.excluded().size());
        assertEquals(Map.of("core", "fruit", "rind", "fruit"), s.description().groups());
        assertEquals(dir.resolve("cube.ply").toAbsolutePath().normalize(),
                s.description().files().get("models/cube.ply"));
        try (Simulation sim = new Simulation(s.scene())) {
            SimulationState st = sim.captureState();
            double[] x = st.channels().get(ParticleStore.POSITION);
            double[] fiber = st.channels().get("fiber-1");
            int core = 0;
            int shell = 0;
            for (int p = 0; p < st.size(); p++) {
                double m = Math.max(Math.abs(x[3 * p] - 0.5), Math.max(Math.abs(x[3 * p + 1] - 0.5),
                        Math.abs(x[3 * p + 2] - 0.5)));
                if (st.body()[p] == 0) {
                    core++;
                    assertTrue(m <= 0.1 + 1e-9, "core particles inside the small cube");
                } else {
                    shell++;
                    assertTrue(m > 0.1 - 1e-9 && m <= 0.2 + 1e-9, "rind particles between the cubes, not inside");
                    assertArrayEquals(new double[] {0, 0, 1}, new double[] {fiber[3 * p], fiber[3 * p + 1],
                        fiber[3 * p + 2]}, 1e-12);
                }
            }
            // Lattice spacing 0.025 m: 8^3 points inside the small cube, 16^3 - 8^3 in the shell (common practice,
            // no source: counting lattice points).
            assertEquals(512, core);
            assertEquals(16 * 16 * 16 - 512, shell);
        }
    }

    @Test
    void fileNamesAreRewrittenForWhereTheTextGoes() throws IOException {
        Path dir = Files.createDirectories(tmp.resolve("models"));
        Files.writeString(dir.resolve("cube.ply"), cubePly());
        Path file = tmp.resolve("fruit.json");
        Files.writeString(file, scene("models/cube.ply"));
        LoadedScene s = READER.read(file);
        assertTrue(SceneWriter.toJson(s).contains("\"file\": \"models/cube.ply\""));
        Path elsewhere = Files.createDirectories(tmp.resolve("a/b"));
        SceneWriter.write(elsewhere.resolve("copy.json"), s);
        String copy = Files.readString(elsewhere.resolve("copy.json"));
        assertTrue(copy.contains("\"file\": \"../../models/cube.ply\""), copy);
        String absolute = SceneWriter.toJson(s, null);
        assertTrue(absolute.contains("\"file\": \"" + dir.resolve("cube.ply").toAbsolutePath().normalize() + "\""));
        LoadedScene again = READER.read(elsewhere.resolve("copy.json"));
        try (Simulation a = new Simulation(s.scene()); Simulation b = new Simulation(again.scene())) {
            SimulationState sa = a.captureState();
            SimulationState sb = b.captureState();
            for (String ch : sa.channels().keySet()) {
                assertArrayEquals(sa.channels().get(ch), sb.channels().get(ch), ch);
            }
        }
        assertEquals(SceneWriter.toJson(s, null), SceneWriter.toJson(again, null));

        // A checkpoint carries the mesh bytes: the scene reads with the file gone.
        byte[] mesh = Files.readAllBytes(dir.resolve("cube.ply"));
        Files.delete(dir.resolve("cube.ply"));
        String name = dir.resolve("cube.ply").toAbsolutePath().normalize().toString();
        LoadedScene embedded = READER.read(absolute.getBytes(StandardCharsets.UTF_8), "embedded", null,
                Map.of(name, mesh));
        try (Simulation a = new Simulation(embedded.scene())) {
            assertEquals(512 + 16 * 16 * 16 - 512, a.particles().size());
        }
        SceneFileException e = assertThrows(SceneFileException.class, () -> READER.read(file));
        assertEquals(3, e.problems().size(), e.getMessage());
        for (SceneProblem p : e.problems()) {
            assertTrue(p.path().endsWith("shape.file") && p.message().contains("no such mesh file"), p.toString());
        }
    }

    @Test
    void brokenMeshesAndMisusedMeshFibersAreLocated() throws IOException {
        Files.writeString(tmp.resolve("cube.ply"), cubePly());
        Files.writeString(tmp.resolve("junk.obj"), "v 0 0 0\nv 1 0 0\nf 1 2 9\n");
        String text = scene("cube.ply").replaceFirst("\"cube.ply\", \"scale\": 0.2", "\"junk.obj\", \"scale\": 0.2")
                .replace("\"attribute\": \"f\"", "\"attribute\": \"g\"");
        Path file = tmp.resolve("broken.json");
        Files.writeString(file, text);
        SceneFileException e = assertThrows(SceneFileException.class, () -> READER.read(file));
        assertEquals(2, e.problems().size(), e.getMessage());
        assertEquals("bodies[0].shape.file", e.problems().get(0).path());
        assertEquals(6, e.problems().get(0).line());
        assertTrue(e.problems().get(0).message().contains("junk.obj"), e.getMessage());
        assertEquals("bodies[1].fiberDirections[0].attribute", e.problems().get(1).path());
        assertTrue(e.problems().get(1).message().contains("[f]"), e.getMessage());
    }
}

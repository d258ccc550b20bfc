package dev.fray.examples.cli;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.examples.scenes.DemoScenes;
import dev.fray.io.checkpoint.CheckpointListener;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.SceneDescription;
import dev.fray.io.scene.SceneReader;
import dev.fray.io.scene.SceneWriter;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import picocli.CommandLine;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** {@code fray run}, {@code check}, {@code resume} and {@code info} in-process, and the shipped scene files. */
class SceneCommandsTest {
    @TempDir
    Path tmp;

    private record Run(int code, String out, String err) {
    }

    private static Run fray(String... args) {
        CommandLine cl = FrayCommand.newCommandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute(args);
        return new Run(code, out.toString(), err.toString());
    }

    private Path write(String name, String text) throws IOException {
        Path p = tmp.resolve(name);
        Files.writeString(p, text);
        return p;
    }

    /** A tiny scene: 216 particles, a few steps per frame. */
    static String tiny(String extraBody, String extraTop) {
        return String.join("\n",
                "{",
                "  \"format\": \"fray-scene/1\",",
                "  \"domain\": {\"min\": [0, 0, 0], \"max\": [0.5, 0.5, 0.5]},",
                "  \"run\": {\"cellSize\": 0.05, \"frameRate\": 30, \"threads\": 1},",
                "  \"output\": {\"frames\": 3, \"formats\": [\"ply\", \"vtp\", \"csv\"], \"checkpointEvery\": 1},",
                "  \"bodies\": [{\"name\": \"cube\", \"shape\": {\"type\": \"box\", \"min\": [0.2, 0.2, 0.2], "
                        + "\"max\": [0.35, 0.35, 0.35]},",
                "    \"material\": {\"law\": \"fixed-corotated\", \"youngsModulus\": 2e3, \"poissonRatio\": 0.3, "
                        + "\"density\": 1000},",
                "    \"damage\": {\"model\": \"rankine\", \"criticalStress\": 20, \"softeningStress\": 10}" + extraBody,
                "  }]" + extraTop,
                "}", "");
    }

    @Test
    void runWritesOutputsAndASummaryThatInfoReads() throws IOException {
        Path scene = write("tiny.json", tiny("", ""));
        Path out = tmp.resolve("out");
        Run r = fray("run", scene.toString(), "--out", out.toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().startsWith("tiny: 216 particles, frames 0 to 3"), r.out());
        JsonNode summary = new ObjectMapper().readTree(out.resolve("summary.json").toFile());
        for (String key : List.of("frames", "steps", "wallSeconds", "particleStepsPerSecond", "peakHeapBytes",
                "maxDamage", "lastCheckpoint")) {
            assertTrue(summary.has(key), key + " in " + summary);
        }
        assertEquals("completed", summary.get("status").asText());
        assertEquals(3, summary.get("frames").asInt());
        assertEquals(216, summary.get("particles").asInt());
        assertTrue(summary.get("steps").asLong() > 3);
        assertTrue(summary.get("maxDamage").isNumber());
        assertEquals(List.of("checkpoint_00002.fcp", "checkpoint_00003.fcp", "diagnostics.csv", "frame_00000.ply",
                "frame_00000.vtp", "frame_00001.ply", "frame_00001.vtp", "frame_00002.ply", "frame_00002.vtp",
                "frame_00003.ply", "frame_00003.vtp", "frames.pvd", "summary.json"), RunSession.outputs(out));

        Run ply = fray("info", out.resolve("frame_00002.ply").toString());
        assertEquals(0, ply.code(), ply.err());
        assertTrue(ply.out().contains("complete") && ply.out().contains("particles: 216")
                && ply.out().contains("frame 2") && ply.out().contains("damage"), ply.out());
        Run vtp = fray("info", out.resolve("frame_00002.vtp").toString());
        assertTrue(vtp.out().contains("complete") && vtp.out().contains("particles: 216"), vtp.out());
        Run ck = fray("info", out.resolve("checkpoint_00003.fcp").toString());
        assertEquals(0, ck.code(), ck.err());
        assertTrue(ck.out().contains("every checksum verified") && ck.out().contains("frame 3")
                && ck.out().contains("damage") && ck.out().contains("diagnostics.csv")
                && ck.out().contains("1 bodies (cube)"), ck.out());
        assertTrue(fray("info", out.resolve("frames.pvd").toString()).out().contains("4 frames, every file present"));
        assertTrue(fray("info", out.resolve("diagnostics.csv").toString()).out().contains("24 columns"));

        byte[] frame = Files.readAllBytes(out.resolve("frame_00002.ply"));
        Path cut = write("cut.ply", "");
        Files.write(cut, Arrays.copyOf(frame, frame.length - 100));
        assertTrue(fray("info", cut.toString()).out().contains("TRUNCATED (100 bytes missing)"));
        byte[] ckBytes = Files.readAllBytes(out.resolve("checkpoint_00003.fcp"));
        ckBytes[ckBytes.length / 2] ^= 1;
        Path bad = tmp.resolve("bad.fcp");
        Files.write(bad, ckBytes);
        Run corrupt = fray("info", bad.toString());
        assertEquals(FrayCommand.BAD_INPUT, corrupt.code());
        assertTrue(corrupt.err().contains("checksum mismatch"), corrupt.err());
        assertEquals(FrayCommand.BAD_INPUT, fray("resume", bad.toString()).code());
        assertEquals(FrayCommand.BAD_INPUT, fray("info", scene.toString()).code(), "a scene is not an output");

        Run done = fray("resume", out.resolve("checkpoint_00003.fcp").toString());
        assertEquals(0, done.code(), done.err());
        assertTrue(done.out().contains("nothing to do"), done.out());
        // Resuming into a new folder with more frames continues the run there.
        Path more = tmp.resolve("more");
        Run longer = fray("resume", out.resolve("checkpoint_00003.fcp").toString(), "--out", more.toString(),
                "--frames", "4");
        assertEquals(0, longer.code(), longer.err());
        assertTrue(Files.exists(more.resolve("frame_00004.ply")) && !Files.exists(more.resolve("frame_00003.ply")));
        assertTrue(fray("info", more.resolve("frames.pvd").toString()).out().contains("1 frames"));
    }

    @Test
    void checkPrintsCountsTimeStepMemoryAndWarnings() throws IOException {
        String text = tiny("", ",\n  \"obstacles\": [{\"name\": \"post\", \"shape\": {\"type\": \"sphere\", "
                + "\"center\": [0.3, 0.3, 0.3], \"radius\": 0.03}}],\n"
                + "  \"grips\": [{\"name\": \"hold\", \"body\": \"stone\", \"region\": {\"type\": \"box\", "
                + "\"min\": [0, 0, 0], \"max\": [0.01, 0.01, 0.01]}}]")
                .replace("\"damage\": {\"model\": \"rankine\", \"criticalStress\": 20, \"softeningStress\": 10}",
                        "\"damage\": {\"model\": \"phase-field-at2\", \"fractureEnergy\": 5, \"lengthScale\": 0.06}")
                .replace("  }]", "  }, {\"name\": \"stone\", \"shape\": {\"type\": \"sphere\", \"center\": "
                        + "[0.1, 0.1, 0.1], \"radius\": 0.04}, \"material\": {\"law\": \"stvk-hencky\", "
                        + "\"youngsModulus\": 5e10, \"poissonRatio\": 0.2, \"density\": 2500}}]");
        Run r = fray("check", write("warn.json", text).toString());
        assertEquals(0, r.code(), r.err());
        String o = r.out();
        assertTrue(o.contains("valid (fray-scene/1)"), o);
        assertTrue(o.matches("(?s).*cube\\s+216 particles.*"), o);
        assertTrue(o.contains("steps per frame") && o.contains("memory: particles"), o);
        assertTrue(o.contains("length scale 0.06 m is under two cells"), o);
        assertTrue(o.contains("very stiff for this grid: body \"stone\""), o);
        assertTrue(o.contains("start inside obstacle \"post\""), o);
        assertTrue(o.contains("grip \"hold\" holds no particle"), o);
        assertTrue(o.contains("body \"stone\" holds only"), o);
        assertFalse(Files.list(tmp).anyMatch(p -> p.toString().endsWith(".ply")), "check writes nothing");
    }

    @Test
    void badScenesListEveryProblemOnItsOwnLine() throws IOException {
        String text = tiny("", "").replace("\"threads\": 1", "\"threads\": 0").replace("\"density\": 1000",
                "\"densty\": 1000").replace("\"cube\"", "\"cube\", \"jiter\": 0.1");
        Path scene = write("bad.json", text);
        for (String cmd : List.of("check", "run")) {
            Run r = cmd.equals("run") ? fray("run", scene.toString(), "--out", tmp.resolve("never").toString())
                    : fray("check", scene.toString());
            assertEquals(FrayCommand.BAD_INPUT, r.code(), r.err());
            List<String> lines = r.err().lines().toList();
            assertEquals(4, lines.size(), r.err());
            assertTrue(lines.get(0).startsWith("fray: " + scene + ": 3 problems"), lines.get(0));
            assertTrue(lines.get(1).contains("line 4") && lines.get(1).contains("run.threads"), lines.get(1));
            assertTrue(lines.get(2).contains("bodies[0].jiter") && lines.get(2).contains("\"jitter\""), lines.get(2));
            assertTrue(lines.get(3).contains("densty") && lines.get(3).contains("\"density\""), lines.get(3));
        }
        assertFalse(Files.exists(tmp.resolve("never")), "nothing is made for a bad scene");
        Run missing = fray("run", tmp.resolve("absent.json").toString(), "--out", tmp.resolve("x").toString());
        assertEquals(FrayCommand.BAD_INPUT, missing.code());
        assertTrue(missing.err().contains("no such scene file"), missing.err());
        assertEquals(FrayCommand.BAD_INPUT, fray("run", scene.toString()).code(), "--out is required");
    }

    @Test
    void divergedRunExits3AndLeavesItsSummaryAndLastCheckpoint() throws IOException {
        // One step per frame; falling faster each step, the cube crosses more than a cell per step at step 3.
        String text = tiny(", \"velocity\": [0, -2.1, 0]", "").replace("\"threads\": 1",
                "\"threads\": 1, \"fixedTimeStep\": 0.02").replace("\"frameRate\": 30", "\"frameRate\": 50");
        Path out = tmp.resolve("boom");
        Run r = fray("run", write("boom.json", text).toString(), "--out", out.toString());
        assertEquals(FrayCommand.DIVERGED, r.code(), r.err());
        assertTrue(r.err().contains("diverged"), r.err());
        JsonNode summary = new ObjectMapper().readTree(out.resolve("summary.json").toFile());
        assertEquals("diverged", summary.get("status").asText());
        assertTrue(summary.get("message").asText().contains("diverged"));
        Path last = Path.of(summary.get("lastCheckpoint").asText());
        assertEquals(out.resolve(CheckpointListener.fileName(2)), last, "the last good checkpoint is kept");
        assertEquals(2, dev.fray.io.checkpoint.CheckpointReader.read(last).state().frame());
    }

    /** The shipped scene files of the demos are exactly the built-in demo scenes. */
    @ParameterizedTest
    @ValueSource(strings = {"soft-drop", "spin-box"})
    void shippedDemoScenesEqualTheBuiltInOnes(String demo) {
        LoadedScene file = new SceneReader().read(Path.of("scenes", demo + ".json")).withThreads(2);
        Scene built = DemoScenes.build(demo, 2);
        SceneDescription d = new SceneDescription(file.description().registry()).text(file.description().text());
        assertEquals(SceneWriter.toJson(built, file.output(), d), SceneWriter.toJson(file));
        try (Simulation a = new Simulation(built); Simulation b = new Simulation(file.scene())) {
            SimulationState sa = a.captureState();
            SimulationState sb = b.captureState();
            for (String ch : sa.channels().keySet()) {
                assertArrayEquals(sa.channels().get(ch), sb.channels().get(ch), ch);
            }
        }
    }

    @ParameterizedTest
    @ValueSource(strings = {"soft-drop", "spin-box", "bean-drop", "board-split", "slab-tear", "slab-tear-fast",
        "slab-tear-slow", "slab-tear-soft", "slab-tear-stiff", "sand-collapse", "metal-tear", "clay-cut"})
    void shippedScenesPassCheck(String name) {
        Run r = fray("check", Path.of("scenes", name + ".json").toString(), "--threads", "2");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("no warnings"), r.out());
    }

    /** A shipped fracture scene runs from the command line; two frames keep it short. */
    @Test
    void shippedSlabTearRuns() {
        Path out = tmp.resolve("slab");
        Run r = fray("run", Path.of("scenes", "slab-tear.json").toString(), "--out", out.toString(), "--frames", "2",
                "--threads", "2");
        assertEquals(0, r.code(), r.err());
        for (int k = 0; k <= 2; k++) {
            assertTrue(Files.isRegularFile(out.resolve(String.format("frame_%05d.ply", k))), "frame " + k);
        }
        assertFalse(Files.exists(out.resolve("frame_00003.ply")), "stops after two frames");
        assertTrue(Files.isRegularFile(out.resolve("summary.json")));
    }

    /** The complete example of docs/scene-format.md is a valid scene that passes check without warnings. */
    @Test
    void documentedExampleIsValid() throws IOException {
        String doc = Files.readString(Path.of("..", "docs", "scene-format.md"));
        int start = doc.indexOf("```json\n") + "```json\n".length();
        String json = doc.substring(start, doc.indexOf("```", start));
        LoadedScene s = new SceneReader().read(json.getBytes(java.nio.charset.StandardCharsets.UTF_8),
                "scene-format.md", Path.of("..", "docs").toAbsolutePath());
        assertEquals(2, s.scene().bodies().size());
        assertEquals(2, s.scene().grips().size());
        Path copy = Files.createDirectories(tmp.resolve("docs")).resolve("example.json");
        Files.writeString(copy, json.replace("../examples/meshes/wedge.obj",
                Path.of("meshes", "wedge.obj").toAbsolutePath().toString()));
        Run r = fray("check", copy.toString(), "--threads", "1");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("no warnings"), r.out());
    }

    @Test
    void checkpointsOfMeshScenesCarryTheirMeshes() throws IOException {
        // A small copy of the bean scene, with the meshes copied next to it and deleted before resuming.
        Path dir = Files.createDirectories(tmp.resolve("scene"));
        Files.copy(Path.of("meshes", "bean.obj"), dir.resolve("bean.obj"));
        Files.copy(Path.of("meshes", "wedge.obj"), dir.resolve("wedge.obj"));
        String text = Files.readString(Path.of("scenes", "bean-drop.json")).replace("../meshes/", "")
                .replace("\"cellSize\": 0.025", "\"cellSize\": 0.05").replace("\"spacing\": 0.01,", "")
                .replace("\"frames\": 36", "\"frames\": 2").replace("\"checkpointEvery\": 12", "\"checkpointEvery\": 1")
                .replace("\"frameRate\": 24", "\"frameRate\": 240");
        Path scene = dir.resolve("bean.json");
        Files.writeString(scene, text);
        Path out = tmp.resolve("bean-out");
        Run r = fray("run", scene.toString(), "--out", out.toString(), "--frames", "1", "--threads", "1");
        assertEquals(0, r.code(), r.err());
        Files.delete(dir.resolve("bean.obj"));
        Files.delete(dir.resolve("wedge.obj"));
        Path ck = out.resolve(CheckpointListener.fileName(1));
        Run info = fray("info", ck.toString());
        assertTrue(info.out().contains("file:" + dir.toAbsolutePath().resolve("bean.obj")), info.out());
        Run resumed = fray("resume", ck.toString(), "--frames", "2");
        assertEquals(0, resumed.code(), resumed.err());
        assertTrue(Files.exists(out.resolve("frame_00002.ply")));
    }
}

package dev.fray.io.checkpoint;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.SceneReader;
import dev.fray.io.scene.SceneWriter;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.zip.CRC32C;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Checkpoints round-trip exactly, resume bitwise identically, and every corruption is caught. */
class CheckpointTest extends FrayTestBase {
    private static final SceneReader READER = new SceneReader(PluginRegistry.load());

    @TempDir
    Path tmp;

    /** A small cracking scene of our own: a brick with stress-based damage dropped on an edge. About 500 particles. */
    static final String SCENE = String.join("\n",
            "{",
            "  \"format\": \"fray-scene/1\",",
            "  \"domain\": {\"min\": [0, 0, 0], \"max\": [0.5, 0.5, 0.5]},",
            "  \"run\": {\"cellSize\": 0.04, \"frameRate\": 60, \"threads\": 2},",
            "  \"output\": {\"frames\": 6, \"checkpointEvery\": 2},",
            "  \"walls\": {\"all\": {\"type\": \"slip\", \"friction\": 0.3}},",
            "  \"bodies\": [{",
            "    \"name\": \"brick\",",
            "    \"shape\": {\"type\": \"box\", \"min\": [0.15, 0.2, 0.15], \"max\": [0.35, 0.3, 0.35]},",
            "    \"material\": {\"law\": \"fixed-corotated\", \"youngsModulus\": 2e4, \"poissonRatio\": 0.3, "
                    + "\"density\": 800},",
            "    \"damage\": {\"model\": \"rankine\", \"criticalStress\": 800, \"softeningStress\": 300},",
            "    \"jitter\": 0.3, \"seed\": 5, \"velocity\": [0, -2, 0]",
            "  }],",
            "  \"obstacles\": [{\"name\": \"edge\", \"shape\": {\"type\": \"cylinder\", \"center\": [0.25, 0.12, 0.25],",
            "    \"axis\": [0, 0, 1], \"radius\": 0.03, \"halfLength\": 0.3}}]",
            "}", "");

    static LoadedScene scene() {
        return READER.read(SCENE.getBytes(StandardCharsets.UTF_8), "checkpoint-test.json", null);
    }

    private static Checkpoint capture(Simulation sim, LoadedScene s) {
        return new Checkpoint(SceneWriter.toJson(s), sim.captureState(),
                Map.of("notes.txt", "frame so far".getBytes(StandardCharsets.UTF_8)));
    }

    private static void assertSameState(SimulationState a, SimulationState b) {
        assertEquals(a.time(), b.time());
        assertEquals(a.step(), b.step());
        assertEquals(a.dt(), b.dt());
        assertEquals(a.frame(), b.frame());
        assertEquals(a.frameZeroSent(), b.frameZeroSent());
        assertEquals(a.maxSpeed(), b.maxSpeed());
        assertEquals(a.boundaryWork(), b.boundaryWork());
        assertEquals(List.copyOf(a.channels().keySet()), List.copyOf(b.channels().keySet()));
        for (String c : a.channels().keySet()) {
            assertArrayEquals(a.channels().get(c), b.channels().get(c), c);
        }
        assertArrayEquals(a.body(), b.body());
        assertArrayEquals(a.id(), b.id());
    }

    @Test
    void roundTripIsExactAndResumeIsBitwiseIdentical() throws IOException {
        LoadedScene s = scene();
        Path file = tmp.resolve("c.fcp");
        SimulationState reference;
        try (Simulation sim = new Simulation(s.scene())) {
            sim.runFrames(2);
            Checkpoint c = capture(sim, s);
            CheckpointWriter.write(file, c);
            Checkpoint back = CheckpointReader.read(file);
            assertEquals(c.sceneJson(), back.sceneJson());
            assertSameState(c.state(), back.state());
            assertEquals(List.of("notes.txt"), List.copyOf(back.attachments().keySet()));
            assertArrayEquals(c.attachments().get("notes.txt"), back.attachments().get("notes.txt"));
            sim.runFrames(2);
            reference = sim.captureState();
        }
        // Resume from the file alone, with another thread count: the same bits.
        Checkpoint c = CheckpointReader.read(file);
        LoadedScene again = READER.read(c.sceneJson().getBytes(StandardCharsets.UTF_8), "embedded", null)
                .withThreads(1);
        try (Simulation sim = new Simulation(again.scene())) {
            sim.restoreState(c.state());
            sim.runFrames(2);
            assertSameState(reference, sim.captureState());
        }
        CheckpointReader.Info info = CheckpointReader.info(file);
        assertEquals(2, info.frame());
        assertEquals(c.state().size(), info.particles());
        assertEquals(Files.size(file), info.fileBytes());
        assertEquals(c.state().channels().size(), info.channels().size());
        assertTrue(info.channels().stream().anyMatch(e -> e.name().equals("damage") && e.width() == 1));
        assertEquals(Map.of("notes.txt", 12L), info.attachments());
    }

    private static byte[] bytes(Checkpoint c) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        CheckpointWriter.write(out, c);
        return out.toByteArray();
    }

    private static InvalidInputException rejected(byte[] data) {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> CheckpointReader.read(data, "x"));
        assertEquals(FrayMessage.FILE_ERROR, e.key());
        assertTrue(e.getMessage().startsWith("x: not a usable checkpoint"), e.getMessage());
        return e;
    }

    @Test
    void everyCorruptionAndTruncationIsRejected() throws IOException {
        byte[] good;
        try (Simulation sim = new Simulation(scene().scene())) {
            sim.runFrames(1);
            good = bytes(capture(sim, scene()));
        }
        CheckpointReader.read(good, "x");
        // CRC32C catches every single-bit error (published: Castagnoli et al. 1993, a Hamming distance >= 2 code);
        // flip one bit at many seeded positions, including every header byte.
        for (int i = 0; i < 400; i++) {
            int at = i < 20 ? i : rand.nextInt(good.length);
            byte[] bad = good.clone();
            bad[at] ^= (byte) (1 << rand.nextInt(8));
            rejected(bad);
        }
        for (int len : new int[] {0, 1, 7, 8, 19, 20, 31, 32, good.length / 2, good.length - 5, good.length - 1}) {
            rejected(Arrays.copyOf(good, len));
        }
        for (int i = 0; i < 50; i++) {
            rejected(Arrays.copyOf(good, rand.nextInt(good.length)));
        }
        byte[] longer = Arrays.copyOf(good, good.length + 3);
        assertTrue(rejected(longer).getMessage().contains("after the last"));
        byte[] text = "{\"format\": \"fray-scene/1\"}".getBytes(StandardCharsets.UTF_8);
        assertTrue(rejected(text).getMessage().contains("not a Fray checkpoint"));
    }

    @Test
    void newerVersionsAreRefusedByNumber() throws IOException {
        byte[] data;
        try (Simulation sim = new Simulation(scene().scene())) {
            data = bytes(capture(sim, scene()));
        }
        ByteBuffer h = ByteBuffer.wrap(data).order(ByteOrder.LITTLE_ENDIAN);
        h.putInt(8, 3);
        CRC32C crc = new CRC32C();
        crc.update(data, 0, 16);
        h.putInt(16, (int) crc.getValue());
        assertTrue(rejected(data).getMessage().contains("format version 3; this reader reads version 2"));
    }

    @Test
    void listenerWritesEveryNFramesAndKeepsTheNewest() {
        LoadedScene s = scene();
        try (Simulation sim = new Simulation(s.scene())) {
            int[] calls = {0};
            CheckpointListener l = new CheckpointListener(sim, tmp, SceneWriter.toJson(s), 2, 2)
                    .beforeEach(() -> calls[0]++)
                    .attach("calls", () -> new byte[] {(byte) calls[0]});
            sim.addFrameListener(l);
            sim.runFrames(5);
            assertEquals(3, l.written(), "frames 2, 4 and the last, 5");
            assertEquals(3, calls[0]);
            assertEquals(List.of(tmp.resolve("checkpoint_00004.fcp"), tmp.resolve("checkpoint_00005.fcp")),
                    CheckpointListener.list(tmp));
            assertEquals(tmp.resolve("checkpoint_00005.fcp"), l.lastWritten());
            Checkpoint last = CheckpointReader.read(l.lastWritten());
            assertEquals(5, last.state().frame());
            assertArrayEquals(new byte[] {3}, last.attachments().get("calls"));
            assertEquals(5, CheckpointListener.frameOf(l.lastWritten()));
        }
    }
}

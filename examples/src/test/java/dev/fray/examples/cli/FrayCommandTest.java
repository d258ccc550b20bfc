package dev.fray.examples.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.fray.core.error.FrayInternalException;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.error.SimulationDivergedException;
import dev.fray.examples.scenes.DemoScenes;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import picocli.CommandLine;

/** Runs the fray command in-process with captured output. */
class FrayCommandTest {
    @TempDir
    Path tmp;

    /** Exit code and captured streams of one run. */
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

    @Test
    void listsTheDemos() {
        Run r = fray("demo", "--list");
        assertEquals(0, r.code(), r.err());
        List<String> lines = r.out().lines().toList();
        assertEquals(DemoScenes.names().size(), lines.size(), r.out());
        for (int i = 0; i < lines.size(); i++) {
            assertTrue(lines.get(i).startsWith(DemoScenes.names().get(i) + " "), lines.get(i));
        }
        assertTrue(DemoScenes.names().containsAll(List.of("soft-drop", "spin-box")));
    }

    /** Same demo with 1 and 2 threads: every output file must be byte for byte the same. */
    @ParameterizedTest
    @CsvSource({"spin-box, 2", "soft-drop, 1"})
    void demoOutputDoesNotDependOnThreadCount(String demo, int frames) throws IOException {
        Path one = tmp.resolve("t1");
        Path two = tmp.resolve("t2");
        Run a = fray("demo", demo, "--out", one.toString(), "--threads", "1", "--frames", String.valueOf(frames));
        assertEquals(0, a.code(), a.err());
        Run b = fray("demo", demo, "--out", two.toString(), "--threads", "2", "--frames", String.valueOf(frames));
        assertEquals(0, b.code(), b.err());
        assertTrue(a.out().startsWith("demo " + demo + ":"), a.out());

        List<String> expected = new ArrayList<>();
        expected.add("diagnostics.csv");
        for (int k = 0; k <= frames; k++) {
            expected.add(String.format("frame_%05d.ply", k));
        }
        assertEquals(expected, names(one));
        assertEquals(expected, names(two));
        for (String f : expected) {
            assertArrayEquals(Files.readAllBytes(one.resolve(f)), Files.readAllBytes(two.resolve(f)), f);
        }
        assertTrue(Files.readString(one.resolve("frame_00000.ply"), java.nio.charset.StandardCharsets.ISO_8859_1)
                .startsWith("ply\nformat binary_little_endian 1.0\n"));
        List<String> csv = Files.readAllLines(one.resolve("diagnostics.csv"));
        assertTrue(csv.get(0).startsWith("step,time_s,dt_s,"), csv.get(0));
        assertTrue(csv.size() > 2, "rows for the steps");
    }

    private static List<String> names(Path dir) throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }

    @Test
    void benchPrintsOneJsonLine() throws IOException {
        Run r = fray("bench", "--particles", "4000", "--steps", "5", "--threads", "1");
        assertEquals(0, r.code(), r.err());
        List<String> lines = r.out().lines().toList();
        assertEquals(1, lines.size(), r.out());
        JsonNode json = new ObjectMapper().readTree(lines.get(0));
        List<String> keys = new ArrayList<>();
        for (Iterator<String> it = json.fieldNames(); it.hasNext(); ) {
            keys.add(it.next());
        }
        assertEquals(List.of("scene", "particles", "steps", "threads", "seconds", "particleStepsPerSecond",
                "peakHeapBytes", "bytesPerParticle", "peakBytesPerParticle", "gridBytes", "estimatedBytesPerParticle"),
                keys);
        assertEquals("drop", json.get("scene").asText());
        assertEquals(4096, json.get("particles").asInt(), "(2m)^3 with m = round(cbrt(4000/8)) = 8");
        assertEquals(5, json.get("steps").asInt());
        assertEquals(1, json.get("threads").asInt());
        assertTrue(json.get("seconds").asDouble() > 0);
        assertTrue(json.get("particleStepsPerSecond").asDouble() > 0);
        assertTrue(json.get("peakHeapBytes").asLong() > 0);
        assertTrue(json.get("bytesPerParticle").isNumber());
        assertTrue(json.get("gridBytes").asLong() > 0);
    }

    @Test
    void benchVariantsWithDamageRun() throws IOException {
        for (String scene : List.of("drop-damage", "drop-fibers")) {
            Run r = fray("bench", "--scene", scene, "--particles", "1000", "--steps", "3", "--threads", "2",
                    "--breakdown");
            assertEquals(0, r.code(), r.err());
            JsonNode json = new ObjectMapper().readTree(r.out().lines().toList().get(0));
            assertEquals(scene, json.get("scene").asText());
            assertTrue(json.get("phaseShares").get("solve").asDouble() > 0, "the phase field is solved: " + json);
        }
        Run bad = fray("bench", "--scene", "drop-dmg");
        assertEquals(FrayCommand.BAD_INPUT, bad.code());
        assertTrue(bad.err().contains("drop-damage"), bad.err());
    }

    @Test
    void unknownDemoIsBadInputNamingIt() {
        Run r = fray("demo", "no-such-demo", "--out", tmp.resolve("x").toString());
        assertEquals(FrayCommand.BAD_INPUT, r.code());
        assertTrue(r.err().contains("no-such-demo"), r.err());
        assertTrue(r.err().contains("soft-drop"), "lists the known demos: " + r.err());
        assertEquals(1, r.err().lines().count(), r.err());
        assertFalse(Files.exists(tmp.resolve("x")));
    }

    @Test
    void zeroThreadsIsBadInput() {
        Run r = fray("demo", "spin-box", "--out", tmp.resolve("y").toString(), "--threads", "0");
        assertEquals(FrayCommand.BAD_INPUT, r.code());
        assertTrue(r.err().contains("--threads"), r.err());
        assertEquals(1, r.err().lines().count(), r.err());
        assertFalse(Files.exists(tmp.resolve("y")));

        Run bench = fray("bench", "--threads", "0");
        assertEquals(FrayCommand.BAD_INPUT, bench.code());
        assertTrue(bench.err().contains("--threads"), bench.err());
    }

    @Test
    void usageErrorsAreBadInput() {
        assertEquals(FrayCommand.BAD_INPUT, fray().code());
        assertEquals(FrayCommand.BAD_INPUT, fray("demo", "spin-box").code(), "missing --out");
        assertEquals(FrayCommand.BAD_INPUT, fray("demo").code(), "missing NAME");
        assertEquals(FrayCommand.BAD_INPUT, fray("bench", "--steps", "many").code());
        assertEquals(FrayCommand.BAD_INPUT, fray("bench", "--scene", "no-such-scene").code());
        Run r = fray("frobnicate");
        assertEquals(FrayCommand.BAD_INPUT, r.code());
        assertEquals(1, r.err().lines().count(), r.err());
        assertFalse(r.err().contains("\tat "), "no stack trace without --debug");
    }

    @Test
    void exitCodesFollowTheExceptionType() {
        assertEquals(FrayCommand.BAD_INPUT,
                FrayCommand.exitCode(new InvalidInputException(FrayMessage.MISSING, "x")));
        assertEquals(FrayCommand.DIVERGED, FrayCommand.exitCode(
                new SimulationDivergedException("NaN velocity", "b", 3, 10, 0.5, "use a smaller time step")));
        assertEquals(FrayCommand.DIVERGED, FrayCommand.exitCode(new RuntimeException(
                new SimulationDivergedException("NaN velocity", "b", 3, 10, 0.5, "fix"))));
        assertEquals(FrayCommand.INTERNAL, FrayCommand.exitCode(new FrayInternalException("bug", null)));
        assertEquals(FrayCommand.INTERNAL, FrayCommand.exitCode(new NullPointerException()));
    }
}

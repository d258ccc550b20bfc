package dev.fray.examples.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import picocli.CommandLine;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Scenes whose lattice count wraps around a long, or that do not fit the heap, are refused by {@code check} and
 * {@code run} with exit 2 before anything is sampled (so at once rather than after filling the heap), naming the
 * file, the JSON path, the estimate, the heap and what to change.
 */
class MemoryRefusalTest {
    @TempDir
    Path tmp;

    private static String slab(String spacing) {
        return String.join("\n", "{", "  \"format\": \"fray-scene/1\",",
                "  \"domain\": {\"min\": [0, 0, 0], \"max\": [1, 1, 1]},",
                "  \"run\": {\"cellSize\": 0.05, \"frameRate\": 30, \"threads\": 1},",
                "  \"output\": {\"frames\": 3},",
                "  \"bodies\": [{\"name\": \"slab\", \"shape\": {\"type\": \"box\", \"min\": [0.1, 0.1, 0.1], "
                        + "\"max\": [0.9, 0.9, 0.5]}, \"spacing\": " + spacing + ",",
                "    \"material\": {\"law\": \"fixed-corotated\", \"youngsModulus\": 2e3, \"poissonRatio\": 0.3, "
                        + "\"density\": 1000}}]", "}", "");
    }

    @ParameterizedTest
    @CsvSource({
        // 2.56e20 lattice points: the product of the three long counts wraps around to a small number.
        "check, 1e-7, bodies[0], lattice points",
        "run, 1e-7, bodies[0], lattice points",
        // 7.6e7 lattice points of 26 doubles each: under the per-body limit, about 33 GiB at the peak, over the heap.
        "check, 1.5e-3, bodies, -Xmx",
        "run, 1.5e-3, bodies, -Xmx"})
    void refusedAtOnceWithExitTwo(String command, String spacing, String path, String words) throws IOException {
        Path scene = tmp.resolve("big.json");
        Files.writeString(scene, slab(spacing));
        CommandLine cl = FrayCommand.newCommandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        long t0 = System.nanoTime();
        int code = command.equals("run")
                ? cl.execute("run", scene.toString(), "--out", tmp.resolve("out").toString())
                : cl.execute("check", scene.toString());
        double seconds = (System.nanoTime() - t0) * 1e-9;
        assertEquals(2, code, err.toString());
        String e = err.toString();
        assertTrue(e.contains("big.json") && e.contains(", " + path + ": ") && e.contains(words), e);
        // The bound: refused before anything is allocated, so well within 2 s.
        assertTrue(seconds < 2, "refused after " + seconds + " s");
        assertFalse(Files.exists(tmp.resolve("out")), "no output folder for a refused run");
    }
}

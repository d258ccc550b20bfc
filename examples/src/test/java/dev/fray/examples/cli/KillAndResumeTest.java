package dev.fray.examples.cli;

import dev.fray.io.checkpoint.CheckpointListener;
import dev.fray.io.checkpoint.CheckpointReader;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

import javax.xml.parsers.DocumentBuilderFactory;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

/**
 * {@code fray run} as a real process, killed mid-run: every file it leaves is complete, and {@code fray resume}
 * from its last checkpoint finishes with outputs byte-identical to a run that was never interrupted.
 */
class KillAndResumeTest {
    /** A soft block of our own bouncing in a box: about 1000 particles, 6 steps per frame, 80 frames. */
    static final String SCENE = String.join("\n",
            "{",
            "  \"format\": \"fray-scene/1\",",
            "  \"domain\": {\"min\": [0, 0, 0], \"max\": [0.6, 0.6, 0.6]},",
            "  \"walls\": {\"all\": {\"type\": \"separating\", \"friction\": 0.3}},",
            "  \"run\": {\"cellSize\": 0.04, \"frameRate\": 40, \"threads\": 2},",
            "  \"output\": {\"frames\": 80, \"formats\": [\"ply\", \"vtp\", \"csv\"], \"checkpointEvery\": 2,",
            "             \"keepCheckpoints\": 2, \"diagnosticsEvery\": 3},",
            "  \"bodies\": [{",
            "    \"name\": \"block\",",
            "    \"shape\": {\"type\": \"box\", \"min\": [0.2, 0.3, 0.2], \"max\": [0.4, 0.5, 0.4]},",
            "    \"material\": {\"law\": \"neo-hookean\", \"youngsModulus\": 5e3, \"poissonRatio\": 0.3, \"density\": 1000},",
            "    \"jitter\": 0.2, \"seed\": 4, \"velocity\": [1.0, 0.5, -0.4], \"angularVelocity\": [0, 3, 1]",
            "  }]",
            "}", "");

    private static final Pattern PLY = Pattern.compile("frame_\\d{5}\\.ply");
    private static final Pattern VTP = Pattern.compile("frame_\\d{5}\\.vtp");

    @TempDir
    Path tmp;

    private static int fray(String... args) {
        CommandLine cl = FrayCommand.newCommandLine();
        StringWriter sink = new StringWriter();
        cl.setOut(new PrintWriter(sink, true));
        cl.setErr(new PrintWriter(sink, true));
        int code = cl.execute(args);
        assertEquals(0, code, sink.toString());
        return code;
    }

    @Test
    void killedRunLeavesCompleteFilesAndResumesToIdenticalOutputs() throws Exception {
        Path scene = tmp.resolve("bounce.json");
        Files.writeString(scene, SCENE);
        Path killed = tmp.resolve("killed");
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Process p = new ProcessBuilder(java, "-Xmx512m", "-cp", System.getProperty("java.class.path"),
                FrayCommand.class.getName(), "run", scene.toString(), "--out", killed.toString())
                .redirectOutput(tmp.resolve("stdout.txt").toFile())
                .redirectError(tmp.resolve("stderr.txt").toFile())
                .start();
        boolean alive;
        try {
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
            Path target = killed.resolve(CheckpointListener.fileName(6));
            while (!Files.exists(target)) {
                if (!p.isAlive()) {
                    fail("fray run ended before it could be killed (exit " + p.exitValue() + "): "
                            + Files.readString(tmp.resolve("stderr.txt")));
                }
                if (System.nanoTime() > deadline) {
                    fail("no checkpoint after 120 s: " + Files.readString(tmp.resolve("stderr.txt")));
                }
                Thread.sleep(5);
            }
            alive = p.isAlive();
        } finally {
            p.destroyForcibly();
            assertTrue(p.waitFor(30, TimeUnit.SECONDS), "the killed process ends");
        }
        assertTrue(alive, "the run was still going when it was killed");

        int frames = checkEveryFileIsComplete(killed);
        assertTrue(frames >= 7, "frames 0 to 6 at least were written: " + frames);
        List<Path> checkpoints = CheckpointListener.list(killed);
        assertFalse(checkpoints.isEmpty());
        // The newest two are kept; a kill between writing one and deleting the oldest leaves a third.
        assertTrue(checkpoints.size() <= 3, "old checkpoints are deleted: " + checkpoints);

        fray("resume", checkpoints.get(checkpoints.size() - 1).toString());
        Path straight = tmp.resolve("straight");
        fray("run", scene.toString(), "--out", straight.toString());

        List<String> names = RunSession.outputs(straight);
        assertEquals(names, RunSession.outputs(killed), "the same files, and no temporary ones left");
        assertTrue(names.containsAll(List.of("diagnostics.csv", "frames.pvd", "summary.json", "frame_00080.ply",
                "frame_00080.vtp", "checkpoint_00078.fcp", "checkpoint_00080.fcp")), names.toString());
        for (String n : names) {
            if (!n.equals(RunSession.SUMMARY_FILE)) {
                assertArrayEquals(Files.readAllBytes(straight.resolve(n)), Files.readAllBytes(killed.resolve(n)), n);
            }
        }
        String summary = Files.readString(killed.resolve(RunSession.SUMMARY_FILE));
        assertTrue(summary.contains("\"resumedFrom\"") && summary.contains("\"lastFrame\" : 80"), summary);
    }

    /**
     * Parses every file a run left, independently of the writers: PLY frames byte by byte, VTP frames block by
     * block, the series, the CSV table and each checkpoint. Temporary files must be hidden ".NAME.HEX.tmp" ones.
     *
     * @return the number of PLY frames
     */
    static int checkEveryFileIsComplete(Path dir) throws Exception {
        int frames = 0;
        int particles = -1;
        List<String> seen = new ArrayList<>();
        try (var s = Files.list(dir)) {
            for (Path f : s.sorted().toList()) {
                String n = f.getFileName().toString();
                seen.add(n);
                if (RunSession.TEMP_FILE.matcher(n).matches()) {
                    continue;
                } else if (PLY.matcher(n).matches()) {
                    int k = plyParticles(f);
                    assertTrue(particles < 0 || k == particles, n);
                    particles = k;
                    frames++;
                } else if (VTP.matcher(n).matches()) {
                    checkVtp(f);
                } else if (n.equals("frames.pvd")) {
                    var doc = DocumentBuilderFactory.newInstance().newDocumentBuilder().parse(f.toFile());
                    var sets = doc.getElementsByTagName("DataSet");
                    for (int i = 0; i < sets.getLength(); i++) {
                        String file = ((org.w3c.dom.Element) sets.item(i)).getAttribute("file");
                        assertTrue(Files.isRegularFile(dir.resolve(file)), "the series lists only written frames");
                    }
                } else if (n.equals("diagnostics.csv")) {
                    List<String> lines = Files.readAllLines(f);
                    assertTrue(lines.get(0).startsWith("step,time_s,"), n);
                    int columns = lines.get(0).split(",", -1).length;
                    for (String line : lines) {
                        assertEquals(columns, line.split(",", -1).length, line);
                    }
                } else if (CheckpointListener.FILE_PATTERN.matcher(n).matches()) {
                    assertTrue(CheckpointReader.read(f).state().size() > 0);
                } else {
                    fail("unexpected file " + n + " among " + seen);
                }
            }
        }
        return frames;
    }

    /** A binary PLY of Fray's particle layout, read to the last byte. */
    private static int plyParticles(Path f) throws IOException {
        byte[] b = Files.readAllBytes(f);
        String text = new String(b, StandardCharsets.ISO_8859_1);
        int end = text.indexOf("end_header\n");
        assertTrue(end > 0, f + " has a header");
        int record = 0;
        int count = -1;
        int idOffset = -1;
        for (String line : text.substring(0, end).split("\n")) {
            String[] w = line.split(" ");
            if (w[0].equals("element")) {
                assertEquals("vertex", w[1], "only vertices");
                count = Integer.parseInt(w[2]);
            } else if (w[0].equals("property")) {
                if (w[2].equals("id")) {
                    idOffset = record;
                }
                record += w[1].equals("double") ? 8 : w[1].equals("int") ? 4 : -1000;
            }
        }
        int start = end + "end_header\n".length();
        assertEquals(start + (long) count * record, b.length, f + ": complete, nothing missing or extra");
        ByteBuffer buf = ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN);
        for (int i = 0; i < count; i++) {
            assertEquals(i, buf.getInt(start + i * record + idOffset), f + ": particles in id order");
            for (int c = 0; c < 3; c++) {
                assertTrue(Double.isFinite(buf.getDouble(start + i * record + 8 * c)), f + ": finite positions");
            }
        }
        return count;
    }

    private static final Pattern ARRAY = Pattern.compile("type=\"(\\w+)\" Name=\"[^\"]*\" NumberOfComponents=\"(\\d+)\""
            + " format=\"appended\" offset=\"(\\d+)\"");

    /** Every appended block of a raw VTP frame holds the byte count its declaration implies, then the trailer. */
    private static void checkVtp(Path f) throws IOException {
        byte[] b = Files.readAllBytes(f);
        String text = new String(b, StandardCharsets.ISO_8859_1);
        Matcher pm = Pattern.compile("NumberOfPoints=\"(\\d+)\"").matcher(text);
        assertTrue(pm.find(), f.toString());
        long n = Long.parseLong(pm.group(1));
        int data = text.indexOf('_', text.indexOf("<AppendedData")) + 1;
        assertTrue(data > 0, f + " has appended data");
        Matcher am = ARRAY.matcher(text.substring(0, data));
        long expectedEnd = data;
        ByteBuffer buf = ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN);
        while (am.find()) {
            int size = am.group(1).endsWith("64") ? 8 : 4;
            long bytes = n * Integer.parseInt(am.group(2)) * size;
            long at = data + Long.parseLong(am.group(3));
            assertTrue(at + 8 <= b.length, f + ": block inside the file");
            assertEquals(bytes, buf.getLong((int) at), f + ": block length");
            expectedEnd = Math.max(expectedEnd, at + 8 + bytes);
        }
        String trailer = "\n  </AppendedData>\n</VTKFile>\n";
        assertEquals(expectedEnd + trailer.length(), b.length, f + ": complete");
        assertEquals(trailer, new String(Arrays.copyOfRange(b, (int) expectedEnd, b.length), StandardCharsets.US_ASCII));
    }
}

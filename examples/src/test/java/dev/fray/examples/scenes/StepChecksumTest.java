package dev.fray.examples.scenes;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.examples.bench.StandardBench;
import dev.fray.io.scene.SceneReader;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Every shipped scene file, built-in demo and bench scene, run for a fixed number of steps, gives the same bits as
 * recorded in {@code regress/step-checksums.txt}: a guard that restructuring the solver changes no result. A change
 * that is meant to alter results re-records the file and says in its commit which scenes changed and why.
 *
 * <p>The digest covers time, step, and every particle channel in particle-id order (what every frame writer
 * exports). To re-record, run this test with {@code -Dfray.recordChecksums=PATH}: it then writes the file to PATH
 * instead of comparing.
 */
class StepChecksumTest {
    /** Steps per scene: enough for grips, obstacles, walls and damage to act, short enough for every verify. */
    static final int STEPS = 40;
    private static final String RESOURCE = "/regress/step-checksums.txt";

    static Stream<String> cases() throws IOException {
        List<String> out = new ArrayList<>();
        for (String d : DemoScenes.names()) {
            out.add("demo:" + d);
        }
        try (Stream<Path> files = Files.list(Path.of("scenes"))) {
            files.map(p -> p.getFileName().toString()).filter(f -> f.endsWith(".json")).sorted()
                    .forEach(f -> out.add("scene:" + f));
        }
        for (String b : StandardBench.scenes()) {
            out.add("bench:" + b);
        }
        // Slab-tear with separation and crack friction: two velocity fields per node where the pre-cut lies.
        out.add("variant:slab-tear-separated");
        return out.stream();
    }

    private static Scene scene(String c) {
        String name = c.substring(c.indexOf(':') + 1);
        if (c.startsWith("demo:")) {
            return DemoScenes.build(name, 2);
        }
        if (c.startsWith("scene:")) {
            return new SceneReader().read(Path.of("scenes", name)).withThreads(2).scene();
        }
        if (c.startsWith("variant:")) {
            return FractureDemos.slabTear(FractureDemos.SLAB_E, FractureDemos.SLAB_VISCOSITY, 0.3)
                    .separation(0.5, 0.3).threads(2).build();
        }
        return StandardBench.scene(name, 20_000, STEPS, 2);
    }

    static String digest(Scene scene) {
        try (Simulation sim = new Simulation(scene)) {
            for (int i = 0; i < STEPS; i++) {
                sim.step();
            }
            SimulationState s = sim.captureState();
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            ByteBuffer head = ByteBuffer.allocate(16).putDouble(s.time()).putLong(s.step());
            md.update(head.array());
            int[] id = s.id();
            for (Map.Entry<String, double[]> e : s.channels().entrySet()) {
                md.update(e.getKey().getBytes(StandardCharsets.UTF_8));
                double[] a = e.getValue();
                int w = a.length / id.length;
                double[] byId = new double[a.length];
                for (int p = 0; p < id.length; p++) {
                    System.arraycopy(a, w * p, byId, w * id[p], w);
                }
                ByteBuffer bb = ByteBuffer.allocate(8 * byId.length);
                bb.asDoubleBuffer().put(byId);
                md.update(bb.array());
            }
            return HexFormat.of().formatHex(md.digest());
        } catch (NoSuchAlgorithmException e) {
            throw new AssertionError(e);
        }
    }

    private static Map<String, String> recorded() throws IOException {
        Map<String, String> m = new LinkedHashMap<>();
        try (InputStream in = StepChecksumTest.class.getResourceAsStream(RESOURCE)) {
            if (in == null) {
                return m;
            }
            for (String line : new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\n")) {
                if (!line.isBlank() && !line.startsWith("#")) {
                    String[] kv = line.trim().split("\\s+");
                    m.put(kv[0], kv[1]);
                }
            }
        }
        return m;
    }

    @ParameterizedTest
    @MethodSource("cases")
    void sameBitsAsRecorded(String c) throws IOException {
        String got = digest(scene(c));
        String record = System.getProperty("fray.recordChecksums");
        if (record != null) {
            Path file = Path.of(record);
            synchronized (StepChecksumTest.class) {
                String line = c + " " + got + "\n";
                Files.writeString(file, line, StandardCharsets.UTF_8, java.nio.file.StandardOpenOption.CREATE,
                        java.nio.file.StandardOpenOption.APPEND);
            }
            return;
        }
        Map<String, String> want = recorded();
        assertTrue(want.containsKey(c), c + " has no recorded checksum (re-record, see the class comment)");
        assertEquals(want.get(c), got, c + ": results changed");
    }
}

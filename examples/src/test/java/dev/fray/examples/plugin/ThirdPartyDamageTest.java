package dev.fray.examples.plugin;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.Parameters;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.damage.Elastic;
import dev.fray.io.cache.PlyFrameWriter;
import dev.fray.io.cache.PlyParticleWriter;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A damage criterion from outside the library ({@link MaxStrainDamage}, registered through
 * {@code META-INF/services}) does what a built-in one does (DESIGN.md section 1): the registry finds it beside the
 * built-in models, builds it from named parameters with the usual checks, a simulation runs it until a strip
 * breaks, and its own channel reaches the PLY frames without any change to io.
 */
class ThirdPartyDamageTest {
    private static final double CRITICAL = 0.02;
    private static final double FAILURE = 0.04;
    private static final double CELL = 1.0 / 48;
    private static final int STEPS = 60;

    @TempDir
    Path tmp;

    private static Parameters params(Map<String, ?> values) {
        return new Parameters("ThirdPartyDamageTest", values);
    }

    /** A strip one cell thick, 0.4 m wide and 0.2 m tall, pulled apart along y at 0.2 m/s per end. */
    private static Scene strip(DamageModel model) {
        double v = 0.2, y0 = 0.4, y1 = 0.6;
        Body body = Body.named("strip").shape(Shapes.box(0.3, y0, 0.5 - CELL / 2, 0.7, y1, 0.5 + CELL / 2))
                .material(Elastic.neoHookean(1e5, 0.3, 1000)).damage(model).jitter(0.3).seed(3)
                // The matching linear velocity profile, so the pull starts without a shock.
                .velocityField((x, y, z, out) -> out[1] = v * (y - 0.5) / (0.5 * (y1 - y0) - CELL))
                .build();
        return Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(CELL).gravity(0, 0, 0).threads(2)
                .frameRate(1 / (STEPS * 4e-4))
                .maxTimeStep(4e-4)
                .add(body)
                .add(new Grip("bottom", "strip", Shapes.box(0, 0, 0, 1, y0 + 2 * CELL, 1), Motion.linear(0, -v, 0)))
                .add(new Grip("top", "strip", Shapes.box(0, y1 - 2 * CELL, 0, 1, 1, 1), Motion.linear(0, v, 0)))
                .build();
    }

    @Test
    void registryFindsTheModelBesideTheBuiltInOnes() {
        PluginRegistry registry = PluginRegistry.load();
        assertTrue(registry.damageModels().containsKey(MaxStrainDamage.NAME), registry.damageModels().keySet()
                .toString());
        assertTrue(registry.damageModels().containsKey("phase-field-at2"), "built-in models are still there");
        DamageModel m = registry.damageModel(MaxStrainDamage.NAME, params(Map.of("criticalStrain", CRITICAL)));
        // The documented default: failure at twice the critical strain.
        assertEquals(new MaxStrainDamage(CRITICAL, 2 * CRITICAL, MaxStrainDamageProvider.DEFAULT_RESIDUAL_STIFFNESS),
                m);
    }

    @Test
    void parametersAreCheckedLikeBuiltInOnes() {
        PluginRegistry registry = PluginRegistry.load();
        InvalidInputException misspelt = assertThrows(InvalidInputException.class, () -> registry.damageModel(
                MaxStrainDamage.NAME, params(Map.of("criticalStrain", CRITICAL, "failureStrian", FAILURE))));
        assertTrue(misspelt.getMessage().contains("failureStrain"), "suggests the right name: " + misspelt);
        InvalidInputException missing = assertThrows(InvalidInputException.class,
                () -> registry.damageModel(MaxStrainDamage.NAME, params(Map.of())));
        assertTrue(missing.getMessage().contains("criticalStrain"), missing.getMessage());
        InvalidInputException order = assertThrows(InvalidInputException.class, () -> registry.damageModel(
                MaxStrainDamage.NAME, params(Map.of("criticalStrain", CRITICAL, "failureStrain", CRITICAL / 2))));
        assertTrue(order.getMessage().contains("failureStrain"), order.getMessage());
    }

    @Test
    void largestStretchOfSimpleShear() {
        double gamma = 0.3;
        double[] f = {1, gamma, 0, 0, 1, 0, 0, 0, 1};
        // Value from memory: simple shear by gamma has principal stretches (sqrt(gamma^2 + 4) +- gamma) / 2.
        assertEquals((Math.sqrt(gamma * gamma + 4) + gamma) / 2, MaxStrainDamage.largestStretch(f, 0), 1e-12);
        double[] stretch = {0.9, 0, 0, 0, 1.1, 0, 0, 0, 1};
        assertEquals(1.1, MaxStrainDamage.largestStretch(stretch, 0), 1e-12);
        double[] identity = {1, 0, 0, 0, 1, 0, 0, 0, 1};
        assertEquals(1.0, MaxStrainDamage.largestStretch(identity, 0), 1e-12);
    }

    /**
     * Runs the strip with the model from the registry (writing PLY frames) and with the model given directly to
     * the body builder: both break the strip, with the same bits, and the frames carry both of its channels.
     */
    @Test
    void breaksAStripAndItsChannelsReachThePlyFrames() throws IOException {
        DamageModel byName = PluginRegistry.load().damageModel(MaxStrainDamage.NAME,
                params(Map.of("criticalStrain", CRITICAL, "failureStrain", FAILURE)));
        Path out = tmp.resolve("frames");
        double[] damage;
        double[] peak;
        try (Simulation sim = new Simulation(strip(byName))) {
            PlyFrameWriter frames = new PlyFrameWriter(out, PlyParticleWriter.withPluginChannels());
            sim.addFrameListener(frames);
            sim.runFrames(1);
            assertEquals(2, frames.framesWritten(), "frames 0 and 1");
            int n = sim.particles().size();
            damage = new double[n];
            peak = new double[n];
            sim.particles().copyById(DamageModel.DAMAGE, damage, 0);
            sim.particles().copyById(MaxStrainDamage.PEAK, peak, 0);
        }
        int broken = 0;
        for (int i = 0; i < damage.length; i++) {
            broken += damage[i] == 1 ? 1 : 0;
            // The model's own law: fully broken exactly where the peak strain passed the failure strain.
            if (Math.abs(peak[i] - FAILURE) > 1e-12) {
                assertEquals(peak[i] > FAILURE, damage[i] == 1, "particle " + i + ": peak " + peak[i]);
            }
        }
        assertTrue(broken > 10 && broken < damage.length / 2, "the strip breaks along a band: " + broken + " of "
                + damage.length + " particles fully broken");

        try (Simulation sim = new Simulation(strip(new MaxStrainDamage(CRITICAL, FAILURE,
                MaxStrainDamageProvider.DEFAULT_RESIDUAL_STIFFNESS)))) {
            sim.runFrames(1);
            double[] direct = new double[damage.length];
            sim.particles().copyById(DamageModel.DAMAGE, direct, 0);
            assertArrayEquals(damage, direct, 0.0, "same model through Body.Builder.damage gives the same bits");
        }

        Path last = out.resolve(PlyFrameWriter.fileName(1));
        Ply ply = Ply.read(last);
        assertTrue(ply.properties().contains("damage") && ply.properties().contains("strain-peak"),
                "PLY properties: " + ply.properties());
        assertTrue(ply.header().contains("comment unit strain-peak 1 (largest principal strain"), ply.header());
        assertEquals(damage.length, ply.vertices());
        // Rows are in stable-id order: the exported values are the simulation's, bit for bit.
        assertArrayEquals(damage, ply.column("damage"), 0.0);
        assertArrayEquals(peak, ply.column("strain-peak"), 0.0);
    }

    /** The parts of a binary little-endian PLY file of vertices that the test reads. */
    private record Ply(String header, List<String> properties, List<String> types, int vertices, ByteBuffer body) {
        static Ply read(Path file) throws IOException {
            byte[] bytes = Files.readAllBytes(file);
            String text = new String(bytes, StandardCharsets.US_ASCII);
            int end = text.indexOf("end_header\n") + "end_header\n".length();
            String header = text.substring(0, end);
            List<String> names = new ArrayList<>();
            List<String> types = new ArrayList<>();
            int vertices = -1;
            for (String line : header.split("\n")) {
                String[] w = line.split(" ");
                if (w[0].equals("element") && w[1].equals("vertex")) {
                    vertices = Integer.parseInt(w[2]);
                } else if (w[0].equals("property")) {
                    types.add(w[1]);
                    names.add(w[2]);
                }
            }
            assertTrue(header.startsWith("ply\nformat binary_little_endian 1.0\n"), header);
            ByteBuffer body = ByteBuffer.wrap(bytes, end, bytes.length - end).slice().order(ByteOrder.LITTLE_ENDIAN);
            return new Ply(header, names, types, vertices, body);
        }

        private static int size(String type) {
            return type.equals("double") ? 8 : 4;
        }

        double[] column(String name) {
            int record = 0;
            int offset = -1;
            for (int i = 0; i < properties.size(); i++) {
                if (properties.get(i).equals(name)) {
                    offset = record;
                }
                record += size(types.get(i));
            }
            assertEquals(vertices * record, body.capacity(), "body size");
            double[] out = new double[vertices];
            for (int v = 0; v < vertices; v++) {
                out[v] = body.getDouble(v * record + offset);
            }
            return out;
        }
    }
}

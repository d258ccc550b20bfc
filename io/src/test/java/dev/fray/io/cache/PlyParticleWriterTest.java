package dev.fray.io.cache;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.io.AtomicFiles;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Round trip of the PLY writer through an independent reader, and the atomic-write guarantees. */
class PlyParticleWriterTest extends FrayTestBase {
    @TempDir
    Path dir;

    /** Two small bodies, stepped a few times so that particles are reordered and velocities are non-trivial. */
    private static Simulation smallSimulation() {
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 1, 1)
                .cellSize(1.0 / 16)
                .threads(2)
                .add(Body.named("left").shape(Shapes.box(0.2, 0.3, 0.2, 0.4, 0.5, 0.4))
                        .material(Elastic.fixedCorotated(1e4, 0.3, 1000)).jitter(0.25).seed(7)
                        .velocity(0.5, 0, 0).angularVelocity(0, 2, 0).build())
                .add(Body.named("right").shape(Shapes.sphere(0.7, 0.5, 0.6, 0.1))
                        .material(Elastic.neoHookean(1e4, 0.3, 1000)).jitter(0.25).seed(8)
                        .velocity(-0.5, 0, 0).build())
                .build();
        Simulation sim = new Simulation(scene);
        for (int i = 0; i < 5; i++) {
            sim.step();
        }
        return sim;
    }

    @Test
    void valuesRoundTripInStableIdOrder() throws IOException {
        try (Simulation sim = smallSimulation()) {
            Path file = dir.resolve("f.ply");
            PlyParticleWriter.withChannels(List.of(ParticleStore.DEFORMATION, ParticleStore.MASS))
                    .write(file, sim, 3);
            Ply ply = Ply.read(Files.readAllBytes(file));

            ParticleView pv = sim.particles();
            int n = pv.size();
            assertEquals(n, ply.count);
            List<String> expected = new ArrayList<>(List.of("x", "y", "z", "vx", "vy", "vz", "body", "id"));
            for (int k = 0; k < 9; k++) {
                expected.add("deformation_" + k);
            }
            expected.add("mass");
            assertEquals(expected, ply.names);
            assertEquals("int", ply.types.get(6));
            assertEquals("int", ply.types.get(7));
            assertTrue(ply.comments.contains("time_s " + sim.time()), ply.comments.toString());
            assertTrue(ply.comments.contains("step 5"), ply.comments.toString());
            assertTrue(ply.comments.contains("frame 3"), ply.comments.toString());
            assertTrue(ply.comments.contains("body 0 left"), ply.comments.toString());
            assertTrue(ply.comments.contains("body 1 right"), ply.comments.toString());

            double[] pos = new double[3 * n];
            double[] vel = new double[3 * n];
            double[] f = new double[9 * n];
            double[] m = new double[n];
            pv.copyById(ParticleStore.POSITION, pos, 0);
            pv.copyById(ParticleStore.VELOCITY, vel, 0);
            pv.copyById(ParticleStore.DEFORMATION, f, 0);
            pv.copyById(ParticleStore.MASS, m, 0);
            int[] body = new int[n];
            boolean reordered = false;
            for (int p = 0; p < n; p++) {
                body[pv.id(p)] = pv.body(p);
                reordered |= pv.id(p) != p;
            }
            assertTrue(reordered, "the test needs particles stored out of id order");
            for (int i = 0; i < n; i++) {
                double[] row = ply.rows[i];
                for (int k = 0; k < 3; k++) {
                    assertEquals(Double.doubleToRawLongBits(pos[3 * i + k]), Double.doubleToRawLongBits(row[k]));
                    assertEquals(Double.doubleToRawLongBits(vel[3 * i + k]),
                            Double.doubleToRawLongBits(row[3 + k]));
                }
                assertEquals(body[i], (int) row[6]);
                assertEquals(i, (int) row[7]);
                for (int k = 0; k < 9; k++) {
                    assertEquals(Double.doubleToRawLongBits(f[9 * i + k]), Double.doubleToRawLongBits(row[8 + k]));
                }
                assertEquals(m[i], row[17]);
            }
        }
    }

    @Test
    void pluginChannelsDefaultLeavesBuiltInsOut() throws IOException {
        try (Simulation sim = smallSimulation()) {
            Path file = dir.resolve("g.ply");
            PlyParticleWriter w = PlyParticleWriter.withPluginChannels();
            w.write(file, sim, -1);
            Ply ply = Ply.read(Files.readAllBytes(file));
            List<String> names = ply.names.subList(0, 8);
            assertEquals(List.of("x", "y", "z", "vx", "vy", "vz", "body", "id"), names);
            assertEquals(8 + extraWidth(sim, w), ply.names.size());
            for (String n : ply.names) {
                assertTrue(!n.startsWith("deformation") && !n.startsWith("affine"), n);
            }
        }
    }

    private static int extraWidth(Simulation sim, PlyParticleWriter w) {
        int total = 0;
        for (String c : w.channelsFor(sim.particles())) {
            total += sim.particles().spec(c).width();
        }
        return total;
    }

    @Test
    void frameWriterNamesFilesByFrame() throws IOException {
        try (Simulation sim = smallSimulation()) {
            Path out = dir.resolve("frames");
            PlyFrameWriter fw = new PlyFrameWriter(out, PlyParticleWriter.withPluginChannels());
            sim.addFrameListener(fw);
            sim.runFrames(2);
            try (Stream<Path> s = Files.list(out)) {
                assertEquals(List.of("frame_00000.ply", "frame_00001.ply", "frame_00002.ply"),
                        s.map(p -> p.getFileName().toString()).sorted().toList());
            }
            Ply last = Ply.read(Files.readAllBytes(fw.fileOf(2)));
            assertTrue(last.comments.contains("frame 2"), last.comments.toString());
            assertEquals(3, fw.framesWritten());
        }
    }

    @Test
    void failedWriteKeepsEarlierFileAndLeavesNoTemporary() throws IOException {
        try (Simulation sim = smallSimulation()) {
            Path file = dir.resolve("keep.ply");
            PlyParticleWriter.withPluginChannels().write(file, sim, 0);
            byte[] before = Files.readAllBytes(file);

            InvalidInputException io = assertThrows(InvalidInputException.class,
                    () -> AtomicFiles.write(file, out -> {
                        out.write(new byte[100_000]); // beyond the buffer, so bytes reach the temporary file
                        throw new IOException("disk full (simulated)");
                    }));
            assertEquals(FrayMessage.FILE_ERROR, io.key());
            assertEquals(file.toAbsolutePath().toString(), io.parts()[0]);

            assertThrows(IllegalStateException.class, () -> AtomicFiles.write(file, out -> {
                out.write(1);
                throw new IllegalStateException("bug in a writer (simulated)");
            }));

            InvalidInputException unknown = assertThrows(InvalidInputException.class,
                    () -> PlyParticleWriter.withChannels(List.of("no-such-channel")).write(file, sim, 1));
            assertEquals(FrayMessage.UNKNOWN_NAME, unknown.key());

            assertArrayEquals(before, Files.readAllBytes(file));
            try (Stream<Path> s = Files.list(dir)) {
                assertEquals(List.of("keep.ply"), s.map(p -> p.getFileName().toString()).toList());
            }
        }
    }

    @Test
    void publishedFileHasOrdinaryPermissions() throws IOException {
        if (!dir.getFileSystem().supportedFileAttributeViews().contains("posix")) {
            return;
        }
        Path plain = Files.writeString(dir.resolve("plain.txt"), "x");
        Path atomic = dir.resolve("atomic.txt");
        AtomicFiles.write(atomic, out -> out.write('x'));
        assertEquals(Files.getPosixFilePermissions(plain), Files.getPosixFilePermissions(atomic),
                "same permissions as a file written directly (the umask decides, not the temporary file)");
    }

    @Test
    void missingFolderIsAFileError() {
        try (Simulation sim = smallSimulation()) {
            Path file = dir.resolve("absent").resolve("x.ply");
            InvalidInputException e = assertThrows(InvalidInputException.class,
                    () -> PlyParticleWriter.withPluginChannels().write(file, sim, 0));
            assertEquals(FrayMessage.FILE_ERROR, e.key());
        }
    }

    @Test
    void badChannelListsAreRejected() {
        assertEquals(FrayMessage.INCONSISTENT, assertThrows(InvalidInputException.class,
                () -> PlyParticleWriter.withChannels(List.of("position"))).key());
        assertEquals(FrayMessage.INCONSISTENT, assertThrows(InvalidInputException.class,
                () -> PlyParticleWriter.withChannels(List.of("mass", "mass"))).key());
    }

    /**
     * A minimal reader written from the PLY format description: ASCII header lines up to "end_header", one
     * "element vertex N", scalar "property TYPE NAME" lines, then N little-endian records. Independent of the
     * writer on purpose.
     */
    static final class Ply {
        int count = -1;
        final List<String> names = new ArrayList<>();
        final List<String> types = new ArrayList<>();
        final List<String> comments = new ArrayList<>();
        double[][] rows;

        static Ply read(byte[] bytes) throws IOException {
            Ply ply = new Ply();
            InputStream in = new ByteArrayInputStream(bytes);
            int consumed = 0;
            List<String> lines = new ArrayList<>();
            StringBuilder line = new StringBuilder();
            while (true) {
                int c = in.read();
                if (c < 0) {
                    throw new IOException("no end_header");
                }
                consumed++;
                if (c == '\n') {
                    String l = line.toString();
                    lines.add(l);
                    line.setLength(0);
                    if (l.equals("end_header")) {
                        break;
                    }
                } else {
                    line.append((char) c);
                }
            }
            assertEquals("ply", lines.get(0));
            assertEquals("format binary_little_endian 1.0", lines.get(1));
            for (String l : lines.subList(2, lines.size() - 1)) {
                String[] t = l.split(" ");
                switch (t[0]) {
                    case "comment" -> ply.comments.add(l.substring("comment ".length()));
                    case "element" -> {
                        assertEquals("vertex", t[1]);
                        assertEquals(-1, ply.count, "one element only");
                        ply.count = Integer.parseInt(t[2]);
                    }
                    case "property" -> {
                        assertEquals(3, t.length, l);
                        ply.types.add(t[1]);
                        ply.names.add(t[2]);
                    }
                    default -> throw new IOException("unexpected header line: " + l);
                }
            }
            int record = 0;
            for (String type : ply.types) {
                record += size(type);
            }
            assertEquals(bytes.length - consumed, (long) record * ply.count, "body length");
            ByteBuffer b = ByteBuffer.wrap(bytes, consumed, bytes.length - consumed).order(ByteOrder.LITTLE_ENDIAN);
            ply.rows = new double[ply.count][ply.types.size()];
            for (int i = 0; i < ply.count; i++) {
                for (int k = 0; k < ply.types.size(); k++) {
                    ply.rows[i][k] = switch (ply.types.get(k)) {
                        case "double" -> b.getDouble();
                        case "float" -> b.getFloat();
                        case "int" -> b.getInt();
                        default -> throw new IOException("type " + ply.types.get(k));
                    };
                }
            }
            return ply;
        }

        private static int size(String type) {
            return switch (type) {
                case "double" -> 8;
                case "float", "int" -> 4;
                default -> throw new IllegalArgumentException(type);
            };
        }
    }
}

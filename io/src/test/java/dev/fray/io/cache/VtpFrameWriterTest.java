package dev.fray.io.cache;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.FrameListener;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationView;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Stream;
import javax.xml.parsers.DocumentBuilder;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/**
 * The VTK XML PolyData writer read back by the JDK's XML parser plus a decoder of the appended raw data written
 * here from the published VTK file-format description ("VTK File Formats", XML section: VTKFile attributes type,
 * version, byte_order, header_type; Piece with NumberOfPoints / NumberOfVerts; DataArray with type, Name,
 * NumberOfComponents, format, offset; appended raw data after '_', each block a header_type byte count followed by
 * the values; Verts as connectivity and offsets, offsets giving the end of each cell).
 */
class VtpFrameWriterTest extends FrayTestBase {
    /** Scalar type names and sizes of the VTK XML format description. */
    private static final Map<String, Integer> VTK_TYPES = Map.of("Int8", 1, "UInt8", 1, "Int16", 2, "UInt16", 2,
            "Int32", 4, "UInt32", 4, "Int64", 8, "UInt64", 8, "Float32", 4, "Float64", 8);

    @TempDir
    Path dir;

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

    /** A .vtp file split into its parsed XML part and its appended raw bytes. */
    private record Vtp(Document xml, ByteBuffer raw, String tail) {
        static Vtp parse(byte[] file) throws Exception {
            String latin = new String(file, StandardCharsets.ISO_8859_1);
            int tag = latin.indexOf("<AppendedData");
            assertTrue(tag > 0, "appended data section");
            int underscore = latin.indexOf('_', latin.indexOf('>', tag));
            // Everything before '_' is XML; close the open elements to parse it.
            String head = latin.substring(0, underscore) + "</AppendedData></VTKFile>";
            DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
            f.setFeature("http://apache.org/xml/features/disallow-doctype-decl", true);
            DocumentBuilder b = f.newDocumentBuilder();
            Document doc = b.parse(new ByteArrayInputStream(head.getBytes(StandardCharsets.ISO_8859_1)));
            int end = latin.lastIndexOf("</AppendedData>");
            ByteBuffer raw = ByteBuffer.wrap(Arrays.copyOfRange(file, underscore + 1, end))
                    .order(ByteOrder.LITTLE_ENDIAN);
            return new Vtp(doc, raw, latin.substring(end));
        }
    }

    /** Decodes one appended array: the UInt64 byte count at its offset, then little-endian values. */
    private static double[] decode(ByteBuffer raw, Element a) {
        long offset = Long.parseLong(a.getAttribute("offset"));
        long bytes = raw.getLong((int) offset);
        int size = VTK_TYPES.get(a.getAttribute("type"));
        int n = (int) (bytes / size);
        double[] out = new double[n];
        int at = (int) offset + 8;
        for (int i = 0; i < n; i++, at += size) {
            out[i] = switch (a.getAttribute("type")) {
                case "Float64" -> raw.getDouble(at);
                case "Int32" -> raw.getInt(at);
                case "Int64" -> raw.getLong(at);
                default -> throw new AssertionError("type not written by Fray: " + a.getAttribute("type"));
            };
        }
        return out;
    }

    private static Element only(Element parent, String name) {
        NodeList l = parent.getElementsByTagName(name);
        assertEquals(1, l.getLength(), name);
        return (Element) l.item(0);
    }

    @Test
    void framesMatchCopyByIdAndTheFormatDescription() throws Exception {
        try (Simulation sim = smallSimulation()) {
            Path file = dir.resolve("one.vtp");
            VtpParticleWriter.withChannels(List.of(ParticleStore.DEFORMATION, ParticleStore.MASS))
                    .write(file, sim, 3);
            Vtp vtp = Vtp.parse(Files.readAllBytes(file));
            ParticleView pv = sim.particles();
            int n = pv.size();

            Element root = vtp.xml.getDocumentElement();
            assertEquals("VTKFile", root.getTagName());
            assertEquals("PolyData", root.getAttribute("type"));
            assertEquals("1.0", root.getAttribute("version"));
            assertEquals("LittleEndian", root.getAttribute("byte_order"));
            assertEquals("UInt64", root.getAttribute("header_type"));
            Element poly = only(root, "PolyData");
            Element piece = only(poly, "Piece");
            assertEquals(String.valueOf(n), piece.getAttribute("NumberOfPoints"));
            assertEquals(String.valueOf(n), piece.getAttribute("NumberOfVerts"));
            assertEquals("raw", only(root, "AppendedData").getAttribute("encoding"));
            assertTrue(vtp.tail.matches("(?s)</AppendedData>\\s*</VTKFile>\\s*"), vtp.tail);

            // Every DataArray: known type, name, components, appended with an offset; the blocks tile the data.
            NodeList arrays = root.getElementsByTagName("DataArray");
            Map<String, Element> byName = new HashMap<>();
            List<long[]> blocks = new ArrayList<>();
            for (int i = 0; i < arrays.getLength(); i++) {
                Element a = (Element) arrays.item(i);
                assertTrue(VTK_TYPES.containsKey(a.getAttribute("type")), a.getAttribute("type"));
                assertEquals("appended", a.getAttribute("format"));
                int comps = Integer.parseInt(a.getAttribute("NumberOfComponents"));
                long offset = Long.parseLong(a.getAttribute("offset"));
                long bytes = vtp.raw.getLong((int) offset);
                assertEquals((long) n * comps * VTK_TYPES.get(a.getAttribute("type")), bytes, a.getAttribute("Name"));
                blocks.add(new long[] {offset, 8 + bytes});
                byName.put(((Element) a.getParentNode()).getTagName() + "/" + a.getAttribute("Name"), a);
            }
            blocks.sort((x, y) -> Long.compare(x[0], y[0]));
            long at = 0;
            for (long[] b : blocks) {
                assertEquals(at, b[0]);
                at += b[1];
            }
            // The blocks fill the section; only the whitespace before the closing tag follows them.
            for (int i = (int) at; i < vtp.raw.capacity(); i++) {
                assertTrue(Character.isWhitespace(vtp.raw.get(i)), "byte " + i + " after the last block");
            }
            assertTrue(vtp.raw.capacity() - at < 8);
            assertEquals(Set.of("PointData/velocity", "PointData/body", "PointData/id", "PointData/deformation",
                    "PointData/mass", "Points/position", "Verts/connectivity", "Verts/offsets"), byName.keySet());
            assertEquals("3", byName.get("Points/position").getAttribute("NumberOfComponents"));
            assertEquals("9", byName.get("PointData/deformation").getAttribute("NumberOfComponents"));

            boolean reordered = false;
            int[] body = new int[n];
            for (int p = 0; p < n; p++) {
                body[pv.id(p)] = pv.body(p);
                reordered |= pv.id(p) != p;
            }
            assertTrue(reordered, "the test needs particles stored out of id order");
            String[][] channels = {{"Points/position", ParticleStore.POSITION},
                {"PointData/velocity", ParticleStore.VELOCITY}, {"PointData/deformation", ParticleStore.DEFORMATION},
                {"PointData/mass", ParticleStore.MASS}};
            for (String[] c : channels) {
                int w = pv.spec(c[1]).width();
                double[] expected = new double[w * n];
                pv.copyById(c[1], expected, 0);
                double[] got = decode(vtp.raw, byName.get(c[0]));
                assertEquals(expected.length, got.length);
                for (int i = 0; i < expected.length; i++) {
                    assertEquals(Double.doubleToRawLongBits(expected[i]), Double.doubleToRawLongBits(got[i]), c[0]);
                }
            }
            double[] ids = decode(vtp.raw, byName.get("PointData/id"));
            double[] bodies = decode(vtp.raw, byName.get("PointData/body"));
            double[] conn = decode(vtp.raw, byName.get("Verts/connectivity"));
            double[] offs = decode(vtp.raw, byName.get("Verts/offsets"));
            for (int i = 0; i < n; i++) {
                assertEquals(i, ids[i]);
                assertEquals(body[i], bodies[i]);
                assertEquals(i, conn[i], "vertex cell i holds point i");
                assertEquals(i + 1, offs[i], "offsets give the end of each cell");
            }
        }
    }

    @Test
    void collectionListsExactlyTheCompleteFrames() throws Exception {
        try (Simulation sim = smallSimulation()) {
            Path out = dir.resolve("frames");
            VtpFrameWriter w = new VtpFrameWriter(out, VtpParticleWriter.withPluginChannels());
            sim.addFrameListener(w);
            List<Integer> checked = new ArrayList<>();
            List<Double> times = new ArrayList<>();
            // Runs after the writer at every frame: the collection must already list this frame and every
            // earlier one, each file complete.
            sim.addFrameListener(new FrameListener() {
                @Override
                public void onFrame(int frame, double time, SimulationView view, boolean isLast) {
                    try {
                        List<String[]> sets = dataSets(w.collectionFile());
                        assertEquals(frame + 1, sets.size());
                        for (int k = 0; k <= frame; k++) {
                            assertEquals(VtpFrameWriter.fileName(k), sets.get(k)[1]);
                            Vtp.parse(Files.readAllBytes(out.resolve(sets.get(k)[1])));
                        }
                        assertEquals(time, Double.parseDouble(sets.get(frame)[0]));
                        checked.add(frame);
                        times.add(time);
                    } catch (Exception e) {
                        throw new AssertionError(e);
                    }
                }
            });
            sim.runFrames(3);
            assertEquals(List.of(0, 1, 2, 3), checked);
            assertEquals(4, w.framesWritten());
            List<String[]> sets = dataSets(w.collectionFile());
            for (int k = 0; k < 4; k++) {
                assertEquals(times.get(k), Double.parseDouble(sets.get(k)[0]), "timestep of frame " + k);
            }
            // Frames are 1 / frameRate apart (the first is the state when the run starts).
            assertEquals(1 / sim.scene().frameRate(), times.get(3) - times.get(2), 1e-9);
            try (Stream<Path> s = Files.list(out)) {
                assertEquals(List.of("frame_00000.vtp", "frame_00001.vtp", "frame_00002.vtp", "frame_00003.vtp",
                        "frames.pvd"), s.map(p -> p.getFileName().toString()).sorted().toList(),
                        "no temporary files left");
            }
        }
    }

    /** Parses a .pvd: VTKFile type="Collection" / Collection / DataSet (timestep, file). */
    private static List<String[]> dataSets(Path pvd) throws Exception {
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setFeature("http://apache.org/xml/features/disallow-doctype-decl", true);
        Document doc = f.newDocumentBuilder().parse(pvd.toFile());
        Element root = doc.getDocumentElement();
        assertEquals("VTKFile", root.getTagName());
        assertEquals("Collection", root.getAttribute("type"));
        Element coll = only(root, "Collection");
        NodeList l = coll.getElementsByTagName("DataSet");
        List<String[]> out = new ArrayList<>();
        for (int i = 0; i < l.getLength(); i++) {
            Element e = (Element) l.item(i);
            out.add(new String[] {e.getAttribute("timestep"), e.getAttribute("file")});
        }
        return out;
    }

    @Test
    void collectionReplacesARepeatedFrameAndEscapesNames() throws Exception {
        PvdCollection c = new PvdCollection(dir.resolve("c.pvd"));
        c.put(1, 0.5, "b&<\"'>.vtp");
        c.put(0, 0.0, "a.vtp");
        c.put(1, 0.25, "b.vtp");
        c.write();
        List<String[]> sets = dataSets(c.file());
        assertEquals(2, sets.size());
        assertEquals("a.vtp", sets.get(0)[1]);
        assertEquals("0.25", sets.get(1)[0]);
        c.put(2, 1, "x&<\"'>.vtp");
        c.write();
        assertEquals("x&<\"'>.vtp", dataSets(c.file()).get(2)[1]);
        assertThrows(InvalidInputException.class, () -> c.put(-1, 0, "a"));
        assertThrows(InvalidInputException.class, () -> c.put(0, Double.NaN, "a"));
    }

    @Test
    void rejectsReservedOrRepeatedChannels() throws IOException {
        for (List<String> bad : List.of(List.of("position"), List.of("id"), List.of("mass", "mass"))) {
            InvalidInputException e = assertThrows(InvalidInputException.class,
                    () -> VtpParticleWriter.withChannels(bad));
            assertEquals(FrayMessage.INCONSISTENT, e.key());
        }
        try (Simulation sim = smallSimulation()) {
            InvalidInputException e = assertThrows(InvalidInputException.class,
                    () -> VtpParticleWriter.withChannels(List.of("nope")).write(dir.resolve("x.vtp"), sim, 0));
            assertEquals(FrayMessage.UNKNOWN_NAME, e.key());
            try (Stream<Path> s = Files.list(dir)) {
                assertEquals(0, s.count(), "a bad channel leaves no file behind");
            }
        }
    }
}

package dev.fray.io.cache;

import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.SimulationView;
import dev.fray.io.AtomicFiles;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/**
 * Writes the particles of one frame as a VTK XML PolyData file (.vtp, the open VTK XML file format, version 1.0):
 * one point and one vertex cell per particle, in stable-id order, so point i of every frame is the same particle.
 *
 * <p>Layout: {@code VTKFile type="PolyData" version="1.0" byte_order="LittleEndian" header_type="UInt64"} holding
 * one {@code Piece} with NumberOfPoints = NumberOfVerts = particle count. {@code Points} is a Float64 array of 3
 * components (position, m). {@code Verts} has Int64 {@code connectivity} 0 .. n-1 and {@code offsets} 1 .. n
 * (the end of each cell in connectivity). {@code PointData} holds {@code velocity} (Float64, 3 components, m/s),
 * {@code body} (Int32, index into the scene's body list), {@code id} (Int32, stable particle id) and one Float64
 * array per chosen channel, named after it, with the channel's width as NumberOfComponents (deformation: 9,
 * row-major). A comment after the XML declaration gives the simulated time (s), the step and the frame.
 *
 * <p>Encoding: binary, appended, raw (not base64): every DataArray has {@code format="appended"} and an
 * {@code offset} into the {@code AppendedData encoding="raw"} section, counted from the byte after its leading
 * '_'; each block there is a little-endian UInt64 byte count followed by the values, little-endian. Raw appended
 * data keeps exact doubles at 8 bytes each, so a frame costs about as much as the PLY cache; the file is then not
 * well-formed XML after the '_', as the format intends.
 *
 * <p>Immutable and thread-safe; each call allocates one array of the widest exported channel.
 */
public final class VtpParticleWriter {
    /** Names this writer uses for its own output, which channels must not take. */
    private static final Set<String> RESERVED = Set.of("body", "id");
    private static final int CHUNK_BYTES = 1 << 16;

    private final ChannelSelection selection;

    private VtpParticleWriter(ChannelSelection selection) {
        this.selection = selection;
    }

    /**
     * A writer that exports, besides position, velocity, body and id, every channel declared by a plugin (all
     * but the built-in affine, deformation, mass and volume channels).
     *
     * @return the writer
     */
    public static VtpParticleWriter withPluginChannels() {
        return new VtpParticleWriter(ChannelSelection.plugins("VTP", RESERVED));
    }

    /**
     * A writer that exports exactly the given channels besides position, velocity, body and id.
     *
     * @param channels channel names; no duplicates, not "position", "velocity", "body" or "id"
     * @return the writer
     * @throws InvalidInputException INCONSISTENT for a duplicate or reserved name, MISSING for null
     */
    public static VtpParticleWriter withChannels(List<String> channels) {
        return new VtpParticleWriter(ChannelSelection.of("VTP", RESERVED, channels,
                "always written (Points, velocity, body, id); do not list it"));
    }

    /**
     * @param view particles of a simulation
     * @return the extra channels this writer exports for them, in order
     * @throws InvalidInputException UNKNOWN_NAME if a chosen channel does not exist, INCONSISTENT if a plugin
     *         channel is named "body" or "id"
     */
    public List<String> channelsFor(ParticleView view) {
        return selection.resolve(view);
    }

    /**
     * Writes the current state of a simulation to a file, atomically (see {@link AtomicFiles}).
     *
     * @param target the .vtp file; its folder must exist
     * @param view   the simulation (not modified)
     * @param frame  frame index for the comment, or -1 for none
     * @throws InvalidInputException FILE_ERROR if the file cannot be written, UNKNOWN_NAME for a chosen channel
     *         the particles do not have
     */
    public void write(Path target, SimulationView view, int frame) {
        List<String> chosen = channelsFor(view.particles());
        AtomicFiles.write(target, out -> write(out, view, frame, chosen));
    }

    /**
     * Writes the current state of a simulation to a stream.
     *
     * @param out   destination (not closed)
     * @param view  the simulation (not modified)
     * @param frame frame index for the comment, or -1 for none
     * @throws IOException if the stream fails
     * @throws InvalidInputException UNKNOWN_NAME for a chosen channel the particles do not have
     */
    public void write(OutputStream out, SimulationView view, int frame) throws IOException {
        write(out, view, frame, channelsFor(view.particles()));
    }

    /** One appended array: its name, VTK type, components and byte count. */
    private record Block(String name, String type, int components, long bytes) {
    }

    private void write(OutputStream out, SimulationView view, int frame, List<String> chosen) throws IOException {
        ParticleView pv = view.particles();
        int n = pv.size();
        List<Block> pointData = new ArrayList<>();
        pointData.add(new Block("velocity", "Float64", 3, 24L * n));
        pointData.add(new Block("body", "Int32", 1, 4L * n));
        pointData.add(new Block("id", "Int32", 1, 4L * n));
        int widest = 3;
        for (String c : chosen) {
            int w = pv.spec(c).width();
            widest = Math.max(widest, w);
            pointData.add(new Block(c, "Float64", w, 8L * w * n));
        }
        Block points = new Block("position", "Float64", 3, 24L * n);
        Block connectivity = new Block("connectivity", "Int64", 1, 8L * n);
        Block offsets = new Block("offsets", "Int64", 1, 8L * n);

        StringBuilder h = new StringBuilder(2048);
        h.append("<?xml version=\"1.0\"?>\n");
        h.append("<!-- Fray particle frame, SI units, particles in stable-id order: time_s ")
                .append(Double.toString(view.time())).append(", step ").append(view.stepCount());
        if (frame >= 0) {
            h.append(", frame ").append(frame);
        }
        h.append(" -->\n");
        h.append("<VTKFile type=\"PolyData\" version=\"1.0\" byte_order=\"LittleEndian\""
                + " header_type=\"UInt64\">\n");
        h.append("  <PolyData>\n");
        h.append("    <Piece NumberOfPoints=\"").append(n).append("\" NumberOfVerts=\"").append(n)
                .append("\" NumberOfLines=\"0\" NumberOfStrips=\"0\" NumberOfPolys=\"0\">\n");
        long offset = 0;
        h.append("      <PointData>\n");
        for (Block b : pointData) {
            offset = dataArray(h, b, offset, "        ");
        }
        h.append("      </PointData>\n");
        h.append("      <Points>\n");
        offset = dataArray(h, points, offset, "        ");
        h.append("      </Points>\n");
        h.append("      <Verts>\n");
        offset = dataArray(h, connectivity, offset, "        ");
        dataArray(h, offsets, offset, "        ");
        h.append("      </Verts>\n");
        h.append("    </Piece>\n");
        h.append("  </PolyData>\n");
        h.append("  <AppendedData encoding=\"raw\">\n   _");
        out.write(h.toString().getBytes(StandardCharsets.US_ASCII));

        Chunks buf = new Chunks(out);
        double[] values = new double[widest * n];
        // PointData, in the order of the header.
        pv.copyById(ParticleStore.VELOCITY, values, 0);
        buf.doubles(values, 3 * n);
        int[] body = new int[n];
        for (int p = 0; p < n; p++) {
            body[pv.id(p)] = pv.body(p);
        }
        buf.count(4L * n);
        for (int i = 0; i < n; i++) {
            buf.putInt(body[i]);
        }
        buf.count(4L * n);
        for (int i = 0; i < n; i++) {
            buf.putInt(i);
        }
        for (String c : chosen) {
            int w = pv.spec(c).width();
            pv.copyById(c, values, 0);
            buf.doubles(values, w * n);
        }
        pv.copyById(ParticleStore.POSITION, values, 0);
        buf.doubles(values, 3 * n);
        buf.count(8L * n);
        for (int i = 0; i < n; i++) {
            buf.putLong(i);
        }
        buf.count(8L * n);
        for (int i = 0; i < n; i++) {
            buf.putLong(i + 1L);
        }
        buf.flush();
        out.write("\n  </AppendedData>\n</VTKFile>\n".getBytes(StandardCharsets.US_ASCII));
        out.flush();
    }

    private static long dataArray(StringBuilder h, Block b, long offset, String indent) {
        h.append(indent).append("<DataArray type=\"").append(b.type).append("\" Name=\"").append(b.name)
                .append("\" NumberOfComponents=\"").append(b.components).append("\" format=\"appended\" offset=\"")
                .append(offset).append("\"/>\n");
        return offset + 8 + b.bytes;
    }

    /** Little-endian output through one reused buffer. */
    private static final class Chunks {
        private final OutputStream out;
        private final ByteBuffer buf = ByteBuffer.allocate(CHUNK_BYTES).order(ByteOrder.LITTLE_ENDIAN);

        Chunks(OutputStream out) {
            this.out = out;
        }

        private void room(int bytes) throws IOException {
            if (buf.remaining() < bytes) {
                flush();
            }
        }

        void flush() throws IOException {
            out.write(buf.array(), 0, buf.position());
            buf.clear();
        }

        /** The UInt64 byte count that starts every appended block. */
        void count(long bytes) throws IOException {
            putLong(bytes);
        }

        void putInt(int v) throws IOException {
            room(4);
            buf.putInt(v);
        }

        void putLong(long v) throws IOException {
            room(8);
            buf.putLong(v);
        }

        void doubles(double[] a, int count) throws IOException {
            putLong(8L * count);
            for (int i = 0; i < count; i++) {
                room(8);
                buf.putDouble(a[i]);
            }
        }
    }

    @Override
    public String toString() {
        return String.format(Locale.ROOT, "VtpParticleWriter[%s]", selection);
    }
}

package dev.fray.io.cache;

import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ChannelSpec;
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
import java.util.List;
import java.util.Set;

/**
 * Writes the particles of one frame as a binary little-endian PLY 1.0 file (the open polygon file format, vertices
 * only). Particles appear in stable-id order, so row i of every frame is the same particle.
 *
 * <p>Each vertex carries {@code double x y z} (position, m), {@code double vx vy vz} (velocity, m/s),
 * {@code int body} (index into the scene's body list), {@code int id} (stable particle id), then one
 * {@code double} property per component of every chosen channel: a channel of width 1 is named after the channel
 * ({@code damage}), a wider one {@code NAME_k} ({@code deformation_0 .. deformation_8}, row-major). Header comments
 * give the simulated time (s), the step count, the frame index when known, the body names and each property's SI
 * unit.
 *
 * <p>Immutable and thread-safe; each call allocates its own copy of the exported channels.
 */
public final class PlyParticleWriter {
    /** Names this writer uses for its own output, which channels must not take. */
    private static final Set<String> RESERVED = Set.of();
    private static final int CHUNK_BYTES = 1 << 16;

    private final ChannelSelection selection;

    private PlyParticleWriter(ChannelSelection selection) {
        this.selection = selection;
    }

    /**
     * A writer that exports, besides position, velocity, body and id, every channel declared by a plugin (material
     * law or damage model), i.e. everything except the built-in affine, deformation, mass and volume channels. A new
     * plugin's state thus reaches the files without changes here.
     *
     * @return the writer
     */
    public static PlyParticleWriter withPluginChannels() {
        return new PlyParticleWriter(ChannelSelection.plugins("PLY", RESERVED));
    }

    /**
     * A writer that exports exactly the given channels besides position, velocity, body and id.
     *
     * @param channels channel names, e.g. "damage", "deformation"; no duplicates, not "position" or "velocity"
     * @return the writer
     * @throws InvalidInputException with key INCONSISTENT for a duplicate or an always-written channel, MISSING
     *         for a null name
     */
    public static PlyParticleWriter withChannels(List<String> channels) {
        return new PlyParticleWriter(ChannelSelection.of("PLY", RESERVED, channels,
                "always written as x y z / vx vy vz; do not list it"));
    }

    /**
     * @param view particles of a simulation
     * @return the extra channels this writer would export for them, in order
     * @throws InvalidInputException with key UNKNOWN_NAME if an explicitly chosen channel does not exist
     */
    public List<String> channelsFor(ParticleView view) {
        return selection.resolve(view);
    }

    /**
     * Writes the current state of a simulation to a file, atomically (see {@link AtomicFiles}).
     *
     * @param target the .ply file; its folder must exist
     * @param view   the simulation (not modified)
     * @param frame  frame index for the header comment, or -1 for none
     * @throws InvalidInputException with key FILE_ERROR if the file cannot be written, UNKNOWN_NAME for a chosen
     *         channel the particles do not have
     */
    public void write(Path target, SimulationView view, int frame) {
        // Resolve channels before touching the disk, so a bad name leaves no temporary file.
        List<String> chosen = channelsFor(view.particles());
        AtomicFiles.write(target, out -> write(out, view, frame, chosen));
    }

    /**
     * Writes the current state of a simulation to a stream.
     *
     * @param out   destination (not closed)
     * @param view  the simulation (not modified)
     * @param frame frame index for the header comment, or -1 for none
     * @throws IOException if the stream fails
     * @throws InvalidInputException with key UNKNOWN_NAME for a chosen channel the particles do not have
     */
    public void write(OutputStream out, SimulationView view, int frame) throws IOException {
        write(out, view, frame, channelsFor(view.particles()));
    }

    private void write(OutputStream out, SimulationView view, int frame, List<String> chosen) throws IOException {
        ParticleView pv = view.particles();
        int n = pv.size();
        double[] pos = new double[3 * n];
        double[] vel = new double[3 * n];
        pv.copyById(ParticleStore.POSITION, pos, 0);
        pv.copyById(ParticleStore.VELOCITY, vel, 0);
        int[] body = new int[n];
        for (int p = 0; p < n; p++) {
            body[pv.id(p)] = pv.body(p);
        }
        int k = chosen.size();
        double[][] extra = new double[k][];
        int[] width = new int[k];
        int extraDoubles = 0;
        for (int c = 0; c < k; c++) {
            width[c] = pv.spec(chosen.get(c)).width();
            extra[c] = new double[width[c] * n];
            pv.copyById(chosen.get(c), extra[c], 0);
            extraDoubles += width[c];
        }

        out.write(header(view, frame, chosen, n).getBytes(StandardCharsets.US_ASCII));

        int record = 8 * (6 + extraDoubles) + 4 * 2;
        int perChunk = Math.max(1, CHUNK_BYTES / record);
        ByteBuffer buf = ByteBuffer.allocate(perChunk * record).order(ByteOrder.LITTLE_ENDIAN);
        for (int i = 0; i < n; i++) {
            buf.putDouble(pos[3 * i]).putDouble(pos[3 * i + 1]).putDouble(pos[3 * i + 2]);
            buf.putDouble(vel[3 * i]).putDouble(vel[3 * i + 1]).putDouble(vel[3 * i + 2]);
            buf.putInt(body[i]).putInt(i);
            for (int c = 0; c < k; c++) {
                int w = width[c];
                double[] a = extra[c];
                for (int j = 0; j < w; j++) {
                    buf.putDouble(a[w * i + j]);
                }
            }
            if (buf.remaining() < record) {
                out.write(buf.array(), 0, buf.position());
                buf.clear();
            }
        }
        out.write(buf.array(), 0, buf.position());
        out.flush();
    }

    private static String header(SimulationView view, int frame, List<String> chosen, int n) {
        ParticleView pv = view.particles();
        StringBuilder h = new StringBuilder(1024);
        h.append("ply\n");
        h.append("format binary_little_endian 1.0\n");
        h.append("comment Fray particle frame, SI units, particles in stable-id order\n");
        h.append("comment time_s ").append(Double.toString(view.time())).append('\n');
        h.append("comment step ").append(view.stepCount()).append('\n');
        if (frame >= 0) {
            h.append("comment frame ").append(frame).append('\n');
        }
        List<String> bodies = view.bodyNames();
        for (int b = 0; b < bodies.size(); b++) {
            h.append("comment body ").append(b).append(' ').append(oneLine(bodies.get(b))).append('\n');
        }
        h.append("comment unit x y z m\n");
        h.append("comment unit vx vy vz m/s\n");
        h.append("comment unit body index into the body list above\n");
        h.append("comment unit id stable particle id\n");
        for (String c : chosen) {
            ChannelSpec s = pv.spec(c);
            h.append("comment unit ").append(propertyList(s)).append(' ').append(oneLine(s.unit()));
            if (!s.description().isEmpty()) {
                h.append(" (").append(oneLine(s.description())).append(')');
            }
            h.append('\n');
        }
        h.append("element vertex ").append(n).append('\n');
        for (String p : new String[] {"x", "y", "z", "vx", "vy", "vz"}) {
            h.append("property double ").append(p).append('\n');
        }
        h.append("property int body\n");
        h.append("property int id\n");
        for (String c : chosen) {
            ChannelSpec s = pv.spec(c);
            for (int j = 0; j < s.width(); j++) {
                h.append("property double ").append(propertyName(s, j)).append('\n');
            }
        }
        h.append("end_header\n");
        return h.toString();
    }

    /**
     * @param spec      channel declaration
     * @param component component index, in [0, width)
     * @return the PLY property name of that component: the channel name for width 1, else NAME_component
     */
    public static String propertyName(ChannelSpec spec, int component) {
        return spec.width() == 1 ? spec.name() : spec.name() + "_" + component;
    }

    private static String propertyList(ChannelSpec s) {
        if (s.width() == 1) {
            return s.name();
        }
        return propertyName(s, 0) + ".." + propertyName(s, s.width() - 1);
    }

    /** Header lines end at a newline and must stay ASCII, so names and descriptions are flattened. */
    private static String oneLine(String s) {
        StringBuilder b = new StringBuilder(s.length());
        for (int i = 0; i < s.length(); i++) {
            char ch = s.charAt(i);
            b.append(ch < 0x20 || ch > 0x7e ? '?' : ch);
        }
        return b.toString();
    }
}

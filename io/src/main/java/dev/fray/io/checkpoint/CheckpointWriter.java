package dev.fray.io.checkpoint;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.SimulationState;
import dev.fray.io.AtomicFiles;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Map;
import java.util.zip.CRC32C;

/**
 * Writes checkpoints in Fray's own binary format (see {@link CheckpointFormat} for the layout): magic bytes,
 * version, the embedded scene file, the run scalars, a channel table, the particle arrays and attachments, each
 * section with a CRC32C checksum. Files are written through {@link AtomicFiles}, so a checkpoint is either
 * complete or absent. Stateless and thread-safe.
 */
public final class CheckpointWriter {
    private static final int CHUNK = 1 << 16;

    private CheckpointWriter() {
    }

    /**
     * Writes a checkpoint file atomically.
     *
     * @param target the file; its folder must exist
     * @param c      the checkpoint
     * @throws InvalidInputException FILE_ERROR if the file cannot be written, INCONSISTENT for a state whose
     *         arrays do not fit its particle count
     */
    public static void write(Path target, Checkpoint c) {
        check(c);
        AtomicFiles.write(target, out -> write(out, c));
    }

    /**
     * Writes a checkpoint to a stream.
     *
     * @param out destination (not closed)
     * @param c   the checkpoint
     * @throws IOException if the stream fails
     * @throws InvalidInputException INCONSISTENT for a state whose arrays do not fit its particle count
     */
    public static void write(OutputStream out, Checkpoint c) throws IOException {
        check(c);
        SimulationState s = c.state();
        int n = s.size();
        Map<String, double[]> channels = s.channels();
        ByteBuffer buf = ByteBuffer.allocate(CHUNK).order(ByteOrder.LITTLE_ENDIAN);

        ByteBuffer header = ByteBuffer.allocate(CheckpointFormat.HEADER_BYTES).order(ByteOrder.LITTLE_ENDIAN);
        Map<String, byte[]> attachments = new java.util.LinkedHashMap<>(c.attachments());
        if (s.tallies().length > 0) {
            ByteBuffer t = ByteBuffer.allocate(8 * s.tallies().length).order(ByteOrder.LITTLE_ENDIAN);
            for (double v : s.tallies()) {
                t.putDouble(v);
            }
            attachments.put(CheckpointFormat.TALLIES, t.array());
        }
        header.put(CheckpointFormat.MAGIC).putInt(CheckpointFormat.VERSION)
                .putInt(CheckpointFormat.FIXED_SECTIONS + channels.size() + attachments.size());
        CRC32C crc = new CRC32C();
        crc.update(header.array(), 0, 16);
        header.putInt((int) crc.getValue());
        out.write(header.array());

        Section scene = new Section(out, buf, CheckpointFormat.SCENE,
                c.sceneJson().getBytes(StandardCharsets.UTF_8).length);
        scene.bytes(c.sceneJson().getBytes(StandardCharsets.UTF_8));
        scene.end();

        Section run = new Section(out, buf, CheckpointFormat.RUN, CheckpointFormat.RUNS_BYTES);
        run.room(CheckpointFormat.RUNS_BYTES);
        buf.putDouble(s.time()).putLong(s.step()).putDouble(s.dt()).putInt(s.frame())
                .put((byte) (s.frameZeroSent() ? 1 : 0)).put((byte) 0).put((byte) 0).put((byte) 0)
                .putDouble(s.maxSpeed()).putDouble(s.boundaryWork()).putInt(n).putInt(channels.size());
        run.end();

        long tableBytes = 4;
        for (String name : channels.keySet()) {
            tableBytes += 2 + name.getBytes(StandardCharsets.UTF_8).length + 4 + 4;
        }
        Section table = new Section(out, buf, CheckpointFormat.TABLE, tableBytes);
        table.room(4);
        buf.putInt(channels.size());
        for (Map.Entry<String, double[]> e : channels.entrySet()) {
            table.name(e.getKey());
            table.room(8);
            buf.putInt(e.getValue().length / n).putInt(n);
        }
        table.end();

        ints(out, buf, CheckpointFormat.BODY, s.body());
        ints(out, buf, CheckpointFormat.IDS, s.id());
        long[] blockKeys = s.blockKeys();
        int nb = blockKeys.length;
        Section blocks = new Section(out, buf, CheckpointFormat.BLOCKS, nb == 0 ? 4 : 4 + 12L * nb + 4);
        blocks.room(4);
        buf.putInt(nb);
        for (long k : blockKeys) {
            blocks.room(8);
            buf.putLong(k);
        }
        for (int i = 0; nb > 0 && i <= nb; i++) {
            blocks.room(4);
            buf.putInt(s.blockStarts()[i]);
        }
        blocks.end();
        for (double[] a : channels.values()) {
            Section ch = new Section(out, buf, CheckpointFormat.CHANNEL, 8L * a.length);
            for (double v : a) {
                ch.room(8);
                buf.putDouble(v);
            }
            ch.end();
        }
        for (Map.Entry<String, byte[]> e : attachments.entrySet()) {
            byte[] name = e.getKey().getBytes(StandardCharsets.UTF_8);
            Section at = new Section(out, buf, CheckpointFormat.ATTACHMENT, 2L + name.length + e.getValue().length);
            at.name(e.getKey());
            at.bytes(e.getValue());
            at.end();
        }
        out.flush();
    }

    private static void ints(OutputStream out, ByteBuffer buf, String tag, int[] a) throws IOException {
        Section s = new Section(out, buf, tag, 4L * a.length);
        for (int v : a) {
            s.room(4);
            buf.putInt(v);
        }
        s.end();
    }

    private static void check(Checkpoint c) {
        Checks.notNull("checkpoint", c);
        SimulationState s = c.state();
        int n = s.size();
        if (n == 0 || s.body().length != n) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "checkpoint state",
                    "has " + n + " ids and " + s.body().length + " body indices; both must be the same, > 0");
        }
        int nb = s.blockKeys().length;
        if (nb > n || s.blockStarts().length != (nb == 0 ? 0 : nb + 1)) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "checkpoint state",
                    "has " + nb + " particle blocks and " + s.blockStarts().length + " block starts for " + n
                            + " particles; expected at most one block per particle and one start more than blocks");
        }
        if (s.channels().size() > CheckpointFormat.MAX_CHANNELS) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "checkpoint channels", s.channels().size(),
                    "<= " + CheckpointFormat.MAX_CHANNELS);
        }
        for (Map.Entry<String, double[]> e : s.channels().entrySet()) {
            int len = e.getValue().length;
            if (len % n != 0 || len / n < 1 || len / n > 9) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, "checkpoint channel \"" + e.getKey()
                        + "\"", "holds " + len + " values for " + n + " particles; expected 1 to 9 per particle");
            }
            name(e.getKey());
        }
        for (String a : c.attachments().keySet()) {
            name(a);
        }
    }

    private static void name(String name) {
        int len = name.getBytes(StandardCharsets.UTF_8).length;
        if (len < 1 || len > CheckpointFormat.MAX_NAME) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "checkpoint name length (UTF-8 bytes) of \""
                    + name + "\"", len, "1 to " + CheckpointFormat.MAX_NAME);
        }
    }

    /** One section: tag and length first, payload through the shared buffer, then the checksum. */
    private static final class Section {
        private final OutputStream out;
        private final ByteBuffer buf;
        private final CRC32C crc = new CRC32C();
        private final long expected;
        private long written;

        Section(OutputStream out, ByteBuffer buf, String tag, long length) throws IOException {
            this.out = out;
            this.buf = buf;
            this.expected = length;
            buf.clear();
            buf.put(CheckpointFormat.tag(tag)).putLong(length);
            flush();
            written = 0;
        }

        /** Makes room for n more bytes in the buffer. */
        void room(int n) throws IOException {
            if (buf.remaining() < n) {
                flush();
            }
        }

        void bytes(byte[] b) throws IOException {
            int off = 0;
            while (off < b.length) {
                room(1);
                int k = Math.min(buf.remaining(), b.length - off);
                buf.put(b, off, k);
                off += k;
            }
        }

        void name(String s) throws IOException {
            byte[] b = s.getBytes(StandardCharsets.UTF_8);
            room(2);
            buf.putShort((short) b.length);
            bytes(b);
        }

        private void flush() throws IOException {
            crc.update(buf.array(), 0, buf.position());
            out.write(buf.array(), 0, buf.position());
            written += buf.position();
            buf.clear();
        }

        void end() throws IOException {
            flush();
            if (written != expected) {
                throw new IllegalStateException("checkpoint section length " + written + " != " + expected);
            }
            buf.putInt((int) crc.getValue());
            out.write(buf.array(), 0, 4);
            buf.clear();
        }
    }
}

package dev.fray.io.checkpoint;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.SimulationState;

import java.io.ByteArrayInputStream;
import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.CharBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.zip.CRC32C;

/**
 * Reads checkpoints written by {@link CheckpointWriter}. Everything is validated before anything is returned: the
 * magic bytes, the version, every section's tag, length and CRC32C checksum, the sizes of the arrays against the
 * channel table and the particle count, the run scalars, the particle ids (a permutation), and that nothing follows
 * the last section. A truncated or corrupted file is rejected with a message saying what is wrong, never half-read.
 * No allocation exceeds what the file itself holds, so a corrupt length cannot exhaust memory. Stateless and
 * thread-safe.
 */
public final class CheckpointReader {
    private static final int CHUNK = 1 << 16;

    private CheckpointReader() {
    }

    /**
     * One row of the channel table.
     *
     * @param name  channel name
     * @param width components per particle, 1 to 9
     * @param count particles
     */
    public record ChannelEntry(String name, int width, int count) {
    }

    /**
     * What a checkpoint holds, without the particle arrays.
     *
     * @param version     format version
     * @param sceneJson   the embedded scene file text
     * @param time        simulated time, s
     * @param step        steps taken
     * @param dt          last time step, s
     * @param frame       frames reached
     * @param particles   particle count
     * @param channels    the channel table
     * @param attachments attachment names and sizes in bytes
     * @param fileBytes   size of the checkpoint, bytes
     */
    public record Info(int version, String sceneJson, double time, long step, double dt, int frame, int particles,
                       List<ChannelEntry> channels, Map<String, Long> attachments, long fileBytes) {
    }

    /**
     * @param file a checkpoint file
     * @return its content, fully validated
     * @throws InvalidInputException FILE_ERROR (file, what is wrong) for a missing, truncated, corrupt or foreign
     *         file
     */
    public static Checkpoint read(Path file) {
        return (Checkpoint) readFile(file, true);
    }

    /**
     * Reads and validates a checkpoint but keeps only its summary; the arrays are checked and dropped.
     *
     * @param file a checkpoint file
     * @return what it holds
     * @throws InvalidInputException FILE_ERROR as {@link #read(Path)}
     */
    public static Info info(Path file) {
        return (Info) readFile(file, false);
    }

    /**
     * @param data the bytes of a checkpoint
     * @param name what to call them in messages
     * @return the content, fully validated
     * @throws InvalidInputException FILE_ERROR as {@link #read(Path)}
     */
    public static Checkpoint read(byte[] data, String name) {
        Checks.notNull("checkpoint bytes", data);
        try {
            return (Checkpoint) new Parse(new ByteArrayInputStream(data), data.length, name, true).run();
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, name, "cannot read: " + e);
        }
    }

    private static Object readFile(Path file, boolean keep) {
        Checks.notNull("checkpoint file", file);
        try (InputStream in = Files.newInputStream(file)) {
            return new Parse(in, Files.size(file), file.toString(), keep).run();
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "no such checkpoint file");
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "cannot read: " + e);
        }
    }

    /** One pass over one file. */
    private static final class Parse {
        private final InputStream in;
        private final long size;
        private final String name;
        private final boolean keep;
        private final byte[] chunk = new byte[CHUNK];
        private long pos;
        private int section;
        private String tag = "header";

        Parse(InputStream in, long size, String name, boolean keep) {
            this.in = in;
            this.size = size;
            this.name = name;
            this.keep = keep;
        }

        private InvalidInputException bad(String why) {
            String where = section == 0 ? "" : String.format(Locale.ROOT, "section %d (%s): ", section, tag);
            return new InvalidInputException(FrayMessage.FILE_ERROR, name, "not a usable checkpoint: " + where + why);
        }

        private void readFully(byte[] b, int off, int len) throws IOException {
            int done = 0;
            while (done < len) {
                int k = in.read(b, off + done, len - done);
                if (k < 0) {
                    throw new EOFException();
                }
                done += k;
            }
            pos += len;
        }

        Object run() throws IOException {
            byte[] header = new byte[CheckpointFormat.HEADER_BYTES];
            if (size < header.length) {
                int have = (int) Math.max(0, size);
                try {
                    readFully(header, 0, have);
                } catch (EOFException e) {
                    have = 0;
                }
                if (!startsWithMagic(header, have)) {
                    throw bad("the file does not start with the checkpoint magic bytes (not a Fray checkpoint)");
                }
                throw bad("truncated: the file ends inside the " + header.length + "-byte header (" + size
                        + " bytes)");
            }
            readFully(header, 0, header.length);
            if (!startsWithMagic(header, 8)) {
                throw bad("the file does not start with the checkpoint magic bytes (not a Fray checkpoint)");
            }
            ByteBuffer h = ByteBuffer.wrap(header).order(ByteOrder.LITTLE_ENDIAN);
            int version = h.getInt(8);
            int sections = h.getInt(12);
            CRC32C crc = new CRC32C();
            crc.update(header, 0, 16);
            if ((int) crc.getValue() != h.getInt(16)) {
                throw bad("header checksum mismatch: the file is corrupt");
            }
            if (version != CheckpointFormat.VERSION) {
                throw bad("format version " + Integer.toUnsignedString(version) + "; this reader reads version "
                        + CheckpointFormat.VERSION);
            }
            int fixed = CheckpointFormat.FIXED_SECTIONS;
            if (sections < fixed || sections > fixed + 2 * CheckpointFormat.MAX_CHANNELS) {
                throw bad("the header lists " + Integer.toUnsignedString(sections) + " sections; a checkpoint has "
                        + fixed + " plus one per channel and attachment");
            }

            String scene = utf8(expect(CheckpointFormat.SCENE), "the scene text");
            ByteBuffer run = ByteBuffer.wrap(expect(CheckpointFormat.RUN)).order(ByteOrder.LITTLE_ENDIAN);
            if (run.capacity() != CheckpointFormat.RUNS_BYTES) {
                throw bad("holds " + run.capacity() + " bytes; the run section has " + CheckpointFormat.RUNS_BYTES);
            }
            double time = run.getDouble();
            long step = run.getLong();
            double dt = run.getDouble();
            int frame = run.getInt();
            byte zeroSent = run.get();
            boolean padOk = run.get() == 0 && run.get() == 0 && run.get() == 0;
            double maxSpeed = run.getDouble();
            double work = run.getDouble();
            int n = run.getInt();
            int channelCount = run.getInt();
            if (!(Double.isFinite(time) && time >= 0 && step >= 0 && Double.isFinite(dt) && dt >= 0 && frame >= 0
                    && (zeroSent == 0 || zeroSent == 1) && padOk && Double.isFinite(maxSpeed) && maxSpeed >= 0
                    && Double.isFinite(work))) {
                throw bad("run values out of range (time " + time + " s, step " + step + ", dt " + dt + " s, frame "
                        + frame + ", max speed " + maxSpeed + " m/s): the file is corrupt");
            }
            if (n < 1 || n > Integer.MAX_VALUE / 9) {
                throw bad("particle count " + n + " out of range");
            }
            if (channelCount < 1 || channelCount > CheckpointFormat.MAX_CHANNELS
                    || fixed + channelCount > sections) {
                throw bad("channel count " + channelCount + " does not fit the " + sections + " sections");
            }

            ByteBuffer table = ByteBuffer.wrap(expect(CheckpointFormat.TABLE)).order(ByteOrder.LITTLE_ENDIAN);
            List<ChannelEntry> entries = new ArrayList<>();
            try {
                if (table.getInt() != channelCount) {
                    throw bad("the table lists a different channel count than the run section (" + channelCount
                            + ")");
                }
                for (int c = 0; c < channelCount; c++) {
                    String ch = name(table);
                    int width = table.getInt();
                    int count = table.getInt();
                    if (width < 1 || width > 9 || count != n) {
                        throw bad("channel \"" + ch + "\" has width " + width + " and count " + count
                                + "; expected width 1 to 9 and count " + n);
                    }
                    for (ChannelEntry e : entries) {
                        if (e.name().equals(ch)) {
                            throw bad("channel \"" + ch + "\" is listed twice");
                        }
                    }
                    entries.add(new ChannelEntry(ch, width, count));
                }
            } catch (java.nio.BufferUnderflowException e) {
                throw bad("the channel table ends early: the file is corrupt");
            }
            if (table.hasRemaining()) {
                throw bad(table.remaining() + " stray bytes after the channel table");
            }

            int[] body = ints(expect(CheckpointFormat.BODY, 4L * n), n);
            int[] ids = ints(expect(CheckpointFormat.IDS, 4L * n), n);
            boolean[] seen = new boolean[n];
            for (int p = 0; p < n; p++) {
                int id = ids[p];
                if (id < 0 || id >= n || seen[id]) {
                    throw bad("particle id " + id + " at index " + p + " is out of range or repeated");
                }
                seen[id] = true;
                if (body[p] < 0) {
                    throw bad("negative body index " + body[p] + " at particle " + p);
                }
            }
            ByteBuffer blocks = ByteBuffer.wrap(expect(CheckpointFormat.BLOCKS)).order(ByteOrder.LITTLE_ENDIAN);
            int nb = blocks.capacity() >= 4 ? blocks.getInt() : -1;
            if (nb < 0 || nb > n || blocks.capacity() != (nb == 0 ? 4 : 4 + 12L * nb + 4)) {
                throw bad("the block table holds " + blocks.capacity() + " bytes for " + nb + " blocks; expected "
                        + "0 to " + n + " blocks, 4 + 12 per block + 4 bytes: the file is corrupt");
            }
            long[] blockKeys = new long[nb];
            int[] blockStarts = new int[nb == 0 ? 0 : nb + 1];
            blocks.asLongBuffer().get(blockKeys);
            blocks.position(4 + 8 * nb);
            blocks.asIntBuffer().get(blockStarts);
            for (int r = 0; r < nb; r++) {
                if (blockStarts[r] < 0 || blockStarts[r + 1] <= blockStarts[r] || blockStarts[nb] != n
                        || (r > 0 && blockKeys[r] <= blockKeys[r - 1])) {
                    throw bad("block " + r + " of the block table is out of order: the file is corrupt");
                }
            }

            Map<String, double[]> channels = new LinkedHashMap<>();
            for (ChannelEntry e : entries) {
                channels.put(e.name(), doubles((long) e.width() * n));
            }

            Map<String, byte[]> attachments = new LinkedHashMap<>();
            Map<String, Long> attachmentSizes = new LinkedHashMap<>();
            for (int a = fixed + channelCount; a < sections; a++) {
                ByteBuffer at = ByteBuffer.wrap(expect(CheckpointFormat.ATTACHMENT)).order(ByteOrder.LITTLE_ENDIAN);
                String an;
                try {
                    an = name(at);
                } catch (java.nio.BufferUnderflowException e) {
                    throw bad("the attachment name ends early: the file is corrupt");
                }
                if (attachments.containsKey(an)) {
                    throw bad("attachment \"" + an + "\" appears twice");
                }
                byte[] content = Arrays.copyOfRange(at.array(), at.position(), at.capacity());
                attachments.put(an, content);
                attachmentSizes.put(an, (long) content.length);
            }
            section = 0;
            if (in.read() >= 0 || pos != size) {
                throw bad("unexpected bytes after the last of the " + sections + " sections");
            }
            attachmentSizes.remove(CheckpointFormat.TALLIES);
            if (!keep) {
                return new Info(version, scene, time, step, dt, frame, n, List.copyOf(entries),
                        java.util.Collections.unmodifiableMap(attachmentSizes), size);
            }
            byte[] talliesBytes = attachments.remove(CheckpointFormat.TALLIES);
            double[] tallies = new double[0];
            if (talliesBytes != null) {
                if (talliesBytes.length % 8 != 0) {
                    throw bad("the tallies attachment holds " + talliesBytes.length
                            + " bytes, not a whole number of doubles: the file is corrupt");
                }
                tallies = new double[talliesBytes.length / 8];
                ByteBuffer.wrap(talliesBytes).order(ByteOrder.LITTLE_ENDIAN).asDoubleBuffer().get(tallies);
            }
            SimulationState state = new SimulationState(time, step, dt, frame, zeroSent == 1, maxSpeed, work,
                    channels, body, ids, blockKeys, blockStarts, tallies);
            return new Checkpoint(scene, state, attachments);
        }

        private static boolean startsWithMagic(byte[] b, int have) {
            int k = Math.min(have, CheckpointFormat.MAGIC.length);
            if (k == 0) {
                return false;
            }
            for (int i = 0; i < k; i++) {
                if (b[i] != CheckpointFormat.MAGIC[i]) {
                    return false;
                }
            }
            return true;
        }

        /** Reads the next section's tag and length, checking the tag and that the length fits the file. */
        private long open(String expected) throws IOException {
            section++;
            tag = expected;
            byte[] head = new byte[12];
            if (size - pos < head.length + 4) {
                throw bad("truncated: the file ends " + (size - pos) + " bytes into this section");
            }
            readFully(head, 0, head.length);
            String found = new String(head, 0, 4, StandardCharsets.ISO_8859_1);
            if (!found.equals(expected)) {
                throw bad("found tag \"" + printable(found) + "\" where \"" + expected + "\" belongs: the file is "
                        + "corrupt");
            }
            long len = ByteBuffer.wrap(head, 4, 8).order(ByteOrder.LITTLE_ENDIAN).getLong();
            if (len < 0 || len > size - pos - 4) {
                throw bad("claims " + Long.toUnsignedString(len) + " bytes but only " + Math.max(0, size - pos - 4)
                        + " remain: truncated or corrupt");
            }
            crc.reset();
            crc.update(head, 0, head.length);
            return len;
        }

        private final CRC32C crc = new CRC32C();

        private void close() throws IOException {
            byte[] sum = new byte[4];
            readFully(sum, 0, 4);
            int stored = ByteBuffer.wrap(sum).order(ByteOrder.LITTLE_ENDIAN).getInt();
            if (stored != (int) crc.getValue()) {
                throw bad("checksum mismatch: the file is corrupt");
            }
        }

        private byte[] expect(String t) throws IOException {
            long len = open(t);
            if (len > Integer.MAX_VALUE - 16) {
                throw bad("is too large (" + len + " bytes)");
            }
            byte[] b = new byte[(int) len];
            readFully(b, 0, b.length);
            crc.update(b, 0, b.length);
            close();
            return b;
        }

        private byte[] expect(String t, long wanted) throws IOException {
            byte[] b = expect(t);
            if (b.length != wanted) {
                throw bad("holds " + b.length + " bytes; the particle count needs " + wanted);
            }
            return b;
        }

        /** A channel section read straight into a double array (dropped unless kept). */
        private double[] doubles(long count) throws IOException {
            long len = open(CheckpointFormat.CHANNEL);
            if (len != 8 * count) {
                throw bad("holds " + len + " bytes; the channel table needs " + 8 * count);
            }
            double[] out = keep ? new double[(int) count] : null;
            long done = 0;
            int off = 0;
            while (done < len) {
                int k = (int) Math.min(chunk.length, len - done);
                readFully(chunk, 0, k);
                crc.update(chunk, 0, k);
                if (out != null) {
                    ByteBuffer.wrap(chunk, 0, k).order(ByteOrder.LITTLE_ENDIAN).asDoubleBuffer().get(out, off, k / 8);
                }
                off += k / 8;
                done += k;
            }
            close();
            return out;
        }

        private static int[] ints(byte[] b, int n) {
            int[] out = new int[n];
            ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN).asIntBuffer().get(out);
            return out;
        }

        private String name(ByteBuffer b) {
            int len = b.getShort() & 0xffff;
            if (len < 1 || len > CheckpointFormat.MAX_NAME || len > b.remaining()) {
                throw bad("a name of " + len + " bytes does not fit: the file is corrupt");
            }
            byte[] s = new byte[len];
            b.get(s);
            return utf8(s, "a name");
        }

        private String utf8(byte[] b, String what) {
            try {
                CharBuffer c = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                        .onUnmappableCharacter(CodingErrorAction.REPORT).decode(ByteBuffer.wrap(b));
                return c.toString();
            } catch (CharacterCodingException e) {
                throw bad(what + " is not valid UTF-8: the file is corrupt");
            }
        }

        private static String printable(String s) {
            StringBuilder b = new StringBuilder();
            for (char c : s.toCharArray()) {
                b.append(c >= 0x20 && c < 0x7f ? c : '?');
            }
            return b.toString();
        }
    }
}

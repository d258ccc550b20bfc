package dev.fray.io.checkpoint;

import java.nio.charset.StandardCharsets;

/**
 * Layout of a Fray checkpoint file (version {@value #VERSION}), all integers and doubles little-endian:
 *
 * <pre>
 *   header   magic (8 bytes: 0x89 'F' 'R' 'A' 'Y' 'C' 'P' 0x0A), version u32, section count u32,
 *            CRC32C u32 of the 16 bytes before it
 *   sections each: tag (4 ASCII bytes), payload length u64, payload, CRC32C u32 of tag + length + payload
 * </pre>
 *
 * Sections, in this order:
 * <pre>
 *   SCEN  the scene file text, UTF-8
 *   RUNS  time f64 (s), step i64, dt f64 (s), frame i32, frame-0-sent u8, 3 zero bytes, max speed f64 (m/s),
 *         boundary work f64 (J), particle count i32, channel count i32
 *   CTAB  channel count u32, then per channel: name length u16, name (UTF-8), width u32, particle count u32
 *   BODY  body index per particle, i32 each
 *   IDNT  stable id per particle, i32 each
 *   CHNL  one per channel, in table order: width x count doubles
 *   ATCH  zero or more: name length u16, name (UTF-8), then the attachment's bytes
 * </pre>
 * The first byte is not ASCII and the magic ends in a line feed, so a file mangled by a text-mode transfer fails
 * the magic check. Every section carries its own checksum, so corruption is found before any of it is used.
 */
final class CheckpointFormat {
    /** Format version written; the reader accepts exactly this one. */
    static final int VERSION = 2;
    /**
     * Name of the attachment holding the run's energy and boundary tallies (damping loss, contact loss, initial
     * energy, then impulse and work per grip and obstacle; little-endian doubles). A checkpoint without it resumes
     * with the tallies restarted at 0; readers hand it to the state, not to the caller's attachments.
     */
    static final String TALLIES = "fray.tallies";
    static final byte[] MAGIC = {(byte) 0x89, 'F', 'R', 'A', 'Y', 'C', 'P', 0x0A};
    static final int HEADER_BYTES = 20;
    static final int RUNS_BYTES = 56;
    static final String SCENE = "SCEN";
    static final String RUN = "RUNS";
    static final String TABLE = "CTAB";
    static final String BODY = "BODY";
    static final String IDS = "IDNT";
    static final String BLOCKS = "BLKS";
    static final String CHANNEL = "CHNL";
    /** Sections before the channels: SCEN, RUNS, CTAB, BODY, IDNT, BLKS. */
    static final int FIXED_SECTIONS = 6;
    static final String ATTACHMENT = "ATCH";
    /** Most channels a checkpoint may list. */
    static final int MAX_CHANNELS = 1024;
    /** Longest channel or attachment name, bytes. */
    static final int MAX_NAME = 255;

    private CheckpointFormat() {
    }

    static byte[] tag(String t) {
        return t.getBytes(StandardCharsets.US_ASCII);
    }
}

/**
 * Checkpoints in Fray's own binary format: magic bytes, version, the scene file embedded (so a run can resume
 * from the checkpoint alone), the run scalars, a channel table, the particle arrays and attachments, every section
 * protected by a CRC32C checksum. {@link dev.fray.io.checkpoint.CheckpointWriter} writes them atomically,
 * {@link dev.fray.io.checkpoint.CheckpointReader} validates everything before returning anything, and
 * {@link dev.fray.io.checkpoint.CheckpointListener} writes one every N frames of a run. A run resumed from a
 * checkpoint continues bitwise identically to one that never stopped.
 *
 * <p>Layout of format version 2, all integers and doubles little-endian:
 * <pre>
 *   header   magic (8 bytes: 0x89 'F' 'R' 'A' 'Y' 'C' 'P' 0x0A), version u32, section count u32,
 *            CRC32C u32 of the 16 bytes before it
 *   sections each: tag (4 ASCII bytes), payload length u64, payload, CRC32C u32 of tag + length + payload
 *
 *   SCEN  the scene file text, UTF-8
 *   RUNS  time f64 (s), step i64, dt f64 (s), frame i32, frame-0-sent u8, 3 zero bytes, max speed f64 (m/s),
 *         boundary work f64 (J), particle count i32, channel count i32
 *   CTAB  channel count u32, then per channel: name length u16, name (UTF-8), width u32, particle count u32
 *   BODY  body index per particle, i32 each
 *   IDNT  stable id per particle, i32 each
 *   BLKS  the solver's particle blocks: block count u32 (0 if the particles are to be sorted before the next step),
 *         then per block its packed block coordinates i64, then the first particle of each block and the particle
 *         count, (block count + 1) x i32 (absent when the count is 0)
 *   CHNL  one per channel, in table order: width x count f64
 *   ATCH  zero or more: name length u16, name (UTF-8), then the attachment's bytes
 * </pre>
 * The section count is 6 plus one per channel and attachment; nothing may follow the last section.
 */
package dev.fray.io.checkpoint;

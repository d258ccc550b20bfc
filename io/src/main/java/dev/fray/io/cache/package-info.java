/**
 * Per-frame and per-step outputs of a run: binary little-endian PLY particle frames
 * ({@link dev.fray.io.cache.PlyParticleWriter}, {@link dev.fray.io.cache.PlyFrameWriter}) and the diagnostics
 * table as CSV ({@link dev.fray.io.cache.DiagnosticsCsvWriter}), and VTK XML PolyData frames with a .pvd time
 * series ({@link dev.fray.io.cache.VtpParticleWriter}, {@link dev.fray.io.cache.VtpFrameWriter},
 * {@link dev.fray.io.cache.PvdCollection}). All values are in SI units; every file is written
 * through {@link dev.fray.io.AtomicFiles}.
 */
package dev.fray.io.cache;

package dev.fray.examples.cli;

import dev.fray.core.sim.FrameListener;
import dev.fray.core.sim.SimulationView;
import dev.fray.io.cache.PvdCollection;
import dev.fray.io.cache.VtpFrameWriter;
import dev.fray.io.cache.VtpParticleWriter;

import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Writes {@code frame_NNNNN.vtp} per frame and keeps {@code frames.pvd} listing them, like {@link VtpFrameWriter}
 * (same file names), but a resumed run first lists the frames written before the checkpoint, so the series it
 * leaves equals the uninterrupted run's. Frame k sits at time k / frameRate exactly: frames are landed on.
 */
final class VtpSeries implements FrameListener {
    private final Path dir;
    private final VtpParticleWriter writer;
    private final PvdCollection collection;

    /**
     * @param dir        output folder (exists)
     * @param writer     the per-frame writer
     * @param frameRate  frames per second, 1/s
     * @param firstFrame the frame the run starts from; earlier frames whose files exist are listed
     */
    VtpSeries(Path dir, VtpParticleWriter writer, double frameRate, int firstFrame) {
        this.dir = dir;
        this.writer = writer;
        this.collection = new PvdCollection(dir.resolve(VtpFrameWriter.COLLECTION_FILE));
        for (int k = 0; k <= firstFrame && firstFrame > 0; k++) {
            String name = VtpFrameWriter.fileName(k);
            if (Files.isRegularFile(dir.resolve(name))) {
                collection.put(k, k / frameRate, name);
            }
        }
    }

    @Override
    public void onFrame(int frame, double time, SimulationView view, boolean isLast) {
        String name = VtpFrameWriter.fileName(frame);
        writer.write(dir.resolve(name), view, frame);
        collection.put(frame, time, name);
        collection.write();
    }
}

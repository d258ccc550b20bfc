package dev.fray.io.cache;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.FrameListener;
import dev.fray.core.sim.SimulationView;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

/**
 * Frame listener that writes every frame to {@code DIR/frame_NNNNN.ply} (five digits, more when needed) with a
 * {@link PlyParticleWriter}. Frame 0 is the initial state. Each file is written atomically.
 */
public final class PlyFrameWriter implements FrameListener {
    private final Path dir;
    private final PlyParticleWriter writer;
    private int written;

    /**
     * @param dir    output folder, created if missing
     * @param writer the per-frame writer
     * @throws InvalidInputException with key FILE_ERROR if the folder cannot be created, MISSING for null arguments
     */
    public PlyFrameWriter(Path dir, PlyParticleWriter writer) {
        if (dir == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "PLY output folder");
        }
        if (writer == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "PLY writer");
        }
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, dir.toString(),
                    "cannot create the output folder: " + e);
        }
        this.dir = dir;
        this.writer = writer;
    }

    /**
     * @param frame frame index, &gt;= 0
     * @return the file of that frame in this writer's folder
     */
    public Path fileOf(int frame) {
        return dir.resolve(fileName(frame));
    }

    /**
     * @param frame frame index, &gt;= 0
     * @return "frame_%05d.ply"
     */
    public static String fileName(int frame) {
        return String.format(Locale.ROOT, "frame_%05d.ply", frame);
    }

    /** @return how many frames this writer has written */
    public int framesWritten() {
        return written;
    }

    /** {@inheritDoc} */
    @Override
    public void onFrame(int frame, double time, SimulationView view, boolean isLast) {
        writer.write(fileOf(frame), view, frame);
        written++;
    }
}

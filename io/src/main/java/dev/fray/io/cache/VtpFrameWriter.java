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
 * Frame listener that writes every frame to {@code DIR/frame_NNNNN.vtp} (five digits, more when needed) with a
 * {@link VtpParticleWriter}, then rewrites the collection {@code DIR/frames.pvd} ({@link PvdCollection}) so that it
 * lists exactly the frames whose files are complete. Both are written atomically: the .vtp first, the .pvd after
 * it, so a viewer opening the collection mid-run never meets a missing or half-written frame.
 *
 * <p>The collection lists the frames written by this listener (a frame index seen again replaces its entry).
 * Not thread-safe; the simulation calls it from one thread.
 */
public final class VtpFrameWriter implements FrameListener {
    /** Name of the collection file inside the output folder. */
    public static final String COLLECTION_FILE = "frames.pvd";

    private final Path dir;
    private final VtpParticleWriter writer;
    private final PvdCollection collection;
    private int written;

    /**
     * @param dir    output folder, created if missing
     * @param writer the per-frame writer
     * @throws InvalidInputException FILE_ERROR if the folder cannot be created, MISSING for null arguments
     */
    public VtpFrameWriter(Path dir, VtpParticleWriter writer) {
        if (dir == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "VTP output folder");
        }
        if (writer == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "VTP writer");
        }
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, dir.toString(),
                    "cannot create the output folder: " + e);
        }
        this.dir = dir;
        this.writer = writer;
        this.collection = new PvdCollection(dir.resolve(COLLECTION_FILE));
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
     * @return "frame_%05d.vtp"
     */
    public static String fileName(int frame) {
        return String.format(Locale.ROOT, "frame_%05d.vtp", frame);
    }

    /** @return the .pvd collection file */
    public Path collectionFile() {
        return collection.file();
    }

    /** @return how many frames this writer has written */
    public int framesWritten() {
        return written;
    }

    /** {@inheritDoc} */
    @Override
    public void onFrame(int frame, double time, SimulationView view, boolean isLast) {
        writer.write(fileOf(frame), view, frame);
        collection.put(frame, time, fileName(frame));
        collection.write();
        written++;
    }
}

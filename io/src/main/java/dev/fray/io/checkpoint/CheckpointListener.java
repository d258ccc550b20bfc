package dev.fray.io.checkpoint;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.FrameListener;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationView;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.Supplier;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;

/**
 * Frame listener that writes a checkpoint every N frames, and at the last frame of a run, to
 * {@code DIR/checkpoint_NNNNN.fcp} (the frame number, five digits or more), each file atomically. After each
 * write it deletes all but the newest K checkpoints in the folder, so a run that diverges or is killed always
 * leaves its last good one. Attachments (for example the diagnostics table so far) are asked for at each
 * checkpoint, after the {@link #beforeEach} actions have run. Not thread-safe: belongs to one simulation.
 */
public final class CheckpointListener implements FrameListener {
    /** Name pattern of checkpoint files; group 1 is the frame number. */
    public static final Pattern FILE_PATTERN = Pattern.compile("checkpoint_(\\d{5,})\\.fcp");

    private final Simulation sim;
    private final Path dir;
    private final String sceneJson;
    private final int every;
    private final int keep;
    private final Map<String, Supplier<byte[]>> attachments = new LinkedHashMap<>();
    private final List<Runnable> before = new ArrayList<>();
    private Path last;
    private int written;

    /**
     * @param sim       the simulation whose state is saved (the listener must be added to it)
     * @param dir       output folder (must exist)
     * @param sceneJson the scene file text the simulation was made from
     * @param every     frames between checkpoints, &gt;= 1
     * @param keep      newest checkpoints kept in the folder, 0 for all
     * @throws InvalidInputException OUT_OF_RANGE for bad counts, MISSING for null arguments
     */
    public CheckpointListener(Simulation sim, Path dir, String sceneJson, int every, int keep) {
        this.sim = Checks.notNull("simulation", sim);
        this.dir = Checks.notNull("checkpoint folder", dir);
        this.sceneJson = Checks.notNull("scene text", sceneJson);
        this.every = Checks.inRange("checkpoint interval (frames)", every, 1, Integer.MAX_VALUE);
        this.keep = Checks.inRange("checkpoints kept", keep, 0, Integer.MAX_VALUE);
    }

    /**
     * @param frame frame number, &gt;= 0
     * @return "checkpoint_%05d.fcp"
     */
    public static String fileName(int frame) {
        return String.format(Locale.ROOT, "checkpoint_%05d.fcp", frame);
    }

    /**
     * @param name    attachment name, 1 to 255 UTF-8 bytes
     * @param content asked for at every checkpoint
     * @return this
     */
    public CheckpointListener attach(String name, Supplier<byte[]> content) {
        attachments.put(Checks.notNull("attachment name", name), Checks.notNull("attachment", content));
        return this;
    }

    /**
     * @param action run before each checkpoint is taken (e.g. publishing a file that is then attached)
     * @return this
     */
    public CheckpointListener beforeEach(Runnable action) {
        before.add(Checks.notNull("action", action));
        return this;
    }

    /** @return the newest checkpoint this listener wrote, or null */
    public Path lastWritten() {
        return last;
    }

    /** @return how many checkpoints this listener wrote */
    public int written() {
        return written;
    }

    /** {@inheritDoc} Writes at frames divisible by the interval and at the last frame of a run (never frame 0). */
    @Override
    public void onFrame(int frame, double time, SimulationView view, boolean isLast) {
        if (frame == 0 || (frame % every != 0 && !isLast)) {
            return;
        }
        for (Runnable r : before) {
            r.run();
        }
        Map<String, byte[]> att = new LinkedHashMap<>();
        for (Map.Entry<String, Supplier<byte[]>> e : attachments.entrySet()) {
            att.put(e.getKey(), e.getValue().get());
        }
        Path target = dir.resolve(fileName(frame));
        CheckpointWriter.write(target, new Checkpoint(sceneJson, sim.captureState(), att));
        last = target;
        written++;
        prune();
    }

    /**
     * @param dir a folder
     * @return its checkpoint files, oldest frame first
     * @throws InvalidInputException FILE_ERROR if the folder cannot be listed
     */
    public static List<Path> list(Path dir) {
        List<Path> out = new ArrayList<>();
        try (Stream<Path> s = Files.list(dir)) {
            s.filter(p -> FILE_PATTERN.matcher(p.getFileName().toString()).matches()).forEach(out::add);
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, dir.toString(), "cannot list: " + e);
        }
        out.sort((a, b) -> Long.compare(frameOf(a), frameOf(b)));
        return out;
    }

    /**
     * @param file a checkpoint file named by {@link #fileName}
     * @return its frame number
     */
    public static long frameOf(Path file) {
        Matcher m = FILE_PATTERN.matcher(file.getFileName().toString());
        if (!m.matches()) {
            return -1;
        }
        try {
            return Long.parseLong(m.group(1));
        } catch (NumberFormatException e) {
            return Long.MAX_VALUE;
        }
    }

    private void prune() {
        if (keep == 0) {
            return;
        }
        List<Path> all = list(dir);
        for (int i = 0; i < all.size() - keep; i++) {
            try {
                Files.deleteIfExists(all.get(i));
            } catch (IOException e) {
                throw new InvalidInputException(FrayMessage.FILE_ERROR, e, all.get(i).toString(),
                        "cannot delete an old checkpoint: " + e);
            }
        }
    }
}

package dev.fray.io.scene;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.util.Collections;
import java.util.EnumSet;
import java.util.List;
import java.util.Set;

/**
 * What a run of a scene writes and for how long: the {@code output} block of a scene file. Immutable; derive
 * variants with the {@code with...} methods.
 *
 * @param frames           frames to simulate after the initial one, 1 to {@value #MAX_FRAMES}
 * @param formats          outputs to write (not empty)
 * @param channels         particle channels written besides position, velocity, body and id; null means every
 *                         channel declared by a material law or damage model
 * @param checkpointEvery  write a checkpoint every this many frames, 0 for none, at most {@value #MAX_FRAMES}
 * @param keepCheckpoints  how many of the newest checkpoints to keep, 0 for all, at most 1000
 * @param diagnosticsEvery write a diagnostics row every this many steps, 1 to 1e9
 */
public record OutputSettings(int frames, Set<OutputFormat> formats, List<String> channels, int checkpointEvery,
                             int keepCheckpoints, int diagnosticsEvery) {
    /** Largest frame count a scene may ask for. */
    public static final int MAX_FRAMES = 1_000_000;
    /** Default frame count: one second at the default 24 frames per second. */
    public static final int DEFAULT_FRAMES = 24;
    /** Default checkpoint interval, frames. */
    public static final int DEFAULT_CHECKPOINT_EVERY = 10;
    /** Default number of checkpoints kept. */
    public static final int DEFAULT_KEEP_CHECKPOINTS = 2;

    /** Validates and freezes the settings. */
    public OutputSettings {
        Checks.inRange("output.frames", frames, 1, MAX_FRAMES);
        Checks.notNull("output.formats", formats);
        if (formats.isEmpty()) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "output.formats", "[]",
                    "at least one of ply, vtp, csv");
        }
        formats = Collections.unmodifiableSet(EnumSet.copyOf(formats));
        channels = channels == null ? null : List.copyOf(channels);
        Checks.inRange("output.checkpointEvery (frames)", checkpointEvery, 0, MAX_FRAMES);
        Checks.inRange("output.keepCheckpoints", keepCheckpoints, 0, 1000);
        Checks.inRange("output.diagnosticsEvery (steps)", diagnosticsEvery, 1, 1_000_000_000);
    }

    /** @return the defaults: {@value #DEFAULT_FRAMES} frames, PLY and CSV, plugin channels, checkpoints every 10 */
    public static OutputSettings defaults() {
        return new OutputSettings(DEFAULT_FRAMES, EnumSet.of(OutputFormat.PLY, OutputFormat.CSV), null,
                DEFAULT_CHECKPOINT_EVERY, DEFAULT_KEEP_CHECKPOINTS, 1);
    }

    /**
     * @param n frames after the initial one
     * @return a copy with this frame count
     */
    public OutputSettings withFrames(int n) {
        return new OutputSettings(n, formats, channels, checkpointEvery, keepCheckpoints, diagnosticsEvery);
    }

    /**
     * @param f the outputs to write
     * @return a copy with these formats
     */
    public OutputSettings withFormats(Set<OutputFormat> f) {
        return new OutputSettings(frames, f, channels, checkpointEvery, keepCheckpoints, diagnosticsEvery);
    }

    /**
     * @param c channel names, or null for every plugin channel
     * @return a copy with these channels
     */
    public OutputSettings withChannels(List<String> c) {
        return new OutputSettings(frames, formats, c, checkpointEvery, keepCheckpoints, diagnosticsEvery);
    }

    /**
     * @param every checkpoint interval in frames, 0 for none
     * @param keep  newest checkpoints to keep, 0 for all
     * @return a copy with this checkpoint policy
     */
    public OutputSettings withCheckpoints(int every, int keep) {
        return new OutputSettings(frames, formats, channels, every, keep, diagnosticsEvery);
    }

    /**
     * @param steps diagnostics interval in steps
     * @return a copy with this interval
     */
    public OutputSettings withDiagnosticsEvery(int steps) {
        return new OutputSettings(frames, formats, channels, checkpointEvery, keepCheckpoints, steps);
    }
}

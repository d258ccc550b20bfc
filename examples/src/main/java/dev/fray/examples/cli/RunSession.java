package dev.fray.examples.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.error.SimulationDivergedException;
import dev.fray.core.sim.FrameListener;
import dev.fray.core.sim.RunSummary;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.core.sim.SimulationView;
import dev.fray.io.AtomicFiles;
import dev.fray.io.cache.DiagnosticsCsvWriter;
import dev.fray.io.cache.PlyFrameWriter;
import dev.fray.io.cache.PlyParticleWriter;
import dev.fray.io.cache.VtpParticleWriter;
import dev.fray.io.checkpoint.CheckpointListener;
import dev.fray.io.result.CrackBand;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.OutputFormat;
import dev.fray.io.scene.OutputSettings;
import dev.fray.io.scene.SceneWriter;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.io.PrintWriter;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Pattern;
import java.util.stream.Stream;

/**
 * One run of a scene into an output folder, fresh or resumed from a checkpoint: sets up the writers the scene's
 * output settings ask for (PLY frames, VTP frames with a .pvd series, the diagnostics CSV), checkpoints every N
 * frames, the progress line, runs, and writes {@value #SUMMARY_FILE} at the end (also after a divergence), with the
 * crack band of {@link CrackBand} at the last frame and its width at every frame of the run.
 *
 * <p>Resuming reproduces the uninterrupted run's files byte for byte: the simulation continues bitwise
 * identically, frames are rewritten identically, the .pvd series is seeded with the earlier frames, and the
 * diagnostics table continues from the copy the checkpoint carries (see {@link #continueDiagnostics}).
 */
final class RunSession {
    /** Name of the run summary written next to the outputs. */
    static final String SUMMARY_FILE = "summary.json";
    /** Attachment holding the diagnostics table up to the checkpoint. */
    static final String DIAGNOSTICS_ATTACHMENT = "diagnostics.csv";
    /** Prefix of attachments holding files the scene reads (meshes), followed by the name the scene gives. */
    static final String FILE_ATTACHMENT = "file:";
    /** Temporary files {@link AtomicFiles} leaves behind when a run is killed mid-write. */
    static final Pattern TEMP_FILE = Pattern.compile("\\..+\\.[0-9a-f]+\\.tmp");

    private static final Logger LOG = LoggerFactory.getLogger(RunSession.class);
    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private final LoadedScene loaded;
    private final Path out;
    private final PrintWriter stdout;
    private final PrintWriter stderr;
    private final String label;

    RunSession(LoadedScene loaded, Path out, PrintWriter stdout, PrintWriter stderr, String label) {
        this.loaded = loaded;
        this.out = out;
        this.stdout = stdout;
        this.stderr = stderr;
        this.label = label;
    }

    /**
     * Runs to the scene's last frame.
     *
     * @param resumeFrom the checkpoint state to continue from, or null for a fresh run
     * @param checkpoint the checkpoint file resumed from, for the summary, or null
     * @param attachments the checkpoint's attachments, or an empty map
     * @return the exit code
     */
    int run(SimulationState resumeFrom, Path checkpoint, Map<String, byte[]> attachments) {
        OutputSettings o = loaded.output();
        long wall0 = System.nanoTime();
        try (Simulation sim = new Simulation(loaded.scene())) {
            checkChannels(sim);
            createFolder();
            int startFrame = 0;
            if (resumeFrom != null) {
                sim.restoreState(resumeFrom);
                startFrame = resumeFrom.frame();
            }
            int frames = o.frames() - startFrame;
            if (frames <= 0) {
                stdout.printf(Locale.ROOT, "%s: nothing to do, the checkpoint is at frame %d and the scene ends at "
                        + "frame %d%n", label, startFrame, o.frames());
                stdout.flush();
                return FrayCommand.OK;
            }
            long startStep = sim.stepCount();
            removeStaleTemporaryFiles();
            DiagnosticsCsvWriter csv = null;
            if (o.formats().contains(OutputFormat.PLY)) {
                sim.addFrameListener(new PlyFrameWriter(out, ply()));
            }
            if (o.formats().contains(OutputFormat.VTP)) {
                sim.addFrameListener(new VtpSeries(out, vtp(), loaded.scene().frameRate(), startFrame));
            }
            if (o.formats().contains(OutputFormat.CSV)) {
                csv = new DiagnosticsCsvWriter(out.resolve(DiagnosticsCsvWriter.FILE_NAME), o.diagnosticsEvery());
                if (resumeFrom != null) {
                    continueDiagnostics(csv, sim, attachments.get(DIAGNOSTICS_ATTACHMENT));
                }
                sim.addStepListener(csv);
            }
            CheckpointListener checkpoints = null;
            if (o.checkpointEvery() > 0) {
                checkpoints = checkpoints(sim, csv, attachments);
                sim.addFrameListener(checkpoints);
            }
            Stats stats = new Stats();
            sim.addFrameListener(stats);
            ProgressReporter progress = ProgressReporter.forConsole(stderr, label, frames);
            progress.begin(sim, startFrame);
            sim.addFrameListener(progress);
            resetPeaks();
            RunSummary run;
            try {
                run = runToFrame(sim, o.frames());
            } catch (SimulationDivergedException e) {
                summary(sim, stats, "diverged", e.getMessage(), startFrame, startStep, wall0, checkpoints, checkpoint);
                throw e;
            }
            summary(sim, stats, run.stopped() ? "stopped" : "completed", null, startFrame, startStep, wall0,
                    checkpoints, checkpoint);
            double seconds = (System.nanoTime() - wall0) * 1e-9;
            stdout.printf(Locale.ROOT, "%s: %d particles, frames %d to %d, %d steps, %.3g s simulated in %.1f s; "
                            + "wrote %s%n", label, sim.particles().size(), startFrame, sim.frame(), run.steps(),
                    sim.time(), seconds, out);
            stdout.flush();
            return FrayCommand.OK;
        }
    }

    /**
     * Runs to the time of a frame, k / frameRate (the frame times of {@link FrameListener}). The run's end time is
     * made exactly that time whatever the start: {@code Simulation.runFrames} adds a duration to the current time,
     * which can miss the frame time by an ulp when resuming from an early frame, and a last step one ulp shorter
     * would break the bitwise identity of resumed and uninterrupted runs.
     */
    static RunSummary runToFrame(Simulation sim, int lastFrame) {
        double end = lastFrame / sim.scene().frameRate();
        double t = sim.time();
        double d = end - t;
        for (int i = 0; i < 64 && t + d != end; i++) {
            d = t + d < end ? Math.nextUp(d) : Math.nextDown(d);
        }
        return sim.run(d);
    }

    private PlyParticleWriter ply() {
        List<String> c = loaded.output().channels();
        return c == null ? PlyParticleWriter.withPluginChannels() : PlyParticleWriter.withChannels(c);
    }

    private VtpParticleWriter vtp() {
        List<String> c = loaded.output().channels();
        return c == null ? VtpParticleWriter.withPluginChannels() : VtpParticleWriter.withChannels(c);
    }

    /** A channel the output block names but no model declares fails before any file or folder is made. */
    private void checkChannels(Simulation sim) {
        if (loaded.output().formats().contains(OutputFormat.PLY)) {
            ply().channelsFor(sim.particles());
        }
        if (loaded.output().formats().contains(OutputFormat.VTP)) {
            vtp().channelsFor(sim.particles());
        }
    }

    private void createFolder() {
        try {
            Files.createDirectories(out);
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, out.toString(),
                    "cannot create the output folder: " + e);
        }
    }

    /** A killed run may leave the temporary files of half-written outputs; they are never outputs themselves. */
    private void removeStaleTemporaryFiles() {
        try (Stream<Path> s = Files.list(out)) {
            for (Path p : s.filter(p -> TEMP_FILE.matcher(p.getFileName().toString()).matches()).toList()) {
                Files.deleteIfExists(p);
                LOG.info("removed the temporary file {} left by an interrupted run", p.getFileName());
            }
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, out.toString(), "cannot list: " + e);
        }
    }

    private CheckpointListener checkpoints(Simulation sim, DiagnosticsCsvWriter csv, Map<String, byte[]> carried) {
        OutputSettings o = loaded.output();
        // Absolute file names, and the files themselves attached, so the checkpoint alone can resume.
        String sceneJson = SceneWriter.toJson(loaded, null);
        CheckpointListener l = new CheckpointListener(sim, out, sceneJson, o.checkpointEvery(), o.keepCheckpoints());
        Path base = loaded.baseDir() == null ? Path.of("").toAbsolutePath() : loaded.baseDir();
        for (Map.Entry<String, Path> f : loaded.description().files().entrySet()) {
            String key = FILE_ATTACHMENT + base.resolve(f.getKey()).toAbsolutePath().normalize();
            // A resumed run passes on the copy its checkpoint carried; the original may be gone.
            byte[] bytes = carried.containsKey(key) ? carried.get(key)
                    : read(f.getValue() != null ? f.getValue() : base.resolve(f.getKey()));
            l.attach(key, () -> bytes);
        }
        if (csv != null) {
            DiagnosticsCsvWriter w = csv;
            // Publish the table so far, then carry it in the checkpoint; the writer picks up where it was.
            l.beforeEach(() -> w.finish(sim));
            l.attach(DIAGNOSTICS_ATTACHMENT, () -> read(w.target()));
        }
        return l;
    }

    private static byte[] read(Path file) {
        try {
            return Files.readAllBytes(file);
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "cannot read: " + e);
        }
    }

    /**
     * Makes a fresh diagnostics writer continue the table a checkpoint carries, so the resumed table equals the
     * uninterrupted one. The writer continues a table it published itself; so it is made to record and publish the
     * current row once, the carried table (which ends with that same row) is put in its place, and the writer
     * then copies it when the run starts and appends from the next step on.
     */
    private void continueDiagnostics(DiagnosticsCsvWriter csv, Simulation sim, byte[] table) {
        if (table == null) {
            LOG.warn("the checkpoint carries no diagnostics table; {} restarts at step {}",
                    DiagnosticsCsvWriter.FILE_NAME, sim.stepCount());
            return;
        }
        csv.init(sim, Double.NaN);
        csv.finish(sim);
        AtomicFiles.write(csv.target(), s -> s.write(table));
    }

    private void resetPeaks() {
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                pool.resetPeakUsage();
            }
        }
    }

    private static long peakHeapBytes() {
        long sum = 0;
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP && pool.getPeakUsage() != null) {
                sum += pool.getPeakUsage().getUsed();
            }
        }
        return sum;
    }

    private void summary(Simulation sim, Stats stats, String status, String message, int startFrame, long startStep,
                         long wall0, CheckpointListener checkpoints, Path resumedFrom) {
        double wall = (System.nanoTime() - wall0) * 1e-9;
        long steps = sim.stepCount() - startStep;
        int n = sim.particles().size();
        ObjectNode o = JSON.createObjectNode();
        o.put("scene", loaded.name());
        o.put("status", status);
        if (message != null) {
            o.put("message", message);
        }
        o.put("particles", n);
        o.put("threads", loaded.scene().threads());
        o.put("firstFrame", startFrame);
        o.put("lastFrame", sim.frame());
        o.put("frames", sim.frame() - startFrame);
        o.put("steps", steps);
        o.put("totalSteps", sim.stepCount());
        o.put("simulatedSeconds", sim.time());
        o.put("wallSeconds", wall);
        o.put("particleStepsPerSecond", wall > 0 ? n * (double) steps / wall : 0);
        o.put("peakHeapBytes", peakHeapBytes());
        o.put("peakGridBytes", stats.peakGridBytes);
        o.put("particleBytes", sim.particleMemoryBytes());
        double maxDamage = maxDamage(sim);
        if (Double.isNaN(maxDamage)) {
            o.putNull("maxDamage");
        } else {
            o.put("maxDamage", maxDamage);
        }
        if (stats.lastBand == null) {
            o.putNull("crackBand");
        } else {
            ObjectNode band = o.putObject("crackBand");
            band.put("frame", stats.lastBandFrame);
            putNumber(band, "bandVolume_m3", stats.lastBand.bandVolume());
            putNumber(band, "crackArea_m2", stats.lastBand.crackArea());
            putNumber(band, "width_m", stats.lastBand.width());
            ArrayNode widths = band.putArray("widthByFrame_m");
            for (double w : stats.widths) {
                if (Double.isNaN(w)) {
                    widths.addNull();
                } else {
                    widths.add(w);
                }
            }
        }
        if (resumedFrom != null) {
            o.put("resumedFrom", resumedFrom.toString());
        }
        if (checkpoints != null && checkpoints.lastWritten() != null) {
            o.put("lastCheckpoint", checkpoints.lastWritten().toString());
        }
        Map<String, Double> phases = new LinkedHashMap<>(sim.phaseSeconds());
        ObjectNode ph = o.putObject("phaseSeconds");
        phases.forEach(ph::put);
        try {
            byte[] bytes = JSON.writeValueAsBytes(o);
            AtomicFiles.write(out.resolve(SUMMARY_FILE), s -> {
                s.write(bytes);
                s.write('\n');
            });
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, out.resolve(SUMMARY_FILE).toString(),
                    e.toString());
        }
    }

    /** @return the largest damage over all particles, NaN if no body has a damage model */
    static double maxDamage(SimulationView sim) {
        if (!sim.particles().channelNames().contains(DamageModel.DAMAGE)) {
            return Double.NaN;
        }
        double best = 0;
        for (int p = 0; p < sim.particles().size(); p++) {
            best = Math.max(best, sim.particles().get(DamageModel.DAMAGE, p, 0));
        }
        return best;
    }

    /** A number, or null where it is NaN (JSON has no NaN). */
    private static void putNumber(ObjectNode o, String key, double v) {
        if (Double.isNaN(v)) {
            o.putNull(key);
        } else {
            o.put(key, v);
        }
    }

    /** Peak grid memory and the crack band seen at frames. */
    private static final class Stats implements FrameListener {
        long peakGridBytes;
        final CrackBand band = new CrackBand();
        final List<Double> widths = new ArrayList<>();
        CrackBand.Measure lastBand;
        int lastBandFrame;

        @Override
        public void onFrame(int frame, double time, SimulationView view, boolean isLast) {
            peakGridBytes = Math.max(peakGridBytes, view.gridMemoryBytes());
            if (view.particles().channelNames().contains(DamageModel.DAMAGE)) {
                lastBand = band.measure(view);
                lastBandFrame = frame;
                widths.add(lastBand.width());
            }
        }
    }

    /** @return the files of a folder that are outputs of a run (not temporary files), sorted by name */
    static List<String> outputs(Path dir) throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.map(p -> p.getFileName().toString()).filter(n -> !TEMP_FILE.matcher(n).matches()).sorted()
                    .toList();
        }
    }
}

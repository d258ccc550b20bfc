package dev.fray.examples.cli;

import dev.fray.core.error.Checks;
import dev.fray.core.sim.RunSummary;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.examples.scenes.DemoScenes;
import dev.fray.io.cache.DiagnosticsCsvWriter;
import dev.fray.io.cache.PlyFrameWriter;
import dev.fray.io.cache.PlyParticleWriter;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code fray demo NAME --out DIR}: runs a built-in demo scene and writes {@code DIR/frame_00000.ply ...} (frame 0
 * is the initial state) and {@code DIR/diagnostics.csv}. {@code fray demo --list} lists the demos.
 */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Run a built-in demo scene, writing one PLY file per frame and a diagnostics CSV.",
            "Use --list to see the demos."})
public final class DemoCommand implements Callable<Integer> {
    @Spec
    private CommandSpec spec;

    @Mixin
    private DebugOption debug;

    @Parameters(index = "0", arity = "0..1", paramLabel = "NAME", description = "Demo to run (see --list).")
    private String name;

    @Option(names = "--list", description = "List the demos and exit.")
    private boolean list;

    @Option(names = "--out", paramLabel = "DIR", description = "Output folder (created if missing).")
    private Path out;

    @Option(names = "--threads", paramLabel = "N",
            description = "Worker threads, 1 to 1024 (default: all cores). Results do not depend on it.")
    private Integer threads;

    @Option(names = "--frames", paramLabel = "K",
            description = "Frames to simulate after the initial one, 1 to 100000 (default: "
                    + DemoScenes.DEFAULT_FRAMES + ").")
    private Integer frames;

    @Option(names = "--channels", paramLabel = "NAME", split = ",",
            description = "Particle channels to add to the PLY files, comma-separated (default: those declared "
                    + "by material and damage models).")
    private List<String> channels;

    @Option(names = "--diagnostics-every", paramLabel = "N", defaultValue = "1",
            description = "Write a diagnostics row every N steps, 1 to 1e9 (default: ${DEFAULT-VALUE}).")
    private int diagnosticsEvery;

    /** Created by picocli. */
    public DemoCommand() {
    }

    /**
     * Lists or runs a demo.
     *
     * @return the exit code
     */
    @Override
    public Integer call() {
        PrintWriter stdout = spec.commandLine().getOut();
        if (list) {
            for (String n : DemoScenes.names()) {
                stdout.printf(Locale.ROOT, "%-16s %s%n", n, DemoScenes.description(n));
            }
            stdout.flush();
            return FrayCommand.OK;
        }
        if (name == null) {
            throw new ParameterException(spec.commandLine(),
                    "missing demo NAME; known: " + String.join(", ", DemoScenes.names()));
        }
        DemoScenes.description(name); // unknown names fail before any folder is made
        if (out == null) {
            throw new ParameterException(spec.commandLine(), "missing --out DIR");
        }
        int t = threads == null ? Runtime.getRuntime().availableProcessors() : threads;
        Checks.inRange("--threads", t, 1, 1024);
        int k = frames == null ? DemoScenes.DEFAULT_FRAMES : frames;
        Checks.inRange("--frames", k, 1, 100_000);
        Checks.inRange("--diagnostics-every", diagnosticsEvery, 1, 1_000_000_000);
        PlyParticleWriter ply = channels == null ? PlyParticleWriter.withPluginChannels()
                : PlyParticleWriter.withChannels(channels);

        Scene scene = DemoScenes.build(name, t);
        long t0 = System.nanoTime();
        try (Simulation sim = new Simulation(scene)) {
            ply.channelsFor(sim.particles()); // a bad --channels name fails before anything is written
            PlyFrameWriter frameWriter = new PlyFrameWriter(out, ply);
            sim.addStepListener(new DiagnosticsCsvWriter(out.resolve(DiagnosticsCsvWriter.FILE_NAME),
                    diagnosticsEvery));
            sim.addFrameListener(frameWriter);
            sim.addFrameListener(ProgressReporter.forConsole(spec.commandLine().getErr(), name, k));
            RunSummary run = sim.runFrames(k);
            double seconds = (System.nanoTime() - t0) * 1e-9;
            stdout.printf(Locale.ROOT, "demo %s: %d particles, %d frames, %d steps, %.1f s simulated in %.1f s; "
                            + "wrote %s%n", name, sim.particles().size(), frameWriter.framesWritten(), run.steps(),
                    sim.time(), seconds, out);
            stdout.flush();
        }
        return FrayCommand.OK;
    }
}

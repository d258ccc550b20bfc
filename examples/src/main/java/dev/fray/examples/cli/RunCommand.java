package dev.fray.examples.cli;

import dev.fray.core.error.Checks;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.OutputSettings;
import dev.fray.io.scene.SceneReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.nio.file.Path;
import java.util.concurrent.Callable;

/**
 * {@code fray run SCENE --out DIR}: runs a scene file and writes what its {@code output} block asks for (PLY and
 * VTP frames, the diagnostics CSV, checkpoints every N frames) and {@code DIR/summary.json} at the end.
 */
@Command(name = "run", mixinStandardHelpOptions = true,
        description = {"Run a scene file, writing frames, diagnostics, checkpoints and a summary to DIR.",
            "A run stopped midway can continue with 'fray resume DIR/checkpoint_NNNNN.fcp'."})
public final class RunCommand implements Callable<Integer> {
    @Spec
    private CommandSpec spec;

    @Mixin
    private DebugOption debug;

    @Parameters(index = "0", paramLabel = "SCENE", description = "Scene file (JSON, see docs/scene-format.md).")
    private Path scene;

    @Option(names = "--out", paramLabel = "DIR", required = true, description = "Output folder (created if missing).")
    private Path out;

    @Option(names = "--threads", paramLabel = "N",
            description = "Worker threads, 1 to 1024 (default: the scene's, else all cores). Results do not depend on it.")
    private Integer threads;

    @Option(names = "--frames", paramLabel = "K",
            description = "Frames to simulate after the initial one, 1 to 1000000 (default: the scene's output.frames).")
    private Integer frames;

    /** Created by picocli. */
    public RunCommand() {
    }

    /**
     * Reads the scene and runs it.
     *
     * @return the exit code
     */
    @Override
    public Integer call() {
        if (threads != null) {
            Checks.inRange("--threads", threads, 1, 1024);
        }
        if (frames != null) {
            Checks.inRange("--frames", frames, 1, OutputSettings.MAX_FRAMES);
        }
        LoadedScene loaded = new SceneReader().read(scene);
        if (threads != null) {
            loaded = loaded.withThreads(threads);
        }
        if (frames != null) {
            loaded = loaded.withOutput(loaded.output().withFrames(frames));
        }
        return new RunSession(loaded, out, spec.commandLine().getOut(), spec.commandLine().getErr(),
                label(scene)).run(null, null, java.util.Map.of());
    }

    /** @return the file name without its extension, for progress lines */
    static String label(Path file) {
        String n = file.getFileName().toString();
        int dot = n.lastIndexOf('.');
        return dot > 0 ? n.substring(0, dot) : n;
    }
}

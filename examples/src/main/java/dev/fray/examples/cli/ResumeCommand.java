package dev.fray.examples.cli;

import dev.fray.core.error.Checks;
import dev.fray.io.checkpoint.Checkpoint;
import dev.fray.io.checkpoint.CheckpointReader;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.OutputSettings;
import dev.fray.io.scene.SceneReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.Callable;

/**
 * {@code fray resume CHECKPOINT [--out DIR]}: continues a run from a checkpoint, which carries the scene and the
 * files it reads, to the scene's last frame. The outputs equal those of a run that never stopped.
 */
@Command(name = "resume", mixinStandardHelpOptions = true,
        description = {"Continue a run from a checkpoint to the scene's last frame.",
            "The checkpoint carries the scene; the outputs equal those of a run that never stopped."})
public final class ResumeCommand implements Callable<Integer> {
    @Spec
    private CommandSpec spec;

    @Mixin
    private DebugOption debug;

    @Parameters(index = "0", paramLabel = "CHECKPOINT", description = "A checkpoint_NNNNN.fcp file.")
    private Path checkpoint;

    @Option(names = "--out", paramLabel = "DIR",
            description = "Output folder (default: the checkpoint's folder).")
    private Path out;

    @Option(names = "--threads", paramLabel = "N",
            description = "Worker threads, 1 to 1024 (default: as the checkpointed run). Results do not depend on it.")
    private Integer threads;

    @Option(names = "--frames", paramLabel = "K",
            description = "Last frame to reach, 1 to 1000000 (default: the scene's output.frames).")
    private Integer frames;

    /** Created by picocli. */
    public ResumeCommand() {
    }

    /**
     * Reads the checkpoint and continues the run.
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
        Checkpoint c = CheckpointReader.read(checkpoint);
        Map<String, byte[]> files = new LinkedHashMap<>();
        for (Map.Entry<String, byte[]> e : c.attachments().entrySet()) {
            if (e.getKey().startsWith(RunSession.FILE_ATTACHMENT)) {
                files.put(e.getKey().substring(RunSession.FILE_ATTACHMENT.length()), e.getValue());
            }
        }
        LoadedScene loaded = new SceneReader().read(c.sceneJson().getBytes(StandardCharsets.UTF_8),
                checkpoint + " (embedded scene)", null, files);
        if (threads != null) {
            loaded = loaded.withThreads(threads);
        }
        if (frames != null) {
            loaded = loaded.withOutput(loaded.output().withFrames(frames));
        }
        Path dir = out != null ? out : checkpoint.toAbsolutePath().getParent();
        return new RunSession(loaded, dir, spec.commandLine().getOut(), spec.commandLine().getErr(),
                RunCommand.label(checkpoint)).run(c.state(), checkpoint, c.attachments());
    }
}

package dev.fray.io.scene;

import dev.fray.core.error.Checks;
import dev.fray.core.sim.Scene;

import java.nio.file.Path;

/**
 * A scene read from a file (or made in Java for writing): the core {@link Scene}, the {@link OutputSettings} of a
 * run, and the {@link SceneDescription} that says how its models were made. Immutable apart from the description,
 * which callers must treat as read-only.
 */
public final class LoadedScene {
    private final Scene scene;
    private final OutputSettings output;
    private final SceneDescription description;
    private final String name;
    private final Path baseDir;

    /**
     * @param scene       the scene
     * @param output      what a run writes
     * @param description how its models were made
     * @param name        the file as named to the reader, for messages (e.g. "scenes/drop.json")
     * @param baseDir     folder that relative file names in the scene (meshes) resolve against, or null
     */
    public LoadedScene(Scene scene, OutputSettings output, SceneDescription description, String name,
                       Path baseDir) {
        this.scene = Checks.notNull("scene", scene);
        this.output = Checks.notNull("output settings", output);
        this.description = Checks.notNull("scene description", description);
        this.name = Checks.notNull("scene name", name);
        this.baseDir = baseDir;
    }

    /** @return the scene */
    public Scene scene() {
        return scene;
    }

    /** @return the output settings */
    public OutputSettings output() {
        return output;
    }

    /** @return how the scene's models were made */
    public SceneDescription description() {
        return description;
    }

    /** @return the file as named to the reader */
    public String name() {
        return name;
    }

    /** @return folder relative file names resolve against, or null */
    public Path baseDir() {
        return baseDir;
    }

    /**
     * @param threads worker threads, 1 to 1024 (results do not depend on it)
     * @return a copy whose scene uses this many threads
     */
    public LoadedScene withThreads(int threads) {
        return new LoadedScene(scene.toBuilder().threads(threads).build(), output, description, name, baseDir);
    }

    /**
     * @param settings new output settings
     * @return a copy with them
     */
    public LoadedScene withOutput(OutputSettings settings) {
        return new LoadedScene(scene, settings, description, name, baseDir);
    }
}

package dev.fray.examples.scenes;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.io.scene.SceneWriter;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/**
 * The scene files in {@code examples/scenes/} that are written from the built-in demos rather than by hand: the
 * fracture demos, the plastic ones and the implicit one. Each is {@link SceneWriter}'s text of {@link DemoScenes#load} with
 * {@link #THREADS} worker threads ({@code fray run --threads} overrides it, and results do not depend on it).
 * Regenerate them after changing a demo with
 * <pre>
 *   java -cp examples/target/fray.jar dev.fray.examples.scenes.DemoSceneFiles examples/scenes
 * </pre>
 */
public final class DemoSceneFiles {
    /** The demos shipped as generated scene files, file name NAME.json. */
    public static final List<String> GENERATED = List.of("board-split", "slab-tear", "slab-tear-fast",
            "slab-tear-slow", "slab-tear-soft", "slab-tear-stiff", "sand-collapse", "metal-tear", "clay-cut",
            "tile-strike");
    /** Worker threads the files name. */
    public static final int THREADS = 4;

    private DemoSceneFiles() {
    }

    /**
     * @param name one of {@link #GENERATED}
     * @return the scene file text of that demo, ending with a newline
     * @throws InvalidInputException with key UNKNOWN_NAME for a demo not in {@link #GENERATED}
     */
    public static String text(String name) {
        Checks.notNull("demo scene name", name);
        if (!GENERATED.contains(name)) {
            throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "generated demo scene file", name,
                    String.join(", ", GENERATED));
        }
        return SceneWriter.toJson(DemoScenes.load(name, THREADS));
    }

    /**
     * Writes every generated scene file into a folder.
     *
     * @param args one argument: the folder (created if missing)
     * @throws Exception if a file cannot be written
     */
    public static void main(String[] args) throws Exception {
        if (args.length != 1) {
            throw new IllegalArgumentException("usage: DemoSceneFiles FOLDER");
        }
        Path dir = Files.createDirectories(Path.of(args[0]));
        for (String name : GENERATED) {
            Files.writeString(dir.resolve(name + ".json"), text(name));
        }
    }
}

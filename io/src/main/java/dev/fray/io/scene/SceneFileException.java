package dev.fray.io.scene;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.util.List;

/**
 * A scene file with one or more problems. All problems found in one pass are listed, so a user can fix them
 * together; {@link #problems()} gives them one by one. Key {@link FrayMessage#FILE_ERROR} with parts (file, a
 * summary listing every problem on its own line).
 */
public class SceneFileException extends InvalidInputException {
    private static final long serialVersionUID = 1L;
    /** Problems listed in full in the message; the rest are counted. */
    static final int SHOWN = 50;

    private final transient List<SceneProblem> problems;
    private final String file;

    /**
     * @param file     the file as named to the reader
     * @param problems the problems, at least one (copied)
     */
    public SceneFileException(String file, List<SceneProblem> problems) {
        super(FrayMessage.FILE_ERROR, file, summary(problems));
        if (problems.isEmpty()) {
            throw new IllegalArgumentException("a scene file exception needs at least one problem");
        }
        this.problems = List.copyOf(problems);
        this.file = file;
    }

    /** @return the problems in the order found (roughly file order), unmodifiable */
    public List<SceneProblem> problems() {
        return problems;
    }

    /** @return the file as named to the reader */
    public String file() {
        return file;
    }

    private static String summary(List<SceneProblem> problems) {
        StringBuilder b = new StringBuilder();
        b.append(problems.size() == 1 ? "1 problem" : problems.size() + " problems");
        int n = Math.min(SHOWN, problems.size());
        for (int i = 0; i < n; i++) {
            b.append("\n  ").append(problems.get(i).describe());
        }
        if (problems.size() > n) {
            b.append("\n  ... and ").append(problems.size() - n).append(" more");
        }
        return b.toString();
    }
}

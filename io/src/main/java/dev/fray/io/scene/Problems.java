package dev.fray.io.scene;

import java.util.ArrayList;
import java.util.List;

/** Collects the problems of one scene file, in the order found. */
final class Problems {
    /** Collecting stops here; a file this broken is not worth listing in full. */
    static final int MAX = 500;

    private final String file;
    private final List<SceneProblem> list = new ArrayList<>();

    Problems(String file) {
        this.file = file;
    }

    String file() {
        return file;
    }

    void at(String path, int line, int column, String message) {
        if (list.size() < MAX) {
            list.add(new SceneProblem(file, path, line, column, message));
        }
    }

    boolean isEmpty() {
        return list.isEmpty();
    }

    int size() {
        return list.size();
    }

    /** @throws SceneFileException listing every problem, if there is any */
    void throwIfAny() {
        if (!list.isEmpty()) {
            // File order reads best; problems without a line (whole-file ones) come first.
            List<SceneProblem> sorted = new ArrayList<>(list);
            sorted.sort(java.util.Comparator.comparingInt(SceneProblem::line).thenComparingInt(SceneProblem::column));
            throw new SceneFileException(file, sorted);
        }
    }
}

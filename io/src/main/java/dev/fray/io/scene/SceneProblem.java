package dev.fray.io.scene;

import java.util.Locale;

/**
 * One problem found in a scene file: where it is and what is wrong or allowed.
 *
 * @param file    the file as named to the reader (or a label such as "checkpoint scene")
 * @param path    JSON path of the offending value, e.g. {@code bodies[0].material.youngsModulus}; "" for the
 *                document as a whole
 * @param line    1-based line of the value, or 0 where unknown
 * @param column  1-based column of the value, or 0 where unknown
 * @param message what is wrong and what is allowed, with SI units
 */
public record SceneProblem(String file, String path, int line, int column, String message) {
    /**
     * @return "line L, column C, PATH: MESSAGE" (location parts left out where unknown), without the file name
     */
    public String describe() {
        StringBuilder b = new StringBuilder();
        if (line > 0) {
            b.append(String.format(Locale.ROOT, "line %d, column %d, ", line, column));
        }
        b.append(JsonPaths.shown(path)).append(": ").append(message);
        return b.toString();
    }

    /** @return "FILE: " followed by {@link #describe()} */
    @Override
    public String toString() {
        return file + ": " + describe();
    }
}

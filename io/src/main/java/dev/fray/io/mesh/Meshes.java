package dev.fray.io.mesh;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.io.InputStream;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;

/**
 * Reads a mesh file with the reader its extension names: {@code .obj} ({@link ObjReader}), {@code .stl}
 * ({@link StlReader}) or {@code .ply} ({@link PlyReader}), in any letter case. Positions are in m.
 */
public final class Meshes {
    /** The extensions {@link #read(Path)} understands, lower case without the dot. */
    public static final List<String> EXTENSIONS = List.of("obj", "stl", "ply");

    private Meshes() {
    }

    /**
     * @param file an .obj, .stl or .ply file
     * @return the mesh, named after the file
     * @throws InvalidInputException FILE_ERROR (file, reason) for an unknown extension, an unreadable file or a
     *         malformed one; MISSING for a null path
     */
    public static TriangleMesh read(Path file) {
        if (file == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh file");
        }
        return switch (extension(file.toString())) {
            case "obj" -> ObjReader.read(file);
            case "stl" -> StlReader.read(file);
            case "ply" -> PlyReader.read(file);
            default -> throw unknown(file.toString());
        };
    }

    /**
     * @param in   the file's bytes (read to the end, not closed)
     * @param name the file name; its extension picks the reader
     * @return the mesh, named name
     * @throws InvalidInputException FILE_ERROR (name, reason) for an unknown extension, a failing stream or a
     *         malformed file; MISSING for null arguments
     */
    public static TriangleMesh read(InputStream in, String name) {
        if (name == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "mesh file name");
        }
        return switch (extension(name)) {
            case "obj" -> ObjReader.read(in, name);
            case "stl" -> StlReader.read(in, name);
            case "ply" -> PlyReader.read(in, name);
            default -> throw unknown(name);
        };
    }

    private static String extension(String name) {
        int slash = Math.max(name.lastIndexOf('/'), name.lastIndexOf('\\'));
        int dot = name.lastIndexOf('.');
        return dot > slash ? name.substring(dot + 1).toLowerCase(Locale.ROOT) : "";
    }

    private static InvalidInputException unknown(String name) {
        return new InvalidInputException(FrayMessage.FILE_ERROR, name,
                "unknown mesh file extension; allowed: .obj, .stl, .ply");
    }
}

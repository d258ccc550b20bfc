package dev.fray.io.mesh;

import dev.fray.core.error.InvalidInputException;

import java.io.InputStream;
import java.nio.file.Path;

/**
 * Reads the geometry of a Wavefront OBJ file (the open text format): {@code v x y z} vertex records (m; a fourth
 * weight or trailing colour values are ignored) and {@code f} face records. A face lists three or more corners,
 * each a vertex index optionally followed by {@code /texture/normal} indices (ignored); polygons are split into a
 * fan of triangles around their first corner. Indices are 1-based; a negative index counts back from the last
 * vertex read so far (-1 is the latest). Every other record (normals, texture coordinates, groups, materials,
 * lines, points, comments) is ignored. A backslash at the end of a line joins it with the next.
 *
 * <p>A face may only refer to vertices that appear before it, so every error names its line. Vertices are kept
 * as written, in double precision: no welding.
 *
 * <p>Errors are {@link InvalidInputException}s with key FILE_ERROR (file, "line N: reason"): a malformed number,
 * a non-finite coordinate, an index of 0 or out of range, a face with fewer than three corners, or a file
 * without triangles.
 */
public final class ObjReader {
    private static final String[] AXIS = {"vertex coordinate x", "vertex coordinate y", "vertex coordinate z"};
    private static final String[] AXIS_M = {"vertex coordinate x (m)", "vertex coordinate y (m)",
        "vertex coordinate z (m)"};
    private ObjReader() {
    }

    /**
     * @param file the .obj file
     * @return the mesh, named after the file
     * @throws InvalidInputException FILE_ERROR (file, reason) if the file cannot be read or is malformed
     */
    public static TriangleMesh read(Path file) {
        byte[] b = MeshBytes.read(file);
        return parse(b, file.toString());
    }

    /**
     * @param in   the OBJ text (read to its end, not closed)
     * @param name name for messages and for the mesh, e.g. the file name
     * @return the mesh
     * @throws InvalidInputException FILE_ERROR (name, reason) if the stream cannot be read or is malformed
     */
    public static TriangleMesh read(InputStream in, String name) {
        return parse(MeshBytes.read(in, name), name);
    }

    static TriangleMesh parse(byte[] b, String name) {
        TextCursor c = new TextCursor(b, 0, b.length, name, 1, true);
        DoubleList xyz = new DoubleList();
        IntList tri = new IntList();
        int[] corners = new int[16];
        while (!c.atEnd()) {
            if (c.lineToken()) {
                if (c.is("v")) {
                    for (int k = 0; k < 3; k++) {
                        c.requireLineToken(AXIS[k]);
                        xyz.add(c.finiteNumber(AXIS_M[k]));
                    }
                } else if (c.is("f")) {
                    int count = xyz.size() / 3;
                    int n = 0;
                    while (c.lineToken()) {
                        long idx = c.leadingInteger("face vertex index");
                        long v = idx > 0 ? idx - 1 : count + idx;
                        if (count == 0) {
                            throw c.error("a face before any vertex; faces may only refer to vertices listed"
                                    + " before them");
                        }
                        if (idx == 0 || v < 0 || v >= count) {
                            throw c.error("face vertex index " + idx + " is out of range: allowed 1 to " + count
                                    + " or -1 to -" + count + " (" + count + " vertices so far)");
                        }
                        if (n == corners.length) {
                            corners = java.util.Arrays.copyOf(corners, 2 * n);
                        }
                        corners[n++] = (int) v;
                    }
                    if (n < 3) {
                        throw c.error("a face needs at least 3 vertices, got " + n);
                    }
                    for (int k = 1; k + 1 < n; k++) {
                        tri.add(corners[0]);
                        tri.add(corners[k]);
                        tri.add(corners[k + 1]);
                    }
                }
            }
            c.skipLine();
        }
        if (tri.size() == 0) {
            throw MeshBytes.error(name, "line " + c.line(), "the file has no faces (f records); a mesh needs"
                    + " at least one triangle");
        }
        return new TriangleMesh(name, null, xyz.toArray(), tri.toArray(), java.util.Map.of(), java.util.Map.of());
    }
}

package dev.fray.io.mesh;

import dev.fray.core.error.InvalidInputException;

import java.io.InputStream;
import java.nio.file.Path;
import java.util.Map;

/**
 * Reads STL files (the open stereolithography format), ASCII or binary, and welds vertices: corners at exactly
 * the same position become one vertex (-0.0 and 0.0 count as equal), numbered in order of first appearance, so
 * the mesh has shared edges and its open edges can be counted.
 *
 * <p>The encoding is decided by size, not by the leading word: a file of exactly 84 + 50 n bytes, where n is the
 * little-endian unsigned 32-bit triangle count at byte 80, is binary (an 80-byte header, then per triangle a
 * normal and three vertices as 12 little-endian floats and a 2-byte attribute, all but the vertices ignored).
 * Binary files begin with "solid" often enough that the word alone proves nothing. Any other file must be ASCII:
 * {@code solid [name]}, then facets {@code facet normal nx ny nz / outer loop / vertex x y z (3 or more) /
 * endloop / endfacet}, then {@code endsolid [name]}; keywords in any letter case, several solids in a row allowed,
 * loops of more than three vertices split into a fan. Normals are ignored (the vertex order gives the
 * orientation). Binary positions stay in single precision; ASCII ones are kept in double precision. Units: m.
 *
 * <p>Errors are {@link InvalidInputException}s with key FILE_ERROR (file, reason), naming the byte offset
 * (binary) or the line (ASCII): a size that fits neither encoding, a malformed record, a non-finite coordinate,
 * or no triangles at all.
 */
public final class StlReader {
    private static final int HEADER = 84;
    private static final int RECORD = 50;
    private static final String[] AXIS = {"vertex coordinate x", "vertex coordinate y", "vertex coordinate z"};
    private static final String[] AXIS_M = {"vertex coordinate x (m)", "vertex coordinate y (m)",
        "vertex coordinate z (m)"};

    private StlReader() {
    }

    /**
     * @param file the .stl file
     * @return the welded mesh, named after the file
     * @throws InvalidInputException FILE_ERROR (file, reason) if the file cannot be read or is malformed
     */
    public static TriangleMesh read(Path file) {
        return parse(MeshBytes.read(file), file.toString());
    }

    /**
     * @param in   the STL bytes (read to the end, not closed)
     * @param name name for messages and for the mesh
     * @return the welded mesh
     * @throws InvalidInputException FILE_ERROR (name, reason) if the stream cannot be read or is malformed
     */
    public static TriangleMesh read(InputStream in, String name) {
        return parse(MeshBytes.read(in, name), name);
    }

    /**
     * @param b the whole file
     * @return whether its size is exactly that of a binary STL with the triangle count it declares
     */
    static boolean isBinary(byte[] b) {
        if (b.length < HEADER) {
            return false;
        }
        long n = u32(b, 80);
        return HEADER + RECORD * n == b.length;
    }

    static TriangleMesh parse(byte[] b, String name) {
        if (isBinary(b)) {
            return binary(b, name);
        }
        int i = 0;
        while (i < b.length && (b[i] == ' ' || b[i] == '\t' || b[i] == '\r' || b[i] == '\n')) {
            i++;
        }
        boolean solid = b.length - i >= 5 && (b[i] | 0x20) == 's' && (b[i + 1] | 0x20) == 'o'
                && (b[i + 2] | 0x20) == 'l' && (b[i + 3] | 0x20) == 'i' && (b[i + 4] | 0x20) == 'd';
        if (!solid) {
            String why = b.length < HEADER
                    ? "is " + b.length + " bytes, shorter than the 84-byte header of a binary STL,"
                    : "is " + b.length + " bytes, but a binary STL declaring " + u32(b, 80) + " triangles (at byte"
                            + " 80) must be 84 + 50 x " + u32(b, 80) + " = " + (HEADER + RECORD * u32(b, 80))
                            + " bytes;";
            throw MeshBytes.error(name, "byte 0", "not an STL file: it " + why
                    + " and it does not start with \"solid\" as an ASCII STL does");
        }
        return ascii(b, name);
    }

    private static long u32(byte[] b, int off) {
        return (b[off] & 0xffL) | (b[off + 1] & 0xffL) << 8 | (b[off + 2] & 0xffL) << 16 | (b[off + 3] & 0xffL) << 24;
    }

    private static float f32(byte[] b, int off) {
        return Float.intBitsToFloat((int) u32(b, off));
    }

    private static TriangleMesh binary(byte[] b, String name) {
        int n = (int) u32(b, 80); // the size check bounds n by (2^31 - 84) / 50
        if (n == 0) {
            throw MeshBytes.error(name, "byte 80", "binary STL with 0 triangles; a mesh needs at least one");
        }
        VertexWelder w = new VertexWelder(n / 2 + 8);
        int[] tri = new int[3 * n];
        for (int t = 0; t < n; t++) {
            int off = HEADER + RECORD * t + 12;
            for (int k = 0; k < 3; k++) {
                float x = f32(b, off + 12 * k), y = f32(b, off + 12 * k + 4), z = f32(b, off + 12 * k + 8);
                if (!Float.isFinite(x) || !Float.isFinite(y) || !Float.isFinite(z)) {
                    throw MeshBytes.error(name, "byte " + (off + 12 * k), "triangle " + t + " vertex " + k
                            + " has a non-finite coordinate (" + x + ", " + y + ", " + z + ")");
                }
                tri[3 * t + k] = w.add(x, y, z);
            }
        }
        return new TriangleMesh(name, w.floatPositions(), null, tri, Map.of(), Map.of());
    }

    private static TriangleMesh ascii(byte[] b, String name) {
        TextCursor c = new TextCursor(b, 0, b.length, name, 1, false);
        VertexWelder w = new VertexWelder(1024);
        IntList tri = new IntList();
        int[] loop = new int[16];
        c.requireAnyToken("\"solid\"");
        expect(c, "solid");
        while (true) {
            // At a "solid" keyword: the rest of the line is its name.
            c.skipLine();
            while (true) {
                c.requireAnyToken("\"facet\" or \"endsolid\"");
                if (c.isIgnoreCase("endsolid")) {
                    c.skipLine();
                    break;
                }
                expect(c, "facet");
                c.requireLineToken("\"normal\"");
                expect(c, "normal");
                for (int k = 0; k < 3; k++) {
                    c.requireLineToken("a normal component");
                    c.number("normal component"); // ignored; often NaN for degenerate facets
                }
                c.requireAnyToken("\"outer\"");
                expect(c, "outer");
                c.requireLineToken("\"loop\"");
                expect(c, "loop");
                int n = 0;
                while (true) {
                    c.requireAnyToken("\"vertex\" or \"endloop\"");
                    if (c.isIgnoreCase("endloop")) {
                        break;
                    }
                    expect(c, "vertex");
                    double x = coordinate(c, 0), y = coordinate(c, 1), z = coordinate(c, 2);
                    if (n == loop.length) {
                        loop = java.util.Arrays.copyOf(loop, 2 * n);
                    }
                    loop[n++] = w.add(x, y, z);
                }
                if (n < 3) {
                    throw c.error("a facet loop needs at least 3 vertices, got " + n);
                }
                for (int k = 1; k + 1 < n; k++) {
                    tri.add(loop[0]);
                    tri.add(loop[k]);
                    tri.add(loop[k + 1]);
                }
                c.requireAnyToken("\"endfacet\"");
                expect(c, "endfacet");
            }
            if (!c.anyToken()) {
                break;
            }
            expect(c, "solid");
        }
        if (tri.size() == 0) {
            throw MeshBytes.error(name, "line " + c.line(), "ASCII STL without facets; a mesh needs at least one"
                    + " triangle");
        }
        return new TriangleMesh(name, null, w.positions(), tri.toArray(), Map.of(), Map.of());
    }

    private static double coordinate(TextCursor c, int axis) {
        c.requireLineToken(AXIS[axis]);
        return c.finiteNumber(AXIS_M[axis]);
    }

    private static void expect(TextCursor c, String keyword) {
        if (!c.isIgnoreCase(keyword)) {
            throw c.error("expected \"" + keyword + "\", got " + c.quoted());
        }
    }
}

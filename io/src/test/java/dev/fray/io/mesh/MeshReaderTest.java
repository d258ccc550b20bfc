package dev.fray.io.mesh;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.io.mesh.MeshFixtures.Encoding;
import dev.fray.io.mesh.MeshFixtures.Raw;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.function.Supplier;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The readers against files the test writes itself from the formats' published descriptions (OBJ, STL, PLY 1.0):
 * every format and encoding of the same cube gives the same triangles, attributes come through, and bad files
 * fail with FILE_ERROR naming the file and the place.
 */
class MeshReaderTest extends FrayTestBase {
    @TempDir
    Path dir;

    private static TriangleMesh read(byte[] b, String name) {
        return Meshes.read(new ByteArrayInputStream(b), name);
    }

    @Test
    void cubeInEveryFormatAndEncodingGivesTheSameTriangles() throws IOException {
        Raw cube = MeshFixtures.cube();
        List<String> expected = MeshFixtures.canonicalTriangles(cube.mesh());
        StringBuilder quads = new StringBuilder();
        for (int v = 0; v < 8; v++) {
            quads.append("v ").append(cube.p()[3 * v]).append(' ').append(cube.p()[3 * v + 1]).append(' ')
                    .append(cube.p()[3 * v + 2]).append('\n');
        }
        for (int[] q : MeshFixtures.cubeQuads()) {
            // Negative (relative) indices and v/vt/vn corners: all 8 vertices are read before the faces.
            quads.append("f ").append(q[0] - 8).append("/1/1 ").append(q[1] + 1).append("//2 ")
                    .append(q[2] - 8).append(' ').append(q[3] + 1).append("/3\n");
        }
        byte[][] files = {
            MeshFixtures.obj(cube), quads.toString().getBytes(StandardCharsets.US_ASCII),
            MeshFixtures.stlAscii(cube, "cube"), MeshFixtures.stlBinary(cube, "binary cube"),
            MeshFixtures.stlBinary(cube, "solid cube, binary despite the word"),
            MeshFixtures.ply(cube, Encoding.ASCII, "float"), MeshFixtures.ply(cube, Encoding.LITTLE, "float"),
            MeshFixtures.ply(cube, Encoding.BIG, "float"), MeshFixtures.ply(cube, Encoding.ASCII, "double"),
            MeshFixtures.ply(cube, Encoding.LITTLE, "double"), MeshFixtures.ply(cube, Encoding.BIG, "double")};
        String[] names = {"a.obj", "quads.obj", "a.stl", "b.stl", "c.STL", "a.ply", "b.ply", "c.ply", "d.ply",
            "e.ply", "f.ply"};
        for (int i = 0; i < files.length; i++) {
            Path file = dir.resolve(names[i]);
            Files.write(file, files[i]);
            TriangleMesh fromPath = Meshes.read(file);
            TriangleMesh fromStream = read(files[i], names[i]);
            assertEquals(expected, MeshFixtures.canonicalTriangles(fromPath), names[i]);
            assertEquals(expected, MeshFixtures.canonicalTriangles(fromStream), names[i]);
            assertEquals(8, fromPath.vertexCount(), names[i] + ": STL corners welded to the 8 cube vertices");
            assertEquals(12, fromPath.triangleCount(), names[i]);
            assertEquals(file.toString(), fromPath.name());
            assertEquals(0, MeshShape.of(fromPath).openEdges(), names[i]);
        }
        assertTrue(StlReader.isBinary(files[4]), "size 84 + 50 n decides, not the leading \"solid\"");
        assertTrue(Meshes.read(dir.resolve("b.stl")).singlePrecision());
        assertFalse(Meshes.read(dir.resolve("d.ply")).singlePrecision());
    }

    @Test
    void stlWeldingIsExactAndTreatsNegativeZeroAsZero() {
        // Two triangles sharing an edge, the shared corner once written as -0.
        String s = "solid two\nfacet normal 0 0 1\nouter loop\nvertex 0 0 0\nvertex 1 0 0\nvertex 0 1 0\nendloop\n"
                + "endfacet\nfacet normal 0 0 1\nouter loop\nvertex 1 0 0\nvertex 1 1 0\nvertex -0.0 1 0\nendloop\n"
                + "endfacet\nfacet normal 0 0 1\nouter loop\nvertex 5 5 5\nvertex 5.000000000000001 5 5\n"
                + "vertex 5 6 5\nendloop\nendfacet\nendsolid two\n";
        TriangleMesh m = read(s.getBytes(StandardCharsets.US_ASCII), "two.stl");
        // 4 vertices for the pair (exact duplicates merged), 3 for the last (nearly equal values kept apart).
        assertEquals(7, m.vertexCount());
        assertEquals(m.vertex(0, 1), m.vertex(1, 0));
        assertEquals(m.vertex(0, 2), m.vertex(1, 2));
    }

    @Test
    void plyVertexPropertiesBecomeAttributes() {
        Raw cube = MeshFixtures.cube();
        double[][] extra = new double[7][8];
        for (int v = 0; v < 8; v++) {
            extra[0][v] = 0.5 * v; // quality
            extra[1][v] = v % 2; // fx
            extra[2][v] = 1 - v % 2; // fy
            extra[3][v] = 0; // fz
            extra[4][v] = -1; // nx
            extra[5][v] = 0.25; // ny
            extra[6][v] = 0.125 * v; // nz
        }
        String[] names = {"quality", "fx", "fy", "fz", "nx", "ny", "nz"};
        for (Encoding enc : Encoding.values()) {
            TriangleMesh m = read(MeshFixtures.ply(cube, enc, "float", names, extra), "attr.ply");
            assertEquals(List.of("quality", "f", "n"), m.attributeNames(), enc.word);
            assertEquals(1, m.attributeWidth("quality"));
            assertEquals(3, m.attributeWidth("f"));
            assertEquals(3, m.attributeWidth("n"));
            for (int v = 0; v < 8; v++) {
                assertEquals(extra[0][v], m.attribute("quality", v, 0));
                for (int k = 0; k < 3; k++) {
                    assertEquals(extra[1 + k][v], m.attribute("f", v, k));
                    assertEquals(extra[4 + k][v], m.attribute("n", v, k));
                }
            }
            InvalidInputException e = assertThrows(InvalidInputException.class, () -> m.attributeWidth("g"));
            assertEquals(FrayMessage.UNKNOWN_NAME, e.key());
        }
    }

    @Test
    void plySkipsOtherElementsListsAndFaceProperties() {
        String s = "ply\nformat ascii 1.0\nobj_info made by hand\nelement vertex 4\nproperty double x\n"
                + "property double y\nproperty double z\nproperty list uchar float junk\nproperty uchar red\n"
                + "element edge 1\nproperty int a\nproperty int b\n"
                + "element face 2\nproperty uchar flag\nproperty list uchar uint vertex_index\n"
                + "property list ushort short other\nend_header\n"
                + "0 0 0 2 1.5 2.5 255\n1 0 0 0 0\n1 1 0 1 7 1\n0 1 0 0 3\n"
                + "0 1\n"
                + "1 4 0 1 2 3 0\n0 3 3 2 1 2 -4 5\n";
        TriangleMesh m = read(s.getBytes(StandardCharsets.US_ASCII), "q.ply");
        assertEquals(4, m.vertexCount());
        assertEquals(3, m.triangleCount(), "a quad split into a fan of two, plus one triangle");
        assertArrayEquals(new int[] {0, 1, 2, 0, 2, 3, 3, 2, 1}, m.triangles());
        assertEquals(List.of("red"), m.attributeNames());
        assertEquals(255.0, m.attribute("red", 0, 0));
    }

    @Test
    void objIgnoresOtherRecordsAndJoinsContinuedLines() {
        String s = "mtllib x.mtl\nv 0 0 0 1.0\nv 1 0 0\nvt 0 0\nvn 0 0 1\ng grp\nv 0 1 0 0.5 0.5 0.5\n"
                + "l 1 2\np 3\nf 1/1/1 \\\n 2/1/1 3/1/1\n# comment\n";
        TriangleMesh m = read(s.getBytes(StandardCharsets.US_ASCII), "c.obj");
        assertEquals(3, m.vertexCount());
        assertArrayEquals(new int[] {0, 1, 2}, m.triangles());
    }

    private static void assertFileError(String name, String where, Supplier<TriangleMesh> read) {
        InvalidInputException e = assertThrows(InvalidInputException.class, read::get);
        assertEquals(FrayMessage.FILE_ERROR, e.key());
        assertEquals(name, e.parts()[0]);
        assertTrue(e.parts()[1].toString().startsWith(where), e.getMessage());
    }

    @Test
    void badFilesNameTheFileAndThePlace() {
        assertFileError("a.obj", "line 2", () -> read("v 0 0 0\nv 1 nan 0\n".getBytes(), "a.obj"));
        assertFileError("a.obj", "line 4", () -> read("v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 4\n".getBytes(), "a.obj"));
        assertFileError("a.obj", "line 4", () -> read("v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 0\n".getBytes(), "a.obj"));
        assertFileError("a.obj", "line 4", () -> read("v 0 0 0\nv 1 0 0\nv 0 1 0\nf -4 2 3\n".getBytes(), "a.obj"));
        assertFileError("a.obj", "line 2", () -> read("v 0 0 0\nf 1 1\n".getBytes(), "a.obj"));
        assertFileError("a.obj", "line 1", () -> read("v 0 0 1,5\n".getBytes(), "a.obj"));
        assertFileError("a.obj", "line", () -> read("v 0 0 0\n".getBytes(), "a.obj"));
        assertFileError("a.stl", "line 3", () -> read("solid x\nfacet normal 0 0 1\nouter lop\n".getBytes(),
                "a.stl"));
        assertFileError("a.stl", "line", () -> read("solid x\n".getBytes(), "a.stl"));
        assertFileError("a.stl", "byte 0", () -> read(new byte[100], "a.stl"));
        assertFileError("a.stl", "byte 0", () -> read(new byte[10], "a.stl"));
        byte[] stl = MeshFixtures.stlBinary(MeshFixtures.cube(), "x");
        ByteBuffer.wrap(stl).order(ByteOrder.LITTLE_ENDIAN).putFloat(84 + 50 * 3 + 16, Float.NaN);
        assertFileError("a.stl", "byte " + (84 + 50 * 3 + 12), () -> read(stl, "a.stl"));
        String ply = "ply\nformat ascii 1.0\nelement vertex 3\nproperty float x\nproperty float y\nproperty float z\n"
                + "element face 1\nproperty list uchar int vertex_indices\nend_header\n";
        assertFileError("a.ply", "line 13", () -> read((ply + "0 0 0\n1 0 0\n0 1 0\n3 0 1 3\n").getBytes(),
                "a.ply"));
        assertFileError("a.ply", "line 11", () -> read((ply + "0 0 0\n1 nan 0\n0 1 0\n3 0 1 2\n").getBytes(),
                "a.ply"));
        assertFileError("a.ply", "line 13", () -> read((ply + "0 0 0\n1 0 0\n0 1 0\n3 0 1\n").getBytes(), "a.ply"));
        assertFileError("a.ply", "header line 3", () -> read(ply.replace("vertex 3", "vertex 3000000000")
                .getBytes(), "a.ply"));
        assertFileError("a.ply", "header line 3", () -> read((ply.replace("vertex 3", "vertex 2000000000")
                + "0 0 0\n").getBytes(), "a.ply"));
        assertFileError("a.ply", "header line 4", () -> read(ply.replace("float x", "string x").getBytes(),
                "a.ply"));
        assertFileError("a.ply", "header line 2", () -> read(ply.replace("ascii", "binary").getBytes(), "a.ply"));
        assertFileError("a.ply", "line 1", () -> read("solid\n".getBytes(), "a.ply"));
        assertFileError("a.ply", "header line", () -> read("ply\nformat ascii 1.0\n".getBytes(), "a.ply"));
        byte[] bin = MeshFixtures.ply(MeshFixtures.cube(), Encoding.LITTLE, "float");
        byte[] cut = java.util.Arrays.copyOf(bin, bin.length - 5);
        assertFileError("a.ply", "byte", () -> read(cut, "a.ply"));
        assertFileError("a.xyz", "unknown", () -> read(bin, "a.xyz"));
        assertFileError(dir.resolve("missing.obj").toString(), "file not found",
                () -> Meshes.read(dir.resolve("missing.obj")));
    }
}

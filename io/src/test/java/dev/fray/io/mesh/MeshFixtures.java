package dev.fray.io.mesh;

import java.io.ByteArrayOutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Test meshes made here (a cube, a tetrahedron, a torus and a subdivided icosahedron of our own) and small
 * writers of our own for the OBJ, STL and PLY encodings the readers must understand, written from the formats'
 * published descriptions.
 */
final class MeshFixtures {
    private MeshFixtures() {
    }

    /** Positions (3 per vertex) and triangles (3 per triangle), outward oriented. */
    record Raw(double[] p, int[] t) {
        int vertices() {
            return p.length / 3;
        }

        int triangles() {
            return t.length / 3;
        }

        TriangleMesh mesh() {
            return TriangleMesh.of(p, t);
        }
    }

    /** Unit cube [0, 1]^3: vertex x + 2y + 4z at corner (x, y, z); two triangles per face. */
    static Raw cube() {
        double[] p = new double[24];
        for (int v = 0; v < 8; v++) {
            p[3 * v] = v & 1;
            p[3 * v + 1] = (v >> 1) & 1;
            p[3 * v + 2] = (v >> 2) & 1;
        }
        int[][] quads = {{0, 2, 6, 4}, {1, 3, 7, 5}, {0, 1, 5, 4}, {2, 3, 7, 6}, {0, 1, 3, 2}, {4, 5, 7, 6}};
        int[] t = new int[36];
        for (int f = 0; f < 6; f++) {
            int[] q = quads[f];
            t[6 * f] = q[0];
            t[6 * f + 1] = q[1];
            t[6 * f + 2] = q[2];
            t[6 * f + 3] = q[0];
            t[6 * f + 4] = q[2];
            t[6 * f + 5] = q[3];
        }
        orientConvex(p, t);
        return new Raw(p, t);
    }

    /** The six quads of {@link #cube()}, outward oriented, for polygon-face files. */
    static int[][] cubeQuads() {
        Raw c = cube();
        int[][] q = new int[6][];
        for (int f = 0; f < 6; f++) {
            // Triangles 2f and 2f+1 share a diagonal from their first corner; the quad whose fan gives exactly
            // these two triangles starts with whichever comes first around that corner.
            int[] t1 = Arrays.copyOfRange(c.t, 6 * f, 6 * f + 3), t2 = Arrays.copyOfRange(c.t, 6 * f + 3, 6 * f + 6);
            q[f] = t2[1] == t1[2] ? new int[] {t1[0], t1[1], t1[2], t2[2]} : new int[] {t2[0], t2[1], t2[2], t1[2]};
        }
        return q;
    }

    /** Tetrahedron with corners a0..a3 given as 12 numbers. */
    static Raw tetrahedron(double[] corners) {
        int[] t = {0, 1, 2, 0, 1, 3, 0, 2, 3, 1, 2, 3};
        double[] p = corners.clone();
        orientConvex(p, t);
        return new Raw(p, t);
    }

    /** Flips triangles of a convex mesh whose normal points towards the centroid of the vertices. */
    static void orientConvex(double[] p, int[] t) {
        int nv = p.length / 3;
        double cx = 0, cy = 0, cz = 0;
        for (int v = 0; v < nv; v++) {
            cx += p[3 * v] / nv;
            cy += p[3 * v + 1] / nv;
            cz += p[3 * v + 2] / nv;
        }
        for (int i = 0; i < t.length / 3; i++) {
            int a = t[3 * i], b = t[3 * i + 1], c = t[3 * i + 2];
            double[] n = cross(p, a, b, c);
            double d = n[0] * (p[3 * a] - cx) + n[1] * (p[3 * a + 1] - cy) + n[2] * (p[3 * a + 2] - cz);
            if (d < 0) {
                t[3 * i + 1] = c;
                t[3 * i + 2] = b;
            }
        }
    }

    static double[] cross(double[] p, int a, int b, int c) {
        double ux = p[3 * b] - p[3 * a], uy = p[3 * b + 1] - p[3 * a + 1], uz = p[3 * b + 2] - p[3 * a + 2];
        double wx = p[3 * c] - p[3 * a], wy = p[3 * c + 1] - p[3 * a + 1], wz = p[3 * c + 2] - p[3 * a + 2];
        return new double[] {uy * wz - uz * wy, uz * wx - ux * wz, ux * wy - uy * wx};
    }

    /**
     * Torus about the z axis through the origin: major radius R, minor radius r, nu segments around z and nv
     * around the tube; vertex (i, j) at angle u = 2 pi i / nu, v = 2 pi j / nv.
     */
    static Raw torus(double bigR, double r, int nu, int nv) {
        double[] p = new double[3 * nu * nv];
        for (int i = 0; i < nu; i++) {
            for (int j = 0; j < nv; j++) {
                double u = 2 * Math.PI * i / nu, v = 2 * Math.PI * j / nv;
                int k = 3 * (i * nv + j);
                p[k] = (bigR + r * Math.cos(v)) * Math.cos(u);
                p[k + 1] = (bigR + r * Math.cos(v)) * Math.sin(u);
                p[k + 2] = r * Math.sin(v);
            }
        }
        int[] t = new int[6 * nu * nv];
        int n = 0;
        for (int i = 0; i < nu; i++) {
            for (int j = 0; j < nv; j++) {
                int a = i * nv + j, b = ((i + 1) % nu) * nv + j;
                int c = ((i + 1) % nu) * nv + (j + 1) % nv, d = i * nv + (j + 1) % nv;
                // Outward normal of the tube at the quad's centre decides the winding.
                double u = 2 * Math.PI * (i + 0.5) / nu, v = 2 * Math.PI * (j + 0.5) / nv;
                double ox = Math.cos(v) * Math.cos(u), oy = Math.cos(v) * Math.sin(u), oz = Math.sin(v);
                double[] nn = cross(p, a, b, c);
                boolean ok = nn[0] * ox + nn[1] * oy + nn[2] * oz > 0;
                int[] tri = ok ? new int[] {a, b, c, a, c, d} : new int[] {a, c, b, a, d, c};
                System.arraycopy(tri, 0, t, n, 6);
                n += 6;
            }
        }
        return new Raw(p, t);
    }

    /** Icosahedron subdivided {@code levels} times and projected on the sphere: 20 * 4^levels triangles. */
    static Raw icosphere(double cx, double cy, double cz, double radius, int levels) {
        double g = (1 + Math.sqrt(5)) / 2;
        List<double[]> verts = new ArrayList<>();
        double[][] base = {{-1, g, 0}, {1, g, 0}, {-1, -g, 0}, {1, -g, 0}, {0, -1, g}, {0, 1, g}, {0, -1, -g},
            {0, 1, -g}, {g, 0, -1}, {g, 0, 1}, {-g, 0, -1}, {-g, 0, 1}};
        for (double[] b : base) {
            verts.add(unit(b));
        }
        int[] faces = {0, 11, 5, 0, 5, 1, 0, 1, 7, 0, 7, 10, 0, 10, 11, 1, 5, 9, 5, 11, 4, 11, 10, 2, 10, 7, 6, 7,
            1, 8, 3, 9, 4, 3, 4, 2, 3, 2, 6, 3, 6, 8, 3, 8, 9, 4, 9, 5, 2, 4, 11, 6, 2, 10, 8, 6, 7, 9, 8, 1};
        for (int l = 0; l < levels; l++) {
            java.util.Map<Long, Integer> mid = new java.util.HashMap<>();
            int[] next = new int[faces.length * 4];
            int n = 0;
            for (int f = 0; f < faces.length / 3; f++) {
                int a = faces[3 * f], b = faces[3 * f + 1], c = faces[3 * f + 2];
                int ab = midpoint(verts, mid, a, b), bc = midpoint(verts, mid, b, c), ca = midpoint(verts, mid, c, a);
                int[] sub = {a, ab, ca, b, bc, ab, c, ca, bc, ab, bc, ca};
                System.arraycopy(sub, 0, next, n, 12);
                n += 12;
            }
            faces = next;
        }
        double[] p = new double[3 * verts.size()];
        for (int v = 0; v < verts.size(); v++) {
            p[3 * v] = cx + radius * verts.get(v)[0];
            p[3 * v + 1] = cy + radius * verts.get(v)[1];
            p[3 * v + 2] = cz + radius * verts.get(v)[2];
        }
        orientConvex(p, faces);
        return new Raw(p, faces);
    }

    private static int midpoint(List<double[]> verts, java.util.Map<Long, Integer> mid, int a, int b) {
        long key = (long) Math.min(a, b) << 32 | Math.max(a, b);
        Integer m = mid.get(key);
        if (m != null) {
            return m;
        }
        double[] pa = verts.get(a), pb = verts.get(b);
        verts.add(unit(new double[] {pa[0] + pb[0], pa[1] + pb[1], pa[2] + pb[2]}));
        mid.put(key, verts.size() - 1);
        return verts.size() - 1;
    }

    private static double[] unit(double[] v) {
        double n = Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
        return new double[] {v[0] / n, v[1] / n, v[2] / n};
    }

    /** Enclosed volume by the divergence theorem (Gauss): sum over triangles of a . (b x c) / 6. */
    static double volume(Raw m) {
        double vol = 0;
        for (int i = 0; i < m.triangles(); i++) {
            int a = m.t[3 * i], b = m.t[3 * i + 1], c = m.t[3 * i + 2];
            double[] p = m.p;
            vol += p[3 * a] * (p[3 * b + 1] * p[3 * c + 2] - p[3 * b + 2] * p[3 * c + 1])
                    + p[3 * a + 1] * (p[3 * b + 2] * p[3 * c] - p[3 * b] * p[3 * c + 2])
                    + p[3 * a + 2] * (p[3 * b] * p[3 * c + 1] - p[3 * b + 1] * p[3 * c]);
        }
        return vol / 6;
    }

    // ------------------------------------------------------------------ writers

    static String num(double v) {
        return Double.toString(v);
    }

    /** OBJ with "v" and triangle "f" records, 1-based indices. */
    static byte[] obj(Raw m) {
        StringBuilder s = new StringBuilder("# test mesh\no test\n");
        for (int v = 0; v < m.vertices(); v++) {
            s.append("v ").append(num(m.p[3 * v])).append(' ').append(num(m.p[3 * v + 1])).append(' ')
                    .append(num(m.p[3 * v + 2])).append('\n');
        }
        s.append("vn 0 0 1\nusemtl none\ns off\n");
        for (int i = 0; i < m.triangles(); i++) {
            s.append("f ").append(m.t[3 * i] + 1).append(' ').append(m.t[3 * i + 1] + 1).append(' ')
                    .append(m.t[3 * i + 2] + 1).append('\n');
        }
        return s.toString().getBytes(StandardCharsets.US_ASCII);
    }

    /** ASCII STL: one facet per triangle, normals written as zero (the reader ignores them). */
    static byte[] stlAscii(Raw m, String name) {
        StringBuilder s = new StringBuilder("solid ").append(name).append('\n');
        for (int i = 0; i < m.triangles(); i++) {
            s.append("  facet normal 0 0 0\n    outer loop\n");
            for (int c = 0; c < 3; c++) {
                int v = m.t[3 * i + c];
                s.append("      vertex ").append(num(m.p[3 * v])).append(' ').append(num(m.p[3 * v + 1]))
                        .append(' ').append(num(m.p[3 * v + 2])).append('\n');
            }
            s.append("    endloop\n  endfacet\n");
        }
        s.append("endsolid ").append(name).append('\n');
        return s.toString().getBytes(StandardCharsets.US_ASCII);
    }

    /** Binary STL: 80-byte header (starting with the given text), count, 50 bytes per triangle. */
    static byte[] stlBinary(Raw m, String header) {
        ByteBuffer b = ByteBuffer.allocate(84 + 50 * m.triangles()).order(ByteOrder.LITTLE_ENDIAN);
        byte[] h = Arrays.copyOf(header.getBytes(StandardCharsets.US_ASCII), 80);
        b.put(h);
        b.putInt(m.triangles());
        for (int i = 0; i < m.triangles(); i++) {
            b.putFloat(0).putFloat(0).putFloat(0);
            for (int c = 0; c < 3; c++) {
                int v = m.t[3 * i + c];
                b.putFloat((float) m.p[3 * v]).putFloat((float) m.p[3 * v + 1]).putFloat((float) m.p[3 * v + 2]);
            }
            b.putShort((short) 0);
        }
        return b.array();
    }

    /** PLY encodings. */
    enum Encoding {
        ASCII("ascii"), LITTLE("binary_little_endian"), BIG("binary_big_endian");

        final String word;

        Encoding(String word) {
            this.word = word;
        }
    }

    /**
     * PLY with vertex x y z of the given type ("float" or "double"), extra float vertex properties (names and
     * per-vertex values, one array per name) and a face list "uchar int vertex_indices".
     */
    static byte[] ply(Raw m, Encoding enc, String xyzType, String[] extraNames, double[][] extra) {
        StringBuilder h = new StringBuilder("ply\nformat ").append(enc.word).append(" 1.0\n");
        h.append("comment made by the test\n");
        h.append("element vertex ").append(m.vertices()).append('\n');
        for (String a : new String[] {"x", "y", "z"}) {
            h.append("property ").append(xyzType).append(' ').append(a).append('\n');
        }
        for (String e : extraNames) {
            h.append("property float ").append(e).append('\n');
        }
        h.append("element face ").append(m.triangles()).append('\n');
        h.append("property list uchar int vertex_indices\n");
        h.append("end_header\n");
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        out.writeBytes(h.toString().getBytes(StandardCharsets.US_ASCII));
        boolean dbl = xyzType.equals("double");
        if (enc == Encoding.ASCII) {
            StringBuilder s = new StringBuilder();
            for (int v = 0; v < m.vertices(); v++) {
                for (int k = 0; k < 3; k++) {
                    s.append(num(dbl ? m.p[3 * v + k] : (float) m.p[3 * v + k])).append(' ');
                }
                for (double[] e : extra) {
                    s.append(num((float) e[v])).append(' ');
                }
                s.append('\n');
            }
            for (int i = 0; i < m.triangles(); i++) {
                s.append("3 ").append(m.t[3 * i]).append(' ').append(m.t[3 * i + 1]).append(' ')
                        .append(m.t[3 * i + 2]).append('\n');
            }
            out.writeBytes(s.toString().getBytes(StandardCharsets.US_ASCII));
        } else {
            ByteOrder order = enc == Encoding.LITTLE ? ByteOrder.LITTLE_ENDIAN : ByteOrder.BIG_ENDIAN;
            int per = (dbl ? 24 : 12) + 4 * extra.length;
            ByteBuffer b = ByteBuffer.allocate(per * m.vertices() + 13 * m.triangles()).order(order);
            for (int v = 0; v < m.vertices(); v++) {
                for (int k = 0; k < 3; k++) {
                    if (dbl) {
                        b.putDouble(m.p[3 * v + k]);
                    } else {
                        b.putFloat((float) m.p[3 * v + k]);
                    }
                }
                for (double[] e : extra) {
                    b.putFloat((float) e[v]);
                }
            }
            for (int i = 0; i < m.triangles(); i++) {
                b.put((byte) 3).putInt(m.t[3 * i]).putInt(m.t[3 * i + 1]).putInt(m.t[3 * i + 2]);
            }
            out.writeBytes(b.array());
        }
        return out.toByteArray();
    }

    /** PLY without extra properties. */
    static byte[] ply(Raw m, Encoding enc, String xyzType) {
        return ply(m, enc, xyzType, new String[0], new double[0][]);
    }

    /**
     * The triangles of a mesh as sorted rows of 9 coordinates, each rotated to start at its smallest corner
     * (which keeps the orientation), so meshes with different vertex numbering compare equal.
     */
    static List<String> canonicalTriangles(TriangleMesh m) {
        List<String> rows = new ArrayList<>();
        for (int t = 0; t < m.triangleCount(); t++) {
            String[] c = new String[3];
            for (int k = 0; k < 3; k++) {
                int v = m.vertex(t, k);
                c[k] = m.x(v) + " " + m.y(v) + " " + m.z(v);
            }
            int s = 0;
            for (int k = 1; k < 3; k++) {
                if (c[k].compareTo(c[s]) < 0) {
                    s = k;
                }
            }
            rows.add(c[s] + " | " + c[(s + 1) % 3] + " | " + c[(s + 2) % 3]);
        }
        rows.sort(null);
        return rows;
    }
}

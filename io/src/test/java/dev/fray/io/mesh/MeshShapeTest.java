package dev.fray.io.mesh;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.io.mesh.MeshFixtures.Raw;

import java.util.Arrays;
import org.junit.jupiter.api.Test;

/**
 * The mesh shape against analytic solids. Inside tests are checked point by point against the shapes' own
 * analytic definitions on seeded random points (published: generalised winding number, Jacobson, Kavan and
 * Sorkine-Hornung 2013: 1 inside and 0 outside a closed surface).
 */
class MeshShapeTest extends FrayTestBase {
    /** A point this close to the surface (m) is not judged: the mesh and the analytic solid may disagree there. */
    private static final double PLANAR_BAND = 1e-9;
    /**
     * Fast and exact winding numbers agree to this at the default far-field ratio (measured 0.06 on the sphere and
     * 0.02 on the torus; see the accuracy note of MeshShape), far inside the 1/2 margin of the inside test.
     */
    private static final double FAR_FIELD_TOLERANCE = 0.1;
    /** With beta = 4 the error must shrink (measured 0.015 on the sphere). */
    private static final double FAR_FIELD_TOLERANCE_BETA4 = 0.03;
    /** Distances of a mesh with planar faces equal the analytic ones to rounding. */
    private static final double DISTANCE_TOLERANCE = 1e-12;

    private interface Inside {
        boolean test(double x, double y, double z);
    }

    private interface Margin {
        /** @return a lower bound of the distance to the analytic surface, m */
        double of(double x, double y, double z);
    }

    private int checkInside(MeshShape s, Inside analytic, Margin margin, double band, double[] box, int points) {
        int judged = 0;
        for (int i = 0; i < points; i++) {
            double x = box[0] + (box[3] - box[0]) * rand.nextDouble();
            double y = box[1] + (box[4] - box[1]) * rand.nextDouble();
            double z = box[2] + (box[5] - box[2]) * rand.nextDouble();
            if (margin.of(x, y, z) < band) {
                continue;
            }
            judged++;
            boolean in = analytic.test(x, y, z);
            double w = s.windingNumber(x, y, z);
            assertEquals(in ? 1.0 : 0.0, w, FAR_FIELD_TOLERANCE, "winding number at (" + x + ", " + y + ", " + z
                    + ")");
            assertEquals(in, s.contains(x, y, z));
            assertEquals(in, s.distance(x, y, z) < 0);
        }
        return judged;
    }

    @Test
    void cubeInsideOutsideAndDistance() {
        MeshShape s = MeshShape.of(MeshFixtures.cube().mesh());
        assertEquals(1.0, s.volume(), 1e-15);
        int judged = checkInside(s, (x, y, z) -> x > 0 && x < 1 && y > 0 && y < 1 && z > 0 && z < 1,
                MeshShapeTest::cubeMargin, PLANAR_BAND, new double[] {-1, -1, -1, 2, 2, 2}, 4000);
        assertTrue(judged > 3900);
        // Analytic distance of a box (common practice, no source): Euclidean distance to the box outside, distance
        // to the nearest face inside.
        for (int i = 0; i < 2000; i++) {
            double x = 3 * rand.nextDouble() - 1, y = 3 * rand.nextDouble() - 1, z = 3 * rand.nextDouble() - 1;
            double qx = Math.abs(x - 0.5) - 0.5, qy = Math.abs(y - 0.5) - 0.5, qz = Math.abs(z - 0.5) - 0.5;
            double out = Math.sqrt(sq(Math.max(qx, 0)) + sq(Math.max(qy, 0)) + sq(Math.max(qz, 0)));
            double expected = out + Math.min(Math.max(qx, Math.max(qy, qz)), 0);
            assertEquals(expected, s.distance(x, y, z), DISTANCE_TOLERANCE);
            double[] n = new double[3];
            s.normal(x, y, z, n, 0);
            assertEquals(1.0, Math.sqrt(n[0] * n[0] + n[1] * n[1] + n[2] * n[2]), 1e-12);
            // The normal points from the nearest surface point outward: stepping along it grows the distance
            // at unit rate (gradient of a distance function).
            double h = 1e-7;
            assertEquals(h, s.distance(x + h * n[0], y + h * n[1], z + h * n[2]) - s.distance(x, y, z), 1e-9);
        }
        double[] n = new double[3];
        s.normal(0.5, 0.5, 1.0, n, 0);
        assertEquals(1.0, n[2], 1e-15, "on the top face: the face normal");
        s.normal(0.5, 0.5, 0.9, n, 0);
        assertEquals(1.0, n[2], 1e-15, "inside below the top face: outward");
        s.normal(0.5, 0.5, 1.5, n, 0);
        assertEquals(1.0, n[2], 1e-15);
        assertEquals(new dev.fray.core.boundary.Bounds(0, 0, 0, 1, 1, 1), s.bounds());
    }

    private static double cubeMargin(double x, double y, double z) {
        double m = Double.POSITIVE_INFINITY;
        for (double c : new double[] {x, y, z}) {
            m = Math.min(m, Math.min(Math.abs(c), Math.abs(c - 1)));
        }
        return m;
    }

    private static double sq(double v) {
        return v * v;
    }

    @Test
    void tetrahedronInsideOutside() {
        double[] c = {0.1, 0.2, -0.3, 1.3, 0.1, 0.0, 0.2, 1.1, 0.1, 0.4, 0.3, 0.9};
        MeshShape s = MeshShape.of(MeshFixtures.tetrahedron(c).mesh());
        // Analytic inside of a tetrahedron (published: barycentric coordinates, all positive inside): solve
        // p - a0 = l1 (a1 - a0) + l2 (a2 - a0) + l3 (a3 - a0) by Cramer's rule.
        Inside inside = (x, y, z) -> {
            double[] l = barycentric(c, x, y, z);
            return l[0] > 0 && l[1] > 0 && l[2] > 0 && l[3] > 0;
        };
        Margin margin = (x, y, z) -> {
            double[] l = barycentric(c, x, y, z);
            double m = Double.POSITIVE_INFINITY;
            for (double v : l) {
                m = Math.min(m, Math.abs(v));
            }
            return m; // barycentric units; the band below is tiny either way
        };
        int judged = checkInside(s, inside, margin, PLANAR_BAND, new double[] {-0.5, -0.5, -1, 2, 2, 1.5}, 4000);
        assertTrue(judged > 3900);
        // Volume |det(a1 - a0, a2 - a0, a3 - a0)| / 6 (published: volume of a tetrahedron).
        double det = det3(c[3] - c[0], c[4] - c[1], c[5] - c[2], c[6] - c[0], c[7] - c[1], c[8] - c[2],
                c[9] - c[0], c[10] - c[1], c[11] - c[2]);
        assertEquals(Math.abs(det) / 6, s.volume(), 1e-14);
    }

    private static double[] barycentric(double[] c, double x, double y, double z) {
        double ux = c[3] - c[0], uy = c[4] - c[1], uz = c[5] - c[2];
        double vx = c[6] - c[0], vy = c[7] - c[1], vz = c[8] - c[2];
        double wx = c[9] - c[0], wy = c[10] - c[1], wz = c[11] - c[2];
        double px = x - c[0], py = y - c[1], pz = z - c[2];
        double d = det3(ux, uy, uz, vx, vy, vz, wx, wy, wz);
        double l1 = det3(px, py, pz, vx, vy, vz, wx, wy, wz) / d;
        double l2 = det3(ux, uy, uz, px, py, pz, wx, wy, wz) / d;
        double l3 = det3(ux, uy, uz, vx, vy, vz, px, py, pz) / d;
        return new double[] {1 - l1 - l2 - l3, l1, l2, l3};
    }

    private static double det3(double ax, double ay, double az, double bx, double by, double bz, double cx,
                               double cy, double cz) {
        return ax * (by * cz - bz * cy) - ay * (bx * cz - bz * cx) + az * (bx * cy - by * cx);
    }

    @Test
    void torusInsideOutsideAndFarFieldAccuracy() {
        double bigR = 0.3, r = 0.1;
        int nu = 96, nv = 24;
        Raw torus = MeshFixtures.torus(bigR, r, nu, nv);
        MeshShape s = MeshShape.of(torus.mesh());
        MeshShape exact = MeshShape.builder(torus.mesh()).farFieldRatio(Double.POSITIVE_INFINITY).build();
        // Analytic torus (published: implicit equation (sqrt(x^2 + y^2) - R)^2 + z^2 < r^2). The mesh is inscribed,
        // so points within the sagitta of the coarser direction of the surface are not judged.
        double band = 2 * (r * (1 - Math.cos(Math.PI / nv)) + (bigR + r) * (1 - Math.cos(Math.PI / nu)));
        Margin margin = (x, y, z) -> Math.abs(Math.hypot(Math.hypot(x, y) - bigR, z) - r);
        Inside inside = (x, y, z) -> Math.hypot(Math.hypot(x, y) - bigR, z) < r;
        int judged = checkInside(s, inside, margin, band, new double[] {-0.5, -0.5, -0.2, 0.5, 0.5, 0.2}, 4000);
        assertTrue(judged > 3000, "judged " + judged);
        // Fast (far-field) against exact winding numbers, in and around the box.
        double worst = 0;
        for (int i = 0; i < 1500; i++) {
            double x = 1.2 * rand.nextDouble() - 0.6, y = 1.2 * rand.nextDouble() - 0.6;
            double z = 0.6 * rand.nextDouble() - 0.3;
            worst = Math.max(worst, Math.abs(s.windingNumber(x, y, z) - exact.windingNumber(x, y, z)));
            assertEquals(exact.windingNumber(x, y, z), exact.exactWindingNumber(x, y, z), 1e-12);
        }
        assertTrue(worst < FAR_FIELD_TOLERANCE, "largest far-field error " + worst);
        // Pappus's centroid theorem (published): volume 2 pi^2 R r^2; the inscribed mesh is a little smaller.
        double pappus = 2 * Math.PI * Math.PI * bigR * r * r;
        assertEquals(pappus, s.volume(), 0.02 * pappus);
        assertTrue(s.volume() < pappus);
    }

    @Test
    void sphereFarFieldAccuracy() {
        Raw sphere = MeshFixtures.icosphere(0, 0, 0, 1, 5);
        assertEquals(20480, sphere.triangles());
        MeshShape s = MeshShape.of(sphere.mesh());
        MeshShape fine = MeshShape.builder(sphere.mesh()).farFieldRatio(4).build();
        double worst = 0, worstFine = 0;
        for (int i = 0; i < 1000; i++) {
            double x = 3 * rand.nextDouble() - 1.5, y = 3 * rand.nextDouble() - 1.5, z = 3 * rand.nextDouble() - 1.5;
            double exact = s.exactWindingNumber(x, y, z);
            worst = Math.max(worst, Math.abs(s.windingNumber(x, y, z) - exact));
            worstFine = Math.max(worstFine, Math.abs(fine.windingNumber(x, y, z) - exact));
            // Unit sphere (published: |p| < 1 inside); the inscribed mesh lies within 1e-3 of it at this level.
            double r = Math.sqrt(x * x + y * y + z * z);
            if (Math.abs(r - 1) > 1e-2) {
                assertEquals(r < 1, s.contains(x, y, z));
            }
        }
        assertTrue(worst < FAR_FIELD_TOLERANCE, "largest far-field error " + worst);
        assertTrue(worstFine < FAR_FIELD_TOLERANCE_BETA4, "largest far-field error at beta 4 " + worstFine);
    }

    @Test
    void cubeWithOneFaceRemovedHasFourOpenEdges() {
        Raw cube = MeshFixtures.cube();
        int[] t = Arrays.copyOf(cube.t(), 30); // drops the two triangles of the last face
        TriangleMesh open = TriangleMesh.of(cube.p(), t);
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> MeshShape.of(open));
        assertEquals(FrayMessage.OUT_OF_RANGE, e.key());
        assertEquals(4, e.parts()[1]);
        MeshShape s = MeshShape.builder(open).allowOpen(true).build();
        // Counting by hand (common practice, no source): the removed square's four sides lose one of their two
        // triangles; its diagonal loses both and is gone.
        assertEquals(4, s.openEdges());
        assertEquals(0, s.nonManifoldEdges());
        assertEquals(0, s.misorientedEdges());
        assertFalse(s.reversed(), "open meshes are never re-oriented");
    }

    @Test
    void nonManifoldMisorientedAndDuplicatedVertices() {
        Raw cube = MeshFixtures.cube();
        // A fin: one more triangle on an existing edge makes it used three times; its other two edges are open.
        int[] fin = Arrays.copyOf(cube.t(), 39);
        double[] p = Arrays.copyOf(cube.p(), 27);
        p[24] = 0.5;
        p[25] = 0.5;
        p[26] = 3;
        fin[36] = cube.t()[0];
        fin[37] = cube.t()[1];
        fin[38] = 8;
        MeshShape s = MeshShape.builder(TriangleMesh.of(p, fin)).allowOpen(true).build();
        assertEquals(1, s.nonManifoldEdges());
        assertEquals(2, s.openEdges());
        // One triangle flipped: its three edges are each run the same way by both neighbours.
        int[] flipped = cube.t().clone();
        int tmp = flipped[1];
        flipped[1] = flipped[2];
        flipped[2] = tmp;
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> MeshShape.of(TriangleMesh.of(cube.p(), flipped)));
        assertEquals(3, e.parts()[1]);
        // Vertices repeated per triangle are still one closed surface (counted by position).
        double[] soup = new double[9 * 12];
        int[] st = new int[36];
        for (int i = 0; i < 36; i++) {
            System.arraycopy(cube.p(), 3 * cube.t()[i], soup, 3 * i, 3);
            st[i] = i;
        }
        MeshShape fromSoup = MeshShape.of(TriangleMesh.of(soup, st));
        assertEquals(0, fromSoup.openEdges());
        assertEquals(1.0, fromSoup.volume(), 1e-15);
        assertEquals(8, TriangleMesh.of(soup, st).welded().vertexCount());
    }

    @Test
    void inwardOrientedMeshIsTurnedOutward() {
        Raw cube = MeshFixtures.cube();
        int[] t = cube.t().clone();
        for (int i = 0; i < 12; i++) {
            int tmp = t[3 * i + 1];
            t[3 * i + 1] = t[3 * i + 2];
            t[3 * i + 2] = tmp;
        }
        MeshShape s = MeshShape.of(TriangleMesh.of(cube.p(), t));
        assertTrue(s.reversed());
        assertTrue(s.contains(0.5, 0.5, 0.5));
        assertEquals(-0.5, s.distance(0.5, 0.5, 0.5), 1e-15);
        assertEquals(1.0, s.volume(), 1e-15);
        double[] n = new double[3];
        s.normal(0.5, 0.5, 1, n, 0);
        assertEquals(1.0, n[2], 1e-15);
        // Barycentric weights come back in the mesh's own corner order.
        double[] out = new double[6];
        int tri = s.nearestTriangle(0.2, 0.3, 1.5, out);
        double[] q = new double[3];
        for (int c = 0; c < 3; c++) {
            int v = t[3 * tri + c];
            for (int k = 0; k < 3; k++) {
                q[k] += out[3 + c] * cube.p()[3 * v + k];
            }
        }
        assertEquals(0.2, q[0], 1e-15);
        assertEquals(0.3, q[1], 1e-15);
        assertEquals(1.0, q[2], 1e-15);
    }

    @Test
    void transformedMeshKeepsAttributesAndScalesTheVolume() {
        TriangleMesh mm = MeshFixtures.cube().mesh().withAttribute("f", 3, new double[24]).withName("part.obj");
        TriangleMesh m = mm.transformed(0.001, 1, 2, 3);
        assertEquals("part.obj", m.name());
        assertEquals(3, m.attributeWidth("f"));
        MeshShape s = MeshShape.of(m);
        // Volume scales with the cube of the length scale (published: similarity of solids).
        assertEquals(1e-9, s.volume(), 1e-19); // coordinates near 1 m carry 1e-16 m of rounding
        assertTrue(s.contains(1.0005, 2.0005, 3.0005));
        assertFalse(s.contains(0.5, 0.5, 0.5));
        assertThrows(InvalidInputException.class, () -> mm.transformed(0, 0, 0, 0));
        assertThrows(InvalidInputException.class, () -> mm.transformed(1, Double.NaN, 0, 0));
    }

    @Test
    void rejectsMeshesWithoutArea() {
        TriangleMesh m = TriangleMesh.of(new double[] {0, 0, 0, 1, 0, 0}, new int[] {0, 0, 1});
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> MeshShape.of(m));
        assertEquals(FrayMessage.OUT_OF_RANGE, e.key());
        assertThrows(InvalidInputException.class, () -> MeshShape.builder(MeshFixtures.cube().mesh())
                .farFieldRatio(0.5));
        assertTrue(Double.isNaN(MeshShape.of(MeshFixtures.cube().mesh()).distance(Double.NaN, 0, 0)));
    }
}

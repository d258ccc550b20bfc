package dev.fray.damage.fiber;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ChannelField;
import dev.fray.core.testing.FrayTestBase;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.api.function.Executable;

import java.util.List;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Fiber direction fields: unit length and the geometric property that defines each one (common practice, no
 * source: the cylindrical basis e_r, e_theta, e_z about an axis, and a helix as e_theta turned toward e_z by its
 * pitch angle), and nearest-sample lookup against a brute-force scan.
 */
class FiberFieldsTest extends FrayTestBase {
    /** Unit length and orthogonality hold to rounding of a few products. */
    private static final double ROUNDING = 1e-14;
    private static final int POINTS = 500;

    private static final double[] POINT = {0.3, -1.2, 2.0};
    private static final double[] AXIS = {1.0, 2.0, -0.5};

    private static double dot(double[] a, double[] b) {
        return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    }

    private static double[] unit(double[] a) {
        double n = Math.sqrt(dot(a, a));
        return new double[] {a[0] / n, a[1] / n, a[2] / n};
    }

    private static double[] cross(double[] a, double[] b) {
        return new double[] {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    }

    private double[] randomPoint(double spread) {
        return new double[] {spread * rand.nextGaussian(), spread * rand.nextGaussian(), spread * rand.nextGaussian()};
    }

    private static double[] eval(ChannelField field, double[] x) {
        double[] out = new double[3];
        field.value(x[0], x[1], x[2], out);
        return out;
    }

    /** Unit radial vector of x about the test axis, computed here from the definition. */
    private static double[] radialOf(double[] x) {
        double[] n = unit(AXIS);
        double[] r = {x[0] - POINT[0], x[1] - POINT[1], x[2] - POINT[2]};
        double a = dot(r, n);
        return unit(new double[] {r[0] - a * n[0], r[1] - a * n[1], r[2] - a * n[2]});
    }

    @Test
    void uniformIsTheNormalisedDirectionEverywhere() {
        // common practice, no source
        ChannelField f = FiberFields.uniform(3, 0, 4);
        for (int i = 0; i < 20; i++) {
            assertArrayEquals(new double[] {0.6, 0, 0.8}, eval(f, randomPoint(5)), ROUNDING);
        }
    }

    @Test
    void circumferentialIsPerpendicularToAxisAndRadiusAndRightHanded(TestReporter reporter) {
        // common practice, no source: e_theta = e_z x e_r
        ChannelField f = FiberFields.circumferential(POINT, AXIS);
        double[] n = unit(AXIS);
        double worst = 0;
        for (int i = 0; i < POINTS; i++) {
            double[] x = randomPoint(3);
            double[] t = eval(f, x);
            double[] er = radialOf(x);
            worst = Math.max(worst, Math.abs(dot(t, t) - 1));
            worst = Math.max(worst, Math.abs(dot(t, n)));
            worst = Math.max(worst, Math.abs(dot(t, er)));
            assertTrue(dot(cross(er, t), n) > 0.999, "right-handed about the axis");
        }
        reporter.publishEntry("worst unit-length / orthogonality error", Double.toString(worst));
        assertTrue(worst < ROUNDING, "worst " + worst);
    }

    @Test
    void radialPointsAwayFromTheAxis(TestReporter reporter) {
        // common practice, no source: e_r is the unit part of x - point perpendicular to the axis
        ChannelField f = FiberFields.radial(POINT, AXIS);
        double[] n = unit(AXIS);
        double worst = 0;
        for (int i = 0; i < POINTS; i++) {
            double[] x = randomPoint(3);
            double[] u = eval(f, x);
            double[] r = {x[0] - POINT[0], x[1] - POINT[1], x[2] - POINT[2]};
            double[] c = cross(u, radialOf(x));
            worst = Math.max(worst, Math.abs(dot(u, u) - 1));
            worst = Math.max(worst, Math.abs(dot(u, n)));
            worst = Math.max(worst, Math.sqrt(dot(c, c)));
            assertTrue(dot(u, r) > 0, "points away from the axis");
        }
        reporter.publishEntry("worst unit-length / orthogonality / parallelism error", Double.toString(worst));
        assertTrue(worst < ROUNDING, "worst " + worst);
    }

    @Test
    void helicalIsCircumferentialTiltedTowardTheAxisByThePitch(TestReporter reporter) {
        // common practice, no source: a helix of pitch angle beta has direction cos(beta) e_theta + sin(beta) e_z
        double[] n = unit(AXIS);
        double worst = 0;
        for (double beta : new double[] {0.0, 0.3, -0.7, Math.PI / 4, Math.PI / 2}) {
            ChannelField f = FiberFields.helical(POINT, AXIS, beta);
            ChannelField hoop = FiberFields.circumferential(POINT, AXIS);
            for (int i = 0; i < POINTS / 5; i++) {
                double[] x = randomPoint(3);
                double[] h = eval(f, x);
                double[] t = eval(hoop, x);
                worst = Math.max(worst, Math.abs(dot(h, h) - 1));
                worst = Math.max(worst, Math.abs(dot(h, radialOf(x))));
                worst = Math.max(worst, Math.abs(dot(h, n) - Math.sin(beta)));
                worst = Math.max(worst, Math.abs(dot(h, t) - Math.cos(beta)));
            }
        }
        reporter.publishEntry("worst helix error", Double.toString(worst));
        assertTrue(worst < ROUNDING, "worst " + worst);
    }

    @Test
    void onTheAxisTheDocumentedPerpendicularIsUsed() {
        // common practice, no source: on the axis e_r is undefined; the class documents a fixed perpendicular e
        double[] n = unit(AXIS);
        ChannelField radial = FiberFields.radial(POINT, AXIS);
        ChannelField hoop = FiberFields.circumferential(POINT, AXIS);
        double[] e0 = eval(radial, POINT);
        for (double s : new double[] {0.0, 1.0, -2.5}) {
            double[] x = {POINT[0] + s * AXIS[0], POINT[1] + s * AXIS[1], POINT[2] + s * AXIS[2]};
            double[] e = eval(radial, x);
            double[] t = eval(hoop, x);
            assertEquals(1.0, dot(e, e), ROUNDING);
            assertEquals(0.0, dot(e, n), ROUNDING);
            assertArrayEquals(e0, e, ROUNDING, "same e all along the axis");
            assertArrayEquals(cross(n, e), t, ROUNDING, "circumferential is n x e");
        }
        // e: the coordinate axis least aligned with n (here z: |n_z| = 0.5 / sqrt(5.25) is smallest) made
        // perpendicular to n
        double d = n[2];
        assertArrayEquals(unit(new double[] {-d * n[0], -d * n[1], 1 - d * n[2]}), e0, ROUNDING);
    }

    @Test
    void functionNormalisesAndKeepsZero() {
        // common practice, no source
        ChannelField f = FiberFields.function((x, y, z, out) -> {
            out[0] = x;
            out[1] = 2 * y;
            out[2] = 0;
        });
        assertArrayEquals(new double[] {0.6, 0.8, 0}, eval(f, new double[] {3, 2, 7}), ROUNDING);
        assertArrayEquals(new double[3], eval(f, new double[] {0, 0, 1}), 0.0, "zero stays zero (no fiber)");
        ChannelField bad = FiberFields.function((x, y, z, out) -> out[0] = Double.NaN);
        assertEquals(FrayMessage.NOT_FINITE, assertThrows(InvalidInputException.class,
                () -> eval(bad, new double[] {0, 0, 0})).key());
    }

    @Test
    void samplesReturnTheNearestSampleAsABruteForceScanDoes(TestReporter reporter) {
        // common practice, no source: nearest neighbour by Euclidean distance, checked against a full scan on
        // seeded data: uniform, clustered (many points in a small ball), and on a grid with repeated coordinates
        int checked = 0;
        for (int kind = 0; kind < 3; kind++) {
            Random r = new Random(SEED + kind);
            int n = kind == 2 ? 8 * 8 * 8 : 3000;
            double[] pts = new double[3 * n];
            double[] dirs = new double[3 * n];
            for (int i = 0; i < n; i++) {
                for (int c = 0; c < 3; c++) {
                    pts[3 * i + c] = switch (kind) {
                        case 0 -> 10 * r.nextDouble();
                        case 1 -> (i % 2 == 0 ? 1e-3 : 5.0) * r.nextGaussian();
                        default -> c == 0 ? i % 8 : c == 1 ? (i / 8) % 8 : i / 64;
                    };
                    dirs[3 * i + c] = r.nextGaussian();
                }
            }
            ChannelField f = FiberFields.samples(pts, dirs);
            for (int q = 0; q < 2000; q++) {
                double[] x = kind == 2 && q % 2 == 0
                        // grid: half the queries sit exactly between samples, where the tie rule decides
                        ? new double[] {r.nextInt(8) + 0.5, r.nextInt(8), r.nextInt(8) + 0.5}
                        : new double[] {12 * r.nextDouble() - 1, 12 * r.nextDouble() - 1, 12 * r.nextDouble() - 1};
                int best = bruteForce(pts, x);
                double[] expected = unit(new double[] {dirs[3 * best], dirs[3 * best + 1], dirs[3 * best + 2]});
                assertArrayEquals(expected, eval(f, x), 0.0, "query " + q + " of data set " + kind);
                checked++;
            }
            // a query exactly on a sample returns that sample
            for (int i = 0; i < n; i += 97) {
                double[] x = {pts[3 * i], pts[3 * i + 1], pts[3 * i + 2]};
                int best = bruteForce(pts, x);
                double[] expected = unit(new double[] {dirs[3 * best], dirs[3 * best + 1], dirs[3 * best + 2]});
                assertArrayEquals(expected, eval(f, x), 0.0);
            }
        }
        reporter.publishEntry("queries matching the brute-force scan", Integer.toString(checked));
    }

    /** Nearest sample by a full scan; on a tie, the first one given, as the field documents. */
    private static int bruteForce(double[] pts, double[] x) {
        int best = -1;
        double bd = Double.POSITIVE_INFINITY;
        for (int i = 0; i < pts.length / 3; i++) {
            double dx = pts[3 * i] - x[0], dy = pts[3 * i + 1] - x[1], dz = pts[3 * i + 2] - x[2];
            double d = dx * dx + dy * dy + dz * dz;
            if (d < bd) {
                bd = d;
                best = i;
            }
        }
        return best;
    }

    @Test
    void samplesKeepZeroDirections() {
        // common practice, no source: zero is "no fiber" (FiberChannels)
        ChannelField f = FiberFields.samples(new double[] {0, 0, 0, 1, 0, 0}, new double[] {0, 0, 0, 0, 0, 2});
        assertArrayEquals(new double[3], eval(f, new double[] {0.2, 0, 0}), 0.0);
        assertArrayEquals(new double[] {0, 0, 1}, eval(f, new double[] {0.8, 0, 0}), 0.0);
    }

    @Test
    void rejectsBadInput() {
        // common practice, no source: a direction needs a finite non-zero vector; arrays need 3 values per sample
        List<Executable> outOfRange = List.of(
                () -> FiberFields.uniform(0, 0, 0),
                () -> FiberFields.circumferential(POINT, new double[] {0, 0, 0}),
                () -> FiberFields.radial(new double[] {0, 0}, AXIS),
                () -> FiberFields.helical(POINT, AXIS, 2.0),
                () -> FiberFields.samples(new double[0], new double[0]),
                () -> FiberFields.samples(new double[] {0, 0, 0, 1}, new double[] {1, 0, 0, 1}),
                () -> FiberFields.samples(new double[] {0, 0, 0}, new double[] {1, 0, 0, 1, 0, 0}));
        for (Executable e : outOfRange) {
            assertEquals(FrayMessage.OUT_OF_RANGE, assertThrows(InvalidInputException.class, e).key());
        }
        List<Executable> notFinite = List.of(
                () -> FiberFields.uniform(Double.NaN, 0, 1),
                () -> FiberFields.radial(new double[] {0, Double.POSITIVE_INFINITY, 0}, AXIS),
                () -> FiberFields.helical(POINT, AXIS, Double.NaN),
                () -> FiberFields.samples(new double[] {0, 0, Double.NaN}, new double[] {1, 0, 0}));
        for (Executable e : notFinite) {
            assertEquals(FrayMessage.NOT_FINITE, assertThrows(InvalidInputException.class, e).key());
        }
        assertEquals(FrayMessage.MISSING, assertThrows(InvalidInputException.class,
                () -> FiberFields.circumferential(null, AXIS)).key());
    }
}

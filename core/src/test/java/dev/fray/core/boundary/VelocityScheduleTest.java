package dev.fray.core.boundary;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.testing.FrayTestBase;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Factor and integral of velocity schedules against areas worked by hand: triangles, rectangles and trapezoids
 * under a piecewise linear function (elementary calculus; common practice, no source).
 */
class VelocityScheduleTest extends FrayTestBase {
    /** Hand-computed areas against the schedule's sums: a few roundings of numbers near 1. */
    private static final double EXACT_REL = 1e-12;

    private static void close(double expected, double actual, String what) {
        assertEquals(expected, actual, EXACT_REL * Math.max(1, Math.abs(expected)), what);
    }

    @Test
    void rampThenHold() {
        VelocitySchedule s = VelocitySchedule.ramp(0.1);
        assertEquals(0.0, s.factor(-1));
        assertEquals(0.0, s.factor(0));
        close(0.5, s.factor(0.05), "half way up the ramp");
        assertEquals(1.0, s.factor(0.1));
        assertEquals(1.0, s.factor(7));
        // Triangle of base 0.1 s and height 1: 0.05 s; then a rectangle of height 1.
        assertEquals(0.0, s.integral(0));
        close(0.05 * 0.05 / (2 * 0.1), s.integral(0.05), "t^2 / (2 T) on the ramp");
        close(0.05, s.integral(0.1), "triangle");
        close(0.95, s.integral(1), "triangle + rectangle 0.9 s");
        close(0.05 + 99.9, s.integral(100), "long hold");
        assertEquals(1.0, s.maxFactor());
    }

    @Test
    void rampHoldStop() {
        VelocitySchedule s = VelocitySchedule.of(new double[] {0, 0.1, 2, 2.05}, new double[] {0, 1, 1, 0});
        close(0.5, s.factor(2.025), "half way down");
        assertEquals(0.0, s.factor(3));
        // Up: 0.05; hold 1.9 s: 1.9; down half way: trapezoid 0.025 (1 + 0.5) / 2; down in full: 0.025.
        close(0.05 + 1.9, s.integral(2), "up and hold");
        close(0.05 + 1.9 + 0.025 * 0.75, s.integral(2.025), "half way down");
        close(1.975, s.integral(2.05), "stopped");
        close(1.975, s.integral(10), "stays stopped");
    }

    @Test
    void firstKnotLaterThanZeroAndNegativeFactors() {
        // s = 2 until 1 s, then linear to -1 at 4 s, then -1.
        VelocitySchedule s = VelocitySchedule.of(new double[] {1, 4}, new double[] {2, -1});
        close(1.0, s.integral(0.5), "rectangle 0.5 s at 2");
        close(2.0, s.integral(1), "rectangle 1 s at 2");
        assertEquals(1.0, s.factor(2));
        close(2 + 1.5, s.integral(2), "plus trapezoid (2 + 1) / 2 over 1 s");
        close(2 + 1.5, s.integral(4), "the pieces above and below zero cancel from 2 s to 4 s");
        close(3.5 - 2, s.integral(6), "then -1 for 2 s");
        assertEquals(2.0, s.maxFactor());
        assertEquals(-2.0, s.integral(-1), "before the first knot S = s0 t also for t < 0");
    }

    /**
     * The fundamental theorem of calculus: the central difference of S is s away from the knots (exact for a
     * quadratic S within a piece up to rounding). Common practice, no source. Seeded random schedules.
     */
    @ParameterizedTest
    @ValueSource(longs = {1, 2, 3, 4, 5, 6, 7, 8})
    void integralDifferentiatesToTheFactor(long seed) {
        Random r = new Random(seed);
        int n = 1 + r.nextInt(8);
        double[] t = new double[n];
        double[] f = new double[n];
        double at = r.nextDouble();
        for (int k = 0; k < n; k++) {
            t[k] = at;
            f[k] = 4 * r.nextDouble() - 2;
            at += 0.05 + r.nextDouble();
        }
        VelocitySchedule s = VelocitySchedule.of(t, f);
        double h = 1e-4;
        for (int i = 0; i < 200; i++) {
            double x = -1 + (at + 2) * r.nextDouble();
            boolean nearKnot = false;
            for (double tk : t) {
                nearKnot |= Math.abs(x - tk) < 2 * h;
            }
            if (nearKnot) {
                continue;
            }
            double slope = (s.integral(x + h) - s.integral(x - h)) / (2 * h);
            assertEquals(s.factor(x), slope, 1e-8, "dS/dt = s at t = " + x);
        }
        // Continuity of S across every knot.
        for (double tk : t) {
            assertEquals(s.integral(tk), s.integral(Math.nextDown(tk)), 1e-12);
            assertEquals(s.integral(tk), s.integral(Math.nextUp(tk)), 1e-12);
        }
    }

    @Test
    void constantScheduleIsTimeItself() {
        VelocitySchedule c = VelocitySchedule.constant();
        assertTrue(c.isConstant());
        for (int i = 0; i < 1000; i++) {
            double t = (rand.nextDouble() - 0.1) * Math.pow(10, rand.nextInt(12) - 6);
            assertEquals(Double.doubleToRawLongBits(t), Double.doubleToRawLongBits(c.integral(t)));
            assertEquals(Double.doubleToRawLongBits(1.0), Double.doubleToRawLongBits(c.factor(t)));
        }
        assertSame(c, VelocitySchedule.of(new double[] {0, 1, 5}, new double[] {1, 1, 1}),
                "factor 1 everywhere is the constant schedule");
        assertEquals(1.0, c.maxFactor());
        assertFalse(VelocitySchedule.ramp(0.2).isConstant());
    }

    @Test
    void valueEquality() {
        VelocitySchedule a = VelocitySchedule.ramp(0.1);
        VelocitySchedule b = VelocitySchedule.of(new double[] {0, 0.1}, new double[] {0, 1});
        assertEquals(a, b);
        assertEquals(a.hashCode(), b.hashCode());
        assertNotEquals(a, VelocitySchedule.ramp(0.2));
        double[] times = a.times();
        times[1] = 5;
        assertEquals(0.1, a.times()[1], "times() is a copy");
        assertEquals(2, a.knotCount());
    }

    private static InvalidInputException bad(FrayMessage key, String field, double[] t, double[] f) {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> VelocitySchedule.of(t, f));
        assertEquals(key, e.key(), e.getMessage());
        assertEquals(field, e.parts()[0], e.getMessage());
        return e;
    }

    @Test
    void badKnotsAreNamed() {
        bad(FrayMessage.OUT_OF_RANGE, "number of schedule knots", new double[0], new double[0]);
        bad(FrayMessage.OUT_OF_RANGE, "number of schedule factors", new double[] {0, 1}, new double[] {1});
        bad(FrayMessage.OUT_OF_RANGE, "schedule time[0] (s)", new double[] {-0.5, 1}, new double[] {0, 1});
        InvalidInputException e = bad(FrayMessage.OUT_OF_RANGE, "schedule time[2] (s)",
                new double[] {0, 1, 0.5}, new double[] {0, 1, 1});
        assertTrue(e.getMessage().contains("strictly increasing"), e.getMessage());
        bad(FrayMessage.OUT_OF_RANGE, "schedule time[1] (s)", new double[] {0, 0}, new double[] {0, 1});
        bad(FrayMessage.NOT_FINITE, "schedule time[1] (s)", new double[] {0, Double.NaN}, new double[] {0, 1});
        bad(FrayMessage.NOT_FINITE, "schedule time[1] (s)", new double[] {0, Double.POSITIVE_INFINITY},
                new double[] {0, 1});
        bad(FrayMessage.NOT_FINITE, "schedule factor[0]", new double[] {0, 1}, new double[] {Double.NaN, 1});
        InvalidInputException r = assertThrows(InvalidInputException.class, () -> VelocitySchedule.ramp(0));
        assertEquals(FrayMessage.OUT_OF_RANGE, r.key());
        assertEquals("schedule ramp time (s)", r.parts()[0]);
    }
}

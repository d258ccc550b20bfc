package dev.fray.core.boundary;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.testing.FrayTestBase;
import org.junit.jupiter.api.Test;

/** Poses of scheduled motions: the path is the velocity times the schedule's integral. */
class MotionTest extends FrayTestBase {
    private static final double EXACT_REL = 1e-12;

    /**
     * A grip ramped to 0.2 m/s over 0.1 s moves 0.2 m/s times the area under the schedule: 0.2 * 0.05 m by the end
     * of the ramp and 0.2 * 0.95 m at 1 s (triangle plus rectangle; elementary calculus, common practice, no source).
     */
    @Test
    void rampedPullMovesTheIntegralOfItsSchedule() {
        Motion m = Motion.linear(0.2, 0, 0).withSchedule(VelocitySchedule.ramp(0.1));
        double[] pose = new double[12];
        double[][] cases = {{0.05, 0.2 * 0.0125}, {0.1, 0.2 * 0.05}, {1.0, 0.2 * 0.95}, {3.0, 0.2 * 2.95}};
        for (double[] c : cases) {
            m.pose(c[0], pose);
            assertEquals(c[1], pose[9], EXACT_REL * c[1], "displacement at t = " + c[0]);
            assertEquals(0.0, pose[10]);
            assertEquals(1.0, pose[0]);
        }
        assertEquals(0.0, m.factor(0));
        assertEquals(0.5, m.factor(0.05), 1e-15);
        assertEquals(1.0, m.factor(0.2));
        assertEquals(0.2, m.linearSpeed(), 1e-15);
    }

    /**
     * A solver that moves a grip by its velocity times the step's mean factor, step after step of uneven length,
     * lands on v S(t) (the telescoping sum of S(t1) - S(t0)); the factor at the start of each step would not
     * (forward Euler misses the ramp's triangle by O(step)). Common practice, no source.
     */
    @Test
    void stepsScaledByTheMeanFactorAddUpToThePose() {
        Motion m = Motion.linear(0.2, 0, 0).withSchedule(VelocitySchedule.ramp(0.1));
        double t = 0;
        double x = 0;
        double euler = 0;
        while (t < 0.5) {
            double h = 1e-4 + 1e-3 * rand.nextDouble();
            x += m.vx() * m.meanFactor(t, t + h) * h;
            euler += m.vx() * m.factor(t) * h;
            t += h;
        }
        double[] pose = new double[12];
        m.pose(t, pose);
        assertEquals(pose[9], x, EXACT_REL * pose[9], "mean factor per step");
        assertTrue(Math.abs(euler - pose[9]) > 1e3 * EXACT_REL * pose[9], "the start factor per step drifts");
        assertEquals(1.0, Motion.linear(1, 0, 0).meanFactor(0.3, 0.30001), "exactly 1 without a schedule");
        assertEquals(0.5, m.meanFactor(0.05, 0.05), 1e-15, "an empty step gives the factor itself");
    }

    @Test
    void scheduledPoseIsVelocityTimesIntegral() {
        VelocitySchedule s = VelocitySchedule.of(new double[] {0, 0.3, 1.2, 1.5}, new double[] {0, 2, 2, -0.5});
        Motion m = new Motion(0.3, -0.7, 0.2, 0, 0, 1.5, 0.1, 0.2, 0.3, s);
        double[] pose = new double[12];
        for (int i = 0; i < 200; i++) {
            double t = 2 * rand.nextDouble();
            double area = s.integral(t);
            m.pose(t, pose);
            assertEquals(0.1 + 0.3 * area, pose[9], EXACT_REL);
            assertEquals(0.2 - 0.7 * area, pose[10], EXACT_REL);
            assertEquals(0.3 + 0.2 * area, pose[11], EXACT_REL);
            // Turned about z by |w| S(t).
            assertEquals(Math.cos(1.5 * area), pose[0], EXACT_REL);
            assertEquals(Math.sin(1.5 * area), pose[3], EXACT_REL);
            assertEquals(1.0, pose[8], EXACT_REL);
        }
        assertEquals(2 * Math.sqrt(0.09 + 0.49 + 0.04), m.linearSpeed(), 1e-15, "largest speed over time");
        assertEquals(s, m.withRotation(1, 0, 0, 0, 0, 0).schedule(), "a rotation added keeps the schedule");
    }

    /** Copy of the pose of a motion at constant velocity as it was before schedules, to compare bits. */
    private static void oldPose(Motion m, double t, double[] out) {
        double w = Math.sqrt(m.wx() * m.wx() + m.wy() * m.wy() + m.wz() * m.wz());
        double angle = w * t;
        if (w == 0 || angle == 0) {
            out[0] = 1; out[1] = 0; out[2] = 0;
            out[3] = 0; out[4] = 1; out[5] = 0;
            out[6] = 0; out[7] = 0; out[8] = 1;
        } else {
            double kx = m.wx() / w, ky = m.wy() / w, kz = m.wz() / w;
            double c = Math.cos(angle), s = Math.sin(angle), d = 1 - c;
            out[0] = c + kx * kx * d;      out[1] = kx * ky * d - kz * s; out[2] = kx * kz * d + ky * s;
            out[3] = ky * kx * d + kz * s; out[4] = c + ky * ky * d;      out[5] = ky * kz * d - kx * s;
            out[6] = kz * kx * d - ky * s; out[7] = kz * ky * d + kx * s; out[8] = c + kz * kz * d;
        }
        out[9] = m.cx() + m.vx() * t;
        out[10] = m.cy() + m.vy() * t;
        out[11] = m.cz() + m.vz() * t;
    }

    @Test
    void withoutAScheduleThePoseIsBitwiseAsBefore() {
        double[] now = new double[12];
        double[] before = new double[12];
        for (int i = 0; i < 500; i++) {
            Motion m = new Motion(g(), g(), g(), i % 3 == 0 ? 0 : g(), g(), g(), g(), g(), g());
            assertSame(VelocitySchedule.constant(), m.schedule());
            double t = 10 * rand.nextDouble();
            m.pose(t, now);
            oldPose(m, t, before);
            for (int k = 0; k < 12; k++) {
                assertEquals(Double.doubleToRawLongBits(before[k]), Double.doubleToRawLongBits(now[k]),
                        "pose value " + k + " of " + m + " at t = " + t);
            }
            double speed = Math.sqrt(m.vx() * m.vx() + m.vy() * m.vy() + m.vz() * m.vz());
            assertEquals(Double.doubleToRawLongBits(speed), Double.doubleToRawLongBits(m.linearSpeed()));
            assertEquals(Double.doubleToRawLongBits(1.0), Double.doubleToRawLongBits(m.factor(t)));
        }
    }

    private double g() {
        return 4 * rand.nextDouble() - 2;
    }

    @Test
    void constructorsAndStillness() {
        Motion nine = new Motion(1, 2, 3, 0, 0, 0, 0, 0, 0);
        assertEquals(nine, new Motion(1, 2, 3, 0, 0, 0, 0, 0, 0, null));
        assertEquals(nine, nine.withSchedule(VelocitySchedule.constant()));
        assertFalse(nine.isStill());
        Motion halted = nine.withSchedule(VelocitySchedule.of(new double[] {0}, new double[] {0}));
        assertTrue(halted.isStill(), "a schedule that is always 0 never moves");
        assertEquals(0.0, halted.linearSpeed());
        assertTrue(Motion.STILL.isStill());
    }
}

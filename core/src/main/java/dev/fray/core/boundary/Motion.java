package dev.fray.core.boundary;

import dev.fray.core.error.Checks;

/**
 * A prescribed rigid motion: linear velocity v (m/s) and angular velocity w (rad/s) about a pivot c (m) that
 * travels with the motion, both scaled over time by a dimensionless {@link VelocitySchedule} s(t) (factor 1 at all
 * times unless one is given). With S(t) = &int;<sub>0</sub><sup>t</sup> s(u) du:
 * <ul>
 *   <li>a point x0 at time 0 is at c + v S(t) + R(t)(x0 - c) at time t, where R(t) turns by |w| S(t) about w;</li>
 *   <li>the pivot is at c(t) = c + v S(t);</li>
 *   <li>the velocity of the moving frame at a point x is s(t) (v + w &times; (x - c(t))): linear velocity s(t) v,
 *       angular velocity s(t) w.</li>
 * </ul>
 * Without a schedule S(t) = t and s(t) = 1, a constant velocity and spin.
 *
 * @param vx       linear velocity x, m/s
 * @param vy       linear velocity y, m/s
 * @param vz       linear velocity z, m/s
 * @param wx       angular velocity x, rad/s
 * @param wy       angular velocity y, rad/s
 * @param wz       angular velocity z, rad/s
 * @param cx       pivot x at time 0, m
 * @param cy       pivot y at time 0, m
 * @param cz       pivot z at time 0, m
 * @param schedule factor s(t) on both velocities; null means {@link VelocitySchedule#constant()}
 */
public record Motion(double vx, double vy, double vz, double wx, double wy, double wz,
                     double cx, double cy, double cz, VelocitySchedule schedule) {
    /** Not moving. */
    public static final Motion STILL = new Motion(0, 0, 0, 0, 0, 0, 0, 0, 0);

    /** Checks all values are finite. */
    public Motion {
        Checks.finite("motion velocity x (m/s)", vx);
        Checks.finite("motion velocity y (m/s)", vy);
        Checks.finite("motion velocity z (m/s)", vz);
        Checks.finite("motion angular velocity x (rad/s)", wx);
        Checks.finite("motion angular velocity y (rad/s)", wy);
        Checks.finite("motion angular velocity z (rad/s)", wz);
        Checks.finite("motion pivot x (m)", cx);
        Checks.finite("motion pivot y (m)", cy);
        Checks.finite("motion pivot z (m)", cz);
        schedule = schedule == null ? VelocitySchedule.constant() : schedule;
    }

    /**
     * A motion at constant velocity and spin (the {@link VelocitySchedule#constant() constant} schedule).
     *
     * @param vx linear velocity x, m/s
     * @param vy linear velocity y, m/s
     * @param vz linear velocity z, m/s
     * @param wx angular velocity x, rad/s
     * @param wy angular velocity y, rad/s
     * @param wz angular velocity z, rad/s
     * @param cx pivot x at time 0, m
     * @param cy pivot y at time 0, m
     * @param cz pivot z at time 0, m
     */
    public Motion(double vx, double vy, double vz, double wx, double wy, double wz,
                  double cx, double cy, double cz) {
        this(vx, vy, vz, wx, wy, wz, cx, cy, cz, VelocitySchedule.constant());
    }

    /**
     * @param vx velocity x, m/s
     * @param vy velocity y, m/s
     * @param vz velocity z, m/s
     * @return a translation at constant velocity
     */
    public static Motion linear(double vx, double vy, double vz) {
        return new Motion(vx, vy, vz, 0, 0, 0, 0, 0, 0);
    }

    /**
     * @param wx angular velocity x, rad/s
     * @param wy angular velocity y, rad/s
     * @param wz angular velocity z, rad/s
     * @param cx pivot x, m
     * @param cy pivot y, m
     * @param cz pivot z, m
     * @return this motion with the given rotation added (same schedule)
     */
    public Motion withRotation(double wx, double wy, double wz, double cx, double cy, double cz) {
        return new Motion(vx, vy, vz, wx, wy, wz, cx, cy, cz, schedule);
    }

    /**
     * @param s the factor s(t) on both velocities; null for the constant schedule
     * @return this motion following s
     */
    public Motion withSchedule(VelocitySchedule s) {
        return new Motion(vx, vy, vz, wx, wy, wz, cx, cy, cz, s);
    }

    /**
     * The schedule's factor: the frame's linear velocity at time t is s(t) v and its angular velocity s(t) w.
     *
     * @param t time, s
     * @return s(t), dimensionless; exactly 1.0 without a schedule
     */
    public double factor(double t) {
        return schedule.factor(t);
    }

    /**
     * The schedule's mean factor over a step, (S(t1) - S(t0)) / (t1 - t0): velocities scaled by it over the step
     * carry the pose from time t0 to t1 exactly (see {@link VelocitySchedule#meanFactor(double, double)}).
     *
     * @param t0 start of the step, s
     * @param t1 end of the step, s
     * @return the mean factor, dimensionless; exactly 1.0 without a schedule
     */
    public double meanFactor(double t0, double t1) {
        return schedule.meanFactor(t0, t1);
    }

    /** @return whether the motion is the identity at all times (no velocity, or a schedule that is always 0) */
    public boolean isStill() {
        return (vx == 0 && vy == 0 && vz == 0 && wx == 0 && wy == 0 && wz == 0) || schedule.maxFactor() == 0;
    }

    /**
     * @return the largest linear speed over time, |v| max<sub>t</sub> |s(t)|, m/s; |v| without a schedule. The
     *         bound |v| + |w| r of points at distance r from the pivot is left to callers.
     */
    public double linearSpeed() {
        return Math.sqrt(vx * vx + vy * vy + vz * vz) * schedule.maxFactor();
    }

    /** @return |w| of the unscaled angular velocity, rad/s (the rate at time t is |s(t)| |w|) */
    public double angularSpeed() {
        return Math.sqrt(wx * wx + wy * wy + wz * wz);
    }

    /**
     * The pose at time t as a rotation R (row-major, 9 values) and the pivot's current position (3 values): R
     * turns by |w| S(t) about w, and the pivot is at c + v S(t), with S(t) the schedule's integral (t itself
     * without a schedule).
     *
     * @param t   time, s
     * @param out (output) 12 values: R then current pivot
     */
    public void pose(double t, double[] out) {
        double tau = schedule.integral(t);
        double w = angularSpeed();
        double angle = w * tau;
        if (w == 0 || angle == 0) {
            out[0] = 1; out[1] = 0; out[2] = 0;
            out[3] = 0; out[4] = 1; out[5] = 0;
            out[6] = 0; out[7] = 0; out[8] = 1;
        } else {
            // Rodrigues' rotation formula.
            double kx = wx / w, ky = wy / w, kz = wz / w;
            double c = Math.cos(angle), s = Math.sin(angle), d = 1 - c;
            out[0] = c + kx * kx * d;      out[1] = kx * ky * d - kz * s; out[2] = kx * kz * d + ky * s;
            out[3] = ky * kx * d + kz * s; out[4] = c + ky * ky * d;      out[5] = ky * kz * d - kx * s;
            out[6] = kz * kx * d - ky * s; out[7] = kz * ky * d + kx * s; out[8] = c + kz * kz * d;
        }
        out[9] = cx + vx * tau;
        out[10] = cy + vy * tau;
        out[11] = cz + vz * tau;
    }
}

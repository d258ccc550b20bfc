package dev.fray.core.boundary;

import dev.fray.core.error.Checks;

/**
 * A prescribed rigid motion: constant linear velocity v (m/s) and constant angular velocity w (rad/s) about a
 * pivot c (m) that travels with the motion. A point x0 at time 0 is at c + v t + R(t)(x0 - c) at time t, where
 * R(t) turns by |w| t about w. The velocity of the moving frame at a point x is v + w x (x - c - v t).
 *
 * @param vx linear velocity x
 * @param vy linear velocity y
 * @param vz linear velocity z
 * @param wx angular velocity x
 * @param wy angular velocity y
 * @param wz angular velocity z
 * @param cx pivot x at time 0
 * @param cy pivot y at time 0
 * @param cz pivot z at time 0
 */
public record Motion(double vx, double vy, double vz, double wx, double wy, double wz,
                     double cx, double cy, double cz) {
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
     * @return this motion with the given rotation added
     */
    public Motion withRotation(double wx, double wy, double wz, double cx, double cy, double cz) {
        return new Motion(vx, vy, vz, wx, wy, wz, cx, cy, cz);
    }

    /** @return whether the motion is the identity at all times */
    public boolean isStill() {
        return vx == 0 && vy == 0 && vz == 0 && wx == 0 && wy == 0 && wz == 0;
    }

    /** @return the speed bound |v| + |w| r is left to callers; this is |v|, m/s */
    public double linearSpeed() {
        return Math.sqrt(vx * vx + vy * vy + vz * vz);
    }

    /** @return |w|, rad/s */
    public double angularSpeed() {
        return Math.sqrt(wx * wx + wy * wy + wz * wz);
    }

    /**
     * The pose at time t as a rotation R (row-major, 9 values) and the pivot's current position (3 values).
     *
     * @param t   time, s
     * @param out (output) 12 values: R then current pivot
     */
    public void pose(double t, double[] out) {
        double w = angularSpeed();
        double angle = w * t;
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
        out[9] = cx + vx * t;
        out[10] = cy + vy * t;
        out[11] = cz + vz * t;
    }
}

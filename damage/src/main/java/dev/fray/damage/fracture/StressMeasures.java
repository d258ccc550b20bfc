package dev.fray.damage.fracture;

/**
 * Scalar measures of a symmetric 3x3 stress used by the stress-based damage criteria. Static, allocation-free and
 * written out by hand so that the particle loops can inline them.
 */
final class StressMeasures {
    private StressMeasures() {
    }

    /**
     * Largest eigenvalue of the symmetric matrix with the given entries, by the closed-form trigonometric solution
     * of the characteristic cubic (published: O. K. Smith, "Eigenvalues of a symmetric 3 x 3 matrix", Comm. ACM
     * 4(4), 1961). Exact for repeated eigenvalues (uniaxial and equibiaxial states), which matter for the onset.
     *
     * @param s00 entry (0, 0), Pa
     * @param s11 entry (1, 1), Pa
     * @param s22 entry (2, 2), Pa
     * @param s01 entry (0, 1) = (1, 0), Pa
     * @param s02 entry (0, 2) = (2, 0), Pa
     * @param s12 entry (1, 2) = (2, 1), Pa
     * @return the largest principal value, Pa; NaN if an entry is NaN
     */
    static double largestEigenvalue(double s00, double s11, double s22, double s01, double s02, double s12) {
        double q = (s00 + s11 + s22) / 3.0;
        double a = s00 - q;
        double b = s11 - q;
        double c = s22 - q;
        double off = s01 * s01 + s02 * s02 + s12 * s12;
        double p2 = a * a + b * b + c * c + 2.0 * off;
        if (!(p2 > 0)) {
            // A multiple of the identity (or NaN, which p2 > 0 also rejects and q carries on).
            return p2 == 0 ? q : Double.NaN;
        }
        double p = Math.sqrt(p2 / 6.0);
        double inv = 1.0 / p;
        double ba = a * inv;
        double bb = b * inv;
        double bc = c * inv;
        double b01 = s01 * inv;
        double b02 = s02 * inv;
        double b12 = s12 * inv;
        double det = ba * (bb * bc - b12 * b12) - b01 * (b01 * bc - b12 * b02) + b02 * (b01 * b12 - bb * b02);
        double r = 0.5 * det;
        // Rounding can push |r| slightly past 1, where acos has no value.
        r = r > 1 ? 1 : r < -1 ? -1 : r;
        return q + 2.0 * p * Math.cos(Math.acos(r) / 3.0);
    }

    /**
     * Largest normal stress on planes that contain the unit vector a: the larger eigenvalue of the stress
     * restricted to the plane normal to a (the 2x2 block in an orthonormal basis e1, e2 of that plane).
     *
     * @param s00 entry (0, 0), Pa
     * @param s11 entry (1, 1), Pa
     * @param s22 entry (2, 2), Pa
     * @param s01 entry (0, 1), Pa
     * @param s02 entry (0, 2), Pa
     * @param s12 entry (1, 2), Pa
     * @param ax  unit direction x
     * @param ay  unit direction y
     * @param az  unit direction z
     * @return the largest principal normal stress across a, Pa
     */
    static double largestAcross(double s00, double s11, double s22, double s01, double s02, double s12,
                                double ax, double ay, double az) {
        // e1 = normalised (h x a) with h the coordinate axis least aligned with a, e2 = a x e1.
        double e1x, e1y, e1z;
        double absX = Math.abs(ax), absY = Math.abs(ay), absZ = Math.abs(az);
        if (absX <= absY && absX <= absZ) {
            e1x = 0;
            e1y = -az;
            e1z = ay;
        } else if (absY <= absZ) {
            e1x = az;
            e1y = 0;
            e1z = -ax;
        } else {
            e1x = -ay;
            e1y = ax;
            e1z = 0;
        }
        double n = 1.0 / Math.sqrt(e1x * e1x + e1y * e1y + e1z * e1z);
        e1x *= n;
        e1y *= n;
        e1z *= n;
        double e2x = ay * e1z - az * e1y;
        double e2y = az * e1x - ax * e1z;
        double e2z = ax * e1y - ay * e1x;
        // sigma e1 and sigma e2
        double t1x = s00 * e1x + s01 * e1y + s02 * e1z;
        double t1y = s01 * e1x + s11 * e1y + s12 * e1z;
        double t1z = s02 * e1x + s12 * e1y + s22 * e1z;
        double t2x = s00 * e2x + s01 * e2y + s02 * e2z;
        double t2y = s01 * e2x + s11 * e2y + s12 * e2z;
        double t2z = s02 * e2x + s12 * e2y + s22 * e2z;
        double m11 = e1x * t1x + e1y * t1y + e1z * t1z;
        double m22 = e2x * t2x + e2y * t2y + e2z * t2z;
        double m12 = e1x * t2x + e1y * t2y + e1z * t2z;
        double half = 0.5 * (m11 - m22);
        return 0.5 * (m11 + m22) + Math.sqrt(half * half + m12 * m12);
    }

    /**
     * Normal stress a . sigma a on the plane normal to the unit vector a.
     *
     * @param s00 entry (0, 0), Pa
     * @param s11 entry (1, 1), Pa
     * @param s22 entry (2, 2), Pa
     * @param s01 entry (0, 1), Pa
     * @param s02 entry (0, 2), Pa
     * @param s12 entry (1, 2), Pa
     * @param ax  unit direction x
     * @param ay  unit direction y
     * @param az  unit direction z
     * @return the normal stress along a, Pa
     */
    static double along(double s00, double s11, double s22, double s01, double s02, double s12,
                        double ax, double ay, double az) {
        return ax * (s00 * ax + s01 * ay + s02 * az) + ay * (s01 * ax + s11 * ay + s12 * az)
                + az * (s02 * ax + s12 * ay + s22 * az);
    }
}

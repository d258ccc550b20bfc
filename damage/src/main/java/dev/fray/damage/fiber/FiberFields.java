package dev.fray.damage.fiber;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ChannelField;

import java.util.Arrays;

/**
 * Fields of fiber reference directions, to fill a "fiber-k" channel (width 3) from each particle's initial
 * position (m). Every field writes a unit vector into out[0..2], or the zero vector for "no fiber" where stated.
 * The fields are immutable and thread-safe (the host function of {@link #function} is the host's business), and
 * allocate nothing per query.
 *
 * <p>Fields about an axis (circumferential, radial, helical) are defined by a point on the axis and its direction.
 * On the axis itself, where the radial direction is undefined, they use a fixed reference direction e
 * perpendicular to the axis: e is the coordinate axis least aligned with the axis direction n, with its component
 * along n removed and normalised. So on the axis, radial gives e, circumferential gives n x e, and helical gives
 * cos(beta) n x e + sin(beta) n. A point counts as on the axis when its distance from the axis is at most
 * {@link #ON_AXIS_TOLERANCE} times its distance from the given axis point (below that the radial direction is
 * rounding noise).
 */
public final class FiberFields {
    /** Relative distance from the axis below which a point counts as on the axis (dimensionless). */
    public static final double ON_AXIS_TOLERANCE = 1e-12;

    private FiberFields() {
    }

    /**
     * The same direction everywhere.
     *
     * @param dx direction x component (any length, normalised)
     * @param dy direction y component
     * @param dz direction z component
     * @return the field
     * @throws InvalidInputException NOT_FINITE for a NaN or infinite component, OUT_OF_RANGE for the zero vector
     */
    public static ChannelField uniform(double dx, double dy, double dz) {
        double[] d = unit("fiber direction", new double[] {dx, dy, dz});
        double ux = d[0], uy = d[1], uz = d[2];
        return (x, y, z, out) -> {
            out[0] = ux;
            out[1] = uy;
            out[2] = uz;
        };
    }

    /**
     * Directions tangent to circles about an axis, right-handed about it: t = n x r / |n x r| with n the unit axis
     * and r the position relative to the axis point (hoop fibers of a tube). t is perpendicular to both the axis
     * and the radial direction. On the axis: n x e (see the class comment).
     *
     * @param point a point on the axis, m, 3 values (copied)
     * @param axis  axis direction, 3 values, any non-zero length (copied)
     * @return the field
     * @throws InvalidInputException for a null, non-finite or wrong-length array or a zero axis
     */
    public static ChannelField circumferential(double[] point, double[] axis) {
        return new AxisField(point, axis, AxisField.CIRCUMFERENTIAL, 0.0);
    }

    /**
     * Directions pointing away from an axis, perpendicular to it: r_perp / |r_perp| with r_perp the part of the
     * position relative to the axis point that is perpendicular to the axis. On the axis: e (see the class
     * comment).
     *
     * @param point a point on the axis, m, 3 values (copied)
     * @param axis  axis direction, 3 values, any non-zero length (copied)
     * @return the field
     * @throws InvalidInputException for a null, non-finite or wrong-length array or a zero axis
     */
    public static ChannelField radial(double[] point, double[] axis) {
        return new AxisField(point, axis, AxisField.RADIAL, 0.0);
    }

    /**
     * Helical directions: the circumferential direction t tilted toward the axis n by the pitch angle beta,
     * cos(beta) t + sin(beta) n. beta = 0 gives hoop fibers, beta = pi/2 axial fibers; two families of opposite
     * sign give the crossed helices of a wound tube. The direction stays perpendicular to the radial direction.
     * On the axis: cos(beta) n x e + sin(beta) n (see the class comment).
     *
     * @param point              a point on the axis, m, 3 values (copied)
     * @param axis               axis direction, 3 values, any non-zero length (copied)
     * @param pitchAngleRadians  beta, rad, in [-pi/2, pi/2]
     * @return the field
     * @throws InvalidInputException for a null, non-finite or wrong-length array, a zero axis or beta out of range
     */
    public static ChannelField helical(double[] point, double[] axis, double pitchAngleRadians) {
        Checks.inRange("helix pitch angle (rad)", pitchAngleRadians, -0.5 * Math.PI, false, 0.5 * Math.PI, false);
        return new AxisField(point, axis, AxisField.HELICAL, pitchAngleRadians);
    }

    /**
     * Directions from a host function, normalised: the host writes any vector into out[0..2] (out is preset to
     * zero); a non-zero vector is scaled to unit length and the zero vector stays zero (no fiber).
     *
     * @param direction host function of the initial position (m); called once per particle at set-up, possibly
     *                  from several threads
     * @return the field
     * @throws InvalidInputException MISSING if direction is null; the field throws NOT_FINITE, naming the
     *         position, when the host function returns a NaN or infinite component
     */
    public static ChannelField function(ChannelField direction) {
        Checks.notNull("fiber direction function", direction);
        return (x, y, z, out) -> {
            direction.value(x, y, z, out);
            double ox = out[0], oy = out[1], oz = out[2];
            if (!(Double.isFinite(ox) && Double.isFinite(oy) && Double.isFinite(oz))) {
                throw new InvalidInputException(FrayMessage.NOT_FINITE,
                        "fiber direction at (" + x + ", " + y + ", " + z + ") m",
                        "(" + ox + ", " + oy + ", " + oz + ")");
            }
            double n = norm(ox, oy, oz);
            if (n > 0.0) {
                out[0] = ox / n;
                out[1] = oy / n;
                out[2] = oz / n;
            }
        };
    }

    /**
     * Directions from scattered samples: each query gets the direction of the nearest sample point (Euclidean
     * distance; on a tie, the sample given first). The lookup is a k-d tree built once, O(n log n); a query costs
     * O(log n) for well-spread points. Directions are normalised; a zero direction stays zero (no fiber there).
     *
     * @param points     sample positions, m, 3 per sample (x0, y0, z0, x1, ...), at least one sample (copied)
     * @param directions sample directions, 3 per sample, any length (copied)
     * @return the field
     * @throws InvalidInputException MISSING for null arrays, OUT_OF_RANGE for lengths that are not 3 n with n &gt;= 1
     *         or that differ, NOT_FINITE for a NaN or infinite value
     */
    public static ChannelField samples(double[] points, double[] directions) {
        Checks.notNull("fiber sample points", points);
        Checks.notNull("fiber sample directions", directions);
        if (points.length < 3 || points.length % 3 != 0) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "fiber sample points length", points.length,
                    "a positive multiple of 3 (x, y, z per sample)");
        }
        if (directions.length != points.length) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "fiber sample directions length",
                    directions.length, "= points length " + points.length + " (3 per sample)");
        }
        for (int i = 0; i < points.length; i++) {
            Checks.finite("fiber sample points[" + i + "] (m)", points[i]);
            Checks.finite("fiber sample directions[" + i + "]", directions[i]);
        }
        return new NearestSample(points, directions);
    }

    /** Validates a 3-vector and returns it normalised (new array). */
    private static double[] unit(String field, double[] v) {
        Checks.notNull(field, v);
        if (v.length != 3) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, field + " length", v.length, "3");
        }
        for (int i = 0; i < 3; i++) {
            Checks.finite(field + "[" + i + "]", v[i]);
        }
        double n = norm(v[0], v[1], v[2]);
        if (!(n > 0.0) || !Double.isFinite(n)) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, field, Arrays.toString(v),
                    "a non-zero vector of finite length");
        }
        return new double[] {v[0] / n, v[1] / n, v[2] / n};
    }

    /** Euclidean length; Math.hypot is slower and the inputs here are metres or unit-scale directions. */
    private static double norm(double x, double y, double z) {
        return Math.sqrt(x * x + y * y + z * z);
    }

    /** Circumferential, radial and helical fields about an axis. */
    private static final class AxisField implements ChannelField {
        static final int CIRCUMFERENTIAL = 0;
        static final int RADIAL = 1;
        static final int HELICAL = 2;

        private final double px, py, pz;
        private final double nx, ny, nz;
        /** Reference perpendicular e, used on the axis. */
        private final double ex, ey, ez;
        private final int kind;
        private final double cos, sin;

        AxisField(double[] point, double[] axis, int kind, double pitch) {
            Checks.notNull("axis point (m)", point);
            if (point.length != 3) {
                throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "axis point length", point.length, "3");
            }
            for (int i = 0; i < 3; i++) {
                Checks.finite("axis point[" + i + "] (m)", point[i]);
            }
            double[] n = unit("axis direction", axis);
            px = point[0];
            py = point[1];
            pz = point[2];
            nx = n[0];
            ny = n[1];
            nz = n[2];
            // the coordinate axis least aligned with n, made perpendicular to it
            double ax = Math.abs(nx), ay = Math.abs(ny), az = Math.abs(nz);
            double cx = 0, cy = 0, cz = 0;
            if (ax <= ay && ax <= az) {
                cx = 1;
            } else if (ay <= az) {
                cy = 1;
            } else {
                cz = 1;
            }
            double d = cx * nx + cy * ny + cz * nz;
            double qx = cx - d * nx, qy = cy - d * ny, qz = cz - d * nz;
            double qn = norm(qx, qy, qz);
            ex = qx / qn;
            ey = qy / qn;
            ez = qz / qn;
            this.kind = kind;
            this.cos = kind == HELICAL ? Math.cos(pitch) : 1.0;
            this.sin = kind == HELICAL ? Math.sin(pitch) : 0.0;
        }

        @Override
        public void value(double x, double y, double z, double[] out) {
            double rx = x - px, ry = y - py, rz = z - pz;
            double along = rx * nx + ry * ny + rz * nz;
            double qx = rx - along * nx, qy = ry - along * ny, qz = rz - along * nz;
            double q2 = qx * qx + qy * qy + qz * qz;
            double r2 = rx * rx + ry * ry + rz * rz;
            double ux, uy, uz; // unit radial direction
            if (q2 <= ON_AXIS_TOLERANCE * ON_AXIS_TOLERANCE * r2) {
                ux = ex;
                uy = ey;
                uz = ez;
            } else {
                double q = Math.sqrt(q2);
                ux = qx / q;
                uy = qy / q;
                uz = qz / q;
            }
            if (kind == RADIAL) {
                out[0] = ux;
                out[1] = uy;
                out[2] = uz;
                return;
            }
            // t = n x u is unit, since u is a unit vector perpendicular to n
            double tx = ny * uz - nz * uy, ty = nz * ux - nx * uz, tz = nx * uy - ny * ux;
            out[0] = cos * tx + sin * nx;
            out[1] = cos * ty + sin * ny;
            out[2] = cos * tz + sin * nz;
        }
    }

    /**
     * Nearest-sample lookup in a k-d tree stored implicitly: the node of a range [lo, hi) of the reordered samples
     * is its middle element mid = (lo + hi) / 2, split on axis split[mid]; the left subtree is [lo, mid) with
     * coordinates &lt;= the split value, the right subtree [mid + 1, hi) with coordinates &gt;= it.
     */
    private static final class NearestSample implements ChannelField {
        private final double[] pts;
        private final double[] dirs;
        /** Index of each tree-ordered sample in the caller's arrays, for the tie rule. */
        private final int[] order;
        private final byte[] split;

        NearestSample(double[] points, double[] directions) {
            int n = points.length / 3;
            int[] perm = new int[n];
            for (int i = 0; i < n; i++) {
                perm[i] = i;
            }
            split = new byte[n];
            build(points, perm, 0, n);
            pts = new double[3 * n];
            dirs = new double[3 * n];
            order = perm;
            for (int i = 0; i < n; i++) {
                int s = perm[i];
                pts[3 * i] = points[3 * s];
                pts[3 * i + 1] = points[3 * s + 1];
                pts[3 * i + 2] = points[3 * s + 2];
                double dx = directions[3 * s], dy = directions[3 * s + 1], dz = directions[3 * s + 2];
                double len = norm(dx, dy, dz);
                if (len > 0.0) {
                    dirs[3 * i] = dx / len;
                    dirs[3 * i + 1] = dy / len;
                    dirs[3 * i + 2] = dz / len;
                }
            }
        }

        /** Orders perm[lo, hi) into a k-d subtree, splitting each range on its widest coordinate. */
        private void build(double[] points, int[] perm, int lo, int hi) {
            if (hi - lo <= 0) {
                return;
            }
            int mid = (lo + hi) >>> 1;
            if (hi - lo > 1) {
                int axis = widestAxis(points, perm, lo, hi);
                select(points, perm, lo, hi, mid, axis);
                split[mid] = (byte) axis;
            }
            build(points, perm, lo, mid);
            build(points, perm, mid + 1, hi);
        }

        private static int widestAxis(double[] points, int[] perm, int lo, int hi) {
            int best = 0;
            double bestSpan = -1;
            for (int a = 0; a < 3; a++) {
                double min = Double.POSITIVE_INFINITY, max = Double.NEGATIVE_INFINITY;
                for (int i = lo; i < hi; i++) {
                    double c = points[3 * perm[i] + a];
                    min = Math.min(min, c);
                    max = Math.max(max, c);
                }
                if (max - min > bestSpan) {
                    bestSpan = max - min;
                    best = a;
                }
            }
            return best;
        }

        /**
         * Quickselect with a three-way partition, so repeated coordinates cost no more than distinct ones: moves
         * the k-th smallest (on the axis) to position k, smaller-or-equal before it, greater-or-equal after it.
         */
        private static void select(double[] points, int[] perm, int lo, int hi, int k, int axis) {
            int left = lo, right = hi - 1;
            while (left < right) {
                // median of three as pivot keeps sorted input at O(n) expected
                int m = (left + right) >>> 1;
                double a = points[3 * perm[left] + axis];
                double b = points[3 * perm[m] + axis];
                double c = points[3 * perm[right] + axis];
                double pivot = Math.max(Math.min(a, b), Math.min(Math.max(a, b), c));
                int lt = left, i = left, gt = right;
                while (i <= gt) {
                    double v = points[3 * perm[i] + axis];
                    if (v < pivot) {
                        swap(perm, lt++, i++);
                    } else if (v > pivot) {
                        swap(perm, i, gt--);
                    } else {
                        i++;
                    }
                }
                // now [left, lt) < pivot, [lt, gt] == pivot, (gt, right] > pivot
                if (k < lt) {
                    right = lt - 1;
                } else if (k > gt) {
                    left = gt + 1;
                } else {
                    return;
                }
            }
        }

        private static void swap(int[] a, int i, int j) {
            int t = a[i];
            a[i] = a[j];
            a[j] = t;
        }

        @Override
        public void value(double x, double y, double z, double[] out) {
            int best = search(0, pts.length / 3, x, y, z, -1);
            out[0] = dirs[3 * best];
            out[1] = dirs[3 * best + 1];
            out[2] = dirs[3 * best + 2];
        }

        /** Returns the better of best and the nearest sample in [lo, hi); best = -1 means none yet. */
        private int search(int lo, int hi, double x, double y, double z, int best) {
            if (lo >= hi) {
                return best;
            }
            int mid = (lo + hi) >>> 1;
            best = closer(mid, best, x, y, z);
            int axis = split[mid];
            double diff = (axis == 0 ? x : axis == 1 ? y : z) - pts[3 * mid + axis];
            if (diff < 0) {
                best = search(lo, mid, x, y, z, best);
                if (diff * diff <= distance2(best, x, y, z)) {
                    best = search(mid + 1, hi, x, y, z, best);
                }
            } else {
                best = search(mid + 1, hi, x, y, z, best);
                // "<=" so that an equally near sample on the far side can win the tie
                if (diff * diff <= distance2(best, x, y, z)) {
                    best = search(lo, mid, x, y, z, best);
                }
            }
            return best;
        }

        private int closer(int candidate, int best, double x, double y, double z) {
            if (best < 0) {
                return candidate;
            }
            double dc = distance2(candidate, x, y, z);
            double db = distance2(best, x, y, z);
            return dc < db || (dc == db && order[candidate] < order[best]) ? candidate : best;
        }

        private double distance2(int i, double x, double y, double z) {
            double dx = pts[3 * i] - x, dy = pts[3 * i + 1] - y, dz = pts[3 * i + 2] - z;
            return dx * dx + dy * dy + dz * dz;
        }
    }
}

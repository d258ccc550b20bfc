package dev.fray.core.boundary;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.util.Arrays;

/**
 * A dimensionless factor s(t) that scales a prescribed velocity over time, so that a grip or an obstacle can ramp
 * up, hold and stop instead of starting with a jolt. The schedule is given by knots (t<sub>k</sub>, s<sub>k</sub>),
 * k = 0..n-1, with times in seconds, finite, t<sub>0</sub> &gt;= 0 and strictly increasing:
 * <ul>
 *   <li>s(t) = s<sub>0</sub> for t &lt;= t<sub>0</sub>;</li>
 *   <li>s(t) = s<sub>k</sub> + (s<sub>k+1</sub> - s<sub>k</sub>) (t - t<sub>k</sub>) / (t<sub>k+1</sub> -
 *       t<sub>k</sub>) for t<sub>k</sub> &lt;= t &lt;= t<sub>k+1</sub>;</li>
 *   <li>s(t) = s<sub>n-1</sub> for t &gt;= t<sub>n-1</sub>.</li>
 * </ul>
 * Ramp to full speed over 0.1 s and hold: knots (0, 0), (0.1, 1). Add (2, 1), (2.05, 0) to stop at 2 s.
 *
 * <p>{@link #integral(double)} gives S(t) = &int;<sub>0</sub><sup>t</sup> s(u) du, the "scheduled time" at which
 * a {@link Motion} evaluates its pose. It is exact per linear piece (the trapezoid rule is exact for linear
 * functions); the areas of the pieces are summed once, in order of increasing time, when the schedule is made, so
 * the result does not depend on how it is called.
 *
 * <p>Immutable and thread-safe. Two schedules are equal when their knots are equal; every schedule whose factors
 * are all 1 is the {@link #constant()} schedule, whose integral is t itself (bit for bit).
 */
public final class VelocitySchedule {
    /** Most knots in one schedule; real schedules have a handful. */
    public static final int MAX_KNOTS = 10_000;

    private static final VelocitySchedule CONSTANT = new VelocitySchedule(new double[] {0}, new double[] {1});

    private final double[] times;
    private final double[] factors;
    /** S(t<sub>k</sub>): integral of s from 0 to knot k, s. */
    private final double[] area;
    private final double maxFactor;
    /** Factor 1 at all times: S(t) = t and s(t) = 1 exactly. */
    private final boolean unit;

    private VelocitySchedule(double[] times, double[] factors) {
        this.times = times;
        this.factors = factors;
        int n = times.length;
        area = new double[n];
        area[0] = factors[0] * times[0];
        for (int k = 0; k + 1 < n; k++) {
            area[k + 1] = area[k] + 0.5 * (times[k + 1] - times[k]) * (factors[k] + factors[k + 1]);
        }
        double max = 0;
        boolean allOne = true;
        for (double s : factors) {
            max = Math.max(max, Math.abs(s));
            allOne &= s == 1.0;
        }
        maxFactor = max;
        unit = allOne;
    }

    /** @return factor 1 at all times: the velocity as given (a motion's behaviour without a schedule) */
    public static VelocitySchedule constant() {
        return CONSTANT;
    }

    /**
     * @param rampTime time to reach full speed from rest, s, finite and &gt; 0
     * @return knots (0, 0), (rampTime, 1): a linear ramp from rest, then full speed for good
     * @throws InvalidInputException if rampTime is not finite and positive
     */
    public static VelocitySchedule ramp(double rampTime) {
        Checks.positive("schedule ramp time (s)", rampTime);
        return of(new double[] {0, rampTime}, new double[] {0, 1});
    }

    /**
     * @param times   knot times t<sub>k</sub>, s: finite, t<sub>0</sub> &gt;= 0, strictly increasing, 1 to
     *                {@link #MAX_KNOTS} of them (input, copied)
     * @param factors dimensionless factors s<sub>k</sub>, finite, as many as times (input, copied)
     * @return the schedule; {@link #constant()} when every factor is 1
     * @throws InvalidInputException naming the offending knot and its allowed range
     */
    public static VelocitySchedule of(double[] times, double[] factors) {
        Checks.notNull("schedule times (s)", times);
        Checks.notNull("schedule factors", factors);
        Checks.inRange("number of schedule knots", times.length, 1, MAX_KNOTS);
        if (factors.length != times.length) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "number of schedule factors",
                    factors.length, "as many as the times, " + times.length);
        }
        double[] t = times.clone();
        double[] s = factors.clone();
        Checks.nonNegative("schedule time[0] (s)", t[0]);
        for (int k = 0; k < t.length; k++) {
            String knot = "[" + k + "]";
            Checks.finite("schedule time" + knot + " (s)", t[k]);
            Checks.finite("schedule factor" + knot, s[k]);
            if (k > 0 && !(t[k] > t[k - 1])) {
                throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "schedule time" + knot + " (s)", t[k],
                        "> schedule time[" + (k - 1) + "] = " + t[k - 1] + " s (times strictly increasing)");
            }
        }
        boolean allOne = true;
        for (double f : s) {
            allOne &= f == 1.0;
        }
        return allOne ? CONSTANT : new VelocitySchedule(t, s);
    }

    /**
     * s(t), piecewise linear between the knots and constant outside them.
     *
     * @param t time, s
     * @return the factor, dimensionless; exactly 1.0 for the constant schedule
     */
    public double factor(double t) {
        if (unit) {
            return 1.0;
        }
        int n = times.length;
        if (t <= times[0]) {
            return factors[0];
        }
        if (t >= times[n - 1]) {
            return factors[n - 1];
        }
        int k = piece(t);
        return interpolate(k, t);
    }

    /**
     * S(t) = &int;<sub>0</sub><sup>t</sup> s(u) du, exact per linear piece: S(t<sub>k</sub>) (summed in order of
     * increasing k) plus the trapezoid (t - t<sub>k</sub>)(s<sub>k</sub> + s(t))/2 of the piece holding t. Before
     * the first knot S(t) = s<sub>0</sub> t (also for t &lt; 0); after the last, S grows at s<sub>n-1</sub>.
     *
     * @param t time, s
     * @return the integral, s; t itself (bit for bit) for the constant schedule
     */
    public double integral(double t) {
        if (unit) {
            return t;
        }
        int n = times.length;
        if (t <= times[0]) {
            return factors[0] * t;
        }
        if (t >= times[n - 1]) {
            return area[n - 1] + factors[n - 1] * (t - times[n - 1]);
        }
        int k = piece(t);
        return area[k] + 0.5 * (t - times[k]) * (factors[k] + interpolate(k, t));
    }

    /**
     * The mean factor over a time step, (S(t1) - S(t0)) / (t1 - t0). A driven velocity scaled by it moves, step by
     * step, exactly v (S(t1) - S(t0)) (up to rounding), so over many steps the sum telescopes to v S(t); scaling by
     * s(t0) instead would integrate the schedule by forward Euler and miss the ramp's area by O(step).
     *
     * @param t0 start of the step, s
     * @param t1 end of the step, s; t1 == t0 gives s(t0)
     * @return the mean factor, dimensionless; exactly 1.0 for the constant schedule
     */
    public double meanFactor(double t0, double t1) {
        if (unit) {
            return 1.0;
        }
        if (t1 == t0) {
            return factor(t0);
        }
        return (integral(t1) - integral(t0)) / (t1 - t0);
    }

    /** @return the largest |s(t)| over all times, which is the largest |s<sub>k</sub>|; 1 for the constant one */
    public double maxFactor() {
        return maxFactor;
    }

    /** @return whether s(t) = 1 at all times (the {@link #constant()} schedule) */
    public boolean isConstant() {
        return unit;
    }

    /** @return the number of knots, at least 1 */
    public int knotCount() {
        return times.length;
    }

    /** @return the knot times, s (a copy) */
    public double[] times() {
        return times.clone();
    }

    /** @return the knot factors (a copy) */
    public double[] factors() {
        return factors.clone();
    }

    /** @return k with t<sub>k</sub> &lt;= t &lt; t<sub>k+1</sub>, for t<sub>0</sub> &lt; t &lt; t<sub>n-1</sub> */
    private int piece(double t) {
        int lo = 0;
        int hi = times.length - 1;
        // Invariant: times[lo] <= t < times[hi].
        while (hi - lo > 1) {
            int mid = (lo + hi) >>> 1;
            if (times[mid] <= t) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return lo;
    }

    private double interpolate(int k, double t) {
        double u = (t - times[k]) / (times[k + 1] - times[k]);
        return factors[k] + (factors[k + 1] - factors[k]) * u;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof VelocitySchedule s && Arrays.equals(times, s.times) && Arrays.equals(factors, s.factors);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(times) + Arrays.hashCode(factors);
    }

    @Override
    public String toString() {
        StringBuilder b = new StringBuilder("VelocitySchedule[");
        for (int k = 0; k < times.length; k++) {
            b.append(k == 0 ? "" : ", ").append('(').append(times[k]).append(" s, ").append(factors[k]).append(')');
        }
        return b.append(']').toString();
    }
}

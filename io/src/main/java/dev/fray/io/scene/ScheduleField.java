package dev.fray.io.scene;

import dev.fray.core.boundary.VelocitySchedule;
import dev.fray.io.scene.Fields.Range;
import dev.fray.io.scene.JsonTree.Arr;
import dev.fray.io.scene.JsonTree.Node;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * The velocity schedule of a scene file's {@code motion}: either {@code "ramp": seconds} (from rest to full speed,
 * then hold) or {@code "schedule": [[time, factor], ...]} (knots of a piecewise linear factor on the velocity, times
 * in s, at least 0 and strictly increasing). Problems are recorded at the offending value's JSON path.
 */
final class ScheduleField {
    private ScheduleField() {
    }

    /**
     * @param motion the motion object
     * @return the schedule; the constant one when neither key is given; null after a problem
     */
    static VelocitySchedule read(Fields motion) {
        if (motion.has("ramp") && motion.has("schedule")) {
            motion.error("ramp", "give either \"ramp\" or \"schedule\", not both");
            return null;
        }
        if (motion.has("ramp")) {
            Double ramp = motion.number("ramp", null, Range.positive("s"), "time to full speed");
            return ramp == null ? null : VelocitySchedule.ramp(ramp);
        }
        List<Node> knots = motion.list("schedule", false, VelocitySchedule.MAX_KNOTS,
                "knots [time (s), factor] of the velocity factor");
        if (knots == null) {
            return motion.has("schedule") ? null : VelocitySchedule.constant();
        }
        if (knots.isEmpty()) {
            motion.error("schedule", "must hold at least one knot [time (s), factor]");
            return null;
        }
        Problems problems = motion.problems();
        double[] times = new double[knots.size()];
        double[] factors = new double[knots.size()];
        boolean ok = true;
        // Time of the last knot read well, to check the order against; NaN when there is none.
        double previous = Double.NaN;
        int previousIndex = -1;
        for (int k = 0; k < knots.size(); k++) {
            String at = JsonPaths.index(motion.pathOf("schedule"), k);
            Node n = knots.get(k);
            if (!(n instanceof Arr a) || a.items.size() != 2) {
                problems.at(at, n.line, n.column, "must be a knot [time (s), factor], a list of two numbers, got "
                        + (n instanceof Arr a2 ? "a list of " + a2.items.size() : n.kind()));
                ok = false;
                continue;
            }
            Double t = motion.number(a.items.get(0), JsonPaths.index(at, 0), Range.nonNegative("s"));
            Double s = motion.number(a.items.get(1), JsonPaths.index(at, 1), Range.any(""));
            if (t != null && previousIndex >= 0 && !(t > previous)) {
                Node tn = a.items.get(0);
                problems.at(JsonPaths.index(at, 0), tn.line, tn.column, String.format(Locale.ROOT,
                        "= %s s is out of range: knot times must be strictly increasing, allowed > %s s "
                                + "(the time of knot %d)", Double.toString(t), Double.toString(previous),
                        previousIndex));
                t = null;
            }
            if (t == null || s == null) {
                ok = false;
            }
            if (t != null) {
                times[k] = t;
                previous = t;
                previousIndex = k;
            }
            if (s != null) {
                factors[k] = s;
            }
        }
        return ok ? VelocitySchedule.of(times, factors) : null;
    }

    /**
     * @param s   a schedule
     * @param out the motion's members, where {@code "schedule"} goes unless s is constant (output, modified)
     */
    static void write(VelocitySchedule s, Map<String, Object> out) {
        if (s.isConstant()) {
            return;
        }
        double[] t = s.times();
        double[] f = s.factors();
        List<double[]> knots = new ArrayList<>(t.length);
        for (int k = 0; k < t.length; k++) {
            knots.add(new double[] {t[k], f[k]});
        }
        out.put("schedule", knots);
    }
}

package dev.fray.io.scene;

import dev.fray.core.plugin.Suggest;
import dev.fray.io.scene.JsonTree.Arr;
import dev.fray.io.scene.JsonTree.Node;
import dev.fray.io.scene.JsonTree.Num;
import dev.fray.io.scene.JsonTree.Obj;
import dev.fray.io.scene.JsonTree.Str;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Typed access to one JSON object of a scene file, recording every problem instead of stopping at the first.
 * Each getter returns the value, or its fallback when the key is absent, or null when the value is bad (a problem
 * is then recorded, pointing at the value's line and column). Unknown keys are reported on construction, with the
 * closest allowed key as a suggestion.
 */
final class Fields {
    private final Problems problems;
    private final Obj obj;
    private final String path;

    /**
     * @param problems where problems go
     * @param obj      the object
     * @param path     its JSON path
     * @param allowed  keys it may hold; null to skip the unknown-key check (the caller checks)
     */
    Fields(Problems problems, Obj obj, String path, List<String> allowed) {
        this.problems = problems;
        this.obj = obj;
        this.path = path;
        if (allowed != null) {
            for (String key : obj.members.keySet()) {
                if (!allowed.contains(key)) {
                    unknownKey(key, allowed, "");
                }
            }
        }
    }

    /** Records an unknown key with a did-you-mean suggestion. */
    void unknownKey(String key, List<String> allowed, String context) {
        String best = Suggest.closest(key, allowed);
        problems.at(JsonPaths.member(path, key), keyLine(key), keyColumn(key), "unknown key \"" + key + "\""
                + context + (best == null ? "" : "; did you mean \"" + best + "\"?") + " allowed: "
                + String.join(", ", allowed));
    }

    /** @return the object */
    Obj obj() {
        return obj;
    }

    /** @return its path */
    String path() {
        return path;
    }

    /** @return the problem sink */
    Problems problems() {
        return problems;
    }

    boolean has(String key) {
        return obj.members.containsKey(key);
    }

    Node node(String key) {
        return obj.members.get(key);
    }

    String pathOf(String key) {
        return JsonPaths.member(path, key);
    }

    int keyLine(String key) {
        int[] at = obj.keyAt.get(key);
        return at == null ? obj.line : at[0];
    }

    int keyColumn(String key) {
        int[] at = obj.keyAt.get(key);
        return at == null ? obj.column : at[1];
    }

    /** Records a problem at the value of key (or at the object when the key is absent). */
    void error(String key, String message) {
        Node n = node(key);
        if (n == null) {
            problems.at(path, obj.line, obj.column, message);
        } else {
            problems.at(pathOf(key), n.line, n.column, message);
        }
    }

    /** Records that a required key is missing; what says what it is, with unit and range. */
    void missing(String key, String what) {
        problems.at(path, obj.line, obj.column, "required key \"" + key + "\" is missing (" + what + ")");
    }

    private void wrongType(String key, String expected) {
        error(key, "must be " + expected + ", got " + node(key).kind() + shownValue(node(key)));
    }

    private static String shownValue(Node n) {
        if (n instanceof Num num) {
            return " " + num.text;
        }
        if (n instanceof Str s) {
            String v = s.value.length() > 40 ? s.value.substring(0, 40) + "..." : s.value;
            return " \"" + v + "\"";
        }
        return "";
    }

    /**
     * A number in a range.
     *
     * @param key      the key
     * @param fallback value when absent; null makes the key required
     * @param range    allowed values
     * @param what     what it is, with unit, for the missing-key message
     * @return the value, the fallback, or null after a problem
     */
    Double number(String key, Double fallback, Range range, String what) {
        Node n = node(key);
        if (n == null) {
            if (fallback == null) {
                missing(key, what + ", " + range);
            }
            return fallback;
        }
        return number(n, pathOf(key), range);
    }

    /** A number node anywhere (list items). */
    Double number(Node n, String at, Range range) {
        if (!(n instanceof Num num)) {
            problems.at(at, n.line, n.column, "must be a number, got " + n.kind() + shownValue(n));
            return null;
        }
        if (!Double.isFinite(num.value)) {
            problems.at(at, n.line, n.column, "must be a finite number, got " + num.text);
            return null;
        }
        if (!range.contains(num.value)) {
            problems.at(at, n.line, n.column, "= " + num.text + " is out of range: allowed " + range);
            return null;
        }
        return num.value;
    }

    /**
     * An integer in [lo, hi].
     *
     * @return the value, the fallback, or null after a problem
     */
    Long integer(String key, Long fallback, long lo, long hi, String what) {
        Node n = node(key);
        if (n == null) {
            if (fallback == null) {
                missing(key, what);
            }
            return fallback;
        }
        if (!(n instanceof Num num)) {
            wrongType(key, "an integer");
            return null;
        }
        if (!num.integral) {
            boolean any = lo == Long.MIN_VALUE && hi == Long.MAX_VALUE;
            error(key, "must be " + (any ? "a whole number" : "a whole number from " + lo + " to " + hi)
                    + ", got " + num.text);
            return null;
        }
        if (num.longValue < lo || num.longValue > hi) {
            error(key, "= " + num.text + " is out of range: allowed " + lo + " to " + hi);
            return null;
        }
        return num.longValue;
    }

    /**
     * true or false.
     *
     * @return the value, the fallback, or null after a problem
     */
    Boolean bool(String key, Boolean fallback) {
        Node n = node(key);
        if (n == null) {
            return fallback;
        }
        if (!(n instanceof JsonTree.Bool b)) {
            wrongType(key, "true or false");
            return null;
        }
        return b.value;
    }

    /**
     * A string, optionally one of a fixed set.
     *
     * @param choices allowed values, or null for any non-empty string
     * @return the value, the fallback, or null after a problem
     */
    String string(String key, String fallback, List<String> choices, String what) {
        Node n = node(key);
        if (n == null) {
            if (fallback == null) {
                missing(key, what);
            }
            return fallback;
        }
        return string(n, pathOf(key), choices);
    }

    /** A string node anywhere. */
    String string(Node n, String at, List<String> choices) {
        if (!(n instanceof Str s)) {
            problems.at(at, n.line, n.column, "must be a string, got " + n.kind() + shownValue(n));
            return null;
        }
        if (choices != null && !choices.contains(s.value)) {
            String best = Suggest.closest(s.value, choices);
            problems.at(at, n.line, n.column, "\"" + s.value + "\" is not allowed"
                    + (best == null ? "" : "; did you mean \"" + best + "\"?") + " allowed: "
                    + String.join(", ", choices));
            return null;
        }
        if (choices == null && s.value.isBlank()) {
            problems.at(at, n.line, n.column, "must not be empty");
            return null;
        }
        return s.value;
    }

    /**
     * A list of three finite numbers.
     *
     * @return the vector, the fallback (not copied), or null after a problem
     */
    double[] vector(String key, double[] fallback, Range range, String what) {
        Node n = node(key);
        if (n == null) {
            if (fallback == null) {
                missing(key, what + ", a list of three numbers");
            }
            return fallback;
        }
        return vector(n, pathOf(key), range);
    }

    /** A 3-vector node anywhere. */
    double[] vector(Node n, String at, Range range) {
        if (!(n instanceof Arr a) || a.items.size() != 3) {
            problems.at(at, n.line, n.column, "must be a list of three numbers, got "
                    + (n instanceof Arr a2 ? "a list of " + a2.items.size() : n.kind() + shownValue(n)));
            return null;
        }
        double[] v = new double[3];
        boolean ok = true;
        for (int i = 0; i < 3; i++) {
            Double d = number(a.items.get(i), JsonPaths.index(at, i), range);
            if (d == null) {
                ok = false;
            } else {
                v[i] = d;
            }
        }
        return ok ? v : null;
    }

    /**
     * A nested object.
     *
     * @return the object, or null when absent (a problem when required) or not an object
     */
    Obj object(String key, boolean required, String what) {
        Node n = node(key);
        if (n == null) {
            if (required) {
                missing(key, what);
            }
            return null;
        }
        if (!(n instanceof Obj o)) {
            wrongType(key, "an object (" + what + ")");
            return null;
        }
        return o;
    }

    /**
     * A list.
     *
     * @return its items, or null when absent (a problem when required) or not a list
     */
    List<Node> list(String key, boolean required, int maxItems, String what) {
        Node n = node(key);
        if (n == null) {
            if (required) {
                missing(key, what);
            }
            return null;
        }
        if (!(n instanceof Arr a)) {
            wrongType(key, "a list (" + what + ")");
            return null;
        }
        if (a.items.size() > maxItems) {
            error(key, "holds " + a.items.size() + " items; at most " + maxItems + " allowed");
            return null;
        }
        return a.items;
    }

    /**
     * A list of distinct strings, each one of choices (or any name matching pattern when choices is null).
     *
     * @return the strings, or null when absent or bad
     */
    List<String> strings(String key, List<String> choices, String pattern, int maxItems, String what) {
        List<Node> items = list(key, false, maxItems, what);
        if (items == null) {
            return null;
        }
        List<String> out = new ArrayList<>();
        boolean ok = true;
        for (int i = 0; i < items.size(); i++) {
            String at = JsonPaths.index(pathOf(key), i);
            Node n = items.get(i);
            String s = string(n, at, choices);
            if (s == null) {
                ok = false;
            } else if (pattern != null && !s.matches(pattern)) {
                problems.at(at, n.line, n.column, "\"" + s + "\" is not a valid name: "
                        + "lower-case letters, digits and dashes, starting with a letter");
                ok = false;
            } else if (out.contains(s)) {
                problems.at(at, n.line, n.column, "\"" + s + "\" is listed twice");
                ok = false;
            } else {
                out.add(s);
            }
        }
        return ok ? out : null;
    }

    /** An allowed interval of numbers, shown in messages with its unit. */
    record Range(double lo, boolean loOpen, double hi, boolean hiOpen, String unit) {
        static Range any(String unit) {
            return new Range(Double.NEGATIVE_INFINITY, true, Double.POSITIVE_INFINITY, true, unit);
        }

        static Range positive(String unit) {
            return new Range(0, true, Double.POSITIVE_INFINITY, true, unit);
        }

        static Range nonNegative(String unit) {
            return new Range(0, false, Double.POSITIVE_INFINITY, true, unit);
        }

        static Range closed(double lo, double hi, String unit) {
            return new Range(lo, false, hi, false, unit);
        }

        boolean contains(double v) {
            return (loOpen ? v > lo : v >= lo) && (hiOpen ? v < hi : v <= hi);
        }

        @Override
        public String toString() {
            String u = unit.isEmpty() ? "" : " " + unit;
            boolean noLo = lo == Double.NEGATIVE_INFINITY;
            boolean noHi = hi == Double.POSITIVE_INFINITY;
            if (noLo && noHi) {
                return "any finite number" + (unit.isEmpty() ? "" : " (" + unit + ")");
            }
            if (noHi) {
                return (loOpen ? "> " : ">= ") + num(lo) + u;
            }
            if (noLo) {
                return (hiOpen ? "< " : "<= ") + num(hi) + u;
            }
            return (loOpen ? "(" : "[") + num(lo) + ", " + num(hi) + (hiOpen ? ")" : "]") + u;
        }

        private static String num(double v) {
            return v == Math.rint(v) && Math.abs(v) < 1e15 ? String.format(Locale.ROOT, "%d", (long) v)
                    : Double.toString(v);
        }
    }
}

package dev.fray.io.scene;

import com.fasterxml.jackson.core.io.JsonStringEncoder;

import java.util.List;
import java.util.Map;

/**
 * Writes a tree of maps, lists, strings and numbers as indented JSON: objects one member per line, lists of plain
 * values (vectors, names) on one line. Doubles are written so that reading them back gives the same bits: whole
 * numbers below 1e15 without a fraction, all others in the shortest form {@link Double#toString} gives.
 */
final class JsonOut {
    private static final String INDENT = "  ";
    /** Longest line a flat object is kept on. */
    private static final int INLINE_WIDTH = 100;

    private JsonOut() {
    }

    /**
     * @param root a map (the document)
     * @return the JSON text, ending with a newline
     */
    static String write(Map<String, ?> root) {
        StringBuilder b = new StringBuilder(4096);
        value(b, root, 0);
        b.append('\n');
        return b.toString();
    }

    /** @return a double as JSON text; NaN and infinities are not JSON and must not reach here */
    static String number(double v) {
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException("not a finite number: " + v);
        }
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            // -0.0 keeps its sign through "-0.0"; every other whole number reads back exactly without a fraction.
            return v == 0 && 1 / v < 0 ? "-0.0" : Long.toString((long) v);
        }
        return Double.toString(v).replace('E', 'e');
    }

    private static void value(StringBuilder b, Object v, int depth) {
        if (v instanceof Map<?, ?> m) {
            if (m.isEmpty()) {
                b.append("{}");
                return;
            }
            if (m.values().stream().noneMatch(JsonOut::nested)) {
                // Small flat objects (a contact, a shape) read best on one line.
                StringBuilder line = new StringBuilder();
                line.append('{');
                int k = 0;
                for (Map.Entry<?, ?> e : m.entrySet()) {
                    line.append(k++ == 0 ? "" : ", ");
                    string(line, String.valueOf(e.getKey()));
                    line.append(": ");
                    value(line, e.getValue(), depth + 1);
                }
                line.append('}');
                if (line.length() + 2 * depth <= INLINE_WIDTH) {
                    b.append(line);
                    return;
                }
            }
            b.append("{\n");
            int i = 0;
            for (Map.Entry<?, ?> e : m.entrySet()) {
                indent(b, depth + 1);
                string(b, String.valueOf(e.getKey()));
                b.append(": ");
                value(b, e.getValue(), depth + 1);
                b.append(++i < m.size() ? ",\n" : "\n");
            }
            indent(b, depth);
            b.append('}');
        } else if (v instanceof double[] a) {
            b.append('[');
            for (int i = 0; i < a.length; i++) {
                b.append(i == 0 ? "" : ", ").append(number(a[i]));
            }
            b.append(']');
        } else if (v instanceof List<?> list) {
            boolean flat = list.stream().noneMatch(o -> o instanceof Map || o instanceof List);
            if (flat) {
                b.append('[');
                for (int i = 0; i < list.size(); i++) {
                    b.append(i == 0 ? "" : ", ");
                    value(b, list.get(i), depth);
                }
                b.append(']');
                return;
            }
            b.append("[\n");
            for (int i = 0; i < list.size(); i++) {
                indent(b, depth + 1);
                value(b, list.get(i), depth + 1);
                b.append(i + 1 < list.size() ? ",\n" : "\n");
            }
            indent(b, depth);
            b.append(']');
        } else if (v instanceof String s) {
            string(b, s);
        } else if (v instanceof Double || v instanceof Float) {
            b.append(number(((Number) v).doubleValue()));
        } else if (v instanceof Number n) {
            b.append(n.longValue());
        } else if (v instanceof Boolean bool) {
            b.append(bool.booleanValue());
        } else if (v == null) {
            b.append("null");
        } else {
            throw new IllegalArgumentException("cannot write " + v.getClass().getName() + " as JSON");
        }
    }

    private static boolean nested(Object v) {
        return v instanceof Map || (v instanceof List<?> l && l.stream().anyMatch(o -> o instanceof Map
                || o instanceof List));
    }

    private static void string(StringBuilder b, String s) {
        b.append('"');
        JsonStringEncoder.getInstance().quoteAsString(s, b);
        b.append('"');
    }

    private static void indent(StringBuilder b, int depth) {
        for (int i = 0; i < depth; i++) {
            b.append(INDENT);
        }
    }

}

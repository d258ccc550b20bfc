package dev.fray.core.plugin;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

import java.util.Collections;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Set;

/**
 * Named parameters handed to a plugin provider (from a scene file or a host): numbers, strings and 3-vectors,
 * each with the place it came from for error messages. A provider reads what it needs and then calls
 * {@link #requireAllUsed()}, so a misspelt name is an error with a did-you-mean suggestion, not a silent default.
 */
public final class Parameters {
    private final String where;
    private final Map<String, Object> values;
    private final Set<String> used = new HashSet<>();

    /**
     * @param where  where the parameters come from, e.g. "scene.json: bodies[0].damage"
     * @param values numbers (Number), strings (String) and vectors (double[3]); copied
     */
    public Parameters(String where, Map<String, ?> values) {
        this.where = where;
        this.values = Collections.unmodifiableMap(new LinkedHashMap<>(values));
    }

    /** @return where the parameters come from */
    public String where() {
        return where;
    }

    /** @return the parameter names */
    public Set<String> names() {
        return values.keySet();
    }

    /**
     * @param name parameter name (with its unit in the documentation)
     * @return whether it was given
     */
    public boolean has(String name) {
        return values.containsKey(name);
    }

    /**
     * @param name a required number
     * @return its value
     */
    public double number(String name) {
        Object v = values.get(name);
        used.add(name);
        if (v == null) {
            throw new InvalidInputException(FrayMessage.MISSING, where + "." + name);
        }
        if (!(v instanceof Number num)) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, where + "." + name, v, "a number");
        }
        return Checks.finite(where + "." + name, num.doubleValue());
    }

    /**
     * @param name     an optional number
     * @param fallback value when absent
     * @return its value
     */
    public double number(String name, double fallback) {
        return has(name) ? number(name) : markUsed(name, fallback);
    }

    /**
     * @param name     an optional string
     * @param fallback value when absent
     * @return its value
     */
    public String string(String name, String fallback) {
        used.add(name);
        Object v = values.get(name);
        if (v == null) {
            return fallback;
        }
        if (!(v instanceof String str)) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, where + "." + name, v, "a string");
        }
        return str;
    }

    /**
     * @param name     an optional 3-vector
     * @param fallback value when absent (not copied)
     * @return a copy of its value
     */
    public double[] vector(String name, double[] fallback) {
        used.add(name);
        Object v = values.get(name);
        if (v == null) {
            return fallback;
        }
        if (!(v instanceof double[] a) || a.length != 3) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, where + "." + name, v,
                    "a list of three numbers");
        }
        for (int i = 0; i < 3; i++) {
            Checks.finite(where + "." + name + "[" + i + "]", a[i]);
        }
        return a.clone();
    }

    private double markUsed(String name, double value) {
        used.add(name);
        return value;
    }

    /** @throws InvalidInputException naming the first parameter no reader asked for, with the closest known name */
    public void requireAllUsed() {
        for (String name : values.keySet()) {
            if (!used.contains(name)) {
                String best = Suggest.closest(name, used);
                throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "parameter in " + where, name,
                        best == null ? used : "did you mean \"" + best + "\"? all: " + used);
            }
        }
    }
}

package dev.fray.io.scene;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.Parameters;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * How a model was made, so that it can be written to a scene file again: a name (a registry name such as
 * "neo-hookean", or a built-in kind such as "helical" or "mesh") and named parameters in SI units. Parameter values
 * are numbers (kept as {@link Double}), strings, booleans, or lists of three numbers (kept as an unmodifiable
 * {@code List<Double>}, so that descriptions compare by value).
 *
 * @param name       the name
 * @param parameters the parameters in the order given
 */
public record ModelDescription(String name, Map<String, Object> parameters) {
    /** Checks the name and normalises the values. */
    public ModelDescription {
        Checks.notNull("model name", name);
        Checks.notNull("parameters of \"" + name + "\"", parameters);
        Map<String, Object> m = new LinkedHashMap<>();
        for (Map.Entry<String, ?> e : parameters.entrySet()) {
            m.put(Checks.notNull("parameter name", e.getKey()), normalise(name, e.getKey(), e.getValue()));
        }
        parameters = Collections.unmodifiableMap(m);
    }

    /**
     * @param name       the name
     * @param parameters numbers, strings, booleans, {@code double[3]} or lists of three numbers
     * @return the description
     */
    public static ModelDescription of(String name, Map<String, ?> parameters) {
        return new ModelDescription(name, new LinkedHashMap<>(parameters));
    }

    private static Object normalise(String model, String key, Object v) {
        if (v instanceof Number n) {
            return n.doubleValue();
        }
        if (v instanceof String || v instanceof Boolean) {
            return v;
        }
        if (v instanceof double[] a && a.length == 3) {
            return List.of(a[0], a[1], a[2]);
        }
        if (v instanceof List<?> list && list.size() == 3) {
            List<Double> out = new ArrayList<>(3);
            for (Object o : list) {
                if (!(o instanceof Number n)) {
                    return bad(model, key, v);
                }
                out.add(n.doubleValue());
            }
            return List.copyOf(out);
        }
        return bad(model, key, v);
    }

    private static Object bad(String model, String key, Object v) {
        throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "parameter " + key + " of \"" + model + "\"",
                v, "a number, a string, true/false or a list of three numbers");
    }

    /**
     * @param where where the parameters come from, for messages (e.g. a JSON path)
     * @return the parameters in the form plugin providers read, vectors as {@code double[3]}
     */
    public Parameters toParameters(String where) {
        Map<String, Object> m = new LinkedHashMap<>();
        for (Map.Entry<String, Object> e : parameters.entrySet()) {
            Object v = e.getValue();
            if (v instanceof List<?> list) {
                double[] a = new double[3];
                for (int i = 0; i < 3; i++) {
                    a[i] = (Double) list.get(i);
                }
                v = a;
            }
            m.put(e.getKey(), v);
        }
        return new Parameters(where, m);
    }
}

package dev.fray.core.material;

import java.util.HashMap;
import java.util.Map;

/**
 * A {@link MaterialState} over plain arrays, for evaluating a law outside a simulation (tests, plots, hosts that
 * want a stress-strain curve). Not used by the solver.
 */
public final class ArrayMaterialState implements MaterialState {
    private final double[] deformation;
    private final Map<String, double[]> channels = new HashMap<>();

    /**
     * @param deformation F of each particle, 9 per particle, row-major (kept, not copied)
     */
    public ArrayMaterialState(double[] deformation) {
        this.deformation = deformation;
    }

    /**
     * Adds or replaces a channel.
     *
     * @param name   channel name
     * @param values backing array (kept, not copied)
     * @return this
     */
    public ArrayMaterialState withChannel(String name, double[] values) {
        channels.put(name, values);
        return this;
    }

    @Override
    public double[] deformation() {
        return deformation;
    }

    @Override
    public double[] channel(String name) {
        double[] c = channels.get(name);
        if (c == null) {
            throw new IllegalArgumentException("no channel \"" + name + "\" in this state; have " + channels.keySet());
        }
        return c;
    }
}

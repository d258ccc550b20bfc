package dev.fray.core.sim;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Everything that changes during a run, captured between steps: enough to resume bitwise identically from the
 * same scene. Particle arrays are in the current storage order (which the solver's stable sort depends on).
 *
 * @param time          simulated time, s
 * @param step          steps taken
 * @param dt            last time step, s
 * @param frame         frames reached
 * @param frameZeroSent whether frame 0 was already sent to frame listeners
 * @param maxSpeed      largest particle speed after the last step, m/s (sets the next time step)
 * @param boundaryWork  accumulated boundary work, J
 * @param channels      every particle channel by name, in declaration order (arrays owned by this record)
 * @param body          body index per particle
 * @param id            stable id per particle
 */
public record SimulationState(double time, long step, double dt, int frame, boolean frameZeroSent, double maxSpeed,
                              double boundaryWork, Map<String, double[]> channels, int[] body, int[] id) {
    /** Freezes the channel map. */
    public SimulationState {
        channels = Collections.unmodifiableMap(new LinkedHashMap<>(channels));
    }

    /** @return number of particles */
    public int size() {
        return id.length;
    }
}

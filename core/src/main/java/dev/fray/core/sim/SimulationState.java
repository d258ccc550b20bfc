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
 * @param blockKeys     the particle blocks in storage order (packed block coordinates), or an empty array if the
 *                      particles are to be sorted before the next step; the solver sorts only when a particle
 *                      has left its block's reach, so the blocks are part of the state
 * @param blockStarts   first particle of each block, with the particle count appended (length
 *                      {@code blockKeys.length + 1}), or an empty array with an empty blockKeys
 * @param tallies       the energy and boundary tallies after {@code boundaryWork} (damping loss, contact loss,
 *                      then impulse and work per grip and obstacle; see the step's {@code Tallies}), or an empty
 *                      array for a state saved before they existed (then they restart at 0)
 */
public record SimulationState(double time, long step, double dt, int frame, boolean frameZeroSent, double maxSpeed,
                              double boundaryWork, Map<String, double[]> channels, int[] body, int[] id,
                              long[] blockKeys, int[] blockStarts, double[] tallies) {
    /** Freezes the channel map. */
    public SimulationState {
        channels = Collections.unmodifiableMap(new LinkedHashMap<>(channels));
        blockKeys = blockKeys == null ? new long[0] : blockKeys;
        blockStarts = blockStarts == null ? new int[0] : blockStarts;
        tallies = tallies == null ? new double[0] : tallies;
    }

    /** A state without tallies beyond the boundary work (as saved before they existed). */
    public SimulationState(double time, long step, double dt, int frame, boolean frameZeroSent, double maxSpeed,
                           double boundaryWork, Map<String, double[]> channels, int[] body, int[] id,
                           long[] blockKeys, int[] blockStarts) {
        this(time, step, dt, frame, frameZeroSent, maxSpeed, boundaryWork, channels, body, id, blockKeys,
                blockStarts, null);
    }

    /** @return number of particles */
    public int size() {
        return id.length;
    }
}

package dev.fray.core.sim;

import java.util.List;

/** What listeners see of a running simulation. */
public interface SimulationView {
    /** @return simulated time, s */
    double time();

    /** @return steps taken so far */
    long stepCount();

    /** @return last time step, s (0 before the first) */
    double dt();

    /** @return the scene being simulated */
    Scene scene();

    /** @return names of the bodies, in scene order */
    List<String> bodyNames();

    /** @return the particles */
    ParticleView particles();

    /** @return whole-scene diagnostics now (computed on each call) */
    Diagnostics diagnostics();

    /** @return bytes held by the grid now */
    long gridMemoryBytes();

    /** @return bytes held by the particle arrays */
    long particleMemoryBytes();
}

package dev.fray.core.sim;

/**
 * Receives the state at frame times k / frameRate. Frame 0 is the initial state, sent when the first run starts.
 * Writers and previews are frame listeners.
 */
@FunctionalInterface
public interface FrameListener {
    /**
     * @param frame  frame index
     * @param time   simulated time, s (equal to frame / frameRate up to rounding)
     * @param view   the simulation now
     * @param isLast whether this is the last frame of the current run
     */
    void onFrame(int frame, double time, SimulationView view, boolean isLast);

    /**
     * Called when the run ends.
     *
     * @param view the simulation at the end
     */
    default void finish(SimulationView view) {
    }
}

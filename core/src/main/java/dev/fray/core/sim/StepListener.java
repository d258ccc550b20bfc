package dev.fray.core.sim;

/**
 * Receives run events. Order: {@link #init} once when a run starts; {@link #afterStep} after every step (step
 * listeners in the order added, then frame listeners); {@link #finish} once when the run ends, also after a STOP
 * and after a divergence.
 */
public interface StepListener {
    /**
     * @param view    the simulation at the start of the run
     * @param endTime time the run is asked to reach, s
     */
    default void init(SimulationView view, double endTime) {
    }

    /**
     * @param info the step just taken
     * @return what to do next
     */
    StepAction afterStep(StepInfo info);

    /**
     * @param view the simulation at the end of the run
     */
    default void finish(SimulationView view) {
    }
}

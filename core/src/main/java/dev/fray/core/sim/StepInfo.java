package dev.fray.core.sim;

/**
 * One step just taken.
 *
 * @param step        step number, 0-based
 * @param time        simulated time after the step, s
 * @param dt          time step just taken, s
 * @param wallSeconds wall-clock time of the step, s
 * @param view        the simulation after the step (diagnostics computed on request)
 */
public record StepInfo(long step, double time, double dt, double wallSeconds, SimulationView view) {
}

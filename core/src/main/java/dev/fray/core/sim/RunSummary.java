package dev.fray.core.sim;

/**
 * What one call of {@link Simulation#run(double)} did.
 *
 * @param steps            steps taken
 * @param simulatedSeconds simulated time advanced, s
 * @param wallSeconds      wall-clock time, s
 * @param stopped          whether a listener or the host stopped the run early
 */
public record RunSummary(long steps, double simulatedSeconds, double wallSeconds, boolean stopped) {
}

package dev.fray.core.sim;

import dev.fray.core.error.Checks;

/**
 * How a host runs a simulation, apart from what is simulated: settings that never change a result. A scene may
 * carry a default thread count (scene files keep {@code threads}); run options override it.
 *
 * @param threads worker threads, 1 to 1024; results are bitwise identical for any count
 */
public record RunOptions(int threads) {
    /** Checks the values. */
    public RunOptions {
        Checks.inRange("threads", threads, 1, 1024);
    }

    /**
     * @param scene the scene
     * @return the scene's own defaults
     */
    public static RunOptions of(Scene scene) {
        return new RunOptions(scene.threads());
    }

    /**
     * @param threads worker threads, 1 to 1024
     * @return options with this thread count
     */
    public RunOptions withThreads(int threads) {
        return new RunOptions(threads);
    }
}

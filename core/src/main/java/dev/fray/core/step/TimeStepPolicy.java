package dev.fray.core.step;

import dev.fray.core.sim.Scene;

/**
 * Chooses each step's length: the scene's fixed step, or CFL dx / (max particle speed + largest elastic wave
 * speed), at most the scene's largest step, and clipped so that steps land exactly on frame times (the last two
 * steps before a frame split what is left evenly rather than leave a sliver).
 */
public final class TimeStepPolicy {
    private final Scene scene;
    private final double dx;
    private final double waveSpeed;

    /**
     * @param scene     the scene (CFL number, fixed and largest step)
     * @param waveSpeed largest elastic wave speed of the bodies, m/s
     */
    public TimeStepPolicy(Scene scene, double waveSpeed) {
        this.scene = scene;
        this.dx = scene.cellSize();
        this.waveSpeed = waveSpeed;
    }

    /** @return whether the scene fixes the step */
    public boolean fixed() {
        return !Double.isNaN(scene.fixedTimeStep());
    }

    /**
     * The step the solver takes when no frame time is near.
     *
     * @param maxSpeed largest particle speed, m/s
     * @return the step, s
     */
    public double unclipped(double maxSpeed) {
        double h = fixed() ? scene.fixedTimeStep() : scene.cfl() * dx / (maxSpeed + waveSpeed);
        return Math.min(h, scene.maxTimeStep());
    }

    /**
     * The next step towards a target time.
     *
     * @param maxSpeed  largest particle speed, m/s
     * @param remaining time left to the target, s
     * @return the step, s; equal to {@code remaining} exactly when the step lands on the target
     */
    public double next(double maxSpeed, double remaining) {
        double h = unclipped(maxSpeed);
        if (h >= remaining * (1 - 1e-9)) {
            return remaining;
        }
        if (!fixed() && h > 0.5 * remaining) {
            // Split what is left in two equal steps instead of leaving a sliver.
            return 0.5 * remaining;
        }
        return h;
    }

    /** @return the largest elastic wave speed, m/s */
    public double waveSpeed() {
        return waveSpeed;
    }
}

package dev.fray.core.step;

import dev.fray.core.sim.Scene;

/**
 * Chooses each step's length: the scene's fixed step, or CFL dx / (max particle speed + largest elastic wave
 * speed), at most the scene's largest step, and clipped so that steps land exactly on frame times (the last two
 * steps before a frame split what is left evenly rather than leave a sliver). For the implicit integrator the wave
 * speed drops out: CFL dx / max(speed, sqrt(CFL dx |g|)), a fraction of a cell of motion per step (the second term
 * bounds the step of material at rest under gravity by the distance it would fall), at most one frame.
 */
public final class TimeStepPolicy {
    /**
     * Auto integration picks implicit when the explicit step would be at least this many times shorter than the
     * implicit one (common practice, no source: below about this factor a Newton step costs more than the
     * explicit steps it replaces).
     */
    public static final double IMPLICIT_GAIN = 10;
    private final Scene scene;
    private final double dx;
    private final double waveSpeed;
    private final boolean implicit;
    private final double prescribedSpeed;

    /**
     * @param scene     the scene (CFL number, fixed and largest step)
     * @param waveSpeed largest elastic wave speed of the bodies, m/s
     */
    public TimeStepPolicy(Scene scene, double waveSpeed) {
        this(scene, waveSpeed, false);
    }

    /**
     * @param scene     the scene (CFL number, fixed and largest step)
     * @param waveSpeed largest elastic wave speed of the bodies, m/s
     * @param implicit  whether the steps are implicit (limited by motion only)
     */
    public TimeStepPolicy(Scene scene, double waveSpeed, boolean implicit) {
        this(scene, waveSpeed, implicit, 0);
    }

    /**
     * @param scene           the scene (CFL number, fixed and largest step)
     * @param waveSpeed       largest elastic wave speed of the bodies, m/s
     * @param implicit        whether the steps are implicit (limited by motion only)
     * @param prescribedSpeed largest speed of an obstacle or grip, m/s: an implicit step is also limited by it, so
     *                        a moving obstacle advances a fraction of a cell per step even onto material at rest
     */
    public TimeStepPolicy(Scene scene, double waveSpeed, boolean implicit, double prescribedSpeed) {
        this.prescribedSpeed = prescribedSpeed;
        this.scene = scene;
        this.dx = scene.cellSize();
        this.waveSpeed = waveSpeed;
        this.implicit = implicit;
    }

    /**
     * A speed to plan steps with before anything moves: the largest of the initial particle speed, the speeds of
     * obstacles and grips, and sqrt(2 |g| L) for a fall across the domain's largest edge L.
     *
     * @param scene      the scene
     * @param movedSpeed largest initial or prescribed speed, m/s
     * @return m/s
     */
    public static double motionSpeed(Scene scene, double movedSpeed) {
        double[] g = scene.gravity();
        double gn = Math.sqrt(g[0] * g[0] + g[1] * g[1] + g[2] * g[2]);
        var d = scene.domain();
        double edge = Math.max(d.maxX() - d.minX(), Math.max(d.maxY() - d.minY(), d.maxZ() - d.minZ()));
        return Math.max(movedSpeed, Math.sqrt(2 * gn * edge));
    }

    /**
     * @param waveSpeed   largest elastic wave speed, m/s
     * @param motionSpeed planning speed of the material ({@link #motionSpeed}), m/s
     * @return whether the explicit step (v + c) would be at least {@link #IMPLICIT_GAIN} times shorter than the
     *         implicit one (v)
     */
    public static boolean prefersImplicit(double waveSpeed, double motionSpeed) {
        return waveSpeed + motionSpeed >= IMPLICIT_GAIN * Math.max(motionSpeed, 1e-12);
    }

    /**
     * The step of each integrator at a speed, for reports.
     *
     * @param scene     the scene
     * @param waveSpeed largest elastic wave speed, m/s
     * @param speed     particle speed, m/s
     * @param implicit  which integrator
     * @return the unclipped step, s
     */
    public static double stepAt(Scene scene, double waveSpeed, double speed, boolean implicit) {
        return new TimeStepPolicy(scene, waveSpeed, implicit).unclipped(speed);
    }

    /** @return whether steps are implicit */
    public boolean implicit() {
        return implicit;
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
        if (fixed()) {
            return Math.min(scene.fixedTimeStep(), scene.maxTimeStep());
        }
        if (implicit) {
            double[] g = scene.gravity();
            double gn = Math.sqrt(g[0] * g[0] + g[1] * g[1] + g[2] * g[2]);
            double v = Math.max(Math.max(maxSpeed, prescribedSpeed), Math.sqrt(scene.cfl() * dx * gn));
            double h = v > 0 ? scene.cfl() * dx / v : Double.POSITIVE_INFINITY;
            return Math.min(Math.min(h, 1.0 / scene.frameRate()), scene.maxTimeStep());
        }
        double h = scene.cfl() * dx / (maxSpeed + waveSpeed);
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

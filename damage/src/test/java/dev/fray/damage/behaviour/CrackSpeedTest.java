package dev.fray.damage.behaviour;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION C18: a larger crack-speed viscosity makes a crack grow more slowly. An edge-notched strip
 * (Neo-Hookean, E = 1e5 Pa, nu = 0.3, rho = 1000 kg/m^3; AT2 phase field, Gc = 5 J/m^2, l = two cells) is pulled
 * apart along y and the crack runs from the notch across x. The front is the largest x of broken particles
 * (d &gt; 0.5) near the notch line; its speed is the distance between {@link #FROM} and {@link #TO} of the width
 * over the time it takes, for viscosities 0 (the default), {@link #ETA}[1] and {@link #ETA}[2].
 */
class CrackSpeedTest extends FrayTestBase {
    /** Crack-speed viscosities, Pa s; the first is the library default. */
    static final double[] ETA = {0, 1, 4};
    /** Front positions, as fractions of the width from the left edge, between which the speed is measured. */
    static final double FROM = 0.4;
    /** See {@link #FROM}. */
    static final double TO = 0.8;
    /**
     * Each viscosity must slow the front by at least this factor against the one before, so the trend stands out
     * of run-to-run noise (common practice, no source).
     */
    private static final double SLOWER = 0.9;
    private static final int MAX_STEPS = 200;

    /** @return front speed, m/s, of a run with viscosity eta (Pa s) */
    static double frontSpeed(double eta) {
        Strip strip = new Strip(Elastic.neoHookean(1e5, 0.3, 1000),
                Fracture.phaseField().fractureEnergy(5).viscosity(eta).build()).notch(6).pull(0.1);
        double from = strip.left() + FROM * strip.widthMetres();
        double to = strip.left() + TO * strip.widthMetres();
        try (Simulation sim = new Simulation(strip.scene())) {
            double tFrom = Double.NaN;
            double prevT = 0;
            double prevX = strip.front(sim.particles());
            while (sim.stepCount() < MAX_STEPS) {
                sim.step();
                double x = strip.front(sim.particles());
                double t = sim.time();
                // Passing times interpolated within the step.
                if (Double.isNaN(tFrom) && x >= from) {
                    tFrom = prevT + (t - prevT) * (from - prevX) / (x - prevX);
                }
                if (x >= to) {
                    double tTo = prevT + (t - prevT) * (to - prevX) / (x - prevX);
                    return (to - from) / (tTo - tFrom);
                }
                prevT = t;
                prevX = x;
            }
            throw new AssertionError("eta = " + eta + " Pa s: front at " + (prevX - strip.left()) / strip.widthMetres()
                    + " of the width after " + MAX_STEPS + " steps");
        }
    }

    @Test
    void frontSlowsAsViscosityGrows() {
        double[] speed = new double[ETA.length];
        for (int i = 0; i < ETA.length; i++) {
            speed[i] = frontSpeed(ETA[i]);
        }
        String all = String.format("front speeds %.2f, %.2f, %.2f m/s for eta = %s, %s, %s Pa s", speed[0], speed[1],
                speed[2], ETA[0], ETA[1], ETA[2]);
        for (int i = 1; i < ETA.length; i++) {
            // Common practice, no source (VALIDATION.md C18): monotonic decrease over three viscosities.
            assertTrue(speed[i] < SLOWER * speed[i - 1], all);
        }
    }
}

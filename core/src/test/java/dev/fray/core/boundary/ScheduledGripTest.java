package dev.fray.core.boundary;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.RunOptions;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.SimpleNeoHookean;
import org.junit.jupiter.api.Test;

/**
 * A body held wholly by a grip moves rigidly with the grip: over steps of uneven length, every particle moves by
 * v S(T), S(T) the integral of the grip's velocity schedule up to the end time (a body at rest in the grip's frame
 * follows the frame's path; the integral of a piecewise-linear factor is the sum of trapezoids, elementary calculus,
 * no source). Gravity acts on the body but the grip overrules it at every node the body reaches.
 */
class ScheduledGripTest extends FrayTestBase {
    private static final double[] TIMES = {0, 0.01, 0.025, 0.04};
    private static final double[] FACTORS = {0, 1, 0.4, 1.3};
    private static final double[] V = {0.3, -0.1, 0.2};

    @Test
    void grippedBodyMovesTheScheduleIntegral() {
        Motion motion = Motion.linear(V[0], V[1], V[2]).withSchedule(VelocitySchedule.of(TIMES, FACTORS));
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 1, 1).cellSize(0.05)
                .add(Body.named("block").shape(Shapes.box(0.4, 0.4, 0.4, 0.5, 0.5, 0.5))
                        .material(new SimpleNeoHookean(1e5, 0.3, 1000)).jitter(0.2).seed(5).build())
                .add(new Grip("hold", "block", Shapes.box(0.35, 0.35, 0.35, 0.55, 0.55, 0.55), motion))
                .build();
        try (Simulation sim = new Simulation(scene, new RunOptions(2))) {
            int n = sim.particles().size();
            double[] x0 = new double[3 * n];
            sim.particles().copyById(ParticleStore.POSITION, x0, 0);
            int runs = 0;
            while (sim.time() < 0.03) {
                sim.run(2e-4 + 2.5e-3 * rand.nextDouble());
                runs++;
            }
            double t = sim.time();
            assertTrue(sim.stepCount() > runs, "runs of several uneven steps (" + sim.stepCount() + " steps)");
            double area = integral(t);
            assertTrue(Math.abs(area - t) > 0.1 * t, "the schedule matters: S(T) = " + area + " s at T = " + t + " s");
            double[] x1 = new double[3 * n];
            sim.particles().copyById(ParticleStore.POSITION, x1, 0);
            double scale = Math.sqrt(V[0] * V[0] + V[1] * V[1] + V[2] * V[2]) * area;
            for (int i = 0; i < n; i++) {
                for (int k = 0; k < 3; k++) {
                    assertEquals(V[k] * area, x1[3 * i + k] - x0[3 * i + k], 1e-12 * scale,
                            "displacement of particle " + i + " axis " + k);
                }
            }
        }
    }

    /** Integral from 0 to t of the piecewise-linear factor (constant outside the knots), by trapezoids. */
    private static double integral(double t) {
        double s = FACTORS[0] * Math.min(t, TIMES[0]);
        for (int k = 0; k + 1 < TIMES.length && t > TIMES[k]; k++) {
            double end = Math.min(t, TIMES[k + 1]);
            double fEnd = FACTORS[k] + (FACTORS[k + 1] - FACTORS[k]) * (end - TIMES[k]) / (TIMES[k + 1] - TIMES[k]);
            s += 0.5 * (end - TIMES[k]) * (FACTORS[k] + fEnd);
        }
        int last = TIMES.length - 1;
        return t > TIMES[last] ? s + FACTORS[last] * (t - TIMES[last]) : s;
    }
}

package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.boundary.VelocitySchedule;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.BoundaryLoad;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION E26: the force a grip reports. A bar (Poisson ratio 0, so uniaxial stress is uniaxial strain) held
 * by one grip and pulled by another along a ramp-hold-stop schedule, brought to rest by damping, carries
 * F = E A eps (Hooke's law, any mechanics text); eps is measured between two cross-sections away from the grips,
 * where the bar is free of their end effects. The work the pulling grip reports equals the integral of its
 * reported force over its displacement (trapezoid rule over the steps).
 */
class GripForceTest extends FrayTestBase {
    @Test
    void pulledBarReportsHookesForceAndItsWork() {
        double dx = 1.0 / 64;
        double e = 1e5, rho = 1000;
        double side = 4 * dx;
        double x0 = 0.2, x1 = 0.7;
        double speed = 0.01;
        // Ramp to the pull speed in 0.05 s, hold until 0.25 s, stop by 0.3 s: a displacement of 2.25 mm.
        VelocitySchedule schedule = VelocitySchedule.of(new double[] {0, 0.05, 0.25, 0.3},
                new double[] {0, 1, 1, 0});
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 0.5, 0.5).cellSize(dx).gravity(0, 0, 0).walls(Contact.open())
                .damping(15).threads(2)
                .add(Body.named("bar").shape(Shapes.box(x0, 0.25 - side / 2, 0.25 - side / 2, x1, 0.25 + side / 2,
                        0.25 + side / 2)).material(Elastic.neoHookean(e, 0, rho)).build())
                .add(new Grip("held", "bar", Shapes.box(0, 0, 0, x0 + 3 * dx, 1, 1), Motion.STILL))
                .add(new Grip("pulled", "bar", Shapes.box(x1 - 3 * dx, 0, 0, 1, 1, 1),
                        Motion.linear(speed, 0, 0).withSchedule(schedule)))
                .build();
        try (Simulation sim = new Simulation(scene)) {
            double[] p0 = Probes.byId(sim.particles(), ParticleStore.POSITION);
            double work = 0, lastForce = 0, lastShift = 0;
            while (sim.time() < 1.2) {
                sim.step();
                Diagnostics d = sim.diagnostics();
                BoundaryLoad pulled = d.loads().get(1);
                double shift = speed * schedule.integral(sim.time());
                // Trapezoid rule over the step: the force is the step's mean (impulse / dt).
                work += pulled.forceX() * (shift - lastShift);
                lastForce = pulled.forceX();
                lastShift = shift;
            }
            Diagnostics d = sim.diagnostics();
            assertTrue(d.maxSpeed() < 1e-4, "bar at rest, fastest particle " + d.maxSpeed() + " m/s");
            // Strain between the cross-sections at a quarter and three quarters of the bar.
            double[] p = Probes.byId(sim.particles(), ParticleStore.POSITION);
            double a = x0 + 0.25 * (x1 - x0), b = x0 + 0.75 * (x1 - x0);
            double[] ends = new double[4];
            for (int i = 0; i < p0.length / 3; i++) {
                double x = p0[3 * i];
                int k = Math.abs(x - a) < dx / 2 ? 0 : Math.abs(x - b) < dx / 2 ? 2 : -1;
                if (k >= 0) {
                    ends[k] += p[3 * i] - x;
                    ends[k + 1]++;
                }
            }
            double strain = (ends[2] / ends[3] - ends[0] / ends[1]) / (b - a);
            double expected = e * side * side * strain;
            BoundaryLoad pulled = d.loads().get(1);
            BoundaryLoad held = d.loads().get(0);
            assertEquals("pulled", pulled.name());
            assertEquals(expected, pulled.forceX(), 0.02 * expected, "pulled grip force at strain " + strain);
            assertEquals(-expected, held.forceX(), 0.02 * expected, "held grip force");
            assertEquals(work, pulled.work(), 0.01 * Math.abs(work), "work against the force-displacement integral");
            assertTrue(lastForce > 0, "the last force is a pull");
        }
    }
}

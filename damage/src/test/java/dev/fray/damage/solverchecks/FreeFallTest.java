package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;

/** VALIDATION B10: free fall. */
class FreeFallTest extends FrayTestBase {
    @Test
    void bodyFollowsTheBallisticParabola() {
        double g = 9.81;
        double v0 = 0.5;
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 2, 1).cellSize(1.0 / 32).gravity(0, -g, 0).walls(Contact.open())
                .maxTimeStep(2.5e-4).threads(2)
                .add(Body.named("block").shape(Shapes.box(0.45, 1.6, 0.45, 0.55, 1.7, 0.55))
                        .material(Elastic.neoHookean(1e5, 0.3, 1000)).velocity(0, v0, 0).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            double y0 = Probes.massMean(sim.particles(), ParticleStore.POSITION, 1);
            double t = 0.4;
            sim.run(t);
            double y = Probes.massMean(sim.particles(), ParticleStore.POSITION, 1);
            // Published: Newtonian mechanics, y(t) = y0 + v0 t - g t^2 / 2.
            double expected = y0 + v0 * t - 0.5 * g * t * t;
            double fallen = Math.abs(expected - y0);
            assertEquals(expected, y, 0.005 * fallen, "centre of mass height after " + t + " s");
        }
    }
}

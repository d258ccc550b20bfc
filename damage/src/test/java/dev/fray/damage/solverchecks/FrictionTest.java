package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION B14: a block on an incline with Coulomb friction. The incline is a grid-aligned half-space with the
 * gravity vector tilted by theta, which is the same mechanics as a tilted plane under vertical gravity and keeps
 * the stair-stepped sampling of a tilted surface out of the check of the friction law.
 */
class FrictionTest extends FrayTestBase {
    private static final double G = 9.81;
    private static final double DX = 0.025;
    private static final double MU = 0.3;

    private static Scene incline(double thetaDegrees) {
        double th = Math.toRadians(thetaDegrees);
        return Scene.builder()
                .domain(0, 0, 0, 1.5, 0.5, 0.5).cellSize(DX).gravity(G * Math.sin(th), -G * Math.cos(th), 0)
                .walls(Contact.open()).threads(2)
                .add(new Obstacle("incline", Shapes.halfSpace(0, 0.1, 0, 0, 1, 0), Contact.separating(MU), null))
                .add(Body.named("block").shape(Shapes.box(0.1, 0.1, 0.15, 0.3, 0.2, 0.35))
                        .material(Elastic.neoHookean(1e6, 0.3, 1000)).build())
                .build();
    }

    @Test
    void blockSlidesWithCoulombAcceleration() {
        double theta = 30;
        try (Simulation sim = new Simulation(incline(theta))) {
            sim.run(0.1);
            double[] t = new double[4000];
            double[] v = new double[4000];
            int n = 0;
            while (sim.time() < 0.4) {
                sim.step();
                t[n] = sim.time();
                v[n] = Probes.massMean(sim.particles(), ParticleStore.VELOCITY, 0);
                n++;
            }
            double th = Math.toRadians(theta);
            // Published: Coulomb friction on an incline, a = g (sin theta - mu cos theta), any mechanics text.
            double expected = G * (Math.sin(th) - MU * Math.cos(th));
            assertEquals(expected, Probes.slope(t, v, n), 0.05 * expected, "sliding acceleration");
        }
    }

    @Test
    void blockStaysWhenTheSlopeIsBelowTheFrictionAngle() {
        double theta = 10;
        assertTrue(Math.tan(Math.toRadians(theta)) < MU);
        try (Simulation sim = new Simulation(incline(theta))) {
            sim.run(0.2);
            double x0 = Probes.massMean(sim.particles(), ParticleStore.POSITION, 0);
            sim.run(0.4);
            double x1 = Probes.massMean(sim.particles(), ParticleStore.POSITION, 0);
            // Published: Coulomb friction holds the block when tan theta < mu; drift under 1% of a cell.
            assertEquals(0, x1 - x0, 0.01 * DX, "drift along the slope");
        }
    }
}

package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shape;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;

/**
 * Obstacles thinner than a grid cell: a rigid plate a sixth of a cell thick, which most grid nodes miss, must still
 * stop a block thrown at it (particles never pass through a rigid obstacle: common practice, no source). Grid-node
 * contact alone lets the particles through between the nodes; the particle-level contact of the gather holds them.
 */
class ThinObstacleTest extends FrayTestBase {
    private static final double DX = 1.0 / 32;
    private static final double PLATE = 0.5;
    private static final double THICK = DX / 6;

    private static Scene thrownAt(Motion plateMotion, double speed) {
        return Scene.builder()
                .domain(0, 0, 0, 1, 1, 1).cellSize(DX).gravity(0, 0, 0).threads(2)
                .add(new Obstacle("plate", Shapes.box(PLATE, 0.2, 0.2, PLATE + THICK, 0.8, 0.8), Contact.separating(0),
                        plateMotion))
                .add(Body.named("block").shape(Shapes.box(0.25, 0.35, 0.35, 0.45, 0.65, 0.65))
                        .material(Elastic.neoHookean(2e4, 0.3, 1000)).velocity(speed, 0, 0).build())
                .build();
    }

    @Test
    void aStillPlateThinnerThanACellStopsABlockAndDoesNoWork() {
        try (Simulation sim = new Simulation(thrownAt(null, 2.0))) {
            Shape plate = sim.scene().obstacles().get(0).shape();
            Diagnostics d0 = sim.diagnostics();
            double e0 = d0.kineticEnergy() + d0.elasticEnergy();
            int n = sim.particles().size();
            double[] x = new double[3 * n];
            double ahead = 0;
            while (sim.time() < 0.25) {
                sim.step();
                sim.particles().copyById(ParticleStore.POSITION, x, 0);
                for (int p = 0; p < n; p++) {
                    assertTrue(plate.distance(x[3 * p], x[3 * p + 1], x[3 * p + 2]) >= -1e-9 * DX,
                            "particle " + p + " inside the plate at t = " + sim.time());
                    ahead = Math.max(ahead, x[3 * p]);
                }
                Diagnostics d = sim.diagnostics();
                // A still obstacle does no work, so the energy can only fall (common practice, no source).
                assertEquals(0.0, d.boundaryWork(), 0.0, "work of a still plate");
                assertTrue(d.kineticEnergy() + d.elasticEnergy() <= e0 * (1 + 1e-9), "energy rose at " + d);
            }
            // The block's front reached the plate (at 2 m/s it would be 0.45 m past it) and stayed in front.
            assertTrue(ahead > PLATE - DX && ahead <= PLATE + 1e-9 * DX, "front of the block at " + ahead);
            double vx = Probes.massMean(sim.particles(), ParticleStore.VELOCITY, 0);
            assertTrue(vx < 0.5, "the block was stopped or bounced, mean speed " + vx);
        }
    }

    @Test
    void aMovingThinPlatePushesARestingBlockWithoutPassingThrough() {
        double v = 1.0;
        try (Simulation sim = new Simulation(thrownAt(Motion.linear(-v, 0, 0), 0.0))) {
            int n = sim.particles().size();
            double[] x = new double[3 * n];
            sim.run(0.2);
            sim.particles().copyById(ParticleStore.POSITION, x, 0);
            double plateX = PLATE - v * sim.time();
            double front = 0;
            for (int p = 0; p < n; p++) {
                front = Math.max(front, x[3 * p]);
            }
            // The plate has moved 0.2 m into where the block was; every particle is still on its near side.
            assertTrue(front <= plateX + 1e-9 * DX, "front " + front + " past the plate at " + plateX);
            assertTrue(sim.diagnostics().boundaryWork() > 0, "a plate pushing the block does positive work");
        }
    }
}

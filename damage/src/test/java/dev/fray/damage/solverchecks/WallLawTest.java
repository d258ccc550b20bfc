package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;

/**
 * Walls do what the docs say (docs/scene-format.md, contact types): an elastic ball dropped on a separating floor
 * rebounds (material may leave the boundary); on a slip floor, which stops normal motion both ways, its lowest
 * particles stay within a cell of the floor once they have reached it. Common practice, no source.
 */
class WallLawTest extends FrayTestBase {
    private static final double DX = 1.0 / 32;

    /** @return {highest centre height after the impact, highest lowest-particle height after the impact} */
    private static double[] drop(Contact floor) {
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 1, 1).cellSize(DX).gravity(0, -9.81, 0).walls(Contact.open())
                .wall("yMin", floor).threads(2)
                .add(Body.named("ball").shape(Shapes.sphere(0.5, 0.3, 0.5, 0.1))
                        .material(Elastic.neoHookean(2e5, 0.3, 1000)).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            boolean touched = false;
            double highCentre = 0, highLowest = 0;
            while (sim.time() < 0.8) {
                sim.step();
                double[] x = Probes.byId(sim.particles(), ParticleStore.POSITION);
                double lowest = Double.POSITIVE_INFINITY;
                for (int i = 1; i < x.length; i += 3) {
                    lowest = Math.min(lowest, x[i]);
                }
                double centre = Probes.massMean(sim.particles(), ParticleStore.POSITION, 1);
                if (!touched && lowest < DX) {
                    touched = true;
                } else if (touched) {
                    highCentre = Math.max(highCentre, centre);
                    highLowest = Math.max(highLowest, lowest);
                }
            }
            assertTrue(touched, "the ball reaches the floor");
            return new double[] {highCentre, highLowest};
        }
    }

    @Test
    void ballReboundsFromSeparatingFloor() {
        double[] r = drop(Contact.separating(0));
        // Dropped with its centre at 0.3 m: a rebound lifts the ball clear of the floor again.
        assertTrue(r[1] > 3 * DX, "lowest particle rises to " + r[1] + " m after the impact");
    }

    @Test
    void slipFloorHoldsTheBall() {
        double[] r = drop(Contact.slip(0));
        assertTrue(r[1] < DX, "lowest particle rises to " + r[1] + " m after the impact, more than a cell "
                + DX + " m");
    }
}

package dev.fray.examples.readme;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The README's API tour, kept compiling and running here for 10 frames (the README runs 24): the jelly must crack
 * rather than shatter, keeping at least half of its particles below damage 0.5 (the README says 90%).
 */
class ReadmeExampleTest {
    @Test
    void apiTourRuns() {
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1, 1, 1)          // m
                .cellSize(1.0 / 48)                // m
                .gravity(0, -9.81, 0)              // m/s^2
                .walls(Contact.separating(0.3))    // Coulomb friction 0.3 on all six faces
                .add(Body.named("jelly")
                        .shape(Shapes.box(0.35, 0.55, 0.35, 0.65, 0.75, 0.65))
                        .material(Elastic.neoHookean(2e5, 0.4, 1000))   // E in Pa, Poisson ratio, kg/m^3
                        .damage(Fracture.phaseFieldAT1().strength(3e4, 2e5).build())  // 30 kPa for E = 200 kPa
                        .jitter(0.25).seed(7)
                        .build())
                .add(new Obstacle("ball", Shapes.sphere(0.5, 0.25, 0.5, 0.15), Contact.separating(0.2), null))
                .frameRate(24)
                .threads(2)                        // results are bitwise identical for any thread count
                .build();

        List<Double> kinetic = new ArrayList<>();
        double intact;
        double maxDamage = 0;
        try (Simulation sim = new Simulation(scene)) {
            sim.addFrameListener((frame, time, view, last) -> kinetic.add(view.diagnostics().kineticEnergy()));
            sim.runFrames(10);
            int n = sim.particles().size();
            double[] d = new double[n];
            sim.particles().copyById(DamageModel.DAMAGE, d, 0);
            int below = 0;
            for (double v : d) {
                below += v < 0.5 ? 1 : 0;
                maxDamage = Math.max(maxDamage, v);
            }
            intact = (double) below / n;
        }
        assertEquals(11, kinetic.size(), "frames 0 to 10");
        // Common practice, no source: a body released at rest under gravity gains kinetic energy.
        assertTrue(kinetic.get(1) > kinetic.get(0));
        assertTrue(intact >= 0.5, "the tour's jelly cracks rather than shatters: " + intact + " below damage 0.5");
        assertTrue(maxDamage > 0.9, "and it does crack: largest damage " + maxDamage);
    }
}

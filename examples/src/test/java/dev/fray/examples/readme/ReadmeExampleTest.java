package dev.fray.examples.readme;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The README's API tour, kept compiling and running here (a shorter run than the README's 24 frames). */
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
                        .damage(Fracture.phaseField().fractureEnergy(30).build())  // J/m^2; length scale 2 dx
                        .jitter(0.25).seed(7)
                        .build())
                .add(new Obstacle("ball", Shapes.sphere(0.5, 0.25, 0.5, 0.15), Contact.separating(0.2), null))
                .frameRate(24)
                .threads(2)                        // results are bitwise identical for any thread count
                .build();

        List<Double> kinetic = new ArrayList<>();
        try (Simulation sim = new Simulation(scene)) {
            sim.addFrameListener((frame, time, view, last) -> kinetic.add(view.diagnostics().kineticEnergy()));
            sim.runFrames(1);
        }
        assertEquals(2, kinetic.size(), "frame 0 and frame 1");
        // Common practice, no source: a body released at rest under gravity gains kinetic energy.
        assertTrue(kinetic.get(1) > kinetic.get(0));
    }
}

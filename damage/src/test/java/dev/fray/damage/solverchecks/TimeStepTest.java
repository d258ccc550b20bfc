package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.elastic.ElasticParameters;
import org.junit.jupiter.api.Test;

/** VALIDATION C20: explicit steps for bone-like stiffness at millimetre cells. */
class TimeStepTest extends FrayTestBase {
    @Test
    void stiffMaterialGetsMicrosecondSteps() {
        // Values from memory: cortical bone E about 17 GPa, nu 0.3, rho about 1900 kg/m^3.
        double e = 17e9, nu = 0.3, rho = 1900, dx = 0.005, cfl = 0.5;
        Scene scene = Scene.builder().domain(0, 0, 0, 0.2, 0.2, 0.2).cellSize(dx).cfl(cfl).threads(1)
                .add(Body.named("bone").shape(Shapes.cylinder(0.1, 0.1, 0.1, 0, 1, 0, 0.02, 0.06))
                        .material(Elastic.fixedCorotated(e, nu, rho)).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            // Common practice, no source: dt = CFL dx / c with the P-wave speed c = sqrt((lambda + 2 mu) / rho),
            // which for these values is about 3.5 km/s (the bar speed sqrt(E / rho) is about 3 km/s).
            ElasticParameters p = new ElasticParameters(e, nu, rho);
            double c = Math.sqrt((p.lambda() + 2 * p.mu()) / rho);
            assertEquals(c, sim.maxWaveSpeed(), 1e-9 * c, "wave speed");
            double expected = cfl * dx / c;
            double reported = sim.estimatedTimeStep();
            assertEquals(expected, reported, 0.10 * expected, "time step estimate");
            assertTrue(reported > 0.5e-6 && reported < 1.0e-6, "about a microsecond: " + reported);
            double taken = sim.step();
            assertEquals(expected, taken, 0.10 * expected, "time step taken");
        }
    }
}

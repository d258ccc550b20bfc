package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/** VALIDATION B11: APIC / MLS transfers conserve linear and angular momentum. */
class ConservationTest extends FrayTestBase {
    @ParameterizedTest
    @EnumSource(Kernel.class)
    void spinningTranslatingBodyKeepsItsMomenta(Kernel kernel) {
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 2, 2, 2).cellSize(0.025).gravity(0, 0, 0).walls(Contact.open()).kernel(kernel)
                .threads(2)
                .add(Body.named("spinner").shape(Shapes.box(0.85, 0.9, 0.9, 1.15, 1.1, 1.1))
                        .material(Elastic.fixedCorotated(1e5, 0.3, 1000)).jitter(0.2).seed(3)
                        .velocity(0.3, -0.2, 0.1).angularVelocity(1.0, 2.0, -1.5).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            Diagnostics d0 = sim.diagnostics();
            for (int i = 0; i < 1000; i++) {
                sim.step();
            }
            Diagnostics d1 = sim.diagnostics();
            double p0 = Math.sqrt(d0.momentumX() * d0.momentumX() + d0.momentumY() * d0.momentumY()
                    + d0.momentumZ() * d0.momentumZ());
            double l0 = Math.sqrt(d0.angularX() * d0.angularX() + d0.angularY() * d0.angularY()
                    + d0.angularZ() * d0.angularZ());
            // Published: Jiang et al., The affine particle-in-cell method, ACM TOG 34(4) 2015 - APIC conserves
            // linear and angular momentum exactly; only roundoff remains.
            double tol = 1e-9;
            assertEquals(d0.momentumX(), d1.momentumX(), tol * p0, "momentum x");
            assertEquals(d0.momentumY(), d1.momentumY(), tol * p0, "momentum y");
            assertEquals(d0.momentumZ(), d1.momentumZ(), tol * p0, "momentum z");
            assertEquals(d0.angularX(), d1.angularX(), tol * l0, "angular momentum x");
            assertEquals(d0.angularY(), d1.angularY(), tol * l0, "angular momentum y");
            assertEquals(d0.angularZ(), d1.angularZ(), tol * l0, "angular momentum z");
        }
    }
}

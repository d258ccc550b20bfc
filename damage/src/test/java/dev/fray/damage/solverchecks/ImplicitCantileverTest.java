package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Integration;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;

/**
 * VALIDATION F28: a cantilever under its own weight, small deflection, brought to rest with the implicit integrator
 * at 330 times the explicit step.
 */
class ImplicitCantileverTest extends FrayTestBase {
    @Test
    @Tag("slow")
    void tipDeflectionMatchesBeamTheory(TestReporter reporter) {
        double length = 0.5, h = 0.05, dx = h / 5, rho = 1000, g = 9.81, e = 7.36e7;
        // nu = 0: a beam two cells wide between slip walls is in plane strain, which with nu = 0 is plain bending
        Scene scene = Scene.builder()
                .domain(0, 0, 0, length + 4 * dx, 0.2, 2 * dx).cellSize(dx).gravity(0, -g, 0)
                .walls(Contact.open()).wall("xMin", Contact.sticky())
                .wall("zMin", Contact.slip(0)).wall("zMax", Contact.slip(0))
                .threads(2).integration(Integration.IMPLICIT).fixedTimeStep(5e-3).damping(40)
                .add(Body.named("beam").shape(Shapes.box(0, 0.1, 0, length, 0.1 + h, 2 * dx))
                        .material(Elastic.neoHookean(e, 0.0, rho)).build())
                .build();
        // Published: Euler-Bernoulli beam theory (Gere and Timoshenko, Mechanics of Materials): tip deflection
        // q L^4 / (8 E I) with q = rho g b h and I = b h^3 / 12, so 1.5 rho g L^4 / (E h^2); here L / 100
        double expected = 1.5 * rho * g * Math.pow(length, 4) / (e * h * h);
        try (Simulation sim = new Simulation(scene)) {
            double[] x0 = Probes.byId(sim.particles(), ParticleStore.POSITION);
            while (sim.time() < 0.3) {
                sim.step();
            }
            double[] x = Probes.byId(sim.particles(), ParticleStore.POSITION);
            double sum = 0;
            int n = 0;
            for (int p = 0; p < x0.length / 3; p++) {
                if (x0[3 * p] > length - dx) {
                    sum += x0[3 * p + 1] - x[3 * p + 1];
                    n++;
                }
            }
            double tip = sum / n;
            reporter.publishEntry("tip deflection / beam theory, " + sim.implicitStatistics(),
                    Double.toString(tip / expected));
            assertEquals(expected, tip, 0.05 * expected, "tip deflection, m");
        }
    }
}

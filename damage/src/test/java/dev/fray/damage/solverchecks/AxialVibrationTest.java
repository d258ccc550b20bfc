package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.elastic.ElasticParameters;
import org.junit.jupiter.api.Test;

/** VALIDATION B12: first axial mode of a fixed-free bar in uniaxial strain. */
class AxialVibrationTest extends FrayTestBase {
    @Test
    void periodMatchesFourLengthsOverWaveSpeed() {
        double length = 1.0;
        double dx = length / 32;
        double e = 1e6, nu = 0.3, rho = 1000;
        double v0 = 0.05;
        ElasticParameters params = new ElasticParameters(e, nu, rho);
        // Published: fixed-free bar, T = 4 L / c with c = sqrt((lambda + 2 mu) / rho) (Graff, Wave Motion in
        // Elastic Solids); worked example in VALIDATION.md: c = 36.69 m/s, T = 0.1090 s.
        double c = Math.sqrt((params.lambda() + 2 * params.mu()) / rho);
        assertEquals(36.69, c, 0.01, "P-wave speed of the worked example");
        double period = 4 * length / c;
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1.5, 2 * dx, 2 * dx).cellSize(dx).gravity(0, 0, 0)
                .walls(Contact.slip(0)).wall("xMin", Contact.sticky()).wall("xMax", Contact.open())
                .threads(2)
                .add(Body.named("bar").shape(Shapes.box(0, 0, 0, length, 2 * dx, 2 * dx))
                        .material(Elastic.neoHookean(e, nu, rho))
                        .velocityField((x, y, z, out) -> out[0] = v0 * Math.sin(Math.PI * x / (2 * length)))
                        .build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            // Zero crossings of the mean axial velocity, which follows v0' cos(2 pi t / T) in the first mode.
            double[] crossings = new double[8];
            int found = 0;
            double prevT = 0;
            double prevV = Probes.massMean(sim.particles(), ParticleStore.VELOCITY, 0);
            while (found < 4 && sim.time() < 3 * period) {
                sim.step();
                double v = Probes.massMean(sim.particles(), ParticleStore.VELOCITY, 0);
                if (prevV > 0 != v > 0) {
                    crossings[found++] = prevT + (sim.time() - prevT) * prevV / (prevV - v);
                }
                prevT = sim.time();
                prevV = v;
            }
            assertTrue(found >= 3, "found " + found + " zero crossings");
            double measured = crossings[2] - crossings[0];
            assertEquals(period, measured, 0.03 * period, "period of the first axial mode");
        }
    }
}

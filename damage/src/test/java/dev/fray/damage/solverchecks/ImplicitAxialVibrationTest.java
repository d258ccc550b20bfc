package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Integration;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.elastic.ElasticParameters;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * VALIDATION B12 and F29 with the implicit integrator: the first axial mode of a fixed-free bar in uniaxial strain,
 * at the explicit step and at ten times it. Backward Euler damps: the amplitude decay per period is reported.
 */
class ImplicitAxialVibrationTest extends FrayTestBase {
    @ParameterizedTest(name = "{0} x the explicit step")
    @CsvSource({"1, 0.03", "10, 0.05"})
    void periodMatchesFourLengthsOverWaveSpeed(int multiple, double tolerance, TestReporter reporter) {
        double length = 1.0;
        double dx = length / 32;
        double e = 1e6, nu = 0.3, rho = 1000;
        double v0 = 0.05;
        ElasticParameters params = new ElasticParameters(e, nu, rho);
        // Published: fixed-free bar, T = 4 L / c with c = sqrt((lambda + 2 mu) / rho) (Graff, Wave Motion in
        // Elastic Solids); worked example in VALIDATION.md: c = 36.69 m/s, T = 0.1090 s.
        double c = Math.sqrt((params.lambda() + 2 * params.mu()) / rho);
        double period = 4 * length / c;
        // the explicit step of the same scene: CFL dx / (v + c) with the default CFL
        double explicitStep = Scene.DEFAULT_CFL * dx / (v0 + c);
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 1.5, 2 * dx, 2 * dx).cellSize(dx).gravity(0, 0, 0)
                .walls(Contact.slip(0)).wall("xMin", Contact.sticky()).wall("xMax", Contact.open())
                .threads(2)
                .integration(Integration.IMPLICIT)
                .fixedTimeStep(multiple * explicitStep)
                .add(Body.named("bar").shape(Shapes.box(0, 0, 0, length, 2 * dx, 2 * dx))
                        .material(Elastic.neoHookean(e, nu, rho))
                        .velocityField((x, y, z, out) -> out[0] = v0 * Math.sin(Math.PI * x / (2 * length)))
                        .build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            assertTrue(sim.implicit());
            double[] crossings = new double[8];
            double[] peaks = new double[8];
            int found = 0;
            double prevT = 0;
            double prevV = Probes.massMean(sim.particles(), ParticleStore.VELOCITY, 0);
            double peak = Math.abs(prevV);
            while (found < 5 && sim.time() < 3 * period) {
                sim.step();
                double v = Probes.massMean(sim.particles(), ParticleStore.VELOCITY, 0);
                peak = Math.max(peak, Math.abs(v));
                if (prevV > 0 != v > 0) {
                    peaks[found] = peak;
                    peak = 0;
                    crossings[found++] = prevT + (sim.time() - prevT) * prevV / (prevV - v);
                }
                prevT = sim.time();
                prevV = v;
            }
            assertTrue(found >= 3, "found " + found + " zero crossings");
            double measured = crossings[2] - crossings[0];
            // amplitude of the half-wave after crossing 2 against the one after crossing 0: one period apart
            double decay = found >= 4 ? 1 - peaks[3] / peaks[1] : Double.NaN;
            reporter.publishEntry("period error, decay per period, " + sim.implicitStatistics(),
                    (measured / period - 1) + ", " + decay);
            assertEquals(period, measured, tolerance * period, "period of the first axial mode");
        }
    }
}

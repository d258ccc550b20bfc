package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.Integration;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import dev.fray.damage.Plastic;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;

/** The implicit integrator in whole scenes: stability at large steps, determinism, and what it refuses. */
class ImplicitIntegrationTest extends FrayTestBase {
    private static final String[] CHANNELS = {ParticleStore.POSITION, ParticleStore.VELOCITY, ParticleStore.AFFINE,
        ParticleStore.DEFORMATION};

    /**
     * A stone-like bar (E = 20 GPa, rho = 2000 kg/m^3, values from memory) at dx = 5 mm dropped on a floor, at
     * dt = 1e-4 s, more than 100 times the explicit limit: total energy never exceeds the initial energy plus the
     * work of the boundaries.
     */
    @Test
    void stiffBarIsStableAtAHundredTimesTheExplicitStep(TestReporter reporter) {
        // common practice, no source: backward Euler is unconditionally stable and dissipative, so the energy of
        // a closed system cannot grow (Newtonian mechanics: energy balance, VALIDATION.md E25)
        double dx = 0.005, e = 20e9, nu = 0.25, rho = 2000;
        Scene scene = Scene.builder()
                .domain(0, 0, 0, 0.2, 0.1, 0.05).cellSize(dx).gravity(0, -9.81, 0)
                .walls(Contact.separating(0.3)).threads(2)
                .integration(Integration.IMPLICIT).fixedTimeStep(1e-4)
                .add(Body.named("bar").shape(Shapes.box(0.05, 0.01, 0.015, 0.15, 0.03, 0.035))
                        .material(Elastic.fixedCorotated(e, nu, rho)).velocity(0, -0.5, 0).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            double explicitStep = Scene.DEFAULT_CFL * dx / sim.maxWaveSpeed();
            assertTrue(1e-4 > 100 * explicitStep, "explicit step " + explicitStep + " s");
            double e0 = sim.diagnostics().totalEnergy();
            double worst = Double.NEGATIVE_INFINITY;
            for (int i = 0; i < 200; i++) {
                sim.step();
                Diagnostics d = sim.diagnostics();
                worst = Math.max(worst, (d.totalEnergy() - e0 - d.boundaryWork()) / Math.abs(e0));
            }
            reporter.publishEntry("largest (E - E0 - W) / E0, " + sim.implicitStatistics(), Double.toString(worst));
            assertTrue(worst <= 1e-9, "energy rose above initial plus boundary work by " + worst + " of E0");
            assertEquals(0, sim.implicitStatistics().unconverged(), "steps that did not converge");
        }
    }

    private static Scene determinismScene(int threads) {
        return DeterminismTest.scene(threads, -1).toBuilder()
                .integration(Integration.IMPLICIT).maxTimeStep(2e-3)
                .add(Body.named("brittle").shape(Shapes.box(0.1, 0.1, 0.3, 0.3, 0.2, 0.7))
                        .material(Elastic.neoHookean(1e6, 0.3, 1000)).velocity(0.5, 0, 0)
                        .damage(Fracture.phaseFieldAT1().strength(2e3, 1e6).build())
                        .build())
                .build();
    }

    @Test
    void resultsAreBitwiseIdenticalForOneTwoAndFourThreads() {
        // common practice, no source: DESIGN.md section 3, same bits for any thread count
        double[][] reference = run(determinismScene(1), 25);
        for (int threads : new int[] {2, 4}) {
            double[][] got = run(determinismScene(threads), 25);
            for (int c = 0; c < CHANNELS.length; c++) {
                assertArrayEquals(reference[c], got[c], 0.0, CHANNELS[c] + " with " + threads + " threads");
            }
        }
    }

    private static double[][] run(Scene scene, int steps) {
        try (Simulation sim = new Simulation(scene)) {
            assertTrue(sim.implicit());
            for (int i = 0; i < steps; i++) {
                sim.step();
            }
            double[][] out = new double[CHANNELS.length + 1][];
            for (int c = 0; c < CHANNELS.length; c++) {
                out[c] = Probes.byId(sim.particles(), CHANNELS[c]);
            }
            return out;
        }
    }

    @Test
    void plasticLawsAndSeparationAreRefusedAtBuildTime() {
        // common practice, no source: an unsupported combination is an input error naming what to use instead
        Scene.Builder plastic = Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(0.1)
                .integration(Integration.IMPLICIT)
                .add(Body.named("metal").shape(Shapes.box(0.2, 0.2, 0.2, 0.6, 0.6, 0.6))
                        .material(Plastic.vonMises(2e8, 0.3, 7800, 2e5, 0)).build());
        InvalidInputException e = assertThrows(InvalidInputException.class, plastic::build);
        assertEquals(FrayMessage.IMPLICIT_UNSUPPORTED, e.key());
        assertTrue(e.getMessage().contains("explicit"), e.getMessage());
        Scene.Builder split = Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(0.1)
                .integration(Integration.IMPLICIT).separation(0.5, 0.2)
                .add(Body.named("gel").shape(Shapes.box(0.2, 0.2, 0.2, 0.6, 0.6, 0.6))
                        .material(Elastic.neoHookean(1e5, 0.3, 1000)).build());
        assertEquals(FrayMessage.IMPLICIT_UNSUPPORTED, assertThrows(InvalidInputException.class, split::build).key());
    }

    @Test
    void autoChoosesImplicitForStiffAndExplicitForSoftOrPlastic() {
        // common practice, no source: the implicit step pays off when the elastic limit is far below the motion one
        assertTrue(autoImplicit(Elastic.fixedCorotated(20e9, 0.25, 2000)));
        assertFalse(autoImplicit(Elastic.neoHookean(1e3, 0.3, 1000)));
        assertFalse(autoImplicit(Plastic.vonMises(2e11, 0.3, 7800, 2e8, 0)));
    }

    private static boolean autoImplicit(dev.fray.core.material.MaterialLaw law) {
        Scene scene = Scene.builder().domain(0, 0, 0, 0.1, 0.1, 0.1).cellSize(0.02)
                .integration(Integration.AUTO)
                .add(Body.named("b").shape(Shapes.box(0.02, 0.02, 0.02, 0.06, 0.06, 0.06)).material(law).build())
                .build();
        try (Simulation sim = new Simulation(scene)) {
            return sim.implicit();
        }
    }
}

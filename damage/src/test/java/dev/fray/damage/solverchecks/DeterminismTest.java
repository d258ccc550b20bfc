package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.SimulationState;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;

/**
 * Same scene, same bits: thread count must not change any result (DESIGN.md section 3), and two simulations in
 * one JVM must not interfere. Common practice, no source.
 */
class DeterminismTest extends FrayTestBase {
    private static final String[] CHANNELS = {ParticleStore.POSITION, ParticleStore.VELOCITY, ParticleStore.AFFINE,
        ParticleStore.DEFORMATION};

    /** Two bodies, a moving obstacle, a grip and friction walls: every branch of the step. */
    static Scene scene(int threads, double vy) {
        return Scene.builder()
                .domain(0, 0, 0, 1, 1, 1).cellSize(1.0 / 32).threads(threads).walls(Contact.separating(0.4))
                .add(Body.named("soft").shape(Shapes.sphere(0.35, 0.6, 0.5, 0.12))
                        .material(Elastic.neoHookean(5e4, 0.4, 900)).jitter(0.3).seed(11).velocity(0.4, vy, 0)
                        .build())
                .add(Body.named("stiff").shape(Shapes.box(0.55, 0.2, 0.35, 0.8, 0.45, 0.65))
                        .material(Elastic.fixedCorotated(2e5, 0.3, 1100)).jitter(0.3).seed(12)
                        .angularVelocity(0, 3, 0).build())
                .add(new Obstacle("paddle", Shapes.cylinder(0.5, 0.85, 0.5, 0, 0, 1, 0.05, 0.3),
                        Contact.sticky(), Motion.linear(0, -0.5, 0).withRotation(0, 0, 2, 0.5, 0.85, 0.5)))
                .add(new Grip("hold", "stiff", Shapes.box(0.75, 0.2, 0.35, 0.8, 0.45, 0.65),
                        Motion.linear(0.05, 0, 0)))
                .build();
    }

    private static double[][] run(Simulation sim, int steps) {
        for (int i = 0; i < steps; i++) {
            sim.step();
        }
        double[][] out = new double[CHANNELS.length][];
        for (int c = 0; c < CHANNELS.length; c++) {
            out[c] = Probes.byId(sim.particles(), CHANNELS[c]);
        }
        return out;
    }

    @Test
    void resultsAreBitwiseIdenticalForOneTwoAndFourThreads() {
        double[][] reference;
        try (Simulation one = new Simulation(scene(1, -1))) {
            reference = run(one, 150);
        }
        for (int threads : new int[] {2, 4}) {
            try (Simulation sim = new Simulation(scene(threads, -1))) {
                double[][] got = run(sim, 150);
                for (int c = 0; c < CHANNELS.length; c++) {
                    assertArrayEquals(reference[c], got[c], 0.0, CHANNELS[c] + " with " + threads + " threads");
                }
            }
        }
    }

    @Test
    void interleavedSimulationsEqualTheSameRunAlone() {
        double[][] aloneA;
        double[][] aloneB;
        try (Simulation a = new Simulation(scene(2, -1))) {
            aloneA = run(a, 80);
        }
        try (Simulation b = new Simulation(scene(2, 0.5))) {
            aloneB = run(b, 80);
        }
        try (Simulation a = new Simulation(scene(2, -1)); Simulation b = new Simulation(scene(2, 0.5))) {
            for (int i = 0; i < 80; i++) {
                a.step();
                b.step();
            }
            for (int c = 0; c < CHANNELS.length; c++) {
                assertArrayEquals(aloneA[c], Probes.byId(a.particles(), CHANNELS[c]), 0.0, CHANNELS[c] + " of A");
                assertArrayEquals(aloneB[c], Probes.byId(b.particles(), CHANNELS[c]), 0.0, CHANNELS[c] + " of B");
            }
        }
    }

    @Test
    void resumingFromACapturedStateIsBitwiseIdenticalToARunThatNeverStopped() {
        double[][] straight;
        try (Simulation sim = new Simulation(scene(2, -1))) {
            straight = run(sim, 120);
        }
        SimulationState half;
        try (Simulation sim = new Simulation(scene(2, -1))) {
            run(sim, 60);
            half = sim.captureState();
        }
        try (Simulation resumed = new Simulation(scene(1, -1))) {
            resumed.restoreState(half);
            double[][] got = run(resumed, 60);
            for (int c = 0; c < CHANNELS.length; c++) {
                assertArrayEquals(straight[c], got[c], 0.0, CHANNELS[c] + " after resuming");
            }
        }
    }
}

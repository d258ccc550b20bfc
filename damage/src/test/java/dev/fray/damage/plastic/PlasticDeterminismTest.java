package dev.fray.damage.plastic;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Fracture;
import dev.fray.damage.Plastic;
import org.junit.jupiter.api.Test;

/**
 * Same scene, same bits, with plasticity and damage together: a von Mises strip with Rankine damage torn by grips,
 * Drucker-Prager sand falling on it, and a Cam-Clay block with phase-field damage pressed by a moving obstacle, with
 * separation on. The results must not depend on the thread count (DESIGN.md section 3). Common practice, no
 * source.
 */
class PlasticDeterminismTest extends FrayTestBase {
    private static final String[] CHANNELS = {ParticleStore.POSITION, ParticleStore.VELOCITY,
        ParticleStore.DEFORMATION, HenckyPlasticLaw.PLASTIC_STRAIN, HenckyPlasticLaw.PLASTIC_VOLUME,
        DamageModel.DAMAGE};

    static Scene scene(int threads) {
        return Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(1.0 / 32).threads(threads).gravity(0, -9.81, 0)
                .walls(Contact.separating(0.4)).separation(0.5, 0.2)
                .add(Body.named("metal").shape(Shapes.box(0.1, 0.05, 0.3, 0.6, 0.12, 0.7))
                        .material(Plastic.vonMises(1e5, 0.33, 2700, 2e3, 1e4))
                        .damage(Fracture.rankine().criticalStress(2.2e3).softeningStress(500).build())
                        .jitter(0.3).seed(41).build())
                .add(Body.named("sand").shape(Shapes.box(0.25, 0.2, 0.4, 0.45, 0.4, 0.6))
                        .material(Plastic.druckerPrager(5e4, 0.3, 1600, 30, 0)).jitter(0.3).seed(42).build())
                .add(Body.named("clay").shape(Shapes.box(0.7, 0.02, 0.35, 0.9, 0.2, 0.65))
                        .material(Plastic.camClay(5e4, 0.3, 1800, 25, 3e3, 0.3, 2))
                        .damage(Fracture.phaseField().fractureEnergy(2).build()).jitter(0.3).seed(43).build())
                .add(new Grip("pull", "metal", Shapes.box(0, 0, 0, 0.16, 1, 1), Motion.linear(-0.3, 0, 0)))
                .add(new Obstacle("press", Shapes.sphere(0.8, 0.3, 0.5, 0.06), Contact.separating(0.2),
                        Motion.linear(0, -0.6, 0)))
                .build();
    }

    private static double[][] run(int threads, int steps) {
        try (Simulation sim = new Simulation(scene(threads))) {
            for (int i = 0; i < steps; i++) {
                sim.step();
            }
            double[][] out = new double[CHANNELS.length][];
            for (int c = 0; c < CHANNELS.length; c++) {
                out[c] = new double[sim.particles().size() * sim.particles().spec(CHANNELS[c]).width()];
                sim.particles().copyById(CHANNELS[c], out[c], 0);
            }
            return out;
        }
    }

    @Test
    void oneAndTwoThreadsGiveTheSameBits() {
        double[][] one = run(1, 120);
        double[][] two = run(2, 120);
        for (int c = 0; c < CHANNELS.length; c++) {
            assertArrayEquals(one[c], two[c], 0.0, CHANNELS[c]);
        }
        // the run exercised what it claims to: plastic flow, plastic volume change and damage all happened
        assertTrue(java.util.Arrays.stream(one[3]).max().orElse(0) > 0.01, "plastic strain");
        assertTrue(java.util.Arrays.stream(one[4]).map(Math::abs).max().orElse(0) > 1e-4, "plastic volume");
        assertTrue(java.util.Arrays.stream(one[5]).max().orElse(0) > 0.5, "damage");
    }
}

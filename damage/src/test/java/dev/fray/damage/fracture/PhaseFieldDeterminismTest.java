package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import dev.fray.damage.Fracture;
import dev.fray.damage.fiber.FiberChannels;
import dev.fray.damage.fiber.FiberFields;
import org.junit.jupiter.api.Test;

/**
 * Same scene, same bits, with phase-field damage that really cracks: two notched slabs (Neo-Hookean with
 * isotropic AT2, and fiber-reinforced with the anisotropic model, its stress-based driving force and fibers at 30
 * degrees to the pull) pulled apart by grips, run with 1, 2
 * and 4 threads, must give bitwise identical positions, damage and history (DESIGN.md section 3; common
 * practice, no source).
 */
class PhaseFieldDeterminismTest extends FrayTestBase {
    private static final int STEPS = 200;
    private static final String[] CHANNELS = {ParticleStore.POSITION, DamageModel.DAMAGE, PhaseFieldAT2.HISTORY};

    private static Body slab(String name, double y0, DamageModel model, boolean fibers) {
        MaterialLaw matrix = Elastic.neoHookean(1e5, 0.3, 1000);
        MaterialLaw law = fibers ? Fibers.reinforce(matrix).quadratic(2e5).build() : matrix;
        Body.Builder b = Body.named(name).shape(Shapes.box(0.35, y0, 0.47, 0.65, y0 + 0.1, 0.53))
                .material(law).jitter(0.3).seed(5).damage(model)
                // A pre-damaged notch from one side, half way along, so the crack has a place to start.
                .initialChannel(DamageModel.DAMAGE,
                        (x, y, z, out) -> out[0] = Math.abs(x - 0.5) < 0.02 && y < y0 + 0.035 ? 0.9 : 0.0);
        if (fibers) {
            double angle = Math.toRadians(30);
            b.initialChannel(FiberChannels.reference(1), FiberFields.uniform(Math.cos(angle), Math.sin(angle), 0));
        }
        return b.build();
    }

    private static Scene scene(int threads) {
        DamageModel isotropic = Fracture.phaseField().fractureEnergy(5).build();
        DamageModel fibrous = Fracture.anisotropicPhaseField().fractureEnergy(5).fiberStrengths(10)
                .stressDriving(1e4, 3e3).stressDrivingSlope(10).build();
        Scene.Builder s = Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(1.0 / 32).gravity(0, 0, 0)
                .threads(threads).add(slab("isotropic", 0.25, isotropic, false))
                .add(slab("fibrous", 0.6, fibrous, true));
        for (String body : new String[] {"isotropic", "fibrous"}) {
            double y0 = body.equals("isotropic") ? 0.25 : 0.6;
            s.add(new Grip(body + "-left", body, Shapes.box(0.34, y0 - 0.01, 0.46, 0.39, y0 + 0.11, 0.54),
                    Motion.linear(-0.15, 0, 0)));
            s.add(new Grip(body + "-right", body, Shapes.box(0.61, y0 - 0.01, 0.46, 0.66, y0 + 0.11, 0.54),
                    Motion.linear(0.15, 0, 0)));
        }
        return s.build();
    }

    private static double[][] run(int threads) {
        try (Simulation sim = new Simulation(scene(threads))) {
            for (int i = 0; i < STEPS; i++) {
                sim.step();
            }
            ParticleView v = sim.particles();
            double[][] out = new double[CHANNELS.length + 1][];
            for (int c = 0; c < CHANNELS.length; c++) {
                out[c] = new double[v.size() * v.spec(CHANNELS[c]).width()];
                v.copyById(CHANNELS[c], out[c], 0);
            }
            out[CHANNELS.length] = new double[v.size()];
            for (int p = 0; p < v.size(); p++) {
                out[CHANNELS.length][v.id(p)] = v.body(p);
            }
            return out;
        }
    }

    @Test
    void crackingRunsAreBitwiseIdenticalForOneTwoAndFourThreads() {
        double[][] reference = run(1);
        double[] damage = reference[1];
        double[] body = reference[CHANNELS.length];
        for (int b = 0; b < 2; b++) {
            int broken = 0;
            for (int p = 0; p < damage.length; p++) {
                if (body[p] == b && damage[p] > 0.95) {
                    broken++;
                }
            }
            // The run must exercise the phase-field solve through fracture, not just elastic loading.
            assertTrue(broken > 20, "body " + b + " cracks: " + broken + " particles with d > 0.95");
        }
        for (int threads : new int[] {2, 4}) {
            double[][] got = run(threads);
            for (int c = 0; c < CHANNELS.length; c++) {
                assertArrayEquals(reference[c], got[c], 0.0, CHANNELS[c] + " with " + threads + " threads");
            }
        }
    }
}

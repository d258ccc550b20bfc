package dev.fray.examples.scenes;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Simulation;
import org.junit.jupiter.api.Test;

/**
 * The board-split demo does what its description says: the wedge splits the board along its grain, as wood
 * splits (a fact of the trade: wood splits along its grain far more easily than across it; common practice, no
 * source). Over the first three quarters of its frames the split must run on from the check's tip toward the
 * clamp, on the mid-plane, as a crack: the wood more than four cells off the mid-plane stays below half damage.
 */
class BoardSplitTest {
    /** Where the demo's check ends, m (the check is 0.25 m long from the board's end at x = 0.85 m). */
    private static final double CHECK_TIP = 0.60;
    private static final double MID = 0.5;

    @Test
    void theWedgeSplitsTheBoardAlongTheGrainPastTheCheck() {
        double cell = FractureDemos.CELL;
        try (Simulation sim = new Simulation(DemoScenes.build("board-split", 2))) {
            int n = sim.particles().size();
            double[] x0 = new double[3 * n];
            double[] x = new double[3 * n];
            double[] d = new double[n];
            sim.particles().copyById(ParticleStore.POSITION, x0, 0);
            sim.runFrames(3 * DemoScenes.DEFAULT_FRAMES / 4);
            sim.particles().copyById(ParticleStore.POSITION, x, 0);
            sim.particles().copyById(DamageModel.DAMAGE, d, 0);
            double front = CHECK_TIP;
            int offPlane = 0;
            double upper = 0, lower = 0;
            int nu = 0, nl = 0;
            for (int p = 0; p < n; p++) {
                double off = x0[3 * p + 1] - MID;
                if (d[p] > 0.9 && Math.abs(off) < cell) {
                    front = Math.min(front, x0[3 * p]);
                }
                if (d[p] > 0.5 && Math.abs(off) > 4 * cell) {
                    offPlane++;
                }
                // Opening of the split 5 cm past the check's tip: the halves' mean sideways movement.
                boolean nearPlane = Math.abs(off) > cell && Math.abs(off) < 3 * cell;
                if (Math.abs(x0[3 * p] - (CHECK_TIP - 0.05)) < 0.025 && nearPlane) {
                    if (off > 0) {
                        upper += x[3 * p + 1] - x0[3 * p + 1];
                        nu++;
                    } else {
                        lower += x[3 * p + 1] - x0[3 * p + 1];
                        nl++;
                    }
                }
            }
            double opening = upper / nu - lower / nl;
            System.out.printf("board-split at t = %.3f s: split front at x = %.3f m, opening 5 cm past the check"
                    + " %.1f mm, %d particles off the mid-plane above half damage%n", sim.time(), front,
                    1e3 * opening, offPlane);
            assertTrue(front < CHECK_TIP - 0.1, "the split ran only to x = " + front + " m");
            assertTrue(opening > 0.01, "the halves opened by only " + opening + " m past the check");
            assertTrue(offPlane == 0, offPlane + " particles off the mid-plane are broken: a zone, not a crack");
        }
    }
}

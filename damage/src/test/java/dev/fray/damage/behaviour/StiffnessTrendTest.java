package dev.fray.damage.behaviour;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION C17: at fixed fracture energy a stiffer material needs a larger stress to break, and after breaking
 * its pieces ring at a higher frequency. Edge-notched strips (Neo-Hookean, nu = 0.3, rho = 1000 kg/m^3; AT2 phase
 * field, Gc = {@value #GC} J/m^2, l = two cells) with Young's moduli {@link #MODULI} are pulled apart along y.
 * The grips move at {@value #PULL} m/s in every run.
 *
 * <p>Break stress: the peak over time of the gauge's volume-averaged sigma_yy. Ringing: once the crack has crossed,
 * the upper piece (held by the top grip, free at the crack) swings about the grip's motion; its frequency is
 * 1 / (2 h) with h the mean time between successive turning points of the piece's mean velocity.
 */
class StiffnessTrendTest extends FrayTestBase {
    /** Young's moduli compared, Pa. */
    static final double[] MODULI = {2.5e4, 1e5, 4e5};
    /** Fracture energy of every run, J/m^2. */
    static final double GC = 5;
    /** Grip speed, m/s. */
    private static final double PULL = 0.1;
    /** Turning points of the ringing signal used for the frequency. */
    private static final int TURNS = 3;
    /** A turning point is the largest or smallest value within this many steps on either side. */
    private static final int WINDOW = 12;
    private static final int MAX_STEPS = 450;
    /** Allowed relative spread of the scaling ratios about sqrt(E2 / E1). */
    private static final double SCALING_TOLERANCE = 0.2;

    /** @return {break stress in Pa, ringing frequency in Hz} for Young's modulus e (Pa) */
    static double[] breakStressAndRinging(double e) {
        DamageModel model = Fracture.phaseField().fractureEnergy(GC).build();
        Strip strip = new Strip(Elastic.neoHookean(e, 0.3, 1000), model).notch(6).pull(PULL);
        double cut = strip.left() + 0.95 * strip.widthMetres();
        try (Simulation sim = new Simulation(strip.scene())) {
            double peak = 0;
            int cutStep = -1;
            double[] t = new double[MAX_STEPS + 1];
            double[] u = new double[MAX_STEPS + 1];
            int n = 0;
            double[] turns = new double[TURNS];
            int found = 0;
            while (sim.stepCount() < MAX_STEPS && found < TURNS) {
                sim.step();
                if (cutStep < 0) {
                    peak = Math.max(peak, strip.meanStressYY(sim, model, 0));
                    if (strip.front(sim.particles()) >= cut) {
                        cutStep = (int) sim.stepCount();
                    }
                    continue;
                }
                t[n] = sim.time();
                u[n] = strip.upperPieceVelocity(sim.particles());
                n++;
                // The sample WINDOW steps back is a turning point if it is the extreme of its neighbourhood.
                int c = n - 1 - WINDOW;
                if (c >= WINDOW && isExtreme(u, c, WINDOW)) {
                    turns[found++] = t[c];
                }
            }
            if (found < TURNS) {
                throw new AssertionError("E = " + e + " Pa: " + (cutStep < 0 ? "no cut" : found + " turning points")
                        + " after " + MAX_STEPS + " steps");
            }
            double halfPeriod = (turns[TURNS - 1] - turns[0]) / (TURNS - 1);
            return new double[] {peak, 1 / (2 * halfPeriod)};
        }
    }

    private static boolean isExtreme(double[] u, int c, int w) {
        boolean max = true;
        boolean min = true;
        for (int k = c - w; k <= c + w; k++) {
            max &= u[k] <= u[c];
            min &= u[k] >= u[c];
        }
        return max || min;
    }

    @Test
    void stifferBreaksAtHigherStressAndRingsFaster() {
        double[][] r = new double[MODULI.length][];
        StringBuilder all = new StringBuilder();
        for (int i = 0; i < MODULI.length; i++) {
            r[i] = breakStressAndRinging(MODULI[i]);
            all.append(String.format("E = %.3g Pa: break %.0f Pa, ringing %.2f Hz; ", MODULI[i], r[i][0], r[i][1]));
        }
        for (int i = 1; i < MODULI.length; i++) {
            // Common practice, no source (VALIDATION.md C17): both rise with stiffness.
            assertTrue(r[i][0] > r[i - 1][0], "break stress: " + all);
            assertTrue(r[i][1] > r[i - 1][1], "ringing frequency: " + all);
            // Value from memory: the AT2 strength is sigma_c = (9/16) sqrt(E Gc / (3 l)), so at fixed Gc and l it
            // grows as sqrt(E); a piece's ringing frequency goes as its wave speed sqrt(E / rho).
            double expected = Math.sqrt(MODULI[i] / MODULI[i - 1]);
            double tolerance = SCALING_TOLERANCE * expected;
            assertEquals(expected, r[i][0] / r[i - 1][0], tolerance, "break stress ratio: " + all);
            assertEquals(expected, r[i][1] / r[i - 1][1], tolerance, "frequency ratio: " + all);
        }
    }
}

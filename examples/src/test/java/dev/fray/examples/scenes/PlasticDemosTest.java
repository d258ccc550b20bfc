package dev.fray.examples.scenes;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Simulation;
import java.util.Arrays;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;

/**
 * The plastic demos run end to end and do what their descriptions say (trends only, common practice, no source):
 * the sand comes to rest as a heap far wider and lower than its column, the metal strip tears across at its notch
 * and nowhere else, and the clay block ends in two pieces on either side of the wire's path.
 */
@Tag("slow")
class PlasticDemosTest {
    private static final double MID = 0.5;
    /** Half-width of the band about the notch's plane where the metal strip may tear, m. */
    private static final double TEAR_ZONE = 0.0625;

    /** @return the positions after running the demo through all its default frames */
    private static double[] run(String demo) {
        try (Simulation sim = new Simulation(DemoScenes.build(demo, 2))) {
            double[] x = new double[3 * sim.particles().size()];
            sim.runFrames(DemoScenes.DEFAULT_FRAMES);
            sim.particles().copyById(ParticleStore.POSITION, x, 0);
            return x;
        }
    }

    /** @return {lower end, upper end} of the widest empty interval in x among the particles */
    private static double[] widestGapInX(double[] x) {
        double[] xs = new double[x.length / 3];
        for (int p = 0; p < xs.length; p++) {
            xs[p] = x[3 * p];
        }
        Arrays.sort(xs);
        double[] gap = {0, 0};
        for (int p = 1; p < xs.length; p++) {
            if (xs[p] - xs[p - 1] > gap[1] - gap[0]) {
                gap[0] = xs[p - 1];
                gap[1] = xs[p];
            }
        }
        return gap;
    }

    @Test
    void sandSpreadsIntoALowHeap(TestReporter reporter) {
        double[] x = run("sand-collapse");
        double top = 0, reach = 0;
        for (int p = 0; p < x.length / 3; p++) {
            top = Math.max(top, x[3 * p + 1]);
            reach = Math.max(reach, Math.hypot(x[3 * p] - MID, x[3 * p + 2] - MID));
        }
        reporter.publishEntry("heap height, reach from the axis (m)", top + ", " + reach);
        // the column was 0.32 m tall and reached 0.14 m from its axis (its corners)
        assertTrue(top < 0.16 && reach > 0.3, "height " + top + ", reach " + reach);
    }

    /**
     * Broken particles (damage above 0.9) that started within {@value #TEAR_ZONE} m (three cells) of the notch's
     * plane cross the whole width of the strip: in each of twelve bands across the width at least one such
     * particle. Elsewhere the strip has no broken particle: it tore from the notch (on a path that wanders, as a
     * ductile tear does), not at the grips.
     */
    @Test
    void metalStripTearsAcrossAtTheNotch(TestReporter reporter) {
        double z0 = 0.38, z1 = 0.62;
        int bands = 12;
        try (Simulation sim = new Simulation(DemoScenes.build("metal-tear", 2))) {
            int n = sim.particles().size();
            double[] x0 = new double[3 * n];
            double[] d = new double[n];
            sim.particles().copyById(ParticleStore.POSITION, x0, 0);
            sim.runFrames(DemoScenes.DEFAULT_FRAMES);
            sim.particles().copyById(DamageModel.DAMAGE, d, 0);
            boolean[] crossed = new boolean[bands];
            int away = 0;
            double far = 0;
            for (int p = 0; p < n; p++) {
                if (d[p] > 0.9) {
                    if (Math.abs(x0[3 * p] - MID) < TEAR_ZONE) {
                        int k = (int) ((x0[3 * p + 2] - z0) / (z1 - z0) * bands);
                        crossed[Math.max(0, Math.min(bands - 1, k))] = true;
                    } else {
                        away++;
                        far = Math.max(far, Math.abs(x0[3 * p] - MID));
                    }
                }
            }
            int bandsCrossed = 0;
            for (boolean c : crossed) {
                bandsCrossed += c ? 1 : 0;
            }
            reporter.publishEntry("bands of the width torn, broken particles away from the notch",
                    bandsCrossed + " of " + bands + ", " + away);
            assertTrue(bandsCrossed == bands, "the tear crosses " + bandsCrossed + " of " + bands + " bands");
            assertTrue(away == 0, away + " broken particles away from the notch, up to " + far);
        }
    }

    @Test
    void clayIsCutInTwoAlongTheWiresPath(TestReporter reporter) {
        double[] x = run("clay-cut");
        double[] gap = widestGapInX(x);
        double top = 0;
        for (int p = 0; p < x.length / 3; p++) {
            top = Math.max(top, x[3 * p + 1]);
        }
        reporter.publishEntry("cut (m), block height (m)", gap[0] + " to " + gap[1] + ", " + top);
        assertTrue(gap[1] - gap[0] > PlasticDemos.CELL / 2, "a kerf runs through: " + Arrays.toString(gap));
        assertTrue(Math.abs(0.5 * (gap[0] + gap[1]) - MID) < 0.02, "along the wire: " + Arrays.toString(gap));
        assertTrue(top > 0.15, "the halves stand (the block was 0.2 m tall): " + top);
    }
}

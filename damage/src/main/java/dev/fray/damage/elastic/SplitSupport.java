package dev.fray.damage.elastic;

import dev.fray.core.material.TensionSplit;

import java.util.Arrays;

/** Helpers shared by the tension-compression splits of the elastic laws. Stateless. */
final class SplitSupport {
    private SplitSupport() {
    }

    /**
     * Whether a law that implements both the volumetric-deviatoric and the spectral split accepts the split.
     *
     * @param split the split (input)
     * @return true for each of the four splits, false for null
     */
    static boolean offersEvery(TensionSplit split) {
        return split == TensionSplit.LAW_DEFAULT || split == TensionSplit.VOLUMETRIC_DEVIATORIC
                || split == TensionSplit.SPECTRAL || split == TensionSplit.NONE;
    }

    /**
     * Marks one particle's split outputs as NaN, so the solver's NaN guard reports a failed decomposition.
     *
     * @param tauDegraded (output) degradable stress, 9 values overwritten at o
     * @param tauKept     (output) kept stress, 9 values overwritten at o
     * @param psiDegraded (output) degradable energy, overwritten at i
     * @param psiKept     (output) kept energy, overwritten at i
     * @param o           offset of the particle's stresses, 9 (p - from)
     * @param i           offset of the particle's energies, p - from
     */
    static void invalid(double[] tauDegraded, double[] tauKept, double[] psiDegraded, double[] psiKept, int o,
                        int i) {
        Arrays.fill(tauDegraded, o, o + 9, Double.NaN);
        Arrays.fill(tauKept, o, o + 9, Double.NaN);
        psiDegraded[i] = Double.NaN;
        psiKept[i] = Double.NaN;
    }
}

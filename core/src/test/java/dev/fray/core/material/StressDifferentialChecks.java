package dev.fray.core.material;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;

/**
 * Measurements behind the stress-differential checks of {@link MaterialLawContract}: the law's dP/dF against central
 * differences of its stress (undamaged, and degraded as P = g P_degraded + P_kept), and the smallest eigenvalue of
 * its positive semi-definite projection (EJML's symmetric eigen-decomposition as the reference).
 */
final class StressDifferentialChecks {
    private StressDifferentialChecks() {
    }

    /**
     * Relative error ||A - A_fd||_F / max(||A_fd||_F, floor) of the law's differential of the (possibly degraded)
     * stress against central differences of that stress.
     *
     * @param state       a one-particle state holding F (its deformation array is perturbed in place and restored)
     * @param split       split, or null for the undamaged law
     * @param degradation g (ignored when split is null)
     * @param step        central-difference step, absolute
     * @param floor       smallest differential norm used in the relative error, Pa
     * @return the relative error
     */
    static double differenceError(MaterialLaw law, ArrayMaterialState state, TensionSplit split, double degradation,
                                  double step, double floor) {
        double[] f = state.deformation();
        double[] analytic = new double[MaterialLaw.DIFFERENTIAL_SIZE];
        law.stressDifferential(state, 0, 1, split, split == null ? null : new double[] {degradation}, false,
                analytic);
        double[] numeric = new double[81];
        for (int k = 0; k < 9; k++) {
            double keep = f[k];
            f[k] = keep + step;
            double up = f[k];
            double[] pUp = stress(law, state, split, degradation);
            f[k] = keep - step;
            double down = f[k];
            double[] pDown = stress(law, state, split, degradation);
            f[k] = keep;
            for (int r = 0; r < 9; r++) {
                numeric[9 * r + k] = (pUp[r] - pDown[r]) / (up - down);
            }
        }
        double d = 0, n = 0;
        for (int i = 0; i < 81; i++) {
            d += (analytic[i] - numeric[i]) * (analytic[i] - numeric[i]);
            n += numeric[i] * numeric[i];
        }
        return Math.sqrt(d) / Math.max(Math.sqrt(n), floor);
    }

    /** P = (g tau_degraded + tau_kept) F^-T, or the law's P when split is null. */
    private static double[] stress(MaterialLaw law, ArrayMaterialState state, TensionSplit split, double g) {
        double[] p = new double[9];
        if (split == null) {
            law.firstPiolaKirchhoff(state, 0, 1, p);
            return p;
        }
        double[] tauD = new double[9], tauK = new double[9];
        law.splitKirchhoffStress(split, state, 0, 1, tauD, tauK, new double[1], new double[1]);
        double[] f = state.deformation();
        double f00 = f[0], f01 = f[1], f02 = f[2], f10 = f[3], f11 = f[4], f12 = f[5], f20 = f[6], f21 = f[7],
                f22 = f[8];
        // F^-T = cof(F) / J
        double[] cof = {f11 * f22 - f12 * f21, f12 * f20 - f10 * f22, f10 * f21 - f11 * f20,
            f02 * f21 - f01 * f22, f00 * f22 - f02 * f20, f01 * f20 - f00 * f21,
            f01 * f12 - f02 * f11, f02 * f10 - f00 * f12, f00 * f11 - f01 * f10};
        double j = f00 * cof[0] + f01 * cof[1] + f02 * cof[2];
        for (int r = 0; r < 3; r++) {
            for (int c = 0; c < 3; c++) {
                double s = 0;
                for (int k = 0; k < 3; k++) {
                    s += (g * tauD[3 * r + k] + tauK[3 * r + k]) * cof[3 * k + c];
                }
                p[3 * r + c] = s / j;
            }
        }
        return p;
    }

    /**
     * @param a 81 values of a symmetric 9x9 matrix
     * @return its eigenvalues, by EJML
     */
    static double[] eigenvalues(double[] a) {
        DMatrixRMaj m = new DMatrixRMaj(9, 9, true, a);
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(9, false, true);
        if (!eig.decompose(m)) {
            throw new IllegalStateException("EJML eigen-decomposition failed");
        }
        double[] out = new double[9];
        for (int i = 0; i < 9; i++) {
            out[i] = eig.getEigenvalue(i).getReal();
        }
        return out;
    }
}

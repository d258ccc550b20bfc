package dev.fray.core.material;

import dev.fray.core.particles.ChannelSpec;

import java.util.List;

/**
 * A constitutive law: from the deformation gradient F (and the law's own channels) to energy and stress.
 * One instance is shared by all particles of a body and by all worker threads, so implementations are immutable;
 * per-particle state lives in the channels the law declares. Methods work on a particle range {@code [from, to)}
 * and write into arrays the caller provides, so there is one virtual call per batch, not per particle.
 *
 * <p>Output layout: for particle p in the range, its 3x3 result is at {@code out[9(p-from) + 3r + c]} (row-major)
 * and its scalar result at {@code out[p-from]}. Stresses are in Pa, energy densities in J/m^3 of reference volume.
 */
public interface MaterialLaw {
    /** @return the law's registry name, e.g. "fixed-corotated" */
    String name();

    /** @return mass density in the reference configuration, kg/m^3 */
    double density();

    /**
     * @return the largest elastic wave speed of the undeformed material, m/s, used for the time-step bound
     *         (for isotropic laws the P-wave speed sqrt((lambda + 2 mu)/rho); include fiber stiffness)
     */
    double waveSpeed();

    /** @return the per-particle channels this law needs besides F; default none */
    default List<ChannelSpec> channels() {
        return List.of();
    }

    /**
     * Strain energy density psi(F) of each particle.
     *
     * @param state particle data (input, not modified)
     * @param from  first particle, inclusive
     * @param to    last particle, exclusive
     * @param out   (output) psi in J/m^3, one per particle, at out[p - from]
     */
    void energyDensity(MaterialState state, int from, int to, double[] out);

    /**
     * First Piola-Kirchhoff stress P = dpsi/dF of each particle.
     *
     * @param state particle data (input, not modified)
     * @param from  first particle, inclusive
     * @param to    last particle, exclusive
     * @param out   (output) P in Pa, 9 per particle, row-major, at out[9(p - from)]
     */
    void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out);

    /**
     * Kirchhoff stress tau = P F^T of each particle, the quantity the transfer needs. The default computes P and
     * multiplies; laws override it when tau has a cheaper closed form.
     *
     * @param state particle data (input, not modified)
     * @param from  first particle, inclusive
     * @param to    last particle, exclusive
     * @param out   (output) tau in Pa, 9 per particle, row-major, at out[9(p - from)]
     */
    default void kirchhoffStress(MaterialState state, int from, int to, double[] out) {
        firstPiolaKirchhoff(state, from, to, out);
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int o = 9 * (p - from);
            int fo = 9 * p;
            double p00 = out[o], p01 = out[o + 1], p02 = out[o + 2];
            double p10 = out[o + 3], p11 = out[o + 4], p12 = out[o + 5];
            double p20 = out[o + 6], p21 = out[o + 7], p22 = out[o + 8];
            for (int r = 0; r < 3; r++) {
                double a0 = r == 0 ? p00 : r == 1 ? p10 : p20;
                double a1 = r == 0 ? p01 : r == 1 ? p11 : p21;
                double a2 = r == 0 ? p02 : r == 1 ? p12 : p22;
                for (int c = 0; c < 3; c++) {
                    // (P F^T)_rc = sum_k P_rk F_ck
                    out[o + 3 * r + c] = a0 * f[fo + 3 * c] + a1 * f[fo + 3 * c + 1] + a2 * f[fo + 3 * c + 2];
                }
            }
        }
    }

    /**
     * Splits the undamaged Kirchhoff stress into the part that damage degrades (tension, fiber stretch) and the
     * part it keeps (compression), with the energy densities of both; the degradable energy is the crack driving
     * force. The sums equal {@link #kirchhoffStress} and {@link #energyDensity}. The default treats everything as
     * degradable, so a damaged law without a split also loses its compressive stiffness; laws override it with a
     * tension-compression split (e.g. volumetric-deviatoric or spectral).
     *
     * @param state        particle data (input, not modified)
     * @param from         first particle, inclusive
     * @param to           last particle, exclusive
     * @param tauDegraded  (output) degradable Kirchhoff stress, Pa, 9 per particle at 9(p - from)
     * @param tauKept      (output) kept Kirchhoff stress, Pa, 9 per particle at 9(p - from)
     * @param psiDegraded  (output) degradable energy density, J/m^3, at p - from
     * @param psiKept      (output) kept energy density, J/m^3, at p - from
     */
    default void splitKirchhoffStress(MaterialState state, int from, int to, double[] tauDegraded, double[] tauKept,
                                      double[] psiDegraded, double[] psiKept) {
        kirchhoffStress(state, from, to, tauDegraded);
        energyDensity(state, from, to, psiDegraded);
        java.util.Arrays.fill(tauKept, 0, 9 * (to - from), 0.0);
        java.util.Arrays.fill(psiKept, 0, to - from, 0.0);
    }

    /**
     * {@link #splitKirchhoffStress(MaterialState, int, int, double[], double[], double[], double[])} with the split
     * chosen by the caller (the damage model). The default honours {@link TensionSplit#LAW_DEFAULT} and
     * {@link TensionSplit#NONE} and rejects the others; laws that offer more override it.
     *
     * @param split        the split to use
     * @param state        particle data (input, not modified)
     * @param from         first particle, inclusive
     * @param to           last particle, exclusive
     * @param tauDegraded  (output) degradable Kirchhoff stress, Pa, 9 per particle at 9(p - from)
     * @param tauKept      (output) kept Kirchhoff stress, Pa, 9 per particle at 9(p - from)
     * @param psiDegraded  (output) degradable energy density, J/m^3, at p - from
     * @param psiKept      (output) kept energy density, J/m^3, at p - from
     * @throws UnsupportedOperationException if the law does not offer the split (see {@link #supportsSplit})
     */
    default void splitKirchhoffStress(TensionSplit split, MaterialState state, int from, int to,
                                      double[] tauDegraded, double[] tauKept, double[] psiDegraded,
                                      double[] psiKept) {
        switch (split) {
            case LAW_DEFAULT -> splitKirchhoffStress(state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
            case NONE -> {
                kirchhoffStress(state, from, to, tauDegraded);
                energyDensity(state, from, to, psiDegraded);
                java.util.Arrays.fill(tauKept, 0, 9 * (to - from), 0.0);
                java.util.Arrays.fill(psiKept, 0, to - from, 0.0);
            }
            default -> throw new UnsupportedOperationException(name() + " does not offer the " + split + " split");
        }
    }

    /**
     * Whether {@link #splitKirchhoffStress(TensionSplit, MaterialState, int, int, double[], double[], double[],
     * double[])} accepts the split; scenes check this when they are built, so an unsupported choice is an input
     * error rather than a failure mid-run.
     *
     * @param split the split
     * @return true if the law implements it
     */
    default boolean supportsSplit(TensionSplit split) {
        return split == TensionSplit.LAW_DEFAULT || split == TensionSplit.NONE;
    }

    /** Values per particle written by {@link #stressDifferential}: dP/dF as a 9x9 matrix. */
    int DIFFERENTIAL_SIZE = 81;

    /**
     * Whether {@link #stressDifferential} is implemented. Tells the truth: the implicit integrator needs it, and a
     * scene that asks for implicit integration with a law that answers false is refused when it is built.
     *
     * @return true if the law provides its stress differential; false by default
     */
    default boolean hasStressDifferential() {
        return false;
    }

    /**
     * The stress differential A = dP/dF of each particle, the linear map dP = A : dF that the implicit integrator
     * uses for its Hessian-vector products. With damage the stress is P = g P_degraded + P_kept (the parts of the
     * split the damage model chose, g its degradation held fixed) and A is its derivative at fixed g.
     *
     * <p>Layout: for particle p, {@code out[81(p - from) + 9 (3a + b) + 3c + d] = dP_ab / dF_cd} (dimensionless
     * index pairs row-major, values in Pa). A is symmetric (it is the Hessian of the energy density).
     *
     * @param state       particle data (input, not modified)
     * @param from        first particle, inclusive
     * @param to          last particle, exclusive
     * @param split       the split damage degrades, or null for the undamaged law
     * @param degradation g per particle at [p - from] (input), or null for g = 1; ignored when split is null
     * @param definite    whether to project each particle's A onto the positive semi-definite matrices (eigenvalues
     *                    clamped at zero, Teran, Sifakis, Irving and Fedkiw 2005), so Newton directions descend
     * @param out         (output) A, 81 per particle
     * @throws UnsupportedOperationException if {@link #hasStressDifferential()} is false (the default)
     */
    default void stressDifferential(MaterialState state, int from, int to, TensionSplit split, double[] degradation,
                                    boolean definite, double[] out) {
        throw new UnsupportedOperationException(name() + " does not provide its stress differential dP/dF");
    }

    /**
     * Whether {@link #projectDeformation} does anything. Tells the truth: the solver skips the call when false.
     *
     * @return true for laws with a return mapping (plasticity)
     */
    default boolean projectsDeformation() {
        return false;
    }

    /**
     * After the deformation update, moves F back to the admissible set and updates plastic state (return mapping).
     * A particle whose mapping fails (a non-finite F, or a result that would not be finite) keeps its F and its
     * channels unchanged, is reported through the return value, and the batch goes on; the solver then stops with
     * a {@link dev.fray.core.error.SimulationDivergedException} naming it. The mapping never writes NaN.
     * Default: no-op, returns -1.
     *
     * @param state particle data; F and this law's channels may be modified in [from, to)
     * @param from  first particle, inclusive
     * @param to    last particle, exclusive
     * @return the index of the first particle in [from, to) whose mapping failed, or -1 if every one succeeded
     */
    default int projectDeformation(MaterialState state, int from, int to) {
        return -1;
    }
}

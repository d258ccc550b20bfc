package dev.fray.damage.elastic;

import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.math.Mat3;
import dev.fray.core.math.Svd3;
import dev.fray.core.math.Vec3;

/**
 * What the isotropic elastic laws share: their constants (Lame parameters mu and lambda in Pa, density in
 * kg/m^3) and the P-wave speed that sets the time step.
 */
abstract class IsotropicElasticLaw implements MaterialLaw {
    private final ElasticParameters parameters;
    /** Shear modulus mu, Pa. */
    final double mu;
    /** First Lame parameter lambda, Pa. */
    final double lambda;

    /**
     * @param parameters validated elastic constants (input, kept)
     * @throws dev.fray.core.error.InvalidInputException if parameters is null
     */
    IsotropicElasticLaw(ElasticParameters parameters) {
        this.parameters = Checks.notNull("elastic parameters", parameters);
        this.mu = parameters.mu();
        this.lambda = parameters.lambda();
    }

    /** @return the elastic constants this law was built from */
    public ElasticParameters parameters() {
        return parameters;
    }

    /** {@inheritDoc} */
    @Override
    public double density() {
        return parameters.density();
    }

    /** {@inheritDoc} Here the P-wave speed sqrt((lambda + 2 mu) / rho). */
    @Override
    public double waveSpeed() {
        return parameters.pWaveSpeed();
    }

    /**
     * {@inheritDoc} All four: law default, volumetric-deviatoric, spectral and none (the law's split method says
     * which one its default is).
     */
    @Override
    public boolean supportsSplit(TensionSplit split) {
        return SplitSupport.offersEvery(split);
    }

    /** The interface's split, for the choices a law does not handle itself (reachable from subclasses). */
    final void defaultSplit(TensionSplit split, MaterialState state, int from, int to, double[] tauDegraded,
                            double[] tauKept, double[] psiDegraded, double[] psiKept) {
        MaterialLaw.super.splitKirchhoffStress(split, state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
    }

    /** {@inheritDoc} Every isotropic law does, for every split it offers. */
    @Override
    public boolean hasStressDifferential() {
        return true;
    }

    /**
     * {@inheritDoc}
     *
     * <p>From the principal derivatives of the energy (see {@link PrincipalTangent}): with damage the energy is
     * psi - (1 - g) psi_degraded, whose principal derivatives are those of the whole law minus (1 - g) times those
     * of the degradable part. A particle whose F cannot be decomposed (non-finite) gets NaN.
     */
    @Override
    public void stressDifferential(MaterialState state, int from, int to, TensionSplit split, double[] degradation,
                                   boolean definite, double[] out) {
        double[] f = state.deformation();
        Mat3 a = new Mat3();
        Mat3 u = new Mat3();
        Mat3 v = new Mat3();
        Vec3 s = new Vec3();
        double[] uu = new double[9];
        double[] vv = new double[9];
        double[] g = new double[3];
        double[] h = new double[9];
        double[] gd = new double[3];
        double[] hd = new double[9];
        PrincipalTangent tangent = new PrincipalTangent();
        TensionSplit chosen = split == null || degradation == null ? null : split;
        for (int p = from; p < to; p++) {
            int o = DIFFERENTIAL_SIZE * (p - from);
            a.load(f, 9 * p);
            if (!Svd3.decompose(a, u, s, v)) {
                java.util.Arrays.fill(out, o, o + DIFFERENTIAL_SIZE, Double.NaN);
                continue;
            }
            java.util.Arrays.fill(g, 0.0);
            java.util.Arrays.fill(h, 0.0);
            principalDerivatives(s.x, s.y, s.z, g, h);
            if (chosen != null) {
                double lost = 1.0 - degradation[p - from];
                if (lost != 0.0) {
                    java.util.Arrays.fill(gd, 0.0);
                    java.util.Arrays.fill(hd, 0.0);
                    degradableDerivatives(chosen, s.x, s.y, s.z, gd, hd);
                    for (int k = 0; k < 3; k++) {
                        g[k] -= lost * gd[k];
                    }
                    for (int k = 0; k < 9; k++) {
                        h[k] -= lost * hd[k];
                    }
                }
            }
            u.store(uu, 0);
            v.store(vv, 0);
            tangent.assemble(uu, s.x, s.y, s.z, vv, g, h, definite, out, o);
        }
    }

    /**
     * Adds the principal gradient dpsi/ds_i and Hessian of the whole energy at signed singular values s.
     *
     * @param s0   first singular value
     * @param s1   second
     * @param s2   third (negative for an inverted F)
     * @param g    (input and output) gradient, Pa
     * @param hess (input and output) Hessian, 9 row-major, Pa
     */
    abstract void principalDerivatives(double s0, double s1, double s2, double[] g, double[] hess);

    /**
     * Adds the principal gradient and Hessian of the part of the energy the split degrades.
     *
     * @param split the split, one this law offers (LAW_DEFAULT means the law's own)
     * @param s0    first singular value
     * @param s1    second
     * @param s2    third
     * @param g     (input and output) gradient, Pa
     * @param hess  (input and output) Hessian, 9 row-major, Pa
     */
    abstract void degradableDerivatives(TensionSplit split, double s0, double s1, double s2, double[] g,
                                        double[] hess);
}

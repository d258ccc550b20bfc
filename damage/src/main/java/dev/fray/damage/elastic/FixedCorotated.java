package dev.fray.damage.elastic;

import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.math.Mat3;
import dev.fray.core.math.Svd3;
import dev.fray.core.math.Vec3;

import java.util.Arrays;

/**
 * Fixed corotated elasticity (Stomakhin et al. 2012, <i>Energetically consistent invertible elasticity</i>):
 * <pre>
 *   psi = mu ||F - R||_F^2 + lambda/2 (J - 1)^2
 *   P   = 2 mu (F - R) + lambda (J - 1) J F^-T
 *   tau = 2 mu (F - R) F^T + lambda (J - 1) J I
 * </pre>
 * with F = R S the polar decomposition, J = det F, and mu, lambda the Lamé parameters; stresses in Pa, psi in
 * J/m^3.
 *
 * <p>Inversion: R is taken as a proper rotation also when det F &lt; 0 (the convention of {@link Svd3}, after
 * Irving et al. 2004), and J F^-T is formed as the cofactor matrix cof(F), which is finite for singular F. So the
 * law needs no clamp: energy and stress are defined and finite for every finite F, and the volume term pushes an
 * inverted particle back. If the decomposition fails, which happens only for non-finite F, the outputs of that
 * particle are NaN so the solver's NaN guard reports it.
 *
 * <p>Damage: the law offers the volumetric-deviatoric split (its default) and a spectral split in the principal
 * stretches; see {@link #splitKirchhoffStress(TensionSplit, MaterialState, int, int, double[], double[], double[],
 * double[])}.
 *
 * <p>Immutable and thread-safe; no channels.
 */
public final class FixedCorotated extends IsotropicElasticLaw {
    /** Registry name. */
    public static final String NAME = "fixed-corotated";

    /**
     * @param parameters validated elastic constants (input, kept)
     * @throws dev.fray.core.error.InvalidInputException if parameters is null
     */
    public FixedCorotated(ElasticParameters parameters) {
        super(parameters);
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** {@inheritDoc} Uses ||F - R||_F^2 = sum (sigma_i - 1)^2 over the signed singular values. */
    @Override
    public void energyDensity(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        Mat3 a = new Mat3();
        Mat3 u = new Mat3();
        Mat3 v = new Mat3();
        Vec3 s = new Vec3();
        for (int p = from; p < to; p++) {
            a.load(f, 9 * p);
            if (!Svd3.decompose(a, u, s, v)) {
                out[p - from] = Double.NaN;
                continue;
            }
            double d0 = s.x - 1.0, d1 = s.y - 1.0, d2 = s.z - 1.0;
            double jm1 = det(a) - 1.0;
            out[p - from] = mu * (d0 * d0 + d1 * d1 + d2 * d2) + 0.5 * lambda * jm1 * jm1;
        }
    }

    /** {@inheritDoc} */
    @Override
    public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        Mat3 a = new Mat3();
        Mat3 r = new Mat3();
        for (int p = from; p < to; p++) {
            int o = 9 * (p - from);
            a.load(f, 9 * p);
            if (!Svd3.rotation(a, r)) {
                Arrays.fill(out, o, o + 9, Double.NaN);
                continue;
            }
            double f00 = a.m00, f01 = a.m01, f02 = a.m02;
            double f10 = a.m10, f11 = a.m11, f12 = a.m12;
            double f20 = a.m20, f21 = a.m21, f22 = a.m22;
            // cof(F) = J F^-T, finite for singular F
            double c00 = f11 * f22 - f12 * f21, c01 = f12 * f20 - f10 * f22, c02 = f10 * f21 - f11 * f20;
            double c10 = f02 * f21 - f01 * f22, c11 = f00 * f22 - f02 * f20, c12 = f01 * f20 - f00 * f21;
            double c20 = f01 * f12 - f02 * f11, c21 = f02 * f10 - f00 * f12, c22 = f00 * f11 - f01 * f10;
            double b = lambda * (f00 * c00 + f01 * c01 + f02 * c02 - 1.0);
            double m2 = 2.0 * mu;
            out[o] = m2 * (f00 - r.m00) + b * c00;
            out[o + 1] = m2 * (f01 - r.m01) + b * c01;
            out[o + 2] = m2 * (f02 - r.m02) + b * c02;
            out[o + 3] = m2 * (f10 - r.m10) + b * c10;
            out[o + 4] = m2 * (f11 - r.m11) + b * c11;
            out[o + 5] = m2 * (f12 - r.m12) + b * c12;
            out[o + 6] = m2 * (f20 - r.m20) + b * c20;
            out[o + 7] = m2 * (f21 - r.m21) + b * c21;
            out[o + 8] = m2 * (f22 - r.m22) + b * c22;
        }
    }

    /**
     * {@inheritDoc} Closed form tau = 2 mu (F F^T - R F^T) + lambda (J - 1) J I, with R from the polar
     * decomposition (Newton iteration, SVD fallback; see {@link Svd3#rotation}). R F^T = R S R^T is symmetric;
     * it is symmetrised to remove rounding.
     */
    @Override
    public void kirchhoffStress(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        Mat3 a = new Mat3();
        Mat3 r = new Mat3();
        double m2 = 2.0 * mu;
        for (int p = from; p < to; p++) {
            int o = 9 * (p - from);
            a.load(f, 9 * p);
            if (!Svd3.rotation(a, r)) {
                Arrays.fill(out, o, o + 9, Double.NaN);
                continue;
            }
            double f00 = a.m00, f01 = a.m01, f02 = a.m02;
            double f10 = a.m10, f11 = a.m11, f12 = a.m12;
            double f20 = a.m20, f21 = a.m21, f22 = a.m22;
            // F F^T - sym(R F^T), row by row.
            double s00 = f00 * f00 + f01 * f01 + f02 * f02 - (r.m00 * f00 + r.m01 * f01 + r.m02 * f02);
            double s11 = f10 * f10 + f11 * f11 + f12 * f12 - (r.m10 * f10 + r.m11 * f11 + r.m12 * f12);
            double s22 = f20 * f20 + f21 * f21 + f22 * f22 - (r.m20 * f20 + r.m21 * f21 + r.m22 * f22);
            double s01 = f00 * f10 + f01 * f11 + f02 * f12
                    - 0.5 * (r.m00 * f10 + r.m01 * f11 + r.m02 * f12 + r.m10 * f00 + r.m11 * f01 + r.m12 * f02);
            double s02 = f00 * f20 + f01 * f21 + f02 * f22
                    - 0.5 * (r.m00 * f20 + r.m01 * f21 + r.m02 * f22 + r.m20 * f00 + r.m21 * f01 + r.m22 * f02);
            double s12 = f10 * f20 + f11 * f21 + f12 * f22
                    - 0.5 * (r.m10 * f20 + r.m11 * f21 + r.m12 * f22 + r.m20 * f10 + r.m21 * f11 + r.m22 * f12);
            double j = det(a);
            double iso = lambda * (j - 1.0) * j;
            out[o] = m2 * s00 + iso;
            out[o + 1] = m2 * s01;
            out[o + 2] = m2 * s02;
            out[o + 3] = m2 * s01;
            out[o + 4] = m2 * s11 + iso;
            out[o + 5] = m2 * s12;
            out[o + 6] = m2 * s02;
            out[o + 7] = m2 * s12;
            out[o + 8] = m2 * s22 + iso;
        }
    }

    /**
     * {@inheritDoc}
     *
     * <p>Volumetric-deviatoric split after Amor, Marigo and Maurini 2009 (J. Mech. Phys. Solids 57). The shear
     * term is linear elasticity on the corotated (Biot) strain S - I, whose principal values are sigma_i - 1, so
     * Amor's split applies to it directly: with the mean stretch m = (sigma_1 + sigma_2 + sigma_3) / 3,
     * <pre>
     *   mu ||F - R||^2 = mu sum (sigma_i - m)^2   +   3 mu (m - 1)^2   (exact: the mean and the spread of sigma)
     *                    deviatoric                   volumetric (tr(S - I) = 3 (m - 1))
     * </pre>
     * and the volume term lambda/2 (J - 1)<sup>2</sup> is volumetric. The deviatoric part is always degradable;
     * the volumetric shear part is degradable when m &gt; 1 (the trace of the corotated strain is positive) and
     * the volume term when J &gt; 1. Each part is &gt;= 0 (for lambda &gt;= 0), each vanishes with zero slope at
     * its switch, so the degradable energy and stress are continuous, and J &gt; 1 implies m &gt; 1 (mean of the
     * stretches &gt;= their geometric mean), so a particle in expansion degrades everything. In principal
     * directions (tau = U diag(sigma_i dpsi/dsigma_i) U^T):
     * <pre>
     *   deviatoric       U diag(2 mu (sigma_i - m) sigma_i) U^T
     *   volumetric shear U diag(2 mu (m - 1) sigma_i) U^T
     *   volume           lambda (J - 1) J I
     * </pre>
     * A pure dilatation (m = J<sup>1/3</sup>) has no deviatoric part; an isochoric shear (J = 1, m &gt; 1) is all
     * degradable. At small strain this is Amor's split, K/2 &lt;tr eps&gt;<sup>2</sup> and mu |dev eps|<sup>2</sup>
     * with K = lambda + 2 mu / 3. The switch on m rather than J for the shear term is a choice: a split of the
     * shear term by J alone, 3 mu (J<sup>1/3</sup> - 1)<sup>2</sup>, leaves a deviatoric remainder that turns
     * negative under strongly non-uniform compression (J below about 0.13), which would make the crack driving
     * force negative.
     */
    @Override
    public void splitKirchhoffStress(MaterialState state, int from, int to, double[] tauDegraded, double[] tauKept,
                                     double[] psiDegraded, double[] psiKept) {
        volumetricDeviatoricSplit(state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
    }

    /**
     * The volumetric-deviatoric split without an SVD. With the left stretch V = R F^T = U diag(sigma) U^T (R from
     * the polar decomposition, signed singular values as in {@link Svd3#rotation}) the principal forms above are
     * matrix functions of V: the deviatoric stress is 2 mu V (V - m I), the volumetric shear stress 2 mu (m - 1) V,
     * with m = tr V / 3, and the deviatoric energy mu ||V - m I||^2 (no cancellation between the mean and the
     * spread of the stretches). The polar Newton iteration is several times cheaper than the SVD.
     */
    private void volumetricDeviatoricSplit(MaterialState state, int from, int to, double[] tauDegraded,
                                           double[] tauKept, double[] psiDegraded, double[] psiKept) {
        double[] f = state.deformation();
        Mat3 a = new Mat3();
        Mat3 r = new Mat3();
        double m2 = 2.0 * mu;
        for (int p = from; p < to; p++) {
            int o = 9 * (p - from);
            a.load(f, 9 * p);
            if (!Svd3.rotation(a, r)) {
                SplitSupport.invalid(tauDegraded, tauKept, psiDegraded, psiKept, o, p - from);
                continue;
            }
            // V = sym(R F^T), row by row.
            double v00 = r.m00 * a.m00 + r.m01 * a.m01 + r.m02 * a.m02;
            double v11 = r.m10 * a.m10 + r.m11 * a.m11 + r.m12 * a.m12;
            double v22 = r.m20 * a.m20 + r.m21 * a.m21 + r.m22 * a.m22;
            double v01 = 0.5 * (r.m00 * a.m10 + r.m01 * a.m11 + r.m02 * a.m12
                    + r.m10 * a.m00 + r.m11 * a.m01 + r.m12 * a.m02);
            double v02 = 0.5 * (r.m00 * a.m20 + r.m01 * a.m21 + r.m02 * a.m22
                    + r.m20 * a.m00 + r.m21 * a.m01 + r.m22 * a.m02);
            double v12 = 0.5 * (r.m10 * a.m20 + r.m11 * a.m21 + r.m12 * a.m22
                    + r.m20 * a.m10 + r.m21 * a.m11 + r.m22 * a.m12);
            double m = (v00 + v11 + v22) / 3.0;
            // W = V - m I, the deviatoric stretch.
            double w00 = v00 - m, w11 = v11 - m, w22 = v22 - m;
            double psiDev = mu * (w00 * w00 + w11 * w11 + w22 * w22 + 2.0 * (v01 * v01 + v02 * v02 + v12 * v12));
            double mm1 = m - 1.0;
            double psiMean = 3.0 * mu * mm1 * mm1;
            double j = det(a);
            double jm1 = j - 1.0;
            double psiVol = 0.5 * lambda * jm1 * jm1;
            boolean meanDegraded = m > 1.0;
            boolean volDegraded = j > 1.0;
            // Deviatoric 2 mu V W (V and W commute, so the product is symmetric).
            double d00 = m2 * (v00 * w00 + v01 * v01 + v02 * v02);
            double d11 = m2 * (v01 * v01 + v11 * w11 + v12 * v12);
            double d22 = m2 * (v02 * v02 + v12 * v12 + v22 * w22);
            double d01 = m2 * (v00 * v01 + v01 * w11 + v02 * v12);
            double d02 = m2 * (v00 * v02 + v01 * v12 + v02 * w22);
            double d12 = m2 * (v01 * v02 + v11 * v12 + v12 * w22);
            double g = m2 * mm1;
            double iso = lambda * jm1 * j;
            double gd = meanDegraded ? g : 0.0, gk = meanDegraded ? 0.0 : g;
            double id = volDegraded ? iso : 0.0, ik = volDegraded ? 0.0 : iso;
            putSymmetric(tauDegraded, o, d00 + gd * v00 + id, d11 + gd * v11 + id, d22 + gd * v22 + id,
                    d01 + gd * v01, d02 + gd * v02, d12 + gd * v12);
            putSymmetric(tauKept, o, gk * v00 + ik, gk * v11 + ik, gk * v22 + ik, gk * v01, gk * v02, gk * v12);
            psiDegraded[p - from] = psiDev + (meanDegraded ? psiMean : 0.0) + (volDegraded ? psiVol : 0.0);
            psiKept[p - from] = (meanDegraded ? 0.0 : psiMean) + (volDegraded ? 0.0 : psiVol);
        }
    }

    private static void putSymmetric(double[] out, int o, double s00, double s11, double s22, double s01,
                                     double s02, double s12) {
        out[o] = s00;
        out[o + 1] = s01;
        out[o + 2] = s02;
        out[o + 3] = s01;
        out[o + 4] = s11;
        out[o + 5] = s12;
        out[o + 6] = s02;
        out[o + 7] = s12;
        out[o + 8] = s22;
    }

    /** The spectral split, documented at the public split method. */
    private void spectralSplit(MaterialState state, int from, int to, double[] tauDegraded, double[] tauKept,
                               double[] psiDegraded, double[] psiKept) {
        double[] f = state.deformation();
        Mat3 a = new Mat3();
        Mat3 u = new Mat3();
        Mat3 v = new Mat3();
        Vec3 s = new Vec3();
        for (int p = from; p < to; p++) {
            int o = 9 * (p - from);
            a.load(f, 9 * p);
            if (!Svd3.decompose(a, u, s, v)) {
                SplitSupport.invalid(tauDegraded, tauKept, psiDegraded, psiKept, o, p - from);
                continue;
            }
            double j = det(a);
            double e0 = s.x - 1.0, e1 = s.y - 1.0, e2 = s.z - 1.0;
            boolean t0 = e0 > 0.0, t1 = e1 > 0.0, t2 = e2 > 0.0;
            double jm1 = j - 1.0;
            boolean expanded = jm1 > 0.0;
            double iso = lambda * jm1 * j;
            double m2 = 2.0 * mu;
            double k0 = m2 * e0 * s.x, k1 = m2 * e1 * s.y, k2 = m2 * e2 * s.z;
            symmetricUDUt(u, t0 ? k0 : 0.0, t1 ? k1 : 0.0, t2 ? k2 : 0.0, expanded ? iso : 0.0, tauDegraded, o);
            symmetricUDUt(u, t0 ? 0.0 : k0, t1 ? 0.0 : k1, t2 ? 0.0 : k2, expanded ? 0.0 : iso, tauKept, o);
            double q0 = mu * e0 * e0, q1 = mu * e1 * e1, q2 = mu * e2 * e2;
            double volume = 0.5 * lambda * jm1 * jm1;
            psiDegraded[p - from] = (t0 ? q0 : 0.0) + (t1 ? q1 : 0.0) + (t2 ? q2 : 0.0)
                    + (expanded ? volume : 0.0);
            psiKept[p - from] = (t0 ? 0.0 : q0) + (t1 ? 0.0 : q1) + (t2 ? 0.0 : q2) + (expanded ? 0.0 : volume);
        }
    }

    /**
     * {@inheritDoc}
     *
     * <p>{@link TensionSplit#LAW_DEFAULT} and {@link TensionSplit#VOLUMETRIC_DEVIATORIC}: the split of Amor, Marigo
     * and Maurini 2009 above. {@link TensionSplit#NONE}: everything degradable. {@link TensionSplit#SPECTRAL}: the
     * spectral split of Miehe, Welschinger and Hofacker 2010 (Int. J. Numer. Meth. Engng 83) on the principal
     * corotated (Biot) strains sigma_i - 1, the strain the shear term is quadratic in, with the volume term split
     * by the sign of J - 1:
     * <pre>
     *   psi+ = mu sum &lt;sigma_i - 1&gt;+^2 + lambda/2 &lt;J - 1&gt;+^2
     *   psi- = mu sum &lt;sigma_i - 1&gt;-^2 + lambda/2 &lt;J - 1&gt;-^2
     *   tau+ = U diag(2 mu &lt;sigma_i - 1&gt;+ sigma_i) U^T + lambda &lt;J - 1&gt;+ J I
     *   tau- = U diag(2 mu &lt;sigma_i - 1&gt;- sigma_i) U^T + lambda &lt;J - 1&gt;- J I
     * </pre>
     * (signed singular values sigma_i, F = U diag(sigma) V^T). sigma_i &gt; 1 is the same as a positive principal
     * logarithmic strain and J &gt; 1 the same as a positive trace of it, so tension means what it means for the
     * other laws. Each term vanishes with zero slope at its switch, so energy and stress are continuous; the
     * parts are disjoint and add up to the law exactly. At small strain this is Miehe's linear split. An inverted
     * direction (sigma_3 &lt; 0) is kept. psi+ &gt;= 0 for lambda &gt;= 0 (Poisson ratio &gt;= 0).
     */
    @Override
    public void splitKirchhoffStress(TensionSplit split, MaterialState state, int from, int to,
                                     double[] tauDegraded, double[] tauKept, double[] psiDegraded,
                                     double[] psiKept) {
        switch (split) {
            case LAW_DEFAULT, VOLUMETRIC_DEVIATORIC ->
                    volumetricDeviatoricSplit(state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
            case SPECTRAL -> spectralSplit(state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
            default -> defaultSplit(split, state, from, to, tauDegraded, tauKept,
                    psiDegraded, psiKept);
        }
    }

    /** Determinant from the entries; near rest this is more accurate than the product of singular values. */
    private static double det(Mat3 a) {
        return a.m00 * (a.m11 * a.m22 - a.m12 * a.m21) + a.m01 * (a.m12 * a.m20 - a.m10 * a.m22)
                + a.m02 * (a.m10 * a.m21 - a.m11 * a.m20);
    }

    /**
     * Writes U diag(d) U^T + iso I at out[o..o+8], computing the upper triangle once so the result is exactly
     * symmetric. Package-private so the Hencky law shares it.
     */
    static void symmetricUDUt(Mat3 u, double d0, double d1, double d2, double iso, double[] out, int o) {
        double t00 = d0 * u.m00 * u.m00 + d1 * u.m01 * u.m01 + d2 * u.m02 * u.m02 + iso;
        double t01 = d0 * u.m00 * u.m10 + d1 * u.m01 * u.m11 + d2 * u.m02 * u.m12;
        double t02 = d0 * u.m00 * u.m20 + d1 * u.m01 * u.m21 + d2 * u.m02 * u.m22;
        double t11 = d0 * u.m10 * u.m10 + d1 * u.m11 * u.m11 + d2 * u.m12 * u.m12 + iso;
        double t12 = d0 * u.m10 * u.m20 + d1 * u.m11 * u.m21 + d2 * u.m12 * u.m22;
        double t22 = d0 * u.m20 * u.m20 + d1 * u.m21 * u.m21 + d2 * u.m22 * u.m22 + iso;
        putSymmetric(out, o, t00, t11, t22, t01, t02, t12);
    }

    /** {@inheritDoc} mu sum (s_i - 1)^2 + lambda/2 (J - 1)^2. */
    @Override
    void principalDerivatives(double s0, double s1, double s2, double[] g, double[] hess) {
        PrincipalTangent.addStretch(2.0 * mu, 1.0, s0, s1, s2, g, hess);
        PrincipalTangent.addVolume(s0, s1, s2, lambda * (s0 * s1 * s2 - 1.0), lambda, g, hess);
    }

    /** {@inheritDoc} The parts named at the split methods, term by term. */
    @Override
    void degradableDerivatives(TensionSplit split, double s0, double s1, double s2, double[] g, double[] hess) {
        double m2 = 2.0 * mu;
        double j = s0 * s1 * s2;
        switch (split) {
            case NONE -> principalDerivatives(s0, s1, s2, g, hess);
            case SPECTRAL -> {
                double[] s = {s0, s1, s2};
                for (int i = 0; i < 3; i++) {
                    if (s[i] > 1.0) {
                        g[i] += m2 * (s[i] - 1.0);
                        hess[4 * i] += m2;
                    }
                }
                if (j > 1.0) {
                    PrincipalTangent.addVolume(s0, s1, s2, lambda * (j - 1.0), lambda, g, hess);
                }
            }
            default -> {
                // deviatoric mu sum (s_i - m)^2, always; mean 3 mu (m - 1)^2 when m > 1; volume when J > 1
                double m = (s0 + s1 + s2) / 3.0;
                double[] s = {s0, s1, s2};
                for (int i = 0; i < 3; i++) {
                    g[i] += m2 * (s[i] - m) + (m > 1.0 ? m2 * (m - 1.0) : 0.0);
                    for (int k = 0; k < 3; k++) {
                        hess[3 * i + k] += m2 * ((i == k ? 1.0 : 0.0) - 1.0 / 3.0) + (m > 1.0 ? m2 / 3.0 : 0.0);
                    }
                }
                if (j > 1.0) {
                    PrincipalTangent.addVolume(s0, s1, s2, lambda * (j - 1.0), lambda, g, hess);
                }
            }
        }
    }

    /** @return the law's name and constants, for diagnostics */
    @Override
    public String toString() {
        return NAME + parameters();
    }
}

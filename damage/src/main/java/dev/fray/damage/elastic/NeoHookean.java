package dev.fray.damage.elastic;

import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.math.Mat3;
import dev.fray.core.math.Svd3;
import dev.fray.core.math.Vec3;

import java.util.Arrays;

/**
 * Compressible Neo-Hookean elasticity (Bonet and Wood, <i>Nonlinear Continuum Mechanics for Finite Element
 * Analysis</i>):
 * <pre>
 *   psi = mu/2 (tr(F^T F) - 3) - mu ln J + lambda/2 (ln J)^2
 *   P   = mu (F - F^-T) + lambda ln J F^-T
 *   tau = mu (F F^T - I) + lambda ln J I
 * </pre>
 * with J = det F and mu, lambda the Lamé parameters, all stresses in Pa and psi in J/m^3.
 *
 * <p>Inversion: ln J has no value for J &lt;= 0 and grows without bound as J tends to 0. Below
 * {@link #J_FLOOR} the law continues ln J by its tangent line at the floor,
 * l(J) = ln(J_FLOOR) + (J - J_FLOOR) / J_FLOOR, in energy and stress alike. The energy stays continuously
 * differentiable, P = dpsi/dF holds everywhere, compression keeps costing energy through J = 0 and beyond, so
 * an inverted particle is pushed back, and the solver never sees NaN. Above the floor the law is exact.
 * F^-T is formed as cof(F) / J, and the cofactor is finite for any finite F.
 *
 * <p>Damage: the law offers the volumetric-deviatoric split (its default) and a spectral split in the principal
 * stretches; see {@link #splitKirchhoffStress(TensionSplit, MaterialState, int, int, double[], double[], double[],
 * double[])}.
 *
 * <p>Immutable and thread-safe; no channels.
 */
public final class NeoHookean extends IsotropicElasticLaw {
    /** Registry name. */
    public static final String NAME = "neo-hookean";

    /**
     * Volume ratio J below which ln J is continued linearly (dimensionless). A material compressed to a millionth
     * of its volume is far outside any meaningful use, so the exact law covers every physical state.
     */
    public static final double J_FLOOR = 1e-6;

    private static final double LOG_J_FLOOR = Math.log(J_FLOOR);

    /**
     * @param parameters validated elastic constants (input, kept)
     * @throws dev.fray.core.error.InvalidInputException if parameters is null
     */
    public NeoHookean(ElasticParameters parameters) {
        super(parameters);
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** {@inheritDoc} */
    @Override
    public void energyDensity(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int i = 9 * p;
            double f00 = f[i], f01 = f[i + 1], f02 = f[i + 2];
            double f10 = f[i + 3], f11 = f[i + 4], f12 = f[i + 5];
            double f20 = f[i + 6], f21 = f[i + 7], f22 = f[i + 8];
            double j = f00 * (f11 * f22 - f12 * f21) + f01 * (f12 * f20 - f10 * f22) + f02 * (f10 * f21 - f11 * f20);
            double l = logJ(j);
            double trC = f00 * f00 + f01 * f01 + f02 * f02 + f10 * f10 + f11 * f11 + f12 * f12
                    + f20 * f20 + f21 * f21 + f22 * f22;
            out[p - from] = 0.5 * mu * (trC - 3.0) - mu * l + 0.5 * lambda * l * l;
        }
    }

    /** {@inheritDoc} */
    @Override
    public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int i = 9 * p;
            int o = 9 * (p - from);
            double f00 = f[i], f01 = f[i + 1], f02 = f[i + 2];
            double f10 = f[i + 3], f11 = f[i + 4], f12 = f[i + 5];
            double f20 = f[i + 6], f21 = f[i + 7], f22 = f[i + 8];
            // cofactor matrix cof(F) = dJ/dF = J F^-T, finite even where F is singular
            double c00 = f11 * f22 - f12 * f21, c01 = f12 * f20 - f10 * f22, c02 = f10 * f21 - f11 * f20;
            double c10 = f02 * f21 - f01 * f22, c11 = f00 * f22 - f02 * f20, c12 = f01 * f20 - f00 * f21;
            double c20 = f01 * f12 - f02 * f11, c21 = f02 * f10 - f00 * f12, c22 = f00 * f11 - f01 * f10;
            double j = f00 * c00 + f01 * c01 + f02 * c02;
            // dpsi/dJ = (lambda l - mu) l'(J), with l'(J) = 1 / max(J, J_FLOOR); NaN J stays NaN
            double a = (lambda * logJ(j) - mu) / (j >= J_FLOOR ? j : J_FLOOR);
            out[o] = mu * f00 + a * c00;
            out[o + 1] = mu * f01 + a * c01;
            out[o + 2] = mu * f02 + a * c02;
            out[o + 3] = mu * f10 + a * c10;
            out[o + 4] = mu * f11 + a * c11;
            out[o + 5] = mu * f12 + a * c12;
            out[o + 6] = mu * f20 + a * c20;
            out[o + 7] = mu * f21 + a * c21;
            out[o + 8] = mu * f22 + a * c22;
        }
    }

    /**
     * {@inheritDoc} Closed form tau = mu (F F^T - I) + lambda ln J I above the floor; below it,
     * tau = mu F F^T + (lambda l(J) - mu) (J / J_FLOOR) I, which is P F^T of the continued law.
     */
    @Override
    public void kirchhoffStress(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int i = 9 * p;
            int o = 9 * (p - from);
            double f00 = f[i], f01 = f[i + 1], f02 = f[i + 2];
            double f10 = f[i + 3], f11 = f[i + 4], f12 = f[i + 5];
            double f20 = f[i + 6], f21 = f[i + 7], f22 = f[i + 8];
            double j = f00 * (f11 * f22 - f12 * f21) + f01 * (f12 * f20 - f10 * f22) + f02 * (f10 * f21 - f11 * f20);
            double iso = j >= J_FLOOR ? lambda * Math.log(j) : (lambda * logJ(j) - mu) * (j / J_FLOOR) + mu;
            // b = F F^T, symmetric: compute the upper triangle once
            double b00 = f00 * f00 + f01 * f01 + f02 * f02;
            double b11 = f10 * f10 + f11 * f11 + f12 * f12;
            double b22 = f20 * f20 + f21 * f21 + f22 * f22;
            double b01 = f00 * f10 + f01 * f11 + f02 * f12;
            double b02 = f00 * f20 + f01 * f21 + f02 * f22;
            double b12 = f10 * f20 + f11 * f21 + f12 * f22;
            out[o] = mu * (b00 - 1.0) + iso;
            out[o + 1] = mu * b01;
            out[o + 2] = mu * b02;
            out[o + 3] = mu * b01;
            out[o + 4] = mu * (b11 - 1.0) + iso;
            out[o + 5] = mu * b12;
            out[o + 6] = mu * b02;
            out[o + 7] = mu * b12;
            out[o + 8] = mu * (b22 - 1.0) + iso;
        }
    }

    /**
     * {@inheritDoc}
     *
     * <p>Volumetric-deviatoric split after Amor, Marigo and Maurini 2009 (J. Mech. Phys. Solids 57): the
     * volumetric energy is the energy of the pure dilatation J<sup>1/3</sup> I with the same volume ratio,
     * <pre>
     *   psi_vol(J) = 3 mu/2 (J^(2/3) - 1) - mu ln J + lambda/2 (ln J)^2
     *   tau_vol    = J dpsi_vol/dJ I = (mu (J^(2/3) - 1) + lambda ln J) I
     *   psi_dev    = psi - psi_vol = mu/2 (tr C - 3 J^(2/3))
     *   tau_dev    = tau - tau_vol = mu (F F^T - J^(2/3) I)
     * </pre>
     * (ln J continued below {@link #J_FLOOR} as in the energy). psi_dev &gt;= 0 for every F, since
     * tr C / 3 &gt;= (det C)<sup>1/3</sup> for the eigenvalues of C, with equality exactly for pure dilatation,
     * and psi_vol &gt;= 0 for J &gt;= 1. The deviatoric part is always degradable, the volumetric part only in
     * expansion (J &gt; 1). Both parts vanish with zero slope at J = 1, so the degradable energy and stress are
     * continuous across the switch. At finite strain tau_dev is the stress of psi_dev, not the deviator of tau: its
     * trace mu (tr b - 3 J<sup>2/3</sup>) is &gt;= 0. At small strain the split reduces to Amor's, K/2 &lt;tr eps&gt;<sup>2</sup>
     * and mu |dev eps|<sup>2</sup> with K = lambda + 2 mu / 3.
     */
    @Override
    public void splitKirchhoffStress(MaterialState state, int from, int to, double[] tauDegraded, double[] tauKept,
                                     double[] psiDegraded, double[] psiKept) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int i = 9 * p;
            int o = 9 * (p - from);
            double f00 = f[i], f01 = f[i + 1], f02 = f[i + 2];
            double f10 = f[i + 3], f11 = f[i + 4], f12 = f[i + 5];
            double f20 = f[i + 6], f21 = f[i + 7], f22 = f[i + 8];
            double j = f00 * (f11 * f22 - f12 * f21) + f01 * (f12 * f20 - f10 * f22) + f02 * (f10 * f21 - f11 * f20);
            double l = logJ(j);
            // same expression as kirchhoffStress, so an expanded particle gets the same bits
            double iso = j >= J_FLOOR ? lambda * Math.log(j) : (lambda * logJ(j) - mu) * (j / J_FLOOR) + mu;
            double b00 = f00 * f00 + f01 * f01 + f02 * f02;
            double b11 = f10 * f10 + f11 * f11 + f12 * f12;
            double b22 = f20 * f20 + f21 * f21 + f22 * f22;
            double b01 = f00 * f10 + f01 * f11 + f02 * f12;
            double b02 = f00 * f20 + f01 * f21 + f02 * f22;
            double b12 = f10 * f20 + f11 * f21 + f12 * f22;
            double trC = b00 + b11 + b22;
            // J^(2/3) as cbrt(J)^2 stays real and non-negative for J <= 0
            double c = Math.cbrt(j);
            double j23 = c * c;
            if (j > 1.0) {
                tauDegraded[o] = mu * (b00 - 1.0) + iso;
                tauDegraded[o + 1] = mu * b01;
                tauDegraded[o + 2] = mu * b02;
                tauDegraded[o + 3] = mu * b01;
                tauDegraded[o + 4] = mu * (b11 - 1.0) + iso;
                tauDegraded[o + 5] = mu * b12;
                tauDegraded[o + 6] = mu * b02;
                tauDegraded[o + 7] = mu * b12;
                tauDegraded[o + 8] = mu * (b22 - 1.0) + iso;
                Arrays.fill(tauKept, o, o + 9, 0.0);
                psiDegraded[p - from] = 0.5 * mu * (trC - 3.0) - mu * l + 0.5 * lambda * l * l;
                psiKept[p - from] = 0.0;
            } else {
                double md = mu * j23;
                tauDegraded[o] = mu * b00 - md;
                tauDegraded[o + 1] = mu * b01;
                tauDegraded[o + 2] = mu * b02;
                tauDegraded[o + 3] = mu * b01;
                tauDegraded[o + 4] = mu * b11 - md;
                tauDegraded[o + 5] = mu * b12;
                tauDegraded[o + 6] = mu * b02;
                tauDegraded[o + 7] = mu * b12;
                tauDegraded[o + 8] = mu * b22 - md;
                // tau_vol = tau - tau_dev = (iso + mu (J^(2/3) - 1)) I, also below the floor
                double pVol = iso + mu * (j23 - 1.0);
                tauKept[o] = pVol;
                tauKept[o + 1] = 0.0;
                tauKept[o + 2] = 0.0;
                tauKept[o + 3] = 0.0;
                tauKept[o + 4] = pVol;
                tauKept[o + 5] = 0.0;
                tauKept[o + 6] = 0.0;
                tauKept[o + 7] = 0.0;
                tauKept[o + 8] = pVol;
                // the clamp only removes rounding below zero near pure dilatation
                psiDegraded[p - from] = Math.max(0.0, 0.5 * mu * (trC - 3.0 * j23));
                psiKept[p - from] = 1.5 * mu * (j23 - 1.0) - mu * l + 0.5 * lambda * l * l;
            }
        }
    }

    /**
     * {@inheritDoc}
     *
     * <p>{@link TensionSplit#LAW_DEFAULT} and {@link TensionSplit#VOLUMETRIC_DEVIATORIC}: the split of Amor, Marigo
     * and Maurini 2009 above. {@link TensionSplit#NONE}: everything degradable. {@link TensionSplit#SPECTRAL}: the
     * spectral split of Miehe, Welschinger and Hofacker 2010 (Int. J. Numer. Meth. Engng 83) carried over to the
     * principal stretches s_i of F (principal logarithmic strains g_i = ln s_i). The law is a sum of one term per
     * principal stretch and one of the volume ratio,
     * <pre>
     *   psi = sum_i phi(s_i) + lambda/2 (ln J)^2,   phi(s) = mu/2 (s^2 - 1) - mu ln s = mu/2 (e^(2g) - 1 - 2g),
     * </pre>
     * and phi(1) = phi'(1) = 0, so a term can be switched on and off at s = 1 without a jump in energy or stress.
     * A stretched direction (g_i &gt; 0) and a volume increase (tr g = ln J &gt; 0) are tension:
     * <pre>
     *   psi+ = sum_{s_i &gt; 1} phi(s_i) + lambda/2 &lt;ln J&gt;+^2
     *   psi- = sum_{s_i &lt;= 1} phi(s_i) + lambda/2 &lt;ln J&gt;-^2
     *   tau+ = U diag(mu (s_i^2 - 1) [s_i &gt; 1]) U^T + lambda &lt;ln J&gt;+ I
     *   tau- = U diag(mu (s_i^2 - 1) [s_i &lt;= 1]) U^T + lambda &lt;ln J&gt;- I
     * </pre>
     * with F = U diag(s) V^T and tau = U diag(s_i dpsi/ds_i) U^T. At small strain phi(s) = mu g^2 + O(g^3), so this
     * is Miehe's linear split, mu sum &lt;eps_i&gt;+^2 + lambda/2 &lt;tr eps&gt;+^2. The degradable energy is
     * &gt;= 0 for every admissible Poisson ratio: phi(s) &gt;= mu (ln s)^2 for s &gt;= 1, and
     * mu sum &lt;g_i&gt;+^2 + lambda/2 (tr g)^2 &gt;= 0 for tr g &gt; 0 when lambda &gt; -2 mu / 3. Uniaxial
     * compression (one s_i &lt; 1, the others 1) and any volume decrease with no stretched direction are all kept,
     * unlike the volumetric-deviatoric split, which degrades their deviatoric part. Splits of this energy in the
     * principal stretches are also used by Hesch and Weinberg 2014 (Int. J. Numer. Meth. Engng 99). Below
     * {@link #J_FLOOR}, or for an inverted F, the volume term (continued as in the energy) and the compressed
     * directions are kept: psi- = psi - psi+ and tau- = tau - tau+ in closed form.
     */
    @Override
    public void splitKirchhoffStress(TensionSplit split, MaterialState state, int from, int to,
                                     double[] tauDegraded, double[] tauKept, double[] psiDegraded,
                                     double[] psiKept) {
        switch (split) {
            case LAW_DEFAULT, VOLUMETRIC_DEVIATORIC ->
                    splitKirchhoffStress(state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
            case SPECTRAL -> spectralSplit(state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
            default -> defaultSplit(split, state, from, to, tauDegraded, tauKept,
                    psiDegraded, psiKept);
        }
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
            double j = a.m00 * (a.m11 * a.m22 - a.m12 * a.m21) + a.m01 * (a.m12 * a.m20 - a.m10 * a.m22)
                    + a.m02 * (a.m10 * a.m21 - a.m11 * a.m20);
            double l = logJ(j);
            // same expression as kirchhoffStress, so the two parts add up to its tau
            double iso = j >= J_FLOOR ? lambda * Math.log(j) : (lambda * l - mu) * (j / J_FLOOR) + mu;
            boolean t0 = s.x > 1.0, t1 = s.y > 1.0, t2 = s.z > 1.0;
            double m0 = mu * (s.x - 1.0) * (s.x + 1.0);
            double m1 = mu * (s.y - 1.0) * (s.y + 1.0);
            double m2 = mu * (s.z - 1.0) * (s.z + 1.0);
            boolean expanded = j > 1.0;
            FixedCorotated.symmetricUDUt(u, t0 ? m0 : 0.0, t1 ? m1 : 0.0, t2 ? m2 : 0.0, expanded ? iso : 0.0,
                    tauDegraded, o);
            FixedCorotated.symmetricUDUt(u, t0 ? 0.0 : m0, t1 ? 0.0 : m1, t2 ? 0.0 : m2, expanded ? 0.0 : iso,
                    tauKept, o);
            double volume = 0.5 * lambda * l * l;
            double e0 = stretchEnergy(s.x), e1 = stretchEnergy(s.y), e2 = stretchEnergy(s.z);
            psiDegraded[p - from] = (t0 ? e0 : 0.0) + (t1 ? e1 : 0.0) + (t2 ? e2 : 0.0) + (expanded ? volume : 0.0);
            if (j >= J_FLOOR && s.z > 0.0) {
                psiKept[p - from] = (t0 ? 0.0 : e0) + (t1 ? 0.0 : e1) + (t2 ? 0.0 : e2) + (expanded ? 0.0 : volume);
            } else {
                // continued law: -mu l(J) no longer splits into per-direction logarithms; the stretched
                // directions' logarithms go to the degradable side and the rest of -mu l(J) stays here
                double stretchedLog = (t0 ? Math.log(s.x) : 0.0) + (t1 ? Math.log(s.y) : 0.0)
                        + (t2 ? Math.log(s.z) : 0.0);
                psiKept[p - from] = 0.5 * (t0 ? 0.0 : m0) + 0.5 * (t1 ? 0.0 : m1) + 0.5 * (t2 ? 0.0 : m2)
                        - mu * (l - stretchedLog) + volume;
            }
        }
    }

    /** phi(s) = mu/2 (s^2 - 1) - mu ln s for s &gt; 0, which is &gt;= 0; the clamp removes rounding near s = 1. */
    private double stretchEnergy(double s) {
        return s > 0.0 ? Math.max(0.0, 0.5 * mu * (s - 1.0) * (s + 1.0) - mu * Math.log(s)) : 0.0;
    }

    /** ln J above the floor, its tangent line below; NaN stays NaN. */
    private static double logJ(double j) {
        return j >= J_FLOOR ? Math.log(j) : LOG_J_FLOOR + (j - J_FLOOR) / J_FLOOR;
    }

    /** {@inheritDoc} mu/2 sum s_i^2 plus the volume function -mu l(J) + lambda/2 l(J)^2. */
    @Override
    void principalDerivatives(double s0, double s1, double s2, double[] g, double[] hess) {
        PrincipalTangent.addStretch(mu, 0.0, s0, s1, s2, g, hess);
        double j = s0 * s1 * s2;
        double l = logJ(j), l1 = logSlope(j), l2 = logCurvature(j);
        PrincipalTangent.addVolume(s0, s1, s2, (lambda * l - mu) * l1,
                lambda * l1 * l1 + (lambda * l - mu) * l2, g, hess);
    }

    /** {@inheritDoc} The parts named at the split methods. */
    @Override
    void degradableDerivatives(TensionSplit split, double s0, double s1, double s2, double[] g, double[] hess) {
        double j = s0 * s1 * s2;
        switch (split) {
            case NONE -> principalDerivatives(s0, s1, s2, g, hess);
            case SPECTRAL -> {
                double[] s = {s0, s1, s2};
                for (int i = 0; i < 3; i++) {
                    if (s[i] > 1.0) {
                        // phi(s) = mu/2 (s^2 - 1) - mu ln s
                        g[i] += mu * (s[i] - 1.0 / s[i]);
                        hess[4 * i] += mu * (1.0 + 1.0 / (s[i] * s[i]));
                    }
                }
                if (j > 1.0) {
                    double l = logJ(j), l1 = logSlope(j), l2 = logCurvature(j);
                    PrincipalTangent.addVolume(s0, s1, s2, lambda * l * l1, lambda * (l1 * l1 + l * l2), g, hess);
                }
            }
            default -> {
                if (j > 1.0) {
                    principalDerivatives(s0, s1, s2, g, hess);
                    return;
                }
                // deviatoric mu/2 (sum s_i^2 - 3 J^(2/3))
                PrincipalTangent.addStretch(mu, 0.0, s0, s1, s2, g, hess);
                double c = Math.cbrt(j);
                PrincipalTangent.addVolume(s0, s1, s2, -mu / c, mu / (3.0 * c * c * c * c), g, hess);
            }
        }
    }

    /** d ln J / dJ, continued below the floor. */
    private static double logSlope(double j) {
        return j >= J_FLOOR ? 1.0 / j : 1.0 / J_FLOOR;
    }

    /** d^2 ln J / dJ^2, continued below the floor. */
    private static double logCurvature(double j) {
        return j >= J_FLOOR ? -1.0 / (j * j) : 0.0;
    }

    /** @return the law's name and constants, for diagnostics */
    @Override
    public String toString() {
        return NAME + parameters();
    }
}

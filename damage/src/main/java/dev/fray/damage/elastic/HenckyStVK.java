package dev.fray.damage.elastic;

import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.math.Mat3;
import dev.fray.core.math.Svd3;
import dev.fray.core.math.Vec3;

import java.util.Arrays;

/**
 * St. Venant-Kirchhoff elasticity on Hencky (logarithmic) strain: Hooke's law applied to the principal
 * logarithmic stretches. With F = U diag(s) V^T,
 * <pre>
 *   psi = mu sum_i (ln s_i)^2 + lambda/2 (sum_i ln s_i)^2
 *   P   = U diag(2 mu ln s_i / s_i + lambda sum_j ln s_j / s_i) V^T
 *   tau = U diag(2 mu ln s_i + lambda sum_j ln s_j) U^T
 * </pre>
 * with mu, lambda the Lamé parameters; stresses in Pa, psi in J/m^3.
 *
 * <p>Inversion: the SVD of {@link Svd3} makes U and V rotations and puts the sign of det F on the smallest
 * singular value, so an inverted F has s_3 &lt; 0, where ln has no value. Below {@link #STRETCH_FLOOR} the law
 * continues ln s by its tangent line at the floor, g(s) = ln(STRETCH_FLOOR) + (s - STRETCH_FLOOR) / STRETCH_FLOOR,
 * in energy and stress alike. The energy stays continuously differentiable, P = dpsi/dF holds everywhere,
 * squeezing a direction through zero keeps costing energy, and the solver never sees NaN. Above the floor the
 * law is exact. If the decomposition fails, which happens only for non-finite F, the outputs of that particle
 * are NaN so the solver's NaN guard reports it.
 *
 * <p>Damage: the law offers the spectral split (its default) and the volumetric-deviatoric split, both on the
 * Hencky strain; see {@link #splitKirchhoffStress(TensionSplit, MaterialState, int, int, double[], double[],
 * double[], double[])}.
 *
 * <p>Immutable and thread-safe; no channels.
 */
public final class HenckyStVK extends IsotropicElasticLaw {
    /** Registry name. */
    public static final String NAME = "stvk-hencky";

    /**
     * Principal stretch below which ln s is continued linearly (dimensionless). A principal direction squeezed to a
     * millionth of its length is far outside any meaningful use, so the exact law covers every physical state.
     */
    public static final double STRETCH_FLOOR = 1e-6;

    private static final double LOG_STRETCH_FLOOR = Math.log(STRETCH_FLOOR);

    /**
     * @param parameters validated elastic constants (input, kept)
     * @throws dev.fray.core.error.InvalidInputException if parameters is null
     */
    public HenckyStVK(ElasticParameters parameters) {
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
            double g0 = logStretch(s.x), g1 = logStretch(s.y), g2 = logStretch(s.z);
            double tr = g0 + g1 + g2;
            out[p - from] = mu * (g0 * g0 + g1 * g1 + g2 * g2) + 0.5 * lambda * tr * tr;
        }
    }

    /** {@inheritDoc} */
    @Override
    public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        Mat3 a = new Mat3();
        Mat3 u = new Mat3();
        Mat3 v = new Mat3();
        Vec3 s = new Vec3();
        for (int p = from; p < to; p++) {
            int o = 9 * (p - from);
            a.load(f, 9 * p);
            if (!Svd3.decompose(a, u, s, v)) {
                Arrays.fill(out, o, o + 9, Double.NaN);
                continue;
            }
            double g0 = logStretch(s.x), g1 = logStretch(s.y), g2 = logStretch(s.z);
            double ltr = lambda * (g0 + g1 + g2);
            // dpsi/ds_i = (2 mu g_i + lambda tr g) g'(s_i), with g'(s) = 1 / max(s, floor)
            double d0 = (2.0 * mu * g0 + ltr) / Math.max(s.x, STRETCH_FLOOR);
            double d1 = (2.0 * mu * g1 + ltr) / Math.max(s.y, STRETCH_FLOOR);
            double d2 = (2.0 * mu * g2 + ltr) / Math.max(s.z, STRETCH_FLOOR);
            // P = U diag(d) V^T: P_rc = sum_k U_rk d_k V_ck
            out[o] = u.m00 * d0 * v.m00 + u.m01 * d1 * v.m01 + u.m02 * d2 * v.m02;
            out[o + 1] = u.m00 * d0 * v.m10 + u.m01 * d1 * v.m11 + u.m02 * d2 * v.m12;
            out[o + 2] = u.m00 * d0 * v.m20 + u.m01 * d1 * v.m21 + u.m02 * d2 * v.m22;
            out[o + 3] = u.m10 * d0 * v.m00 + u.m11 * d1 * v.m01 + u.m12 * d2 * v.m02;
            out[o + 4] = u.m10 * d0 * v.m10 + u.m11 * d1 * v.m11 + u.m12 * d2 * v.m12;
            out[o + 5] = u.m10 * d0 * v.m20 + u.m11 * d1 * v.m21 + u.m12 * d2 * v.m22;
            out[o + 6] = u.m20 * d0 * v.m00 + u.m21 * d1 * v.m01 + u.m22 * d2 * v.m02;
            out[o + 7] = u.m20 * d0 * v.m10 + u.m21 * d1 * v.m11 + u.m22 * d2 * v.m12;
            out[o + 8] = u.m20 * d0 * v.m20 + u.m21 * d1 * v.m21 + u.m22 * d2 * v.m22;
        }
    }

    /**
     * {@inheritDoc} Closed form tau = U diag(2 mu g_i + lambda sum_j g_j) U^T above the floor, where g = ln s;
     * a stretch below the floor has its entry scaled by s_i / STRETCH_FLOOR, which is P F^T of the continued law.
     */
    @Override
    public void kirchhoffStress(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        Mat3 a = new Mat3();
        Mat3 u = new Mat3();
        Mat3 v = new Mat3();
        Vec3 s = new Vec3();
        for (int p = from; p < to; p++) {
            int o = 9 * (p - from);
            a.load(f, 9 * p);
            if (!Svd3.decompose(a, u, s, v)) {
                Arrays.fill(out, o, o + 9, Double.NaN);
                continue;
            }
            double g0 = logStretch(s.x), g1 = logStretch(s.y), g2 = logStretch(s.z);
            double ltr = lambda * (g0 + g1 + g2);
            double t0 = (2.0 * mu * g0 + ltr) * belowFloorScale(s.x);
            double t1 = (2.0 * mu * g1 + ltr) * belowFloorScale(s.y);
            double t2 = (2.0 * mu * g2 + ltr) * belowFloorScale(s.z);
            FixedCorotated.symmetricUDUt(u, t0, t1, t2, 0.0, out, o);
        }
    }

    /**
     * {@inheritDoc}
     *
     * <p>Spectral split after Miehe, Welschinger and Hofacker 2010 (Int. J. Numer. Meth. Engng 83), on the
     * principal logarithmic strains g_i = ln s_i (continued below {@link #STRETCH_FLOOR} as in the energy):
     * <pre>
     *   psi+ = lambda/2 &lt;tr g&gt;+^2 + mu sum &lt;g_i&gt;+^2
     *   psi- = lambda/2 &lt;tr g&gt;-^2 + mu sum &lt;g_i&gt;-^2
     *   tau+ = U diag((2 mu &lt;g_i&gt;+ + lambda &lt;tr g&gt;+) s_i g'(s_i)) U^T
     *   tau- = U diag((2 mu &lt;g_i&gt;- + lambda &lt;tr g&gt;-) s_i g'(s_i)) U^T
     * </pre>
     * with &lt;x&gt;+ = max(x, 0), &lt;x&gt;- = min(x, 0); the + part is degradable, the - part kept. Since
     * &lt;x&gt;+ + &lt;x&gt;- = x exactly, the parts add up to the law's energy and stress. psi+ &gt;= 0 for every
     * admissible Poisson ratio: (tr g)<sup>2</sup> &lt;= 3 sum &lt;g_i&gt;+<sup>2</sup> when tr g &gt; 0, and
     * lambda &gt; -2 mu / 3. Unlike a volumetric-deviatoric split, an isochoric shear with principal strains
     * (g, -g, 0) keeps its compressive half, psi- = psi+ = psi / 2.
     */
    @Override
    public void splitKirchhoffStress(MaterialState state, int from, int to, double[] tauDegraded, double[] tauKept,
                                     double[] psiDegraded, double[] psiKept) {
        principalSplit(true, state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
    }

    /** The spectral or the volumetric-deviatoric split, documented at the public split methods. */
    private void principalSplit(boolean spectral, MaterialState state, int from, int to, double[] tauDegraded,
                                double[] tauKept, double[] psiDegraded, double[] psiKept) {
        double[] f = state.deformation();
        double bulk = lambda + 2.0 * mu / 3.0;
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
            double g0 = logStretch(s.x), g1 = logStretch(s.y), g2 = logStretch(s.z);
            double tr = g0 + g1 + g2;
            double sc0 = belowFloorScale(s.x), sc1 = belowFloorScale(s.y), sc2 = belowFloorScale(s.z);
            if (!spectral) {
                double mean = tr / 3.0;
                double d0 = g0 - mean, d1 = g1 - mean, d2 = g2 - mean;
                boolean expanded = tr > 0.0;
                double vol = bulk * tr;
                double volD = expanded ? vol : 0.0, volK = expanded ? 0.0 : vol;
                FixedCorotated.symmetricUDUt(u, (2.0 * mu * d0 + volD) * sc0, (2.0 * mu * d1 + volD) * sc1,
                        (2.0 * mu * d2 + volD) * sc2, 0.0, tauDegraded, o);
                FixedCorotated.symmetricUDUt(u, volK * sc0, volK * sc1, volK * sc2, 0.0, tauKept, o);
                double volume = 0.5 * bulk * tr * tr;
                psiDegraded[p - from] = mu * (d0 * d0 + d1 * d1 + d2 * d2) + (expanded ? volume : 0.0);
                psiKept[p - from] = expanded ? 0.0 : volume;
                continue;
            }
            double trP = Math.max(tr, 0.0), trN = Math.min(tr, 0.0);
            double p0 = Math.max(g0, 0.0), p1 = Math.max(g1, 0.0), p2 = Math.max(g2, 0.0);
            double n0 = Math.min(g0, 0.0), n1 = Math.min(g1, 0.0), n2 = Math.min(g2, 0.0);
            double lp = lambda * trP, ln = lambda * trN;
            FixedCorotated.symmetricUDUt(u, (2.0 * mu * p0 + lp) * sc0, (2.0 * mu * p1 + lp) * sc1,
                    (2.0 * mu * p2 + lp) * sc2, 0.0, tauDegraded, o);
            FixedCorotated.symmetricUDUt(u, (2.0 * mu * n0 + ln) * sc0, (2.0 * mu * n1 + ln) * sc1,
                    (2.0 * mu * n2 + ln) * sc2, 0.0, tauKept, o);
            psiDegraded[p - from] = mu * (p0 * p0 + p1 * p1 + p2 * p2) + 0.5 * lambda * trP * trP;
            psiKept[p - from] = mu * (n0 * n0 + n1 * n1 + n2 * n2) + 0.5 * lambda * trN * trN;
        }
    }

    /**
     * {@inheritDoc}
     *
     * <p>{@link TensionSplit#LAW_DEFAULT} and {@link TensionSplit#SPECTRAL}: the spectral split of Miehe et al. 2010
     * above. {@link TensionSplit#NONE}: everything degradable. {@link TensionSplit#VOLUMETRIC_DEVIATORIC}: the split
     * of Amor, Marigo and Maurini 2009 (J. Mech. Phys. Solids 57) on the Hencky strain. The energy is Hooke's law in
     * g, so it separates exactly into a deviatoric and a volumetric part with the bulk modulus K = lambda + 2 mu / 3:
     * <pre>
     *   psi+ = mu |dev g|^2 + K/2 &lt;tr g&gt;+^2,      dev g = g - (tr g / 3) I
     *   psi- = K/2 &lt;tr g&gt;-^2
     *   tau+ = U diag((2 mu dev g_i + K &lt;tr g&gt;+) s_i g'(s_i)) U^T
     *   tau- = U diag(K &lt;tr g&gt;- s_i g'(s_i)) U^T
     * </pre>
     * (g continued below {@link #STRETCH_FLOOR}; s_i g'(s_i) = 1 above it). The sums are mu sum g_i^2 +
     * lambda/2 (tr g)^2 and 2 mu g_i + lambda tr g, the law itself. tr g = ln J, so volume expansion is
     * degraded and volume compression kept; both parts are &gt;= 0 for every admissible Poisson ratio (K &gt; 0).
     * At small strain this is Amor's split, K/2 &lt;tr eps&gt;+^2 + mu |dev eps|^2.
     */
    @Override
    public void splitKirchhoffStress(TensionSplit split, MaterialState state, int from, int to,
                                     double[] tauDegraded, double[] tauKept, double[] psiDegraded,
                                     double[] psiKept) {
        switch (split) {
            case LAW_DEFAULT, SPECTRAL -> principalSplit(true, state, from, to, tauDegraded, tauKept, psiDegraded,
                    psiKept);
            case VOLUMETRIC_DEVIATORIC -> principalSplit(false, state, from, to, tauDegraded, tauKept, psiDegraded,
                    psiKept);
            default -> defaultSplit(split, state, from, to, tauDegraded, tauKept,
                    psiDegraded, psiKept);
        }
    }

    /**
     * The principal logarithmic strain this law uses: ln s above {@link #STRETCH_FLOOR}, its tangent line below
     * (see the class comment). Plastic laws built on this one take their strains from here, so that their return
     * mapping sees the strain the elastic energy sees.
     *
     * @param s a signed principal stretch (dimensionless)
     * @return the continued logarithm of s, finite for finite s
     */
    public static double logStretch(double s) {
        return s >= STRETCH_FLOOR ? Math.log(s) : LOG_STRETCH_FLOOR + (s - STRETCH_FLOOR) / STRETCH_FLOOR;
    }

    /** s g'(s): exactly 1 above the floor, s / floor below it. */
    private static double belowFloorScale(double s) {
        return s >= STRETCH_FLOOR ? 1.0 : s / STRETCH_FLOOR;
    }

    /** {@inheritDoc} Hooke's law in the log stretches e_i, chained through e_i = ln s_i. */
    @Override
    void principalDerivatives(double s0, double s1, double s2, double[] g, double[] hess) {
        degradableDerivatives(TensionSplit.NONE, s0, s1, s2, g, hess);
    }

    /** {@inheritDoc} The parts named at the split methods, in e_i, chained through e_i = ln s_i. */
    @Override
    void degradableDerivatives(TensionSplit split, double s0, double s1, double s2, double[] g, double[] hess) {
        double[] s = {s0, s1, s2};
        double[] e = {logStretch(s0), logStretch(s1), logStretch(s2)};
        double tr = e[0] + e[1] + e[2];
        double bulk = lambda + 2.0 * mu / 3.0;
        double m2 = 2.0 * mu;
        double[] ge = new double[3];
        double[] he = new double[9];
        for (int i = 0; i < 3; i++) {
            for (int k = 0; k < 3; k++) {
                double d = i == k ? 1.0 : 0.0;
                switch (split) {
                    case NONE -> he[3 * i + k] = m2 * d + lambda;
                    case VOLUMETRIC_DEVIATORIC -> he[3 * i + k] = m2 * (d - 1.0 / 3.0) + (tr > 0.0 ? bulk : 0.0);
                    default -> he[3 * i + k] = (tr > 0.0 ? lambda : 0.0) + (e[i] > 0.0 ? m2 * d : 0.0);
                }
            }
            switch (split) {
                case NONE -> ge[i] = m2 * e[i] + lambda * tr;
                case VOLUMETRIC_DEVIATORIC -> ge[i] = m2 * (e[i] - tr / 3.0) + bulk * Math.max(tr, 0.0);
                default -> ge[i] = lambda * Math.max(tr, 0.0) + m2 * Math.max(e[i], 0.0);
            }
        }
        for (int i = 0; i < 3; i++) {
            double di = s[i] >= STRETCH_FLOOR ? 1.0 / s[i] : 1.0 / STRETCH_FLOOR;
            double ci = s[i] >= STRETCH_FLOOR ? -1.0 / (s[i] * s[i]) : 0.0;
            g[i] += ge[i] * di;
            hess[4 * i] += ge[i] * ci;
            for (int k = 0; k < 3; k++) {
                double dk = s[k] >= STRETCH_FLOOR ? 1.0 / s[k] : 1.0 / STRETCH_FLOOR;
                hess[3 * i + k] += he[3 * i + k] * di * dk;
            }
        }
    }

    /** @return the law's name and constants, for diagnostics */
    @Override
    public String toString() {
        return NAME + parameters();
    }
}

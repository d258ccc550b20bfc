package dev.fray.damage.plastic;

import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.math.Mat3;
import dev.fray.core.math.Svd3;
import dev.fray.core.math.Vec3;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.damage.elastic.ElasticParameters;
import dev.fray.damage.elastic.HenckyStVK;

/**
 * What the plastic laws share: the multiplicative split F = F<sub>E</sub> F<sub>P</sub> with the particle's F
 * channel holding the elastic part F<sub>E</sub>, St. Venant-Kirchhoff elasticity on Hencky strain for it, and a
 * return mapping in principal logarithmic strain. Energy, stresses and the tension-compression splits are those of
 * {@link HenckyStVK} evaluated on F<sub>E</sub>, so every damage model degrades the elastic stress of a plastic law
 * as it does that of an elastic one, and P = dpsi/dF holds for the elastic part.
 *
 * <p>The return mapping (Simo 1992; Klar et al. 2016, section 4): with F<sub>E</sub><sup>trial</sup> = U diag(s)
 * V<sup>T</sup> and principal strains e<sub>i</sub> = ln s<sub>i</sub>, a law maps e to an admissible e' and
 * writes F<sub>E</sub> = U diag(exp e') V<sup>T</sup>; the particle's total deformation is unchanged, so the
 * plastic part takes up the difference. A particle whose trial state is admissible keeps its F bit for bit. An
 * inverted trial F<sub>E</sub> uses the continued logarithm of {@link HenckyStVK#logStretch}; a projected one comes
 * back with positive stretches.
 *
 * <p>Plastic state lives in the channels {@link #PLASTIC_STRAIN} (accumulated equivalent plastic strain
 * sqrt(2/3) |delta e|, summed over the steps) and, for laws whose plastic flow changes volume,
 * {@link #PLASTIC_VOLUME} (ln det F<sub>P</sub>); both start at zero, so bodies with different laws can share them.
 */
abstract class HenckyPlasticLaw implements MaterialLaw {
    /** sqrt(2/3), the factor between the deviatoric norm and the equivalent (uniaxial) measure. */
    static final double SQRT_2_3 = Math.sqrt(2.0 / 3.0);

    /** Elastic law of F<sub>E</sub>. */
    final HenckyStVK elastic;
    /** Shear modulus mu, Pa. */
    final double mu;
    /** Bulk modulus K = lambda + 2 mu / 3, Pa. */
    final double bulk;

    /**
     * @param parameters validated elastic constants (input, kept)
     * @throws dev.fray.core.error.InvalidInputException if parameters is null
     */
    HenckyPlasticLaw(ElasticParameters parameters) {
        Checks.notNull("elastic parameters", parameters);
        this.elastic = new HenckyStVK(parameters);
        this.mu = parameters.mu();
        this.bulk = parameters.lambda() + 2.0 * mu / 3.0;
    }

    /** Channel of the accumulated equivalent plastic strain, dimensionless. */
    public static final String PLASTIC_STRAIN = "plastic-strain";
    /** Channel of the plastic volume change ln det F<sub>P</sub>, dimensionless (negative when compacted). */
    public static final String PLASTIC_VOLUME = "plastic-volume";

    /** Declaration of {@link #PLASTIC_STRAIN}. */
    static final ChannelSpec PLASTIC_STRAIN_SPEC = new ChannelSpec(PLASTIC_STRAIN, 1, 0.0, "1",
            "accumulated equivalent plastic strain");
    /** Declaration of {@link #PLASTIC_VOLUME}. */
    static final ChannelSpec PLASTIC_VOLUME_SPEC = new ChannelSpec(PLASTIC_VOLUME, 1, 0.0, "1",
            "plastic volume change ln det Fp");

    /** @return the elastic constants (Young's modulus in Pa, Poisson ratio, density in kg/m^3) */
    public ElasticParameters parameters() {
        return elastic.parameters();
    }

    /** {@inheritDoc} */
    @Override
    public double density() {
        return elastic.density();
    }

    /** {@inheritDoc} Here the P-wave speed of the elastic part, sqrt((lambda + 2 mu) / rho). */
    @Override
    public double waveSpeed() {
        return elastic.waveSpeed();
    }

    /** {@inheritDoc} The Hencky energy of the elastic part F<sub>E</sub> (the F channel). */
    @Override
    public void energyDensity(MaterialState state, int from, int to, double[] out) {
        elastic.energyDensity(state, from, to, out);
    }

    /** {@inheritDoc} */
    @Override
    public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
        elastic.firstPiolaKirchhoff(state, from, to, out);
    }

    /** {@inheritDoc} */
    @Override
    public void kirchhoffStress(MaterialState state, int from, int to, double[] out) {
        elastic.kirchhoffStress(state, from, to, out);
    }

    /** {@inheritDoc} The spectral split of {@link HenckyStVK}. */
    @Override
    public void splitKirchhoffStress(MaterialState state, int from, int to, double[] tauDegraded, double[] tauKept,
                                     double[] psiDegraded, double[] psiKept) {
        elastic.splitKirchhoffStress(state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
    }

    /** {@inheritDoc} Those of {@link HenckyStVK}. */
    @Override
    public void splitKirchhoffStress(TensionSplit split, MaterialState state, int from, int to,
                                     double[] tauDegraded, double[] tauKept, double[] psiDegraded,
                                     double[] psiKept) {
        elastic.splitKirchhoffStress(split, state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
    }

    /** {@inheritDoc} Those of {@link HenckyStVK}: all four. */
    @Override
    public boolean supportsSplit(TensionSplit split) {
        return elastic.supportsSplit(split);
    }

    /** {@inheritDoc} True: every plastic law has a return mapping. */
    @Override
    public boolean projectsDeformation() {
        return true;
    }

    /**
     * One worker's view of one particle's elastic deformation in principal form: F<sub>E</sub> = U diag(s)
     * V<sup>T</sup> and the principal logarithmic strains e. Made once per batch, reused for every particle.
     */
    static final class Principal {
        private final Mat3 a = new Mat3();
        private final Mat3 u = new Mat3();
        private final Mat3 v = new Mat3();
        private final Vec3 s = new Vec3();
        /** Principal logarithmic strains of the loaded F, dimensionless. */
        double e0;
        double e1;
        double e2;
        /** Their trace tr e = ln det F, and the norm of their deviatoric part |dev e|. */
        double trace;
        double deviatorNorm;

        /**
         * Decomposes the F at {@code f[off..off+8]}.
         *
         * @param f   deformation gradients (input, not modified)
         * @param off offset of the particle's F
         * @return false if F is not finite (nothing usable loaded)
         */
        boolean load(double[] f, int off) {
            if (!Svd3.decompose(a.load(f, off), u, s, v)) {
                return false;
            }
            e0 = HenckyStVK.logStretch(s.x);
            e1 = HenckyStVK.logStretch(s.y);
            e2 = HenckyStVK.logStretch(s.z);
            trace = e0 + e1 + e2;
            double mean = trace / 3.0;
            double d0 = e0 - mean, d1 = e1 - mean, d2 = e2 - mean;
            deviatorNorm = Math.sqrt(d0 * d0 + d1 * d1 + d2 * d2);
            return Double.isFinite(trace + deviatorNorm);
        }

        /**
         * {@link #commit} of the loaded strains with their deviatoric part scaled: g = tr e / 3 + keep dev e.
         *
         * @param keep   factor on the deviatoric part, in [0, 1)
         * @param f      (output) deformation gradients
         * @param p      the particle
         * @param strain (output) equivalent plastic strain channel
         * @param volume (output) plastic volume channel, or null
         * @return false, with nothing written, if the result would not be finite
         */
        boolean commitDeviatoric(double keep, double[] f, int p, double[] strain, double[] volume) {
            double mean = trace / 3.0;
            return commit(mean + keep * (e0 - mean), mean + keep * (e1 - mean), mean + keep * (e2 - mean), f, p,
                    strain, volume);
        }

        /**
         * {@link #commit} of the isotropic state g = (t/3, t/3, t/3): a tip of the yield surface, no shear.
         *
         * @param newTrace the trace t of the new strains
         * @param f        (output) deformation gradients
         * @param p        the particle
         * @param strain   (output) equivalent plastic strain channel
         * @param volume   (output) plastic volume channel, or null
         * @return false, with nothing written, if the result would not be finite
         */
        boolean commitIsotropic(double newTrace, double[] f, int p, double[] strain, double[] volume) {
            double g = newTrace / 3.0;
            return commit(g, g, g, f, p, strain, volume);
        }

        /**
         * Writes F = U diag(exp g) V<sup>T</sup> with the loaded rotations and adds the step's plastic increments to
         * the channels, unless a result is not finite.
         *
         * @param g0     first principal strain after the mapping
         * @param g1     second
         * @param g2     third
         * @param f      (output) deformation gradients, particle p's 9 values overwritten on success
         * @param p      the particle
         * @param strain (output) equivalent plastic strain channel, p's value increased on success
         * @param volume (output) plastic volume channel, p's value increased by tr e - tr g on success; null for
         *               a law without one
         * @return false, with nothing written, if the result would not be finite
         */
        private boolean commit(double g0, double g1, double g2, double[] f, int p, double[] strain,
                               double[] volume) {
            double d0 = Math.exp(g0), d1 = Math.exp(g1), d2 = Math.exp(g2);
            a.set(u.m00 * d0 * v.m00 + u.m01 * d1 * v.m01 + u.m02 * d2 * v.m02,
                    u.m00 * d0 * v.m10 + u.m01 * d1 * v.m11 + u.m02 * d2 * v.m12,
                    u.m00 * d0 * v.m20 + u.m01 * d1 * v.m21 + u.m02 * d2 * v.m22,
                    u.m10 * d0 * v.m00 + u.m11 * d1 * v.m01 + u.m12 * d2 * v.m02,
                    u.m10 * d0 * v.m10 + u.m11 * d1 * v.m11 + u.m12 * d2 * v.m12,
                    u.m10 * d0 * v.m20 + u.m11 * d1 * v.m21 + u.m12 * d2 * v.m22,
                    u.m20 * d0 * v.m00 + u.m21 * d1 * v.m01 + u.m22 * d2 * v.m02,
                    u.m20 * d0 * v.m10 + u.m21 * d1 * v.m11 + u.m22 * d2 * v.m12,
                    u.m20 * d0 * v.m20 + u.m21 * d1 * v.m21 + u.m22 * d2 * v.m22);
            double sum = a.m00 + a.m01 + a.m02 + a.m10 + a.m11 + a.m12 + a.m20 + a.m21 + a.m22;
            double a0 = e0 - g0, a1 = e1 - g1, a2 = e2 - g2;
            double increment = SQRT_2_3 * Math.sqrt(a0 * a0 + a1 * a1 + a2 * a2);
            if (!Double.isFinite(sum + increment)) {
                return false;
            }
            a.store(f, 9 * p);
            strain[p] += increment;
            if (volume != null) {
                volume[p] += a0 + a1 + a2;
            }
            return true;
        }
    }
}

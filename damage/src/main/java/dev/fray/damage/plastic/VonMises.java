package dev.fray.damage.plastic;

import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialState;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.damage.elastic.ElasticParameters;

import java.util.List;

/**
 * Von Mises (J2) plasticity on Hencky strain with linear isotropic hardening, for metal-, clay- or putty-like
 * material: the elastic part is St. Venant-Kirchhoff on Hencky strain (see {@link HenckyPlasticLaw}), and the
 * deviatoric Kirchhoff stress s = 2 mu dev(e) is bounded by
 * <pre>
 *   |s| &lt;= sqrt(2/3) (sigma_y + H epbar)
 * </pre>
 * with yield stress sigma_y (Pa), hardening modulus H (Pa; the slope of uniaxial stress over plastic strain) and
 * the equivalent plastic strain epbar (channel {@value HenckyPlasticLaw#PLASTIC_STRAIN}). In uniaxial tension the
 * law yields at the Kirchhoff stress sigma_y and then hardens with the tangent modulus E H / (E + H).
 *
 * <p>Return mapping: the radial return of Simo and Hughes (<i>Computational Inelasticity</i>, 1998, box 3.2)
 * carried out on principal logarithmic strains (Simo 1992, CMAME 99), where it is exact for finite strain. With
 * f = 2 mu |dev e| - sqrt(2/3)(sigma_y + H epbar) &gt; 0, the plastic multiplier is
 * dgamma = f / (2 mu + 2 H / 3), dev e shrinks by dgamma along itself and epbar grows by sqrt(2/3) dgamma. The
 * trace of e, and so det F<sub>E</sub>, is kept: plastic flow preserves volume (det F<sub>P</sub> = 1).
 *
 * <p>Immutable and thread-safe; channel {@value HenckyPlasticLaw#PLASTIC_STRAIN}.
 */
public final class VonMises extends HenckyPlasticLaw {
    /** Registry name. */
    public static final String NAME = "von-mises";
    /** Field name of the yield stress in error messages, with its unit. */
    public static final String YIELD_STRESS_FIELD = "yieldStress (Pa)";
    /** Field name of the hardening modulus in error messages, with its unit. */
    public static final String HARDENING_MODULUS_FIELD = "hardeningModulus (Pa)";

    private final double yieldStress;
    private final double hardeningModulus;

    /**
     * @param parameters       elastic constants (input, kept)
     * @param yieldStress      initial yield stress sigma_y in uniaxial tension, Pa, finite and &gt; 0
     * @param hardeningModulus linear isotropic hardening modulus H, Pa, finite and &gt;= 0 (0: perfectly plastic)
     * @throws dev.fray.core.error.InvalidInputException with key NOT_FINITE or OUT_OF_RANGE naming the field, or
     *         MISSING for null parameters
     */
    public VonMises(ElasticParameters parameters, double yieldStress, double hardeningModulus) {
        super(parameters);
        check("", yieldStress, hardeningModulus);
        this.yieldStress = yieldStress;
        this.hardeningModulus = hardeningModulus;
    }

    /**
     * Validates the plastic parameters, for providers that report the place in a file.
     *
     * @param where            prefix of the field names, e.g. "scene.json: bodies[0].material." (may be empty)
     * @param yieldStress      Pa, finite and &gt; 0
     * @param hardeningModulus Pa, finite and &gt;= 0
     * @throws dev.fray.core.error.InvalidInputException with key NOT_FINITE or OUT_OF_RANGE naming the field
     */
    public static void check(String where, double yieldStress, double hardeningModulus) {
        Checks.positive(where + YIELD_STRESS_FIELD, yieldStress);
        Checks.nonNegative(where + HARDENING_MODULUS_FIELD, hardeningModulus);
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** @return the initial yield stress sigma_y, Pa */
    public double yieldStress() {
        return yieldStress;
    }

    /** @return the hardening modulus H, Pa */
    public double hardeningModulus() {
        return hardeningModulus;
    }

    /**
     * @param plasticStrain equivalent plastic strain epbar (dimensionless)
     * @return the radius of the yield surface, sqrt(2/3) (sigma_y + H epbar), in deviatoric Kirchhoff stress, Pa
     */
    public double yieldRadius(double plasticStrain) {
        return SQRT_2_3 * (yieldStress + hardeningModulus * plasticStrain);
    }

    /** {@inheritDoc} Here {@value HenckyPlasticLaw#PLASTIC_STRAIN}. */
    @Override
    public List<ChannelSpec> channels() {
        return List.of(PLASTIC_STRAIN_SPEC);
    }

    /** {@inheritDoc} The radial return of the class comment. */
    @Override
    public int projectDeformation(MaterialState state, int from, int to) {
        double[] f = state.deformation();
        double[] ep = state.channel(PLASTIC_STRAIN);
        double twoMu = 2.0 * mu;
        double denominator = twoMu + 2.0 * hardeningModulus / 3.0;
        Principal pr = new Principal();
        int failed = -1;
        for (int p = from; p < to; p++) {
            if (!pr.load(f, 9 * p)) {
                failed = failed < 0 ? p : failed;
                continue;
            }
            double norm = pr.deviatorNorm;
            double excess = twoMu * norm - yieldRadius(ep[p]);
            if (!(excess > 0.0)) {
                continue;
            }
            // the strain change is deviatoric with norm dgamma, so epbar grows by sqrt(2/3) dgamma
            double dgamma = excess / denominator;
            if (!pr.commitDeviatoric(1.0 - dgamma / norm, f, p, ep, null)) {
                failed = failed < 0 ? p : failed;
            }
        }
        return failed;
    }

    /** @return the law's name and constants, for diagnostics */
    @Override
    public String toString() {
        return NAME + "[" + parameters() + ", yieldStress=" + yieldStress + ", hardeningModulus="
                + hardeningModulus + "]";
    }
}

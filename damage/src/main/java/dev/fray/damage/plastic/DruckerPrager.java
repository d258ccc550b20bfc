package dev.fray.damage.plastic;

import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialState;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.damage.elastic.ElasticParameters;

import java.util.List;

/**
 * Drucker-Prager plasticity for granular matter, cohesionless (sand, gravel) or cohesive (damp soil), after Klar
 * et al., <i>Drucker-Prager elastoplasticity for sand animation</i> (ACM TOG 35(4), 2016). The elastic part is St.
 * Venant-Kirchhoff on Hencky strain (see {@link HenckyPlasticLaw}); the Kirchhoff stress tau stays inside the cone
 * <pre>
 *   |dev tau| + alpha tr(tau) &lt;= kappa
 *   alpha = sqrt(2/3) 2 sin(phi) / (3 - sin(phi))
 *   kappa = sqrt(2/3) 6 c cos(phi) / (3 - sin(phi))
 * </pre>
 * with friction angle phi and cohesion c (Pa). alpha is Klar et al.'s, the cone through the compressive meridian of
 * the Mohr-Coulomb pyramid; kappa is the matching cohesion term of the same classical fit, which puts the cone's
 * apex at the mean stress tr(tau)/3 = c cot(phi), the apex of the Mohr-Coulomb surface. With c = 0 the apex is at
 * zero stress and the material holds no tension.
 *
 * <p>Return mapping (Klar et al., section 4.3, with the apex moved by the cohesion), on principal logarithmic
 * strains e with the bulk modulus K = lambda + 2 mu / 3: where tr e is at or beyond the apex's trace
 * kappa / (3 K alpha), the state goes to the apex (every e_i = that trace / 3: the material comes apart and
 * carries no shear); otherwise, where dgamma = |dev e| + (3 K alpha tr e - kappa) / (2 mu) &gt; 0, dev e shrinks
 * by dgamma along itself, which lands tau on the cone at the same tr e. The flow keeps volume except at the apex,
 * where the change goes to {@value HenckyPlasticLaw#PLASTIC_VOLUME}. Klar et al.'s hardening of the friction angle
 * and their volume correction are not included: the friction angle is constant.
 *
 * <p>Immutable and thread-safe; channels {@value HenckyPlasticLaw#PLASTIC_STRAIN} and
 * {@value HenckyPlasticLaw#PLASTIC_VOLUME}.
 */
public final class DruckerPrager extends HenckyPlasticLaw {
    /** Registry name. */
    public static final String NAME = "drucker-prager";
    /** Field name of the friction angle in error messages, with its unit. */
    public static final String FRICTION_ANGLE_FIELD = "frictionAngle (degrees)";
    /** Field name of the cohesion in error messages, with its unit. */
    public static final String COHESION_FIELD = "cohesion (Pa)";
    /** Largest friction angle accepted, degrees (exclusive): at 90 degrees the cone is a half-space. */
    public static final double MAX_FRICTION_ANGLE = 90;

    private final double frictionAngle;
    private final double cohesion;
    private final double alpha;
    private final double kappa;
    /** tr e at the apex; +infinity for a zero friction angle, whose "cone" is a cylinder. */
    private final double apexTrace;

    /**
     * @param parameters    elastic constants (input, kept)
     * @param frictionAngle friction angle phi, degrees, in [0, 90)
     * @param cohesion      cohesion c, Pa, finite and &gt;= 0 (0: cohesionless)
     * @throws dev.fray.core.error.InvalidInputException with key NOT_FINITE or OUT_OF_RANGE naming the field, or
     *         MISSING for null parameters
     */
    public DruckerPrager(ElasticParameters parameters, double frictionAngle, double cohesion) {
        super(parameters);
        check("", frictionAngle, cohesion);
        this.frictionAngle = frictionAngle;
        this.cohesion = cohesion;
        double sin = Math.sin(Math.toRadians(frictionAngle));
        double cos = Math.cos(Math.toRadians(frictionAngle));
        this.alpha = SQRT_2_3 * 2.0 * sin / (3.0 - sin);
        this.kappa = SQRT_2_3 * 6.0 * cohesion * cos / (3.0 - sin);
        this.apexTrace = alpha > 0.0 ? kappa / (3.0 * bulk * alpha) : Double.POSITIVE_INFINITY;
    }

    /**
     * Validates the plastic parameters, for providers that report the place in a file.
     *
     * @param where         prefix of the field names (may be empty)
     * @param frictionAngle degrees, in [0, 90)
     * @param cohesion      Pa, finite and &gt;= 0
     * @throws dev.fray.core.error.InvalidInputException with key NOT_FINITE or OUT_OF_RANGE naming the field
     */
    public static void check(String where, double frictionAngle, double cohesion) {
        Checks.inRange(where + FRICTION_ANGLE_FIELD, frictionAngle, 0.0, false, MAX_FRICTION_ANGLE, true);
        Checks.nonNegative(where + COHESION_FIELD, cohesion);
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** @return the friction angle phi, degrees */
    public double frictionAngle() {
        return frictionAngle;
    }

    /** @return the cohesion c, Pa */
    public double cohesion() {
        return cohesion;
    }

    /** @return the cone's slope alpha = sqrt(2/3) 2 sin(phi) / (3 - sin(phi)), dimensionless */
    public double alpha() {
        return alpha;
    }

    /** @return the cone's cohesion term kappa = sqrt(2/3) 6 c cos(phi) / (3 - sin(phi)), Pa */
    public double kappa() {
        return kappa;
    }

    /** {@inheritDoc} Here {@value HenckyPlasticLaw#PLASTIC_STRAIN} and {@value HenckyPlasticLaw#PLASTIC_VOLUME}. */
    @Override
    public List<ChannelSpec> channels() {
        return List.of(PLASTIC_STRAIN_SPEC, PLASTIC_VOLUME_SPEC);
    }

    /** {@inheritDoc} The projection onto the cone of the class comment. */
    @Override
    public int projectDeformation(MaterialState state, int from, int to) {
        double[] f = state.deformation();
        double[] ep = state.channel(PLASTIC_STRAIN);
        double[] vol = state.channel(PLASTIC_VOLUME);
        double twoMu = 2.0 * mu;
        double threeKAlpha = 3.0 * bulk * alpha;
        Principal pr = new Principal();
        int failed = -1;
        for (int p = from; p < to; p++) {
            if (!pr.load(f, 9 * p)) {
                failed = failed < 0 ? p : failed;
                continue;
            }
            double tr = pr.trace;
            boolean ok;
            if (tr >= apexTrace) {
                ok = pr.commitIsotropic(apexTrace, f, p, ep, vol);
            } else {
                double norm = pr.deviatorNorm;
                double dgamma = norm + (threeKAlpha * tr - kappa) / twoMu;
                if (!(dgamma > 0.0)) {
                    continue;
                }
                // dgamma < norm inside the apex's trace; the clamp only absorbs rounding
                ok = pr.commitDeviatoric(Math.max(0.0, 1.0 - dgamma / norm), f, p, ep, vol);
            }
            if (!ok) {
                failed = failed < 0 ? p : failed;
            }
        }
        return failed;
    }

    /** @return the law's name and constants, for diagnostics */
    @Override
    public String toString() {
        return NAME + "[" + parameters() + ", frictionAngle=" + frictionAngle + ", cohesion=" + cohesion + "]";
    }
}

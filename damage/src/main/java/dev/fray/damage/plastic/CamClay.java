package dev.fray.damage.plastic;

import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialState;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.damage.elastic.ElasticParameters;

import java.util.List;

/**
 * Non-associated Cam-Clay plasticity with hardening, for crumbly and ductile matter (wet clay, snow, dough), after
 * Wolper et al., <i>CD-MPM: continuum damage material point methods for dynamic fracture animation</i> (ACM TOG
 * 38(4), 2019), who pair it with continuum damage, and Gaume et al. (Nature Communications 9, 2018) for snow. The
 * elastic part is St. Venant-Kirchhoff on Hencky strain (see {@link HenckyPlasticLaw}). With the Kirchhoff
 * pressure p = -tr(tau)/3 (positive in compression) and the equivalent shear stress q = sqrt(3/2) |dev tau|, the
 * state stays inside the ellipse
 * <pre>
 *   y(p, q) = (1 + 2 beta) q^2 + M^2 (p + beta p0)(p - p0) &lt;= 0
 *   M  = 6 sin(phi) / (3 - sin(phi))
 *   p0 = K sinh(xi max(-a, 0)),   a = a0 + ln det F<sub>P</sub>,   a0 = -asinh(pc / K) / xi
 * </pre>
 * which spans p from -beta p0 (the tensile strength) to p0 (the consolidation pressure) and is tallest at
 * q = M (1 + beta) p0 / (2 sqrt(1 + 2 beta)). M is the slope of the critical state line q = M p, here from the
 * friction angle phi by the usual match to Mohr-Coulomb in triaxial compression (Wood, <i>Soil Behaviour and
 * Critical State Soil Mechanics</i>, 1990). The hardening law is that of Gaume et al. and Wolper et al.: K is the
 * bulk modulus, xi the hardening factor, and a the logarithmic plastic volume, which starts at a0 so that the
 * consolidation pressure of undisturbed material is pc. Plastic compaction (a falls) hardens the material,
 * plastic dilation softens it, and at a &gt;= 0 the ellipse has shrunk to a point and the material has crumbled to
 * a strengthless powder until it is compacted again.
 *
 * <p>Return mapping on principal logarithmic strains e (p = -K tr e, q = sqrt(3/2) 2 mu |dev e|). Non-associated:
 * <ul>
 *   <li>p beyond p0: the state goes to the tip (p0, 0), compaction; p below -beta p0: to the tip (-beta p0, 0),
 *       dilation. The volume change ln(det F<sub>E</sub><sup>trial</sup> / det F<sub>E</sub>) = tr e - tr e' is
 *       added to {@value HenckyPlasticLaw#PLASTIC_VOLUME}, which moves p0 for the next step.</li>
 *   <li>otherwise, where y &gt; 0: q is reduced at constant p onto the ellipse (purely deviatoric flow, so the
 *       volume and the hardening variable are kept).</li>
 * </ul>
 * The channel {@value HenckyPlasticLaw#PLASTIC_VOLUME} holds ln det F<sub>P</sub> from the start of the run
 * (zero at the start, for every body), so a = a0 + that channel.
 *
 * <p>Immutable and thread-safe; channels {@value HenckyPlasticLaw#PLASTIC_STRAIN} and
 * {@value HenckyPlasticLaw#PLASTIC_VOLUME}.
 */
public final class CamClay extends HenckyPlasticLaw {
    /** Registry name. */
    public static final String NAME = "cam-clay";
    /** Field name of the friction angle in error messages, with its unit. */
    public static final String FRICTION_ANGLE_FIELD = "frictionAngle (degrees)";
    /** Field name of the consolidation pressure in error messages, with its unit. */
    public static final String CONSOLIDATION_PRESSURE_FIELD = "consolidationPressure (Pa)";
    /** Field name of the tensile ratio beta in error messages. */
    public static final String TENSILE_RATIO_FIELD = "tensileRatio";
    /** Field name of the hardening factor xi in error messages. */
    public static final String HARDENING_FACTOR_FIELD = "hardeningFactor";
    /** Largest tensile ratio accepted: tensile strength at most the compressive one. */
    public static final double MAX_TENSILE_RATIO = 1;
    /** Largest hardening factor accepted; beyond it p0 overflows after modest compaction. */
    public static final double MAX_HARDENING_FACTOR = 100;

    private final double frictionAngle;
    private final double consolidationPressure;
    private final double beta;
    private final double xi;
    private final double m2;
    private final double a0;

    /**
     * @param parameters            elastic constants (input, kept)
     * @param frictionAngle         friction angle phi of the critical state line, degrees, in (0, 90)
     * @param consolidationPressure consolidation pressure pc of undisturbed material, Pa, finite and &gt; 0
     * @param tensileRatio          beta, tensile strength over consolidation pressure, in [0, 1]
     * @param hardeningFactor       xi, dimensionless, in (0, 100]
     * @throws dev.fray.core.error.InvalidInputException with key NOT_FINITE or OUT_OF_RANGE naming the field, or
     *         MISSING for null parameters
     */
    public CamClay(ElasticParameters parameters, double frictionAngle, double consolidationPressure,
                   double tensileRatio, double hardeningFactor) {
        super(parameters);
        check("", frictionAngle, consolidationPressure, tensileRatio, hardeningFactor);
        this.frictionAngle = frictionAngle;
        this.consolidationPressure = consolidationPressure;
        this.beta = tensileRatio;
        this.xi = hardeningFactor;
        double sin = Math.sin(Math.toRadians(frictionAngle));
        double m = 6.0 * sin / (3.0 - sin);
        this.m2 = m * m;
        this.a0 = -asinh(consolidationPressure / bulk) / hardeningFactor;
    }

    /**
     * Validates the plastic parameters, for providers that report the place in a file.
     *
     * @param where                 prefix of the field names (may be empty)
     * @param frictionAngle         degrees, in (0, 90)
     * @param consolidationPressure Pa, finite and &gt; 0
     * @param tensileRatio          in [0, 1]
     * @param hardeningFactor       in (0, 100]
     * @throws dev.fray.core.error.InvalidInputException with key NOT_FINITE or OUT_OF_RANGE naming the field
     */
    public static void check(String where, double frictionAngle, double consolidationPressure, double tensileRatio,
                             double hardeningFactor) {
        Checks.inRange(where + FRICTION_ANGLE_FIELD, frictionAngle, 0.0, true, 90.0, true);
        Checks.positive(where + CONSOLIDATION_PRESSURE_FIELD, consolidationPressure);
        Checks.inRange(where + TENSILE_RATIO_FIELD, tensileRatio, 0.0, false, MAX_TENSILE_RATIO, false);
        Checks.inRange(where + HARDENING_FACTOR_FIELD, hardeningFactor, 0.0, true, MAX_HARDENING_FACTOR, false);
    }

    private static double asinh(double x) {
        return Math.log(x + Math.sqrt(x * x + 1.0));
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** @return the friction angle phi of the critical state line, degrees */
    public double frictionAngle() {
        return frictionAngle;
    }

    /** @return the consolidation pressure pc of undisturbed material, Pa */
    public double consolidationPressure() {
        return consolidationPressure;
    }

    /** @return the tensile ratio beta, dimensionless */
    public double tensileRatio() {
        return beta;
    }

    /** @return the hardening factor xi, dimensionless */
    public double hardeningFactor() {
        return xi;
    }

    /** @return the slope of the critical state line M = 6 sin(phi) / (3 - sin(phi)), dimensionless */
    public double criticalStateSlope() {
        return Math.sqrt(m2);
    }

    /**
     * The hardening law.
     *
     * @param plasticVolume ln det F<sub>P</sub> since the start, the channel {@value HenckyPlasticLaw#PLASTIC_VOLUME}
     * @return the consolidation pressure p0 = K sinh(xi max(-(a0 + plasticVolume), 0)), Pa
     */
    public double consolidationPressureAt(double plasticVolume) {
        return bulk * Math.sinh(xi * Math.max(-(a0 + plasticVolume), 0.0));
    }

    /**
     * The yield function.
     *
     * @param pressure      Kirchhoff pressure p = -tr(tau)/3, Pa
     * @param shear         equivalent shear stress q = sqrt(3/2) |dev tau|, Pa
     * @param plasticVolume ln det F<sub>P</sub> since the start
     * @return y(p, q) = (1 + 2 beta) q^2 + M^2 (p + beta p0)(p - p0), Pa^2; admissible where &lt;= 0
     */
    public double yieldFunction(double pressure, double shear, double plasticVolume) {
        double p0 = consolidationPressureAt(plasticVolume);
        return (1.0 + 2.0 * beta) * shear * shear + m2 * (pressure + beta * p0) * (pressure - p0);
    }

    /** {@inheritDoc} Here {@value HenckyPlasticLaw#PLASTIC_STRAIN} and {@value HenckyPlasticLaw#PLASTIC_VOLUME}. */
    @Override
    public List<ChannelSpec> channels() {
        return List.of(PLASTIC_STRAIN_SPEC, PLASTIC_VOLUME_SPEC);
    }

    /** {@inheritDoc} The non-associated mapping of the class comment. */
    @Override
    public int projectDeformation(MaterialState state, int from, int to) {
        double[] f = state.deformation();
        double[] ep = state.channel(PLASTIC_STRAIN);
        double[] vol = state.channel(PLASTIC_VOLUME);
        double shearScale = Math.sqrt(1.5) * 2.0 * mu;
        Principal pr = new Principal();
        int failed = -1;
        for (int p = from; p < to; p++) {
            double p0 = consolidationPressureAt(vol[p]);
            if (!pr.load(f, 9 * p) || !Double.isFinite(p0)) {
                failed = failed < 0 ? p : failed;
                continue;
            }
            double pressure = -bulk * pr.trace;
            boolean ok;
            if (pressure > p0 || pressure < -beta * p0) {
                ok = pr.commitIsotropic(-(pressure > p0 ? p0 : -beta * p0) / bulk, f, p, ep, vol);
            } else {
                double q = shearScale * pr.deviatorNorm;
                double ellipse = -m2 * (pressure + beta * p0) * (pressure - p0);
                if (!((1.0 + 2.0 * beta) * q * q > ellipse)) {
                    continue;
                }
                ok = pr.commitDeviatoric(Math.sqrt(Math.max(ellipse, 0.0) / (1.0 + 2.0 * beta)) / q, f, p, ep, vol);
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
        return NAME + "[" + parameters() + ", frictionAngle=" + frictionAngle + ", consolidationPressure="
                + consolidationPressure + ", tensileRatio=" + beta + ", hardeningFactor=" + xi + "]";
    }
}

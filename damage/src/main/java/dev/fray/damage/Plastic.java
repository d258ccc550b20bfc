package dev.fray.damage;

import dev.fray.core.material.MaterialLaw;
import dev.fray.damage.elastic.ElasticParameters;
import dev.fray.damage.plastic.CamClay;
import dev.fray.damage.plastic.DruckerPrager;
import dev.fray.damage.plastic.VonMises;

/**
 * Static factories for the plastic laws. Each is St. Venant-Kirchhoff elasticity on Hencky strain with a return
 * mapping, and works with every damage model (damage degrades the elastic stress). Parameters are validated here,
 * so a bad value fails when the law is made, with a message that names the field, its unit and the allowed range.
 * Plastic state goes to the particle channels {@code plastic-strain} and {@code plastic-volume}, which every writer
 * exports by name.
 */
public final class Plastic {
    private Plastic() {
    }

    /**
     * Von Mises (J2) plasticity with linear isotropic hardening, for metal-, clay- or putty-like material.
     *
     * @param youngsModulus    Young's modulus E, Pa, &gt; 0
     * @param poissonRatio     Poisson ratio nu, in (-1, 0.5)
     * @param density          density rho, kg/m^3, &gt; 0
     * @param yieldStress      yield stress in uniaxial tension sigma_y, Pa, &gt; 0
     * @param hardeningModulus hardening modulus H (slope of stress over plastic strain), Pa, &gt;= 0
     * @return the law, named "von-mises"
     * @throws dev.fray.core.error.InvalidInputException with key OUT_OF_RANGE or NOT_FINITE for a bad parameter
     */
    public static MaterialLaw vonMises(double youngsModulus, double poissonRatio, double density, double yieldStress,
                                       double hardeningModulus) {
        return new VonMises(new ElasticParameters(youngsModulus, poissonRatio, density), yieldStress,
                hardeningModulus);
    }

    /**
     * Drucker-Prager plasticity for sand, gravel and soil (Klar et al. 2016).
     *
     * @param youngsModulus Young's modulus E, Pa, &gt; 0
     * @param poissonRatio  Poisson ratio nu, in (-1, 0.5)
     * @param density       density rho, kg/m^3, &gt; 0
     * @param frictionAngle friction angle, degrees, in [0, 90) (dry sand: about 30 to 35)
     * @param cohesion      cohesion, Pa, &gt;= 0 (0 for dry sand)
     * @return the law, named "drucker-prager"
     * @throws dev.fray.core.error.InvalidInputException with key OUT_OF_RANGE or NOT_FINITE for a bad parameter
     */
    public static MaterialLaw druckerPrager(double youngsModulus, double poissonRatio, double density,
                                            double frictionAngle, double cohesion) {
        return new DruckerPrager(new ElasticParameters(youngsModulus, poissonRatio, density), frictionAngle,
                cohesion);
    }

    /**
     * Non-associated Cam-Clay with hardening, for crumbly and ductile matter such as wet clay or snow (Wolper et al.
     * 2019).
     *
     * @param youngsModulus         Young's modulus E, Pa, &gt; 0
     * @param poissonRatio          Poisson ratio nu, in (-1, 0.5)
     * @param density               density rho, kg/m^3, &gt; 0
     * @param frictionAngle         friction angle of the critical state line, degrees, in (0, 90)
     * @param consolidationPressure pressure at which undisturbed material starts to compact, Pa, &gt; 0
     * @param tensileRatio          tensile strength as a fraction of the consolidation pressure, in [0, 1]
     * @param hardeningFactor       how fast compaction hardens and dilation softens, dimensionless, in (0, 100]
     * @return the law, named "cam-clay"
     * @throws dev.fray.core.error.InvalidInputException with key OUT_OF_RANGE or NOT_FINITE for a bad parameter
     */
    public static MaterialLaw camClay(double youngsModulus, double poissonRatio, double density,
                                      double frictionAngle, double consolidationPressure, double tensileRatio,
                                      double hardeningFactor) {
        return new CamClay(new ElasticParameters(youngsModulus, poissonRatio, density), frictionAngle,
                consolidationPressure, tensileRatio, hardeningFactor);
    }
}

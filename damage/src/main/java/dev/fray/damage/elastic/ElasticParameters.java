package dev.fray.damage.elastic;

import dev.fray.core.error.Checks;

/**
 * Isotropic linear-elastic constants in engineering terms, validated on construction, with the Lamé parameters
 * derived from them: mu = E / (2 (1 + nu)), lambda = E nu / ((1 + nu)(1 - 2 nu)).
 * Immutable and thread-safe.
 *
 * @param youngsModulus Young's modulus E in Pa, finite and &gt; 0
 * @param poissonRatio  Poisson ratio nu (dimensionless), in the open range (-1, 0.5) where the strain energy of
 *                      linear elasticity is positive definite
 * @param density       mass density rho in the reference configuration in kg/m^3, finite and &gt; 0
 */
public record ElasticParameters(double youngsModulus, double poissonRatio, double density) {
    /** Field name of Young's modulus in error messages, with its unit. */
    public static final String YOUNGS_MODULUS_FIELD = "youngsModulus (Pa)";
    /** Field name of the Poisson ratio in error messages. */
    public static final String POISSON_RATIO_FIELD = "poissonRatio";
    /** Field name of the density in error messages, with its unit. */
    public static final String DENSITY_FIELD = "density (kg/m^3)";

    /**
     * Validates the constants.
     *
     * @param youngsModulus Young's modulus E, Pa, finite and &gt; 0
     * @param poissonRatio  Poisson ratio nu, in (-1, 0.5)
     * @param density       density rho, kg/m^3, finite and &gt; 0
     * @throws dev.fray.core.error.InvalidInputException with key {@code NOT_FINITE} for NaN or infinite values and
     *         {@code OUT_OF_RANGE} for E &lt;= 0, nu outside (-1, 0.5) or rho &lt;= 0; the message names the field
     */
    public ElasticParameters {
        Checks.positive(YOUNGS_MODULUS_FIELD, youngsModulus);
        Checks.inRange(POISSON_RATIO_FIELD, poissonRatio, -1.0, true, 0.5, true);
        Checks.positive(DENSITY_FIELD, density);
    }

    /**
     * Creates validated constants; same as the canonical constructor, reads better at call sites.
     *
     * @param youngsModulus Young's modulus E, Pa
     * @param poissonRatio  Poisson ratio nu, in (-1, 0.5)
     * @param density       density rho, kg/m^3
     * @return the constants
     * @throws dev.fray.core.error.InvalidInputException if a value is out of range or not finite
     */
    public static ElasticParameters of(double youngsModulus, double poissonRatio, double density) {
        return new ElasticParameters(youngsModulus, poissonRatio, density);
    }

    /** @return the shear modulus (second Lamé parameter) mu = E / (2 (1 + nu)), Pa */
    public double mu() {
        return youngsModulus / (2.0 * (1.0 + poissonRatio));
    }

    /** @return the first Lamé parameter lambda = E nu / ((1 + nu)(1 - 2 nu)), Pa; negative when nu &lt; 0 */
    public double lambda() {
        return youngsModulus * poissonRatio / ((1.0 + poissonRatio) * (1.0 - 2.0 * poissonRatio));
    }

    /** @return the P-wave (longitudinal) speed sqrt((lambda + 2 mu) / rho) of the undeformed material, m/s */
    public double pWaveSpeed() {
        return Math.sqrt((lambda() + 2.0 * mu()) / density);
    }
}

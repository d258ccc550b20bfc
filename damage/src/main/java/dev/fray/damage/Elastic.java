package dev.fray.damage;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.damage.elastic.ElasticParameters;
import dev.fray.damage.elastic.FixedCorotated;
import dev.fray.damage.elastic.HenckyStVK;
import dev.fray.damage.elastic.NeoHookean;

import java.util.List;

/**
 * Static factories for the isotropic elastic laws. Parameters are validated here, so a bad value fails when the
 * law is made, with a message that names the field, its unit and the allowed range.
 */
public final class Elastic {
    private static final List<String> NAMES = List.of(FixedCorotated.NAME, NeoHookean.NAME, HenckyStVK.NAME);

    private Elastic() {
    }

    /**
     * Fixed corotated elasticity (Stomakhin et al. 2012), robust under large rotation and inversion.
     *
     * @param youngsModulus Young's modulus E, Pa, &gt; 0
     * @param poissonRatio  Poisson ratio nu, in (-1, 0.5)
     * @param density       density rho, kg/m^3, &gt; 0
     * @return the law, named "fixed-corotated"
     * @throws InvalidInputException with key OUT_OF_RANGE or NOT_FINITE for a bad parameter
     */
    public static MaterialLaw fixedCorotated(double youngsModulus, double poissonRatio, double density) {
        return new FixedCorotated(new ElasticParameters(youngsModulus, poissonRatio, density));
    }

    /**
     * Compressible Neo-Hookean elasticity (Bonet and Wood).
     *
     * @param youngsModulus Young's modulus E, Pa, &gt; 0
     * @param poissonRatio  Poisson ratio nu, in (-1, 0.5)
     * @param density       density rho, kg/m^3, &gt; 0
     * @return the law, named "neo-hookean"
     * @throws InvalidInputException with key OUT_OF_RANGE or NOT_FINITE for a bad parameter
     */
    public static MaterialLaw neoHookean(double youngsModulus, double poissonRatio, double density) {
        return new NeoHookean(new ElasticParameters(youngsModulus, poissonRatio, density));
    }

    /**
     * St. Venant-Kirchhoff elasticity on Hencky (logarithmic) strain.
     *
     * @param youngsModulus Young's modulus E, Pa, &gt; 0
     * @param poissonRatio  Poisson ratio nu, in (-1, 0.5)
     * @param density       density rho, kg/m^3, &gt; 0
     * @return the law, named "stvk-hencky"
     * @throws InvalidInputException with key OUT_OF_RANGE or NOT_FINITE for a bad parameter
     */
    public static MaterialLaw henckyStVK(double youngsModulus, double poissonRatio, double density) {
        return new HenckyStVK(new ElasticParameters(youngsModulus, poissonRatio, density));
    }

    /**
     * Makes a law from its registry name, as a scene file gives it.
     *
     * @param name          one of {@link #names()}, exact spelling
     * @param youngsModulus Young's modulus E, Pa, &gt; 0
     * @param poissonRatio  Poisson ratio nu, in (-1, 0.5)
     * @param density       density rho, kg/m^3, &gt; 0
     * @return the law
     * @throws InvalidInputException with key UNKNOWN_NAME (parts: "material law", the name, the known names) for an
     *         unknown name, MISSING for a null name, OUT_OF_RANGE or NOT_FINITE for a bad parameter
     */
    public static MaterialLaw byName(String name, double youngsModulus, double poissonRatio, double density) {
        Checks.notNull("material law name", name);
        switch (name) {
            case FixedCorotated.NAME:
                return fixedCorotated(youngsModulus, poissonRatio, density);
            case NeoHookean.NAME:
                return neoHookean(youngsModulus, poissonRatio, density);
            case HenckyStVK.NAME:
                return henckyStVK(youngsModulus, poissonRatio, density);
            default:
                throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "material law", name,
                        String.join(", ", NAMES));
        }
    }

    /** @return the names {@link #byName} accepts, unmodifiable, in a fixed order */
    public static List<String> names() {
        return NAMES;
    }
}

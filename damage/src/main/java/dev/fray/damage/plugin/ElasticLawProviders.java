package dev.fray.damage.plugin;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.plugin.Parameters;
import dev.fray.damage.elastic.ElasticParameters;
import dev.fray.damage.elastic.FixedCorotated;
import dev.fray.damage.elastic.HenckyStVK;
import dev.fray.damage.elastic.NeoHookean;

import java.util.function.Function;

/**
 * Scene-file providers of the isotropic elastic laws, registered in
 * {@code META-INF/services/dev.fray.core.plugin.MaterialLawProvider}: "fixed-corotated", "neo-hookean" and
 * "stvk-hencky". Each takes the parameters {@value #YOUNGS_MODULUS} (Pa), {@value #POISSON_RATIO}
 * (dimensionless, in (-1, 0.5)) and {@value #DENSITY} (kg/m^3), all required.
 *
 * <p>Unknown names are reported before missing ones, so a misspelt "youngModulus" gives UNKNOWN_NAME with a
 * did-you-mean suggestion rather than "youngsModulus is required". Field names in errors start with
 * {@link Parameters#where()}, so the user sees the place in the scene file.
 */
public final class ElasticLawProviders {
    /** Parameter name of Young's modulus E, Pa, &gt; 0. */
    public static final String YOUNGS_MODULUS = "youngsModulus";
    /** Parameter name of the Poisson ratio nu, dimensionless, in (-1, 0.5). */
    public static final String POISSON_RATIO = "poissonRatio";
    /** Parameter name of the density rho, kg/m^3, &gt; 0. */
    public static final String DENSITY = "density";

    private static final String PARAMETER_LIST =
            YOUNGS_MODULUS + " (Pa), " + POISSON_RATIO + ", " + DENSITY + " (kg/m^3)";

    private ElasticLawProviders() {
    }

    /**
     * Reads and validates the three elastic constants, then checks that no other parameter was given.
     *
     * @param params the parameters (marked as read)
     * @return validated constants
     * @throws InvalidInputException UNKNOWN_NAME for a parameter that is not one of the three (with a
     *         suggestion), MISSING for an absent one, OUT_OF_RANGE or NOT_FINITE for a bad value; the field
     *         starts with params.where()
     */
    public static ElasticParameters readElasticParameters(Parameters params) {
        Checks.notNull("parameters", params);
        // NaN marks "absent": Parameters.number rejects a given NaN, so it cannot come from the file
        double e = params.number(YOUNGS_MODULUS, Double.NaN);
        double nu = params.number(POISSON_RATIO, Double.NaN);
        double rho = params.number(DENSITY, Double.NaN);
        params.requireAllUsed();
        String w = params.where() + ".";
        require(w + YOUNGS_MODULUS, e);
        require(w + POISSON_RATIO, nu);
        require(w + DENSITY, rho);
        Checks.positive(w + YOUNGS_MODULUS + " (Pa)", e);
        Checks.inRange(w + POISSON_RATIO, nu, -1.0, true, 0.5, true);
        Checks.positive(w + DENSITY + " (kg/m^3)", rho);
        return new ElasticParameters(e, nu, rho);
    }

    private static void require(String field, double value) {
        if (Double.isNaN(value)) {
            throw new InvalidInputException(FrayMessage.MISSING, field);
        }
    }

    /** Shared body of the three providers. */
    private abstract static class Base extends NamedLawProvider {
        private final Function<ElasticParameters, MaterialLaw> factory;

        Base(String name, String law, Function<ElasticParameters, MaterialLaw> factory) {
            super(name, law + "; parameters " + PARAMETER_LIST);
            this.factory = factory;
        }

        @Override
        public final MaterialLaw create(Parameters params) {
            return factory.apply(readElasticParameters(params));
        }
    }

    /** Provider of {@link FixedCorotated}, "fixed-corotated". */
    public static final class FixedCorotatedProvider extends Base {
        /** Creates the provider (ServiceLoader needs a public no-argument constructor). */
        public FixedCorotatedProvider() {
            super(FixedCorotated.NAME, "fixed corotated elasticity (Stomakhin et al. 2012)", FixedCorotated::new);
        }
    }

    /** Provider of {@link NeoHookean}, "neo-hookean". */
    public static final class NeoHookeanProvider extends Base {
        /** Creates the provider (ServiceLoader needs a public no-argument constructor). */
        public NeoHookeanProvider() {
            super(NeoHookean.NAME, "compressible Neo-Hookean elasticity (Bonet and Wood)", NeoHookean::new);
        }
    }

    /** Provider of {@link HenckyStVK}, "stvk-hencky". */
    public static final class HenckyStVKProvider extends Base {
        /** Creates the provider (ServiceLoader needs a public no-argument constructor). */
        public HenckyStVKProvider() {
            super(HenckyStVK.NAME, "St. Venant-Kirchhoff elasticity on Hencky strain", HenckyStVK::new);
        }
    }
}

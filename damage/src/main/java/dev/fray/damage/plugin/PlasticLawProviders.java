package dev.fray.damage.plugin;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.plugin.Parameters;
import dev.fray.damage.elastic.ElasticParameters;
import dev.fray.damage.plastic.CamClay;
import dev.fray.damage.plastic.DruckerPrager;
import dev.fray.damage.plastic.VonMises;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Scene-file providers of the plastic laws, registered in
 * {@code META-INF/services/dev.fray.core.plugin.MaterialLawProvider}: "von-mises", "drucker-prager" and
 * "cam-clay". Each takes the elastic parameters of {@link ElasticLawProviders} (youngsModulus in Pa, poissonRatio,
 * density in kg/m^3) and its own, in engineering units:
 * <ul>
 *   <li>von-mises: {@value #YIELD_STRESS} (Pa, &gt; 0, required), {@value #HARDENING_MODULUS} (Pa, &gt;= 0,
 *       default 0);</li>
 *   <li>drucker-prager: {@value #FRICTION_ANGLE} (degrees, in [0, 90), required), {@value #COHESION} (Pa, &gt;= 0,
 *       default 0);</li>
 *   <li>cam-clay: {@value #FRICTION_ANGLE} (degrees, in (0, 90), required), {@value #CONSOLIDATION_PRESSURE} (Pa,
 *       &gt; 0, required), {@value #HARDENING_FACTOR} (in (0, 100], required), {@value #TENSILE_RATIO} (in [0, 1],
 *       default 0).</li>
 * </ul>
 * As for the elastic laws, unknown names are reported before missing ones, and field names in errors start with
 * {@link Parameters#where()}.
 */
public final class PlasticLawProviders {
    /** Parameter name of the von Mises yield stress, Pa. */
    public static final String YIELD_STRESS = "yieldStress";
    /** Parameter name of the von Mises hardening modulus, Pa. */
    public static final String HARDENING_MODULUS = "hardeningModulus";
    /** Parameter name of the friction angle, degrees. */
    public static final String FRICTION_ANGLE = "frictionAngle";
    /** Parameter name of the Drucker-Prager cohesion, Pa. */
    public static final String COHESION = "cohesion";
    /** Parameter name of the Cam-Clay consolidation pressure, Pa. */
    public static final String CONSOLIDATION_PRESSURE = "consolidationPressure";
    /** Parameter name of the Cam-Clay tensile ratio, dimensionless. */
    public static final String TENSILE_RATIO = "tensileRatio";
    /** Parameter name of the Cam-Clay hardening factor, dimensionless. */
    public static final String HARDENING_FACTOR = "hardeningFactor";

    private static final String ELASTIC = ElasticLawProviders.YOUNGS_MODULUS + " (Pa), "
            + ElasticLawProviders.POISSON_RATIO + ", " + ElasticLawProviders.DENSITY + " (kg/m^3), ";

    private PlasticLawProviders() {
    }

    /**
     * The scene-file parameters of a plastic law made by {@link dev.fray.damage.Plastic} or the constructors, so
     * that a scene writer can write it; optional parameters at their default (zero) are left out.
     *
     * @param law any law
     * @return the parameters in a fixed order, or null if the law is not one of the three plastic laws
     */
    public static Map<String, Object> parametersOf(MaterialLaw law) {
        Map<String, Object> m = new LinkedHashMap<>();
        ElasticParameters e;
        if (law instanceof VonMises vm) {
            e = vm.parameters();
            m.put(YIELD_STRESS, vm.yieldStress());
            putUnlessZero(m, HARDENING_MODULUS, vm.hardeningModulus());
        } else if (law instanceof DruckerPrager dp) {
            e = dp.parameters();
            m.put(FRICTION_ANGLE, dp.frictionAngle());
            putUnlessZero(m, COHESION, dp.cohesion());
        } else if (law instanceof CamClay cc) {
            e = cc.parameters();
            m.put(FRICTION_ANGLE, cc.frictionAngle());
            m.put(CONSOLIDATION_PRESSURE, cc.consolidationPressure());
            m.put(HARDENING_FACTOR, cc.hardeningFactor());
            putUnlessZero(m, TENSILE_RATIO, cc.tensileRatio());
        } else {
            return null;
        }
        Map<String, Object> out = new LinkedHashMap<>();
        out.put(ElasticLawProviders.YOUNGS_MODULUS, e.youngsModulus());
        out.put(ElasticLawProviders.POISSON_RATIO, e.poissonRatio());
        out.put(ElasticLawProviders.DENSITY, e.density());
        out.putAll(m);
        return out;
    }

    private static void putUnlessZero(Map<String, Object> m, String key, double value) {
        if (value != 0.0) {
            m.put(key, value);
        }
    }

    /** Reads an optional number; NaN marks "absent" (Parameters.number rejects a given NaN). */
    private static double read(Parameters params, String name) {
        return params.number(name, Double.NaN);
    }

    /** A required parameter that was absent. */
    private static double require(Parameters params, String name, double value) {
        if (Double.isNaN(value)) {
            throw new InvalidInputException(FrayMessage.MISSING, params.where() + "." + name);
        }
        return value;
    }

    private static double orZero(double value) {
        return Double.isNaN(value) ? 0.0 : value;
    }

    /** Provider of {@link VonMises}, "von-mises". */
    public static final class VonMisesProvider extends NamedLawProvider {
        /** Creates the provider (ServiceLoader needs a public no-argument constructor). */
        public VonMisesProvider() {
            super(VonMises.NAME, "von Mises (J2) plasticity on Hencky strain with linear isotropic hardening; "
                    + "parameters " + ELASTIC + YIELD_STRESS + " (Pa), " + HARDENING_MODULUS + " (Pa, default 0)");
        }

        @Override
        public MaterialLaw create(Parameters params) {
            double yield = read(params, YIELD_STRESS);
            double hardening = orZero(read(params, HARDENING_MODULUS));
            ElasticParameters e = ElasticLawProviders.readElasticParameters(params);
            String w = params.where() + ".";
            VonMises.check(w, require(params, YIELD_STRESS, yield), hardening);
            return new VonMises(e, yield, hardening);
        }
    }

    /** Provider of {@link DruckerPrager}, "drucker-prager". */
    public static final class DruckerPragerProvider extends NamedLawProvider {
        /** Creates the provider (ServiceLoader needs a public no-argument constructor). */
        public DruckerPragerProvider() {
            super(DruckerPrager.NAME, "Drucker-Prager plasticity for granular matter (Klar et al. 2016); parameters "
                    + ELASTIC + FRICTION_ANGLE + " (degrees), " + COHESION + " (Pa, default 0)");
        }

        @Override
        public MaterialLaw create(Parameters params) {
            double phi = read(params, FRICTION_ANGLE);
            double cohesion = orZero(read(params, COHESION));
            ElasticParameters e = ElasticLawProviders.readElasticParameters(params);
            DruckerPrager.check(params.where() + ".", require(params, FRICTION_ANGLE, phi), cohesion);
            return new DruckerPrager(e, phi, cohesion);
        }
    }

    /** Provider of {@link CamClay}, "cam-clay". */
    public static final class CamClayProvider extends NamedLawProvider {
        /** Creates the provider (ServiceLoader needs a public no-argument constructor). */
        public CamClayProvider() {
            super(CamClay.NAME, "non-associated Cam-Clay with hardening (Wolper et al. 2019); parameters "
                    + ELASTIC + FRICTION_ANGLE + " (degrees), " + CONSOLIDATION_PRESSURE + " (Pa), "
                    + HARDENING_FACTOR + ", " + TENSILE_RATIO + " (default 0)");
        }

        @Override
        public MaterialLaw create(Parameters params) {
            double phi = read(params, FRICTION_ANGLE);
            double pc = read(params, CONSOLIDATION_PRESSURE);
            double xi = read(params, HARDENING_FACTOR);
            double beta = orZero(read(params, TENSILE_RATIO));
            ElasticParameters e = ElasticLawProviders.readElasticParameters(params);
            CamClay.check(params.where() + ".", require(params, FRICTION_ANGLE, phi),
                    require(params, CONSOLIDATION_PRESSURE, pc), beta, require(params, HARDENING_FACTOR, xi));
            return new CamClay(e, phi, pc, beta, xi);
        }
    }
}

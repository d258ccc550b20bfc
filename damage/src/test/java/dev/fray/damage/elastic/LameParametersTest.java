package dev.fray.damage.elastic;

import dev.fray.core.material.MaterialLaw;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;

/** VALIDATION.md A1: Lamé parameters and wave speed from Young's modulus, Poisson ratio and density. */
class LameParametersTest extends FrayTestBase {
    /** The worked values below are given to the cent, so they can be off by half a cent. */
    private static final double HAND_ROUNDING_PA = 0.005;
    /** Identities between elastic constants hold to a few ulps of the moduli. */
    private static final double IDENTITY_RELATIVE = 1e-13;

    @Test
    void workedTextbookCase() {
        // published: Timoshenko and Goodier, Theory of Elasticity (mu = E/(2(1+nu)), lambda = E nu/((1+nu)(1-2nu)));
        // by hand: mu = 1e6 / 2.6 = 384615.38 Pa, lambda = 3e5 / (1.3 * 0.4) = 3e5 / 0.52 = 576923.08 Pa
        ElasticParameters p = new ElasticParameters(1e6, 0.3, 1000.0);
        assertEquals(384615.38, p.mu(), HAND_ROUNDING_PA);
        assertEquals(576923.08, p.lambda(), HAND_ROUNDING_PA);
    }

    @Test
    void zeroPoissonRatioHasNoLateralCoupling() {
        // published: Timoshenko and Goodier, Theory of Elasticity: nu = 0 gives lambda = 0 and mu = E/2
        ElasticParameters p = new ElasticParameters(2e9, 0.0, 500.0);
        assertEquals(0.0, p.lambda(), 0.0);
        assertEquals(1e9, p.mu(), 0.0);
    }

    @ParameterizedTest(name = "E = {0} Pa, nu = {1}, rho = {2} kg/m^3")
    @CsvSource({"1e6, 0.3, 1000", "2.1e11, 0.29, 7850", "1e4, -0.5, 50", "5e7, 0.499, 1100", "3e9, -0.99, 2500",
            "7e10, 0.0, 2700"})
    void agreesWithTheOtherTextbookRelations(double e, double nu, double rho) {
        // published: Timoshenko and Goodier, Theory of Elasticity; the standard conversion table between
        // E, nu, K, M, lambda, mu (bulk modulus K, P-wave modulus M), derived independently of the formulas under test
        ElasticParameters p = new ElasticParameters(e, nu, rho);
        double mu = p.mu();
        double lambda = p.lambda();
        assertRelative(e / (3.0 * (1.0 - 2.0 * nu)), lambda + 2.0 * mu / 3.0, "bulk modulus K = E/(3(1-2nu))");
        assertRelative(e * (1.0 - nu) / ((1.0 + nu) * (1.0 - 2.0 * nu)), lambda + 2.0 * mu,
                "P-wave modulus M = E(1-nu)/((1+nu)(1-2nu))");
        assertRelative(e, mu * (3.0 * lambda + 2.0 * mu) / (lambda + mu), "E = mu(3 lambda + 2 mu)/(lambda + mu)");
        assertEquals(nu, lambda / (2.0 * (lambda + mu)), IDENTITY_RELATIVE, "nu = lambda/(2(lambda + mu))");
        // published: P-wave speed c = sqrt(M / rho) (any elasticity or wave-propagation text)
        double m = e * (1.0 - nu) / ((1.0 + nu) * (1.0 - 2.0 * nu));
        assertRelative(Math.sqrt(m / rho), p.pWaveSpeed(), "P-wave speed");
    }

    @ParameterizedTest(name = "E = {0} Pa, nu = {1}, rho = {2} kg/m^3")
    @CsvSource({"1e6, 0.3, 1000", "2.1e11, 0.29, 7850", "1e4, -0.5, 50"})
    void everyLawReportsThePWaveSpeedAndTheDensity(double e, double nu, double rho) {
        // published: sqrt((lambda + 2 mu)/rho) is the fastest elastic wave of an isotropic solid at rest
        double c = new ElasticParameters(e, nu, rho).pWaveSpeed();
        List<MaterialLaw> laws = List.of(Elastic.fixedCorotated(e, nu, rho), Elastic.neoHookean(e, nu, rho),
                Elastic.henckyStVK(e, nu, rho));
        for (MaterialLaw law : laws) {
            assertEquals(c, law.waveSpeed(), 0.0, law.name());
            assertEquals(rho, law.density(), 0.0, law.name());
        }
    }

    private static void assertRelative(double expected, double actual, String what) {
        assertEquals(expected, actual, IDENTITY_RELATIVE * Math.abs(expected), what);
    }
}

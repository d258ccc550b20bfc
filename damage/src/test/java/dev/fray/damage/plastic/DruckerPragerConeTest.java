package dev.fray.damage.plastic;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Plastic;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * VALIDATION.md A9, the Drucker-Prager cone. Published: Klar et al., Drucker-Prager elastoplasticity for sand
 * animation (ACM TOG 35(4), 2016): friction angle phi maps to alpha = sqrt(2/3) 2 sin(phi) / (3 - sin(phi)), and
 * the admissible Kirchhoff stresses are |dev tau| + alpha tr(tau) &lt;= 0; states inside are untouched by the return
 * mapping, states outside land on the cone. With cohesion c the cone is shifted by the classical fit of the cone to
 * the Mohr-Coulomb surface (e.g. Chen and Han, Plasticity for Structural Engineers, 1988): kappa = sqrt(2/3) 6 c
 * cos(phi) / (3 - sin(phi)) on the right-hand side, apex at mean stress c cot(phi).
 */
class DruckerPragerConeTest extends FrayTestBase {
    private static final int SAMPLES = 400;
    /** Stiffness of the samples, Pa; tolerances are relative to it. */
    private static final double YOUNGS = 1e6;

    @ParameterizedTest(name = "phi = {0} degrees, c = {1} Pa")
    @CsvSource({"20, 0", "30, 0", "35, 0", "45, 0", "30, 2000", "0, 2000"})
    void insideIsUntouchedAndOutsideLandsOnTheCone(double phi, double cohesion, TestReporter reporter) {
        DruckerPrager law = (DruckerPrager) Plastic.druckerPrager(YOUNGS, 0.3, 1600, phi, cohesion);
        double sin = Math.sin(Math.toRadians(phi));
        double alpha = Math.sqrt(2.0 / 3.0) * 2 * sin / (3 - sin);
        double kappa = Math.sqrt(2.0 / 3.0) * 6 * cohesion * Math.cos(Math.toRadians(phi)) / (3 - sin);
        assertEquals(alpha, law.alpha(), 1e-15, "alpha");
        double scale = YOUNGS * 1e-12;
        int inside = 0, cone = 0, apex = 0;
        double worst = 0;
        for (int i = 0; i < SAMPLES; i++) {
            // principal log strains from compression to tension, shear from tiny to large
            double mean = -0.02 + 0.03 * rand.nextDouble();
            double shear = (Math.abs(mean) + 0.004) * 2 * rand.nextDouble();
            double[] f = PlasticProbe.deformation(rand, mean + shear * rand.nextGaussian(),
                    mean + shear * rand.nextGaussian(), mean + shear * rand.nextGaussian());
            PlasticProbe probe = new PlasticProbe(law, f.clone());
            double trialDev = probe.deviatorNorm();
            double trialTrace = probe.traceTau();
            double lnJ = Math.log(probe.det());
            double yield = trialDev + alpha * trialTrace - kappa;
            assertEquals(-1, probe.project(), "status");
            if (yield <= 0) {
                inside++;
                assertArrayEquals(f, probe.f, 0.0, "F inside the cone must be untouched");
                assertEquals(0.0, probe.channel(HenckyPlasticLaw.PLASTIC_STRAIN), 0.0);
                continue;
            }
            double dev = probe.deviatorNorm();
            double trace = probe.traceTau();
            if (dev < scale) {
                // at the apex: no shear, mean stress c cot(phi) (zero for sand)
                apex++;
                double apexMean = cohesion * Math.cos(Math.toRadians(phi)) / sin;
                assertEquals(apexMean, trace / 3, 1e-9 * YOUNGS, "mean stress at the apex");
                assertEquals(lnJ - Math.log(probe.det()), probe.channel(HenckyPlasticLaw.PLASTIC_VOLUME), 1e-12,
                        "plastic volume = ln of the removed volume");
            } else {
                cone++;
                double miss = Math.abs(dev + alpha * trace - kappa) / YOUNGS;
                worst = Math.max(worst, miss);
                assertTrue(miss < 1e-12, "off the cone by " + miss + " E");
                assertTrue(dev < trialDev, "shear reduced");
                // the flow is deviatoric off the apex: volume and mean stress kept
                assertEquals(trialTrace, trace, 1e-9 * YOUNGS, "tr tau kept");
                assertEquals(0.0, probe.channel(HenckyPlasticLaw.PLASTIC_VOLUME), 1e-15);
            }
            assertTrue(probe.channel(HenckyPlasticLaw.PLASTIC_STRAIN) > 0, "plastic strain recorded");
        }
        reporter.publishEntry("inside, on cone, at apex, worst miss / E", inside + ", " + cone + ", " + apex + ", "
                + worst);
        assertTrue(inside > 20 && cone > 20, inside + " inside, " + cone + " on the cone");
        if (phi > 0) {
            assertTrue(apex > 20, apex + " at the apex");
        }
    }
}

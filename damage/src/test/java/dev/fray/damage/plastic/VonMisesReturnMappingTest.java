package dev.fray.damage.plastic;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Plastic;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * VALIDATION.md G30, the J2 return mapping. Published: Simo and Hughes, Computational Inelasticity (Springer, 1998),
 * chapter 2 (uniaxial elastoplasticity with linear isotropic hardening: stress sigma_y at yield, then the tangent
 * modulus E H / (E + H)) and box 3.2 (radial return: the state lands on |s| = sqrt(2/3) (sigma_y + H epbar) and the
 * plastic flow is deviatoric, so det F<sub>P</sub> = 1); Simo, CMAME 99 (1992) for carrying the radial return
 * over to principal logarithmic strains, where it is exact for finite strain.
 */
class VonMisesReturnMappingTest extends FrayTestBase {
    private static final double E = 2e6;
    private static final double NU = 0.3;
    private static final double YIELD = 2e4;

    @ParameterizedTest(name = "H = {0} Pa")
    @ValueSource(doubles = {0, 2e5})
    void landsOnTheYieldSurfaceAndKeepsPlasticVolume(double hardening, TestReporter reporter) {
        VonMises law = (VonMises) Plastic.vonMises(E, NU, 1000, YIELD, hardening);
        int inside = 0, projected = 0;
        double worstRadius = 0, worstVolume = 0;
        for (int i = 0; i < 300; i++) {
            double mean = 0.02 * rand.nextGaussian();
            double shear = 0.04 * rand.nextDouble();
            double[] f = PlasticProbe.deformation(rand, mean + shear * rand.nextGaussian(),
                    mean + shear * rand.nextGaussian(), mean + shear * rand.nextGaussian());
            double startStrain = 0.05 * rand.nextDouble();
            PlasticProbe probe = new PlasticProbe(law, f.clone()).with(HenckyPlasticLaw.PLASTIC_STRAIN, startStrain);
            double trialDev = probe.deviatorNorm();
            double trialTrace = probe.traceTau();
            double trialDet = probe.det();
            assertEquals(-1, probe.project());
            double ep = probe.channel(HenckyPlasticLaw.PLASTIC_STRAIN);
            double radius = Math.sqrt(2.0 / 3.0) * (YIELD + hardening * ep);
            if (trialDev <= Math.sqrt(2.0 / 3.0) * (YIELD + hardening * startStrain)) {
                inside++;
                assertArrayEquals(f, probe.f, 0.0, "F inside the yield surface must be untouched");
                assertEquals(startStrain, ep, 0.0);
                continue;
            }
            projected++;
            double radiusError = Math.abs(probe.deviatorNorm() - radius) / YIELD;
            double volumeError = Math.abs(probe.det() / trialDet - 1);
            worstRadius = Math.max(worstRadius, radiusError);
            worstVolume = Math.max(worstVolume, volumeError);
            assertTrue(radiusError < 1e-10, "|dev tau| off sqrt(2/3)(sigma_y + H epbar) by " + radiusError);
            assertTrue(volumeError < 1e-12, "det Fp - 1 = " + volumeError);
            assertEquals(trialTrace, probe.traceTau(), 1e-9 * YIELD, "pressure kept");
            assertTrue(ep > startStrain, "plastic strain grows");
        }
        reporter.publishEntry("inside, projected, worst radius / sigma_y, worst |det Fp - 1|",
                inside + ", " + projected + ", " + worstRadius + ", " + worstVolume);
        assertTrue(inside > 30 && projected > 30, inside + " inside, " + projected + " projected");
    }

    /**
     * A bar in uniaxial tension, driven in small strain increments at zero lateral stress, as a strain-driven
     * material test: Kirchhoff stress against logarithmic strain is E eps up to sigma_y, then
     * sigma_y + E H / (E + H) (eps - sigma_y / E), within 2% (the target of VALIDATION.md G30).
     */
    @Test
    void uniaxialTensionFollowsTheBilinearCurve(TestReporter reporter) {
        double hardening = 1e5;
        VonMises law = (VonMises) Plastic.vonMises(E, NU, 1000, YIELD, hardening);
        double tangent = E * hardening / (E + hardening);
        double yieldStrain = YIELD / E;
        double[] fe = {1, 0, 0, 0, 1, 0, 0, 0, 1};
        double ep = 0;
        double axial = 0;
        double step = yieldStrain / 7.3;
        double worst = 0;
        for (int k = 0; k < 60; k++) {
            axial += step;
            // the lateral strain increment that leaves the lateral stress at zero, by bisection
            double lo = -step, hi = 0;
            PlasticProbe trial = null;
            for (int it = 0; it < 200; it++) {
                double mid = 0.5 * (lo + hi);
                trial = trialState(law, fe, ep, step, mid);
                if (trial.tau()[4] > 0) {
                    hi = mid;
                } else {
                    lo = mid;
                }
            }
            fe = trial.f;
            ep = trial.channel(HenckyPlasticLaw.PLASTIC_STRAIN);
            double stress = trial.tau()[0];
            double expected = axial <= yieldStrain ? E * axial : YIELD + tangent * (axial - yieldStrain);
            double error = Math.abs(stress - expected) / expected;
            worst = Math.max(worst, error);
            assertTrue(error < 0.02, "at strain " + axial + ": tau " + stress + " Pa, bilinear " + expected);
            assertEquals(0.0, trial.tau()[4] / YIELD, 1e-9, "lateral stress");
        }
        reporter.publishEntry("worst relative deviation from the bilinear curve", Double.toString(worst));
        assertTrue(axial > 5 * yieldStrain, "the run reaches well into hardening");
    }

    /** The elastic F of the next increment, projected: F<sub>E</sub> diag(exp(da), exp(dl), exp(dl)). */
    private static PlasticProbe trialState(VonMises law, double[] fe, double ep, double da, double dl) {
        double[] f = fe.clone();
        f[0] *= Math.exp(da);
        f[4] *= Math.exp(dl);
        f[8] *= Math.exp(dl);
        PlasticProbe probe = new PlasticProbe(law, f).with(HenckyPlasticLaw.PLASTIC_STRAIN, ep);
        assertEquals(-1, probe.project());
        return probe;
    }
}

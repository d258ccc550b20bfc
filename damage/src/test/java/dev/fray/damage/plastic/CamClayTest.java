package dev.fray.damage.plastic;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Plastic;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;

/**
 * Cam-Clay: the yield surface and the hardening law match their closed forms at sampled states. Published: the
 * yield function y(p, q) = (1 + 2 beta) q^2 + M^2 (p + beta p0)(p - p0) and hardening p0 = K sinh(xi max(-a, 0)) of
 * Wolper et al., CD-MPM (ACM TOG 38(4), 2019) and Gaume et al. (Nature Communications 9, 2018); M = 6 sin(phi) /
 * (3 - sin(phi)), the critical state slope matched to Mohr-Coulomb in triaxial compression (Wood, Soil Behaviour and
 * Critical State Soil Mechanics, 1990). The invariants are computed here from the Kirchhoff stress the law returns,
 * independently of the law's own formulas.
 */
class CamClayTest extends FrayTestBase {
    private static final double E = 1e6;
    private static final double NU = 0.3;
    private static final double PHI = 35;
    private static final double PC = 2e4;
    private static final double BETA = 0.3;
    private static final double XI = 3;
    private static final double MU = E / (2 * (1 + NU));
    private static final double K = E / (3 * (1 - 2 * NU));
    private static final double M = 6 * Math.sin(Math.toRadians(PHI)) / (3 - Math.sin(Math.toRadians(PHI)));
    private static final double A0 = -asinh(PC / K) / XI;

    private final CamClay law = (CamClay) Plastic.camClay(E, NU, 1500, PHI, PC, BETA, XI);

    private static double asinh(double x) {
        return Math.log(x + Math.sqrt(x * x + 1));
    }

    /** Closed-form hardening law: p0 for the plastic volume channel v, with a = a0 + v. */
    private static double p0(double v) {
        return K * Math.sinh(XI * Math.max(-(A0 + v), 0));
    }

    private static double yieldFunction(double p, double q, double p0) {
        return (1 + 2 * BETA) * q * q + M * M * (p + BETA * p0) * (p - p0);
    }

    /** A particle at pressure p and equivalent shear q (Pa), shear in a random direction. */
    private PlasticProbe state(double p, double q, double v) {
        double tr = -p / K;
        double dev = q / (Math.sqrt(1.5) * 2 * MU);
        // a deviatoric direction with unit norm, random in the plane of deviators
        double t = 2 * Math.PI * rand.nextDouble();
        double a = Math.sqrt(2.0 / 3.0);
        double d0 = a * Math.cos(t), d1 = a * Math.cos(t - 2 * Math.PI / 3), d2 = a * Math.cos(t + 2 * Math.PI / 3);
        return new PlasticProbe(law, PlasticProbe.deformation(rand, tr / 3 + dev * d0, tr / 3 + dev * d1,
                tr / 3 + dev * d2)).with(HenckyPlasticLaw.PLASTIC_VOLUME, v);
    }

    private static double pressure(PlasticProbe probe) {
        return -probe.traceTau() / 3;
    }

    private static double shear(PlasticProbe probe) {
        return Math.sqrt(1.5) * probe.deviatorNorm();
    }

    @Test
    void constantsMatchTheirClosedForms() {
        assertEquals(M, law.criticalStateSlope(), 1e-14);
        // undisturbed material (no plastic volume yet) has the consolidation pressure it was given
        assertEquals(PC, law.consolidationPressureAt(0), 1e-9 * PC);
        for (double v : new double[] {-0.2, -0.05, 0, 0.01, 0.5}) {
            assertEquals(p0(v), law.consolidationPressureAt(v), 1e-12 * PC, "p0 at plastic volume " + v);
        }
    }

    @Test
    void yieldSurfaceMatchesItsClosedForm(TestReporter reporter) {
        int inside = 0, surface = 0, compacted = 0, dilated = 0;
        double worst = 0;
        for (int i = 0; i < 600; i++) {
            // up to a = a0 + v = -0.002, where p0 is still a tenth of pc
            double v = -0.03 + (0.028 + A0 + 0.002) * rand.nextDouble();
            double p0 = p0(v);
            double p = (-0.6 + 1.9 * rand.nextDouble()) * p0;
            double q = 1.2 * M * p0 * rand.nextDouble();
            PlasticProbe probe = state(p, q, v);
            double[] f = probe.f.clone();
            // the state as the law sees it (rounding of building F aside)
            double p1 = pressure(probe), q1 = shear(probe);
            double trialTrace = Math.log(probe.det());
            assertEquals(-1, probe.project());
            double pAfter = pressure(probe), qAfter = shear(probe);
            double vAfter = probe.channel(HenckyPlasticLaw.PLASTIC_VOLUME);
            if (p1 > p0 || p1 < -BETA * p0) {
                // beyond an end of the ellipse: to the tip, with the volume change booked as plastic volume
                double tip = p1 > p0 ? p0 : -BETA * p0;
                if (p1 > p0) {
                    compacted++;
                } else {
                    dilated++;
                }
                assertEquals(tip, pAfter, 1e-9 * PC, "pressure at the tip");
                assertEquals(0.0, qAfter, 1e-9 * PC, "no shear at the tip");
                assertEquals(v + trialTrace - Math.log(probe.det()), vAfter, 1e-12, "plastic volume = ln(J/J')");
                assertEquals(p1 > p0, vAfter < v, "compaction lowers, dilation raises the plastic volume");
            } else if (yieldFunction(p1, q1, p0) <= 0) {
                inside++;
                assertArrayEquals(f, probe.f, 0.0, "an admissible state is untouched");
                assertEquals(v, vAfter, 0.0);
            } else {
                surface++;
                double miss = Math.abs(yieldFunction(pAfter, qAfter, p0)) / (M * M * p0 * p0);
                worst = Math.max(worst, miss);
                assertTrue(miss < 1e-9, "y(p, q) / (M p0)^2 = " + miss + " after the projection");
                assertEquals(p1, pAfter, 1e-9 * PC, "pressure kept (non-associated flow)");
                assertTrue(qAfter < q1);
                assertEquals(v, vAfter, 1e-15, "no volume change");
            }
        }
        reporter.publishEntry("inside, on the ellipse, compacted, dilated, worst |y| / (M p0)^2",
                inside + ", " + surface + ", " + compacted + ", " + dilated + ", " + worst);
        assertTrue(inside > 30 && surface > 30 && compacted > 30 && dilated > 30,
                inside + ", " + surface + ", " + compacted + ", " + dilated);
    }

    @Test
    void ellipseIsTallestAtItsCentre() {
        // closed form: at p = (1 - beta) p0 / 2 the ellipse reaches q = M (1 + beta) p0 / (2 sqrt(1 + 2 beta))
        double v = -0.01;
        double p0 = p0(v);
        PlasticProbe probe = state((1 - BETA) * p0 / 2, 3 * M * p0, v);
        assertEquals(-1, probe.project());
        assertEquals(M * (1 + BETA) * p0 / (2 * Math.sqrt(1 + 2 * BETA)), shear(probe), 1e-9 * p0);
    }

    @Test
    void crumbledMaterialCarriesNoStress() {
        // closed form: at a = a0 + v >= 0 the hardening law gives p0 = 0, the ellipse is the point (0, 0)
        double v = 0.05 - A0;
        assertEquals(0.0, law.consolidationPressureAt(v), 0.0);
        for (int i = 0; i < 20; i++) {
            double[] f = PlasticProbe.deformation(rand, 0.02 * rand.nextGaussian(), 0.02 * rand.nextGaussian(),
                    0.02 * rand.nextGaussian());
            PlasticProbe probe = new PlasticProbe(law, f).with(HenckyPlasticLaw.PLASTIC_VOLUME, v);
            assertEquals(-1, probe.project());
            assertArrayEquals(new double[9], probe.tau(), 1e-9 * PC, "stress of crumbled material");
        }
    }

    /**
     * Isotropic compression in increments past the consolidation pressure: after each step the pressure is the
     * p0 of the hardening law at the plastic volume reached, so the yield pressure follows K sinh(xi (-a)) as the
     * material compacts (and relaxes to a crumbled point when dilated past a = 0).
     */
    @Test
    void compactionFollowsTheHardeningLaw(TestReporter reporter) {
        double[] f = {1, 0, 0, 0, 1, 0, 0, 0, 1};
        PlasticProbe probe = new PlasticProbe(law, f);
        double worst = 0;
        for (int k = 0; k < 40; k++) {
            double before = probe.channel(HenckyPlasticLaw.PLASTIC_VOLUME);
            double s = Math.exp(-0.004);
            for (int d = 0; d < 9; d += 4) {
                f[d] *= s;
            }
            assertEquals(-1, probe.project());
            double v = probe.channel(HenckyPlasticLaw.PLASTIC_VOLUME);
            double p = pressure(probe);
            if (v < before) {
                // compacted this step: the state sits at the tip p0 of the step's yield surface, which moved
                // with the plastic volume of the steps before
                double error = Math.abs(p - p0(before)) / p0(before);
                worst = Math.max(worst, error);
                assertTrue(error < 1e-9, "step " + k + ": p = " + p + ", p0 = " + p0(before));
            } else {
                assertTrue(p <= p0(v) * (1 + 1e-12), "elastic step stays inside");
            }
        }
        double v = probe.channel(HenckyPlasticLaw.PLASTIC_VOLUME);
        reporter.publishEntry("plastic volume reached, p0 / pc, worst tip error", v + ", " + p0(v) / PC + ", "
                + worst);
        assertTrue(v < -0.05 && p0(v) > 2 * PC, "compaction hardened the material: v = " + v);
    }
}

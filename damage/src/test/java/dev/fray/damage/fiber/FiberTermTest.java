package dev.fray.damage.fiber;

import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.math.Mat3;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.RandomMatrices;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * VALIDATION.md A8, fiber terms. Published: Holzapfel, Gasser and Ogden, J. Elasticity 61 (2000), <i>A new
 * constitutive framework for arterial wall mechanics</i>: a fiber family with I4 = a0 . C a0 adds the exponential
 * energy k1/(2 k2) (exp(k2 (I4 - 1)^2) - 1), active only in extension (I4 &gt; 1), so fibers resist stretch and not
 * compression. The quadratic term k/2 (I4 - 1)^2 is its small-strain form (common practice, no source).
 *
 * <p>Closed form used as the oracle, derived here: I4 = a0 . F^T F a0, so dI4/dF = 2 F a0 (x) a0 and the fiber
 * stress is dpsi_f/dF = 2 psi_f'(I4) F a0 (x) a0, with psi_f' = k (I4 - 1) (quadratic) or
 * k1 (I4 - 1) exp(k2 (I4 - 1)^2) (exponential). For the uniaxial stretch F = I + (l - 1) a0 (x) a0,
 * F a0 = l a0, I4 = l^2 and P_f = 2 psi_f'(l^2) l a0 (x) a0.
 */
class FiberTermTest extends FrayTestBase {
    private static final double E = 1e6;
    private static final double NU = 0.3;
    private static final double RHO = 1000.0;
    private static final double K = 3e5;
    private static final double K1 = 2e5;
    private static final double K2 = 1.5;
    /**
     * Closed form and law agree to rounding, amplified by the conditioning of I4 - 1: rounding of I4 (about 2e-16)
     * relative to I4 - 1 = 2e-3 at the smallest stretch checked is 1e-13.
     */
    private static final double CLOSED_FORM_RELATIVE = 1e-12;
    /** VALIDATION.md A3 target for stress against central differences of the energy. */
    private static final double DERIVATIVE_TOLERANCE = 1e-6;
    /** Central-difference step relative to ||F||. */
    private static final double STEP = 1e-6;

    private static MaterialLaw base() {
        return Elastic.neoHookean(E, NU, RHO);
    }

    private static MaterialLaw law(boolean exponential) {
        Fibers.Builder b = Fibers.reinforce(base());
        return (exponential ? b.exponential(K1, K2) : b.quadratic(K)).build();
    }

    /** Closed-form psi_f'(I4), written out here independently of the law. */
    private static double slope(boolean exponential, double i4) {
        double d = i4 - 1;
        if (d <= 0) {
            return 0;
        }
        return exponential ? K1 * d * Math.exp(K2 * d * d) : K * d;
    }

    /** Closed-form psi_f(I4). */
    private static double energy(boolean exponential, double i4) {
        double d = i4 - 1;
        if (d <= 0) {
            return 0;
        }
        // expm1 rather than exp - 1, whose cancellation near I4 = 1 would swamp the comparison
        return exponential ? K1 / (2 * K2) * Math.expm1(K2 * d * d) : 0.5 * K * d * d;
    }

    private static ArrayMaterialState state(double[] f, double[] a0) {
        int n = f.length / 9;
        double[] a = new double[3 * n];
        for (int p = 0; p < n; p++) {
            System.arraycopy(a0, 0, a, 3 * p, 3);
        }
        return new ArrayMaterialState(f).withChannel("fiber-1", a).withChannel("fiber-1-current", new double[3 * n]);
    }

    private static double[] piola(MaterialLaw law, double[] f, double[] a0) {
        double[] out = new double[f.length];
        law.firstPiolaKirchhoff(state(f, a0), 0, f.length / 9, out);
        return out;
    }

    private static double[] kirchhoff(MaterialLaw law, double[] f, double[] a0) {
        double[] out = new double[f.length];
        law.kirchhoffStress(state(f, a0), 0, f.length / 9, out);
        return out;
    }

    private static double[] psi(MaterialLaw law, double[] f, double[] a0) {
        double[] out = new double[f.length / 9];
        law.energyDensity(state(f, a0), 0, f.length / 9, out);
        return out;
    }

    /** F = I + (l - 1) a (x) a: stretch l along the unit vector a, none across it. */
    private static double[] stretchAlong(double[] a, double l) {
        double[] f = new double[9];
        for (int r = 0; r < 3; r++) {
            for (int c = 0; c < 3; c++) {
                f[3 * r + c] = (r == c ? 1 : 0) + (l - 1) * a[r] * a[c];
            }
        }
        return f;
    }

    private double[] randomUnit() {
        double x = rand.nextGaussian(), y = rand.nextGaussian(), z = rand.nextGaussian();
        double n = Math.sqrt(x * x + y * y + z * z);
        return new double[] {x / n, y / n, z / n};
    }

    @ParameterizedTest(name = "exponential = {0}")
    @ValueSource(booleans = {false, true})
    void uniaxialStretchAlongTheFiberGivesTheClosedFormStress(boolean exponential, TestReporter reporter) {
        // published: Holzapfel, Gasser and Ogden 2000; closed form P_f = 2 psi_f'(l^2) l a0 (x) a0 (class comment)
        MaterialLaw law = law(exponential);
        MaterialLaw base = base();
        double worst = 0;
        for (double[] a0 : new double[][] {{1, 0, 0}, randomUnit(), randomUnit()}) {
            for (double l : new double[] {1.001, 1.05, 1.2, 1.5, 1.8}) {
                double[] f = stretchAlong(a0, l);
                double[] p = piola(law, f, a0);
                double[] pb = piola(base, f, a0);
                double[] tau = kirchhoff(law, f, a0);
                double[] taub = kirchhoff(base, f, a0);
                double c = 2 * slope(exponential, l * l);
                double scale = c * l * l;
                for (int r = 0; r < 3; r++) {
                    for (int col = 0; col < 3; col++) {
                        int k = 3 * r + col;
                        double pf = c * l * a0[r] * a0[col];
                        double tf = c * l * l * a0[r] * a0[col];
                        worst = Math.max(worst, Math.abs(p[k] - pb[k] - pf) / scale);
                        worst = Math.max(worst, Math.abs(tau[k] - taub[k] - tf) / scale);
                    }
                }
                double ef = energy(exponential, l * l);
                double de = psi(law, f, a0)[0] - psi(base, f, a0)[0];
                worst = Math.max(worst, Math.abs(de - ef) / ef);
            }
        }
        reporter.publishEntry("worst relative error against the closed form", Double.toString(worst));
        assertTrue(worst < CLOSED_FORM_RELATIVE, "worst " + worst);
    }

    @ParameterizedTest(name = "exponential = {0}")
    @ValueSource(booleans = {false, true})
    void compressionAlongTheFiberGivesExactlyTheBaseStress(boolean exponential) {
        // published: Holzapfel, Gasser and Ogden 2000: the fiber term is active only for I4 > 1
        MaterialLaw law = law(exponential);
        MaterialLaw base = base();
        for (double[] a0 : new double[][] {{1, 0, 0}, randomUnit(), randomUnit()}) {
            for (double l : new double[] {0.999, 0.9, 0.7, 0.4}) {
                double[] f = stretchAlong(a0, l);
                assertArrayEquals(piola(base, f, a0), piola(law, f, a0), 0.0, "P at l = " + l);
                assertArrayEquals(kirchhoff(base, f, a0), kirchhoff(law, f, a0), 0.0, "tau at l = " + l);
                assertArrayEquals(psi(base, f, a0), psi(law, f, a0), 0.0, "psi at l = " + l);
            }
        }
    }

    @ParameterizedTest(name = "exponential = {0}")
    @ValueSource(booleans = {false, true})
    void stretchAcrossTheFiberAddsNothing(boolean exponential, TestReporter reporter) {
        // published: Holzapfel, Gasser and Ogden 2000: I4 <= 1 carries no fiber stress
        MaterialLaw law = law(exponential);
        MaterialLaw base = base();
        double[] ex = {1, 0, 0};
        for (double l : new double[] {1.01, 1.3, 2.0}) {
            // stretch along y only (I4 = 1 exactly), and isochoric stretch along y (I4 = 1 / l < 1)
            double[] plain = {1, 0, 0, 0, l, 0, 0, 0, 1};
            double c = 1 / Math.sqrt(l);
            double[] isochoric = {c, 0, 0, 0, l, 0, 0, 0, c};
            for (double[] f : new double[][] {plain, isochoric}) {
                assertArrayEquals(piola(base, f, ex), piola(law, f, ex), 0.0, "P at l = " + l);
                assertArrayEquals(psi(base, f, ex), psi(law, f, ex), 0.0, "psi at l = " + l);
            }
        }
        // a rotated frame: I4 = 1 only up to rounding, so the fiber may add rounding of k times 1e-16
        double worst = 0;
        double m = law.density() * law.waveSpeed() * law.waveSpeed();
        for (int i = 0; i < 8; i++) {
            double[] a0 = randomUnit();
            double[] b = randomUnit();
            double d = b[0] * a0[0] + b[1] * a0[1] + b[2] * a0[2];
            double[] n = {b[0] - d * a0[0], b[1] - d * a0[1], b[2] - d * a0[2]};
            double len = Math.sqrt(n[0] * n[0] + n[1] * n[1] + n[2] * n[2]);
            double[] across = {n[0] / len, n[1] / len, n[2] / len};
            double[] f = stretchAlong(across, 1.5);
            double[] p = piola(law, f, a0);
            double[] pb = piola(base, f, a0);
            for (int k = 0; k < 9; k++) {
                worst = Math.max(worst, Math.abs(p[k] - pb[k]) / m);
            }
        }
        reporter.publishEntry("fiber stress / M for stretch across rotated fibers", Double.toString(worst));
        assertTrue(worst < 1e-14, "worst " + worst);
    }

    @ParameterizedTest(name = "k2 = {0}")
    @ValueSource(doubles = {0.1, 1.5, 10.0})
    void exponentialStressMatchesItsClosedFormAndCentralDifferences(double k2, TestReporter reporter) {
        // published: Holzapfel, Gasser and Ogden 2000, the exponential term; closed form 2 psi_f'(I4) F a0 (x) a0
        // (class comment) and, common practice, no source, P = dpsi/dF by central differences (VALIDATION.md A3)
        MaterialLaw law = Fibers.reinforce(base()).exponential(K1, k2).build();
        MaterialLaw base = base();
        Random r = new Random(SEED + Double.hashCode(k2));
        double worstClosed = 0;
        double worstDiff = 0;
        int checked = 0;
        while (checked < 24) {
            Mat3 m = RandomMatrices.nearIdentity(r, 0.3);
            double[] f = new double[9];
            m.store(f, 0);
            double[] a0 = randomUnit();
            double[] fa = new double[3];
            for (int row = 0; row < 3; row++) {
                fa[row] = f[3 * row] * a0[0] + f[3 * row + 1] * a0[1] + f[3 * row + 2] * a0[2];
            }
            double i4 = fa[0] * fa[0] + fa[1] * fa[1] + fa[2] * fa[2];
            if (i4 < 1.01) {
                continue; // fiber in compression or at the kink: nothing exponential to check
            }
            checked++;
            double d = i4 - 1;
            double c = 2 * K1 * d * Math.exp(k2 * d * d);
            double[] p = piola(law, f, a0);
            double[] pb = piola(base, f, a0);
            double err = 0;
            double ref = 0;
            for (int row = 0; row < 3; row++) {
                for (int col = 0; col < 3; col++) {
                    double pf = c * fa[row] * a0[col];
                    double e = p[3 * row + col] - pb[3 * row + col] - pf;
                    err += e * e;
                    ref += pf * pf;
                }
            }
            worstClosed = Math.max(worstClosed, Math.sqrt(err / ref));
            worstDiff = Math.max(worstDiff, centralDifferenceError(law, f, a0, p));
        }
        reporter.publishEntry("relative error: closed form, central differences", worstClosed + ", " + worstDiff);
        assertTrue(worstClosed < CLOSED_FORM_RELATIVE, "closed form " + worstClosed);
        assertTrue(worstDiff < DERIVATIVE_TOLERANCE, "central differences " + worstDiff);
    }

    private static double centralDifferenceError(MaterialLaw law, double[] f, double[] a0, double[] p) {
        double h = STEP * Math.sqrt(dot(f, f));
        double[] shifted = new double[18 * 9];
        for (int k = 0; k < 9; k++) {
            System.arraycopy(f, 0, shifted, 18 * k, 9);
            System.arraycopy(f, 0, shifted, 18 * k + 9, 9);
            shifted[18 * k + k] += h;
            shifted[18 * k + 9 + k] -= h;
        }
        double[] e = psi(law, shifted, a0);
        double err = 0;
        for (int k = 0; k < 9; k++) {
            double num = (e[2 * k] - e[2 * k + 1]) / (shifted[18 * k + k] - shifted[18 * k + 9 + k]);
            err += (num - p[k]) * (num - p[k]);
        }
        return Math.sqrt(err / dot(p, p));
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < a.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    @ParameterizedTest(name = "exponential = {0}")
    @ValueSource(booleans = {false, true})
    void termSlopeIsTheEnergyDerivativeInI4(boolean exponential, TestReporter reporter) {
        // common practice, no source: dpsi_f/dI4 by central differences, across the exponential overflow guard
        FiberReinforced.Term t = exponential ? FiberReinforced.Term.exponential(K1, K2)
                : FiberReinforced.Term.quadratic(K);
        double cap = 1 + Math.sqrt(FiberReinforced.Term.EXPONENT_CAP / K2);
        double worst = 0;
        for (double i4 : new double[] {1.001, 1.1, 1.5, 2.0, 3.0, cap - 1e-3, cap + 1e-3, cap + 1, 2 * cap}) {
            double h = 1e-6 * i4;
            double num = (t.energy(i4 + h) - t.energy(i4 - h)) / ((i4 + h) - (i4 - h));
            worst = Math.max(worst, Math.abs(num - t.derivative(i4)) / Math.abs(t.derivative(i4)));
            assertTrue(Double.isFinite(t.energy(i4)) && Double.isFinite(t.derivative(i4)), "finite at " + i4);
        }
        assertEquals(0.0, t.energy(1.0), 0.0);
        assertEquals(0.0, t.derivative(0.5), 0.0);
        assertTrue(Double.isFinite(t.energy(1e8)) && Double.isFinite(t.derivative(1e8)), "finite far past the cap");
        reporter.publishEntry("worst relative error of dpsi/dI4", Double.toString(worst));
        assertTrue(worst < DERIVATIVE_TOLERANCE, "worst " + worst);
    }

    @Test
    void overflowGuardIsContinuousAtTheCap(TestReporter reporter) {
        // common practice, no source: the Taylor continuation matches value, slope and curvature at the cap
        FiberReinforced.Term t = FiberReinforced.Term.exponential(K1, K2);
        double cap = 1 + Math.sqrt(FiberReinforced.Term.EXPONENT_CAP / K2);
        double below = Math.nextDown(cap);
        double above = Math.nextUp(cap);
        double jumpE = Math.abs(t.energy(above) - t.energy(below)) / t.energy(cap);
        double jumpS = Math.abs(t.derivative(above) - t.derivative(below)) / t.derivative(cap);
        reporter.publishEntry("relative jump of energy, slope at the cap", jumpE + ", " + jumpS);
        assertTrue(jumpE < 1e-12 && jumpS < 1e-12, jumpE + ", " + jumpS);
        // closed-form energy just below the cap, k1/(2 k2) (exp(40) - 1)
        double expected = K1 / (2 * K2) * Math.expm1(FiberReinforced.Term.EXPONENT_CAP);
        assertEquals(expected, t.energy(cap), 1e-12 * expected);
    }
}

package dev.fray.damage.fiber;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialLawContract;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.testing.RandomMatrices;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.api.function.Executable;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Runs the material-law contract against a Neo-Hookean base with three fiber families (quadratic, and two
 * exponential ones, one soft and one that reaches the overflow guard within the contract's stretches), and adds
 * the checks specific to the fiber law: channels, wave speed, split, projection of the current directions and
 * parameter validation.
 */
class FiberReinforcedContractTest extends MaterialLawContract {
    private static final double E = 1e6;
    private static final double NU = 0.3;
    private static final double RHO = 1000.0;
    /** Quadratic family stiffness k, Pa. */
    private static final double K = 2e5;
    /** Exponential families k1 (Pa) and k2. */
    private static final double K1A = 1e5, K2A = 0.8, K1B = 5e4, K2B = 5.0;
    /** Seed of the fiber directions; one fixed set of directions for every state, so batches are comparable. */
    private static final long FIBER_SEED = 0xF1BE5L;

    @Override
    protected MaterialLaw createLaw() {
        return Fibers.reinforce(Elastic.neoHookean(E, NU, RHO)).quadratic(K).exponential(K1A, K2A)
                .exponential(K1B, K2B).build();
    }

    @Override
    protected boolean isotropic() {
        return false;
    }

    /**
     * Fills each reference channel with one random unit direction per family, the same for every particle: the
     * contract compares particles of one batch with each other (F against QF, F + h against F), which needs the
     * same fibers in all of them.
     */
    @Override
    protected ArrayMaterialState createState(double[] deformation) {
        ArrayMaterialState state = super.createState(deformation);
        int n = deformation.length / 9;
        Random r = new Random(FIBER_SEED);
        for (int k = 1; k <= 3; k++) {
            double[] a = randomUnit(r);
            double[] ch = state.channel(FiberChannels.reference(k));
            for (int p = 0; p < n; p++) {
                System.arraycopy(a, 0, ch, 3 * p, 3);
            }
        }
        return state;
    }

    private static double[] randomUnit(Random r) {
        double x = r.nextGaussian(), y = r.nextGaussian(), z = r.nextGaussian();
        double n = Math.sqrt(x * x + y * y + z * z);
        return new double[] {x / n, y / n, z / n};
    }

    @Test
    void declaresBaseAndFiberChannels() {
        // common practice, no source: the channel convention of FiberChannels ("fiber-k", "fiber-k-current")
        MaterialLaw law = createLaw();
        List<String> names = law.channels().stream().map(ChannelSpec::name).toList();
        assertEquals(List.of("fiber-1", "fiber-1-current", "fiber-2", "fiber-2-current", "fiber-3",
                "fiber-3-current"), names);
        for (ChannelSpec s : law.channels()) {
            assertEquals(3, s.width(), s.name());
        }
        assertTrue(law.projectsDeformation());
        assertTrue(law instanceof FiberReinforced fr && fr.families() == 3);
    }

    @Test
    void waveSpeedAddsFourTimesTheFiberStiffness(TestReporter reporter) {
        // derived here (common practice, no source): along a fiber, F = I + e a0 (x) a0 gives
        // psi = (lambda + 2 mu + 4 k) e^2 / 2 + O(e^3); check the modulus from the law's own energy
        MaterialLaw one = Fibers.reinforce(Elastic.neoHookean(E, NU, RHO)).exponential(K1A, K2A).build();
        double lambda = E * NU / ((1 + NU) * (1 - 2 * NU));
        double mu = E / (2 * (1 + NU));
        double expected = Math.sqrt((lambda + 2 * mu + 4 * K1A) / RHO);
        double reported = one.waveSpeed();
        double[] a = {0.6, 0.0, 0.8};
        double e = 1e-5;
        double[] f = {1 + e * a[0] * a[0], 0, e * a[0] * a[2], 0, 1, 0, e * a[2] * a[0], 0, 1 + e * a[2] * a[2]};
        double[] psi = new double[1];
        ArrayMaterialState s = new ArrayMaterialState(f).withChannel("fiber-1", a.clone())
                .withChannel("fiber-1-current", new double[3]);
        one.energyDensity(s, 0, 1, psi);
        double measured = Math.sqrt(2 * psi[0] / (e * e) / RHO);
        double errReported = Math.abs(reported - expected) / expected;
        double errMeasured = Math.abs(measured - expected) / expected;
        reporter.publishEntry("wave speed: reported vs formula, energy-based vs formula",
                errReported + ", " + errMeasured);
        assertTrue(errReported < 1e-14, "reported " + reported + " vs " + expected);
        assertTrue(errMeasured < 1e-4, "from the energy " + measured + " vs " + expected);
        // three families: the moduli add (an upper bound, exact for parallel fibers)
        double all = Math.sqrt((lambda + 2 * mu + 4 * (K + K1A + K1B)) / RHO);
        assertEquals(all, createLaw().waveSpeed(), 1e-12 * all);
    }

    @Test
    void splitAddsTheWholeFiberPartToTheDegradableSide(TestReporter reporter) {
        // common practice, no source: broken fibers carry nothing, so the fiber stress is degradable, while the
        // base law keeps its own split (Amor et al. 2009 for Neo-Hookean)
        MaterialLaw law = createLaw();
        MaterialLaw base = ((FiberReinforced) law).base();
        int n = 12;
        double[] f = new double[9 * n];
        for (int i = 0; i < n; i++) {
            RandomMatrices.farFromIdentity(rand).store(f, 9 * i);
        }
        ArrayMaterialState s = createState(f);
        double[] tauD = new double[9 * n], tauK = new double[9 * n], psiD = new double[n], psiK = new double[n];
        double[] bD = new double[9 * n], bK = new double[9 * n], bpD = new double[n], bpK = new double[n];
        law.splitKirchhoffStress(s, 0, n, tauD, tauK, psiD, psiK);
        base.splitKirchhoffStress(s, 0, n, bD, bK, bpD, bpK);
        double[] tau = new double[9 * n], tauBase = new double[9 * n], psi = new double[n], psiBase = new double[n];
        law.kirchhoffStress(s, 0, n, tau);
        base.kirchhoffStress(s, 0, n, tauBase);
        law.energyDensity(s, 0, n, psi);
        base.energyDensity(s, 0, n, psiBase);
        assertArrayEquals(bK, tauK, 0.0, "kept stress is the base law's");
        assertArrayEquals(bpK, psiK, 0.0, "kept energy is the base law's");
        double worst = 0;
        for (int i = 0; i < n; i++) {
            double scale = Math.abs(psi[i]) + 1e-3 * stiffness(law);
            worst = Math.max(worst, Math.abs((psiD[i] - bpD[i]) - (psi[i] - psiBase[i])) / scale);
            for (int k = 0; k < 9; k++) {
                int j = 9 * i + k;
                worst = Math.max(worst, Math.abs((tauD[j] - bD[j]) - (tau[j] - tauBase[j])) / scale);
            }
        }
        reporter.publishEntry("fiber part of the degradable side vs fiber part of the whole", Double.toString(worst));
        assertTrue(worst < 1e-12, "worst " + worst);
    }

    @Test
    void projectionWritesCurrentDirectionsAndLeavesFAlone(TestReporter reporter) {
        // common practice, no source: a fiber is a material line element, so it is convected as
        // a = F a0 / |F a0|; a zero reference vector stays "no fiber"
        MaterialLaw law = createLaw();
        int n = 6;
        double[] f = new double[9 * n];
        for (int i = 0; i < n; i++) {
            RandomMatrices.farFromIdentity(rand).store(f, 9 * i);
        }
        double[] fCopy = f.clone();
        ArrayMaterialState s = createState(f);
        double[] ref2 = s.channel("fiber-2");
        Arrays.fill(ref2, 3 * 4, 3 * 5, 0.0); // particle 4 has no family-2 fiber
        double[] cur2 = s.channel("fiber-2-current");
        Arrays.fill(cur2, 3 * 4, 3 * 5, 7.0); // stale value that must be cleared
        law.projectDeformation(s, 0, n);
        assertArrayEquals(fCopy, f, 0.0, "projectDeformation changed F");
        double worst = 0;
        for (int k = 1; k <= 3; k++) {
            double[] a = s.channel(FiberChannels.reference(k));
            double[] c = s.channel(FiberChannels.current(k));
            for (int p = 0; p < n; p++) {
                double[] fa = new double[3];
                for (int r = 0; r < 3; r++) {
                    for (int col = 0; col < 3; col++) {
                        fa[r] += f[9 * p + 3 * r + col] * a[3 * p + col];
                    }
                }
                double len = Math.sqrt(fa[0] * fa[0] + fa[1] * fa[1] + fa[2] * fa[2]);
                for (int r = 0; r < 3; r++) {
                    double expected = len == 0 ? 0 : fa[r] / len;
                    worst = Math.max(worst, Math.abs(c[3 * p + r] - expected));
                }
            }
        }
        assertArrayEquals(new double[3], Arrays.copyOfRange(cur2, 12, 15), 0.0, "zero reference gives zero");
        reporter.publishEntry("current direction error", Double.toString(worst));
        assertTrue(worst < 1e-15, "worst " + worst);
    }

    @Test
    void rejectsBadFiberParameters() {
        // common practice, no source: stiffnesses and the exponent must be positive and finite; 1 to 3 families
        MaterialLaw base = Elastic.neoHookean(E, NU, RHO);
        List<Executable> bad = new ArrayList<>();
        bad.add(() -> Fibers.reinforce(base).quadratic(0).build());
        bad.add(() -> Fibers.reinforce(base).quadratic(-1e5).build());
        bad.add(() -> Fibers.reinforce(base).exponential(1e5, 0).build());
        bad.add(() -> Fibers.reinforce(base).exponential(-1, 1).build());
        bad.add(() -> Fibers.reinforce(base).build());
        bad.add(() -> Fibers.reinforce(base).quadratic(1).quadratic(1).quadratic(1).quadratic(1).build());
        for (Executable e : bad) {
            InvalidInputException ex = assertThrows(InvalidInputException.class, e);
            assertEquals(FrayMessage.OUT_OF_RANGE, ex.key(), ex.getMessage());
        }
        InvalidInputException nan = assertThrows(InvalidInputException.class,
                () -> Fibers.reinforce(base).quadratic(1e5).exponential(1e5, Double.NaN).build());
        assertEquals(FrayMessage.NOT_FINITE, nan.key());
        assertEquals("fiber family 2: k2", nan.parts()[0]);
        InvalidInputException k1 = assertThrows(InvalidInputException.class,
                () -> Fibers.reinforce(base).exponential(-3, 1).build());
        assertEquals("fiber family 1: k1 (Pa)", k1.parts()[0]);
        assertEquals(-3.0, k1.parts()[1]);
        assertEquals(FrayMessage.MISSING, assertThrows(InvalidInputException.class,
                () -> Fibers.reinforce(null)).key());
        // wrapping a fiber law again would declare "fiber-1" twice
        MaterialLaw once = Fibers.reinforce(base).quadratic(1e5).build();
        assertEquals(FrayMessage.INCONSISTENT, assertThrows(InvalidInputException.class,
                () -> Fibers.reinforce(once).quadratic(1e5).build()).key());
    }
}

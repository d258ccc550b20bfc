package dev.fray.damage.elastic;

import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.math.Mat3;
import dev.fray.core.math.Mat3Ops;
import dev.fray.core.math.Svd3;
import dev.fray.core.math.Vec3;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.RandomMatrices;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import dev.fray.damage.fiber.FiberChannels;
import dev.fray.damage.fiber.FiberReinforced;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Every split each law offers, chosen independently of the law: the volumetric-deviatoric split of Amor, Marigo and
 * Maurini 2009 (J. Mech. Phys. Solids 57), the spectral split of Miehe, Welschinger and Hofacker 2010 (Int. J.
 * Numer. Meth. Engng 83), and no split. The fiber-reinforced law runs over Neo-Hookean with one quadratic family.
 */
class TensionSplitChoiceTest extends FrayTestBase {
    private static final double E = 1e6;
    private static final double NU = 0.3;
    private static final double RHO = 1000.0;
    /** Fiber stiffness of the fiber-reinforced case, Pa. */
    private static final double FIBER_K = 2e5;
    /** Name of the fiber-reinforced case. */
    private static final String FIBERS = FiberReinforced.NAME + "/" + NeoHookean.NAME;
    /** Allowed relative error of degraded + kept against the whole law: a few hundred roundings. */
    private static final double SUM_RELATIVE = 1e-12;
    /**
     * Floor of the reference scale of the sum check, as a fraction of the P-wave modulus M: the laws' own energy
     * formulas (e.g. mu/2 (tr C - 3) for Neo-Hookean) round to about 1e-16 M absolute, so below strains of a few
     * percent a purely relative measure would test the law's rounding, not the split.
     */
    private static final double SCALE_FLOOR = 1e-3;
    /** A part that must vanish may keep rounding of this size relative to M. */
    private static final double ROUNDING = 1e-12;
    /** Allowed relative error of dpsi/dF by central differences against tau F^-T. */
    private static final double DERIVATIVE_TOLERANCE = 1e-6;
    /** Central-difference step relative to ||F||. */
    private static final double STEP = 1e-6;
    /** Distance from a switch below which a derivative case is skipped (central differences straddle it). */
    private static final double SWITCH_MARGIN = 1e-3;
    /** Agreement with the hand-derived closed forms of uniaxial compression. */
    private static final double CLOSED_FORM_RELATIVE = 1e-10;
    /** Random deformation gradients per law, split and seed. */
    private static final int CASES = 40;
    private static final long[] SEEDS = {1, 2, 3};

    static List<String> laws() {
        List<String> out = new ArrayList<>(Elastic.names());
        out.add(FIBERS);
        return out;
    }

    private static MaterialLaw law(String name) {
        if (name.equals(FIBERS)) {
            return Fibers.reinforce(Elastic.neoHookean(E, NU, RHO)).quadratic(FIBER_K).build();
        }
        return Elastic.byName(name, E, NU, RHO);
    }

    static Stream<Arguments> lawSplitSeed() {
        List<Arguments> out = new ArrayList<>();
        for (String name : laws()) {
            for (TensionSplit split : TensionSplit.values()) {
                for (long seed : SEEDS) {
                    out.add(Arguments.of(name, split, seed));
                }
            }
        }
        return out.stream();
    }

    static Stream<Arguments> lawAndRealSplit() {
        List<Arguments> out = new ArrayList<>();
        for (String name : laws()) {
            out.add(Arguments.of(name, TensionSplit.VOLUMETRIC_DEVIATORIC));
            out.add(Arguments.of(name, TensionSplit.SPECTRAL));
        }
        return out.stream();
    }

    /** Evaluated split and whole of a batch. */
    private record Parts(double[] tauD, double[] tauK, double[] psiD, double[] psiK, double[] tau, double[] psi) {
    }

    /** State over f with the law's channels: fiber-1 from the given directions, every other channel zero. */
    private static ArrayMaterialState state(MaterialLaw law, double[] f, double[] fiber) {
        int n = f.length / 9;
        ArrayMaterialState s = new ArrayMaterialState(f);
        for (ChannelSpec c : law.channels()) {
            s.withChannel(c.name(), c.name().equals(FiberChannels.reference(1)) ? fiber : new double[c.width() * n]);
        }
        return s;
    }

    private static Parts evaluate(MaterialLaw law, TensionSplit split, double[] f, double[] fiber) {
        int n = f.length / 9;
        ArrayMaterialState s = state(law, f, fiber);
        Parts out = new Parts(new double[9 * n], new double[9 * n], new double[n], new double[n], new double[9 * n],
                new double[n]);
        law.splitKirchhoffStress(split, s, 0, n, out.tauD, out.tauK, out.psiD, out.psiK);
        law.kirchhoffStress(s, 0, n, out.tau);
        law.energyDensity(s, 0, n, out.psi);
        return out;
    }

    private static double modulus(MaterialLaw law) {
        return law.density() * law.waveSpeed() * law.waveSpeed();
    }

    /** Random unit fiber directions, 3 per particle. */
    private static double[] fibers(Random r, int n) {
        double[] a = new double[3 * n];
        for (int i = 0; i < n; i++) {
            Mat3 q = RandomMatrices.rotation(r);
            a[3 * i] = q.m00;
            a[3 * i + 1] = q.m10;
            a[3 * i + 2] = q.m20;
        }
        return a;
    }

    /** Seeded deformation gradients with det F &gt; 0: near and far from rest, repeated and spread stretches. */
    private static double[] deformations(Random r, int n) {
        double[] f = new double[9 * n];
        for (int i = 0; i < n; i++) {
            Mat3 m = switch (i % 4) {
                case 0 -> RandomMatrices.nearIdentity(r, 0.3);
                case 1 -> RandomMatrices.farFromIdentity(r);
                case 2 -> RandomMatrices.repeatedSingularValues(r);
                default -> RandomMatrices.withSingularValues(r, RandomMatrices.logUniform(r, 0.5, 2),
                        RandomMatrices.logUniform(r, 0.5, 2), RandomMatrices.logUniform(r, 0.5, 2));
            };
            m.store(f, 9 * i);
        }
        return f;
    }

    private static Random random(String name, TensionSplit split, long seed) {
        return new Random(SEED + 1_000_003L * seed + 31L * name.hashCode() + split.ordinal());
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("laws")
    void everyShippedLawOffersEverySplit(String name) {
        // common practice, no source: both published splits and none are defined for each of these laws (see the
        // laws' javadoc for the derivations); the fiber law offers what its base offers
        MaterialLaw law = law(name);
        for (TensionSplit split : TensionSplit.values()) {
            assertTrue(law.supportsSplit(split), name + " offers " + split);
        }
    }

    @ParameterizedTest(name = "{0}, {1}, seed {2}")
    @MethodSource("lawSplitSeed")
    void partsAddUpToTheWholeLaw(String name, TensionSplit split, long seed, TestReporter reporter) {
        // published: Amor et al. 2009 and Miehe et al. 2010 define the split as a partition, psi = psi+ + psi- and
        // sigma = sigma+ + sigma-; here against the law's own kirchhoffStress and energyDensity
        MaterialLaw law = law(name);
        Random r = random(name, split, seed);
        double[] f = deformations(r, CASES);
        Parts p = evaluate(law, split, f, fibers(r, CASES));
        double floor = SCALE_FLOOR * modulus(law);
        double worstTau = 0;
        double worstPsi = 0;
        for (int i = 0; i < CASES; i++) {
            double err = 0;
            double ref = 0;
            for (int k = 0; k < 9; k++) {
                int q = 9 * i + k;
                err += sq(p.tauD[q] + p.tauK[q] - p.tau[q]);
                ref += sq(p.tau[q]);
            }
            worstTau = Math.max(worstTau, Math.sqrt(err) / Math.max(Math.sqrt(ref), floor));
            worstPsi = Math.max(worstPsi, Math.abs(p.psiD[i] + p.psiK[i] - p.psi[i]) / Math.max(p.psi[i], floor));
        }
        reporter.publishEntry("worst relative error of the sum: stress, energy", worstTau + ", " + worstPsi);
        assertTrue(worstTau <= SUM_RELATIVE, name + " " + split + ": stress " + worstTau);
        assertTrue(worstPsi <= SUM_RELATIVE, name + " " + split + ": energy " + worstPsi);
    }

    @ParameterizedTest(name = "{0}, {1}, seed {2}")
    @MethodSource("lawSplitSeed")
    void eachStressPartIsTheDerivativeOfItsEnergy(String name, TensionSplit split, long seed,
                                                 TestReporter reporter) {
        // common practice, no source: a variationally consistent split has P+ = dpsi+/dF (and P- = dpsi-/dF);
        // P = tau F^-T turns the Kirchhoff parts into first Piola-Kirchhoff stresses; central differences away
        // from the switches
        MaterialLaw law = law(name);
        Random r = random(name, split, seed);
        double[] all = deformations(r, CASES);
        double[] fiber = fibers(r, CASES);
        double worst = 0;
        int checked = 0;
        for (int c = 0; c < CASES; c++) {
            Mat3 m = new Mat3().load(all, 9 * c);
            double[] a = {fiber[3 * c], fiber[3 * c + 1], fiber[3 * c + 2]};
            if (nearSwitch(m, a)) {
                continue;
            }
            double[] f = new double[9];
            m.store(f, 0);
            double h = STEP * Mat3Ops.normF(m);
            double[] shifted = new double[18 * 9];
            double[] shiftedFiber = new double[18 * 3];
            for (int k = 0; k < 18; k++) {
                System.arraycopy(f, 0, shifted, 9 * k, 9);
                System.arraycopy(a, 0, shiftedFiber, 3 * k, 3);
            }
            for (int k = 0; k < 9; k++) {
                shifted[18 * k + k] += h;
                shifted[18 * k + 9 + k] -= h;
            }
            Parts sh = evaluate(law, split, shifted, shiftedFiber);
            Parts one = evaluate(law, split, f, a);
            Mat3 inv = new Mat3();
            assertTrue(Mat3Ops.invert(m, inv), "invertible F");
            double[] pd = piola(one.tauD, inv);
            double[] pk = piola(one.tauK, inv);
            double[] pAll = piola(one.tau, inv);
            double err = 0;
            double ref = 0;
            for (int k = 0; k < 9; k++) {
                double dx = shifted[18 * k + k] - shifted[18 * k + 9 + k];
                double numD = (sh.psiD[2 * k] - sh.psiD[2 * k + 1]) / dx;
                double numK = (sh.psiK[2 * k] - sh.psiK[2 * k + 1]) / dx;
                err = Math.max(err, Math.max(sq(numD - pd[k]), sq(numK - pk[k])));
                ref += sq(pAll[k]);
            }
            worst = Math.max(worst, Math.sqrt(err) / Math.max(Math.sqrt(ref), SCALE_FLOOR * modulus(law)));
            checked++;
        }
        reporter.publishEntry("worst relative error of tau F^-T against dpsi/dF (" + checked + " cases)",
                Double.toString(worst));
        assertTrue(checked > CASES / 2, "too few cases away from the switches: " + checked);
        assertTrue(worst < DERIVATIVE_TOLERANCE, name + " " + split + ": " + worst);
    }

    @ParameterizedTest(name = "{0}, {1}, seed {2}")
    @MethodSource("lawSplitSeed")
    void invertedAndCrushedStatesStayFiniteAndAddUp(String name, TensionSplit split, long seed,
                                                   TestReporter reporter) {
        // common practice, no source: the laws continue their energy finitely through inversion and extreme
        // compression (see their javadoc), and a split must partition that continued law as well; the parts are
        // compared with the whole relative to the P-wave modulus M, as the stresses there are of order M or more
        MaterialLaw law = law(name);
        Random r = random(name, split, seed);
        double[] f = new double[9 * CASES];
        for (int i = 0; i < CASES; i++) {
            (i % 2 == 0 ? RandomMatrices.inverted(r) : RandomMatrices.nearSingular(r)).store(f, 9 * i);
        }
        Parts p = evaluate(law, split, f, fibers(r, CASES));
        double worst = 0;
        for (int i = 0; i < CASES; i++) {
            double err = 0;
            double ref = 0;
            for (int k = 0; k < 9; k++) {
                int q = 9 * i + k;
                assertTrue(Double.isFinite(p.tauD[q]) && Double.isFinite(p.tauK[q]), "finite stress, case " + i);
                err += sq(p.tauD[q] + p.tauK[q] - p.tau[q]);
                ref += sq(p.tau[q]);
            }
            assertTrue(Double.isFinite(p.psiD[i]) && Double.isFinite(p.psiK[i]), "finite energy, case " + i);
            double scale = Math.max(modulus(law), Math.max(Math.sqrt(ref), Math.abs(p.psi[i])));
            worst = Math.max(worst, Math.max(Math.sqrt(err), Math.abs(p.psiD[i] + p.psiK[i] - p.psi[i])) / scale);
        }
        reporter.publishEntry("worst relative error of the sum for inverted and crushed F", Double.toString(worst));
        assertTrue(worst <= SUM_RELATIVE, name + " " + split + ": " + worst);
    }

    /** P = tau F^-T: P_rc = sum_k tau_rk (F^-1)_ck. */
    private static double[] piola(double[] tau, Mat3 inv) {
        double[] fInvT = {inv.m00, inv.m10, inv.m20, inv.m01, inv.m11, inv.m21, inv.m02, inv.m12, inv.m22};
        double[] p = new double[9];
        Mat3Ops.mul(tau, 0, fInvT, 0, p, 0);
        return p;
    }

    /**
     * Whether a switch of any split (a principal stretch, J, the mean stretch or the fiber stretch at 1) is within
     * the margin, where a central step could straddle it.
     */
    private static boolean nearSwitch(Mat3 m, double[] a) {
        Mat3 u = new Mat3();
        Mat3 v = new Mat3();
        Vec3 s = new Vec3();
        Svd3.decompose(m, u, s, v);
        double fx = m.m00 * a[0] + m.m01 * a[1] + m.m02 * a[2];
        double fy = m.m10 * a[0] + m.m11 * a[1] + m.m12 * a[2];
        double fz = m.m20 * a[0] + m.m21 * a[1] + m.m22 * a[2];
        double[] x = {s.x, s.y, s.z, Mat3Ops.det(m), (s.x + s.y + s.z) / 3, fx * fx + fy * fy + fz * fz};
        for (double xi : x) {
            if (Math.abs(xi - 1) < SWITCH_MARGIN) {
                return true;
            }
        }
        return false;
    }

    /** F = s I and F = s Q (a dilatation with a rotation), 9 per particle. */
    private double[] dilatations(double[] stretches) {
        double[] f = new double[9 * 2 * stretches.length];
        for (int i = 0; i < stretches.length; i++) {
            Mat3 q = RandomMatrices.rotation(rand);
            Mat3Ops.scale(stretches[i], new Mat3().setIdentity(), new Mat3()).store(f, 18 * i);
            Mat3Ops.scale(stretches[i], q, q).store(f, 18 * i + 9);
        }
        return f;
    }

    @ParameterizedTest(name = "{0}, {1}")
    @MethodSource("lawAndRealSplit")
    void volumetricCompressionIsAllKept(String name, TensionSplit split, TestReporter reporter) {
        // published: Amor et al. 2009 (tr eps < 0, dev eps = 0: psi+ = 0) and Miehe et al. 2010 (all principal
        // strains negative: psi+ = 0) both keep a purely compressive volume change whole
        double worst = oneSided(name, split, new double[] {0.999, 0.9, 0.5, 0.2}, false);
        reporter.publishEntry("degradable part / M in volumetric compression", Double.toString(worst));
        assertTrue(worst <= ROUNDING, name + " " + split + ": " + worst);
    }

    @ParameterizedTest(name = "{0}, {1}")
    @MethodSource("lawAndRealSplit")
    void volumetricExpansionIsAllDegradable(String name, TensionSplit split, TestReporter reporter) {
        // published: Amor et al. 2009 (tr eps > 0, dev eps = 0) and Miehe et al. 2010 (all principal strains
        // positive) both degrade a purely tensile volume change whole
        double worst = oneSided(name, split, new double[] {1.001, 1.1, 2.0, 4.0}, true);
        reporter.publishEntry("kept part / M in volumetric expansion", Double.toString(worst));
        assertTrue(worst <= ROUNDING, name + " " + split + ": " + worst);
    }

    /**
     * Splits F = s I and F = s Q for the stretches, checks that the side that should carry the energy does, and
     * returns the largest deviation from a one-sided split (see {@link #worstVanishing}).
     */
    private double oneSided(String name, TensionSplit split, double[] stretches, boolean degradable) {
        MaterialLaw law = law(name);
        double[] f = dilatations(stretches);
        int n = f.length / 9;
        Parts p = evaluate(law, split, f, fibers(rand, n));
        for (int i = 0; i < n; i++) {
            assertTrue((degradable ? p.psiD[i] : p.psiK[i]) > 0, "the carrying side has the energy, particle " + i);
        }
        return degradable ? worstVanishing(law, p.tauK, p.psiK, p.tauD, p.psiD, p)
                : worstVanishing(law, p.tauD, p.psiD, p.tauK, p.psiK, p);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("laws")
    void uniaxialCompressionSeparatesTheTwoSplits(String name, TestReporter reporter) {
        // F = Q diag(s, 1, 1) Q^T, s < 1, uniaxial strain compression along Q e1.
        // published: Miehe et al. 2010: principal strains (ln s, 0, 0) and tr < 0, so psi+ = 0 in the spectral split.
        // published: Amor et al. 2009: the deviatoric part is degradable, so the volumetric-deviatoric split
        // degrades psi_dev > 0. Closed forms of psi_dev for F = diag(s, 1, 1), derived by hand from each law's
        // deviatoric energy: Neo-Hookean mu/2 (tr C - 3 J^(2/3)) = mu/2 (s^2 + 2 - 3 s^(2/3)); fixed corotated
        // mu sum (sigma_i - mean sigma)^2 = 2/3 mu (1 - s)^2; Hencky mu |dev g|^2 = 2/3 mu (ln s)^2. Fibers
        // are not stretched by this F, so the fiber law gives its base's value.
        MaterialLaw law = law(name);
        double mu = new ElasticParameters(E, NU, RHO).mu();
        double[] s = {0.99, 0.9, 0.7, 0.5, 0.2};
        double[] f = new double[9 * s.length];
        for (int i = 0; i < s.length; i++) {
            Mat3 q = RandomMatrices.rotation(rand);
            Mat3 d = new Mat3().set(s[i], 0, 0, 0, 1, 0, 0, 0, 1);
            Mat3Ops.mulTransB(Mat3Ops.mul(q, d, new Mat3()), q, new Mat3()).store(f, 9 * i);
        }
        double[] fiber = fibers(rand, s.length);
        Parts spectral = evaluate(law, TensionSplit.SPECTRAL, f, fiber);
        Parts volDev = evaluate(law, TensionSplit.VOLUMETRIC_DEVIATORIC, f, fiber);
        double worstSpectral = worstVanishing(law, spectral.tauD, spectral.psiD, spectral.tauK, spectral.psiK,
                spectral);
        double worstClosedForm = 0;
        for (int i = 0; i < s.length; i++) {
            String base = name.equals(FIBERS) ? NeoHookean.NAME : name;
            double expected = switch (base) {
                case NeoHookean.NAME -> 0.5 * mu * (s[i] * s[i] + 2 - 3 * Math.pow(s[i], 2.0 / 3));
                case FixedCorotated.NAME -> 2.0 / 3 * mu * sq(1 - s[i]);
                default -> 2.0 / 3 * mu * sq(Math.log(s[i]));
            };
            worstClosedForm = Math.max(worstClosedForm, Math.abs(volDev.psiD[i] - expected) / expected);
            assertTrue(volDev.psiD[i] > 0, "volumetric-deviatoric split degrades the deviatoric part");
        }
        reporter.publishEntry("spectral degradable part / M; volumetric-deviatoric psi+ against closed form",
                worstSpectral + "; " + worstClosedForm);
        assertTrue(worstSpectral <= ROUNDING, name + ": spectral " + worstSpectral);
        assertTrue(worstClosedForm <= CLOSED_FORM_RELATIVE, name + ": volumetric-deviatoric " + worstClosedForm);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("lawSplitSeedForFibers")
    void fiberLawAddsItsFibersToTheBaseSplit(TensionSplit split, long seed) {
        // common practice, no source: a broken fiber carries nothing, so the base law's split of the chosen kind
        // is passed through and every fiber term is degradable; the kept parts are the base law's bit for bit and
        // the degradable energy grows by the fiber energy
        MaterialLaw base = Elastic.neoHookean(E, NU, RHO);
        MaterialLaw fibers = law(FIBERS);
        Random r = random(FIBERS, split, seed);
        double[] f = deformations(r, CASES);
        double[] a = fibers(r, CASES);
        Parts withFibers = evaluate(fibers, split, f, a);
        Parts alone = evaluate(base, split, f, a);
        assertArrayEquals(alone.tauK, withFibers.tauK, 0.0, "kept stress");
        assertArrayEquals(alone.psiK, withFibers.psiK, 0.0, "kept energy");
        int stretched = 0;
        for (int i = 0; i < CASES; i++) {
            double fiberEnergy = withFibers.psi[i] - alone.psi[i];
            assertEquals(fiberEnergy, withFibers.psiD[i] - alone.psiD[i], 1e-9 * Math.max(withFibers.psi[i], 1),
                    "degradable energy gains the fiber energy, particle " + i);
            if (fiberEnergy > 0) {
                stretched++;
            }
        }
        assertTrue(stretched > CASES / 4, "the fibers are stretched in enough cases: " + stretched);
        assertEquals(base.supportsSplit(split), fibers.supportsSplit(split));
    }

    static Stream<Arguments> lawSplitSeedForFibers() {
        List<Arguments> out = new ArrayList<>();
        for (TensionSplit split : TensionSplit.values()) {
            out.add(Arguments.of(split, SEEDS[out.size() % SEEDS.length]));
        }
        return out.stream();
    }

    /** Largest of |vanishing parts| / M and |carrying parts - whole| / M over the batch. */
    private static double worstVanishing(MaterialLaw law, double[] tauZero, double[] psiZero, double[] tauAll,
                                         double[] psiAll, Parts whole) {
        double m = modulus(law);
        double worst = 0;
        for (int i = 0; i < psiZero.length; i++) {
            double z = 0;
            double d = 0;
            for (int k = 0; k < 9; k++) {
                z += sq(tauZero[9 * i + k]);
                d += sq(tauAll[9 * i + k] - whole.tau[9 * i + k]);
            }
            worst = Math.max(worst, Math.sqrt(z) / m);
            worst = Math.max(worst, Math.sqrt(d) / m);
            worst = Math.max(worst, Math.abs(psiZero[i]) / m);
            worst = Math.max(worst, Math.abs(psiAll[i] - whole.psi[i]) / m);
        }
        return worst;
    }

    private static double sq(double x) {
        return x * x;
    }
}

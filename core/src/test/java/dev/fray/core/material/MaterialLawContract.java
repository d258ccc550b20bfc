package dev.fray.core.material;

import dev.fray.core.math.Mat3;
import dev.fray.core.math.Mat3Ops;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.RandomMatrices;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Random;
import java.util.Set;
import java.util.stream.IntStream;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * Checks every {@link MaterialLaw} must pass, for built-in and third-party laws alike. A law's test extends this
 * class and implements {@link #createLaw()}; the inherited tests then run against it.
 *
 * <p>Stress tolerances are relative to the stress itself, but never to less than {@link #STRESS_FLOOR} times the
 * law's stiffness scale M = density * waveSpeed^2 (Pa), so states near rest, where the stress is near zero, do not
 * turn rounding into a failure. Measured errors are published through {@link TestReporter}, so they appear in the
 * test reports without printing.
 *
 * <p>Hooks: {@link #isotropic()} enables the material-symmetry checks, {@link #invertible()} the finiteness checks
 * on inverted and singular F, and {@link #createState(double[])} fills the law's channels.
 */
public abstract class MaterialLawContract extends FrayTestBase {
    /** Number of seeded random deformation gradients in each parameterized check. */
    protected static final int RANDOM_CASES = 24;
    /** Stress or energy at rest, as a fraction of the stiffness scale M, that still counts as zero. */
    protected static final double REST_TOLERANCE = 1e-12;
    /** Relative difference allowed between a quantity and its rotated counterpart (rounding of 3x3 products and SVD). */
    protected static final double OBJECTIVITY_TOLERANCE = 1e-12;
    /** Relative error allowed between P and the central difference of psi (VALIDATION.md A3). */
    protected static final double DERIVATIVE_TOLERANCE = 1e-6;
    /** Relative error allowed between dP/dF and the central difference of P (VALIDATION.md F27). */
    protected static final double DIFFERENTIAL_TOLERANCE = 1e-5;
    /** Central-difference step, relative to ||F||_F: balances truncation (h^2) against rounding (eps / h). */
    protected static final double DIFFERENCE_STEP = 1e-6;
    /** Relative difference allowed between the law's tau and P F^T, and between tau and its transpose. */
    protected static final double KIRCHHOFF_TOLERANCE = 1e-12;
    /** Smallest stress scale used in relative errors, as a fraction of the stiffness scale M. */
    protected static final double STRESS_FLOOR = 1e-3;

    /** Sentinel written into output arrays to detect writes outside the requested range. */
    private static final double SENTINEL = -7.25e300;

    /** Creates the contract; subclasses need no constructor of their own. */
    protected MaterialLawContract() {
    }

    /** @return a fresh instance of the law under test */
    protected abstract MaterialLaw createLaw();

    /**
     * Whether the law is isotropic, psi(F Q) = psi(F) for every rotation Q. Laws with fiber directions or other
     * preferred directions return false.
     *
     * @return true by default
     */
    protected boolean isotropic() {
        return true;
    }

    /**
     * Whether the law promises finite energy and stress for every finite F, including singular and inverted ones
     * (det F &lt;= 0). The solver relies on it to report divergence instead of propagating NaN.
     *
     * @return true by default
     */
    protected boolean invertible() {
        return true;
    }

    /**
     * Builds the state the law is evaluated on: the given deformation gradients, and every declared channel filled
     * with its initial value. Override to start channels elsewhere.
     *
     * @param deformation F of each particle, 9 per particle, row-major (kept, not copied)
     * @return the state
     */
    protected ArrayMaterialState createState(double[] deformation) {
        int n = deformation.length / 9;
        ArrayMaterialState state = new ArrayMaterialState(deformation);
        for (ChannelSpec spec : createLaw().channels()) {
            double[] values = new double[n * spec.width()];
            Arrays.fill(values, spec.initial());
            state.withChannel(spec.name(), values);
        }
        return state;
    }

    /**
     * The deformation gradient of random case {@code index}, det F &gt; 0: near the identity, far from it, or with
     * repeated singular values, in turn.
     *
     * @param index case number, 0 to {@link #RANDOM_CASES} - 1
     * @return a new matrix
     */
    protected Mat3 randomDeformation(int index) {
        Random r = caseRandom(index);
        switch (index % 3) {
            case 0:
                return RandomMatrices.nearIdentity(r, 0.3);
            case 1:
                return RandomMatrices.farFromIdentity(r);
            default:
                return RandomMatrices.repeatedSingularValues(r);
        }
    }

    /** @return case numbers for the parameterized checks */
    protected static IntStream randomCases() {
        return IntStream.range(0, RANDOM_CASES);
    }

    /** Each parameterized case gets its own stream, since {@link #rand} restarts for every invocation. */
    private static Random caseRandom(int index) {
        return new Random(SEED * 1_000_003L + index);
    }

    /** Density and wave speed are positive and finite; the registry name is lower case with dashes. */
    @Test
    public void reportsPositiveFiniteDensityAndWaveSpeed() {
        // common practice, no source: the time-step bound divides by the wave speed and the mass uses the density
        MaterialLaw law = createLaw();
        assertTrue(Double.isFinite(law.density()) && law.density() > 0, "density " + law.density());
        assertTrue(Double.isFinite(law.waveSpeed()) && law.waveSpeed() > 0, "waveSpeed " + law.waveSpeed());
        assertNotNull(law.name());
        assertTrue(law.name().matches("[a-z][a-z0-9-]*"), "registry name \"" + law.name() + "\"");
    }

    /** psi(I) = 0, P(I) = 0 and tau(I) = 0. */
    @Test
    public void restStateIsStressFree() {
        // published: Truesdell and Noll, The Non-Linear Field Theories of Mechanics: psi(I) = 0, P(I) = 0
        MaterialLaw law = createLaw();
        double m = stiffness(law);
        double[] f = identity();
        assertEquals(0.0, energy(law, f)[0], REST_TOLERANCE * m, "psi(I)");
        assertArrayEquals(new double[9], piola(law, f), REST_TOLERANCE * m, "P(I)");
        assertArrayEquals(new double[9], kirchhoff(law, f), REST_TOLERANCE * m, "tau(I)");
    }

    /**
     * psi(Q) = 0 and P(Q) = 0 for a random rotation Q.
     *
     * @param index    random case
     * @param reporter receives the measured errors
     */
    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void rigidRotationIsStressFree(int index, TestReporter reporter) {
        // published: Truesdell and Noll, frame indifference: psi(Q) = psi(I) = 0 and P(Q) = Q P(I) = 0
        MaterialLaw law = createLaw();
        double m = stiffness(law);
        double[] q = store(RandomMatrices.rotation(caseRandom(index)));
        double psi = Math.abs(energy(law, q)[0]) / m;
        double p = norm(piola(law, q)) / m;
        reporter.publishEntry("rotation psi/M, |P|/M", psi + ", " + p);
        assertTrue(psi <= OBJECTIVITY_TOLERANCE, "psi(Q)/M = " + psi);
        assertTrue(p <= OBJECTIVITY_TOLERANCE, "|P(Q)|/M = " + p);
    }

    /**
     * psi(QF) = psi(F), P(QF) = Q P(F) and tau(QF) = Q tau(F) Q^T for random F and rotation Q.
     *
     * @param index    random case
     * @param reporter receives the measured errors
     */
    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void isObjective(int index, TestReporter reporter) {
        // published: Truesdell and Noll, frame indifference: psi(QF) = psi(F), P(QF) = Q P(F), tau(QF) = Q tau Q^T
        MaterialLaw law = createLaw();
        Random r = caseRandom(index);
        double[] f = store(randomDeformation(index));
        double[] q = store(RandomMatrices.rotation(new Random(r.nextLong() ^ 0x5DEECE66DL)));
        double[] qf = mul(q, f);
        double[] both = concat(f, qf);
        double[] psi = energy(law, both);
        double[] p = piola(law, both);
        double[] tau = kirchhoff(law, both);
        double ePsi = Math.abs(psi[1] - psi[0]) / Math.max(Math.abs(psi[0]), STRESS_FLOOR * stiffness(law));
        double eP = stressError(law, mul(q, part(p, 0)), part(p, 1));
        double eTau = stressError(law, mul(mul(q, part(tau, 0)), transpose(q)), part(tau, 1));
        reporter.publishEntry("objectivity psi, P, tau", ePsi + ", " + eP + ", " + eTau);
        assertTrue(ePsi <= OBJECTIVITY_TOLERANCE, "psi(QF) vs psi(F): " + ePsi);
        assertTrue(eP <= OBJECTIVITY_TOLERANCE, "P(QF) vs Q P(F): " + eP);
        assertTrue(eTau <= OBJECTIVITY_TOLERANCE, "tau(QF) vs Q tau(F) Q^T: " + eTau);
    }

    /**
     * psi(FQ) = psi(F) and P(FQ) = P(F) Q, for laws whose {@link #isotropic()} is true.
     *
     * @param index    random case
     * @param reporter receives the measured errors
     */
    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void isIsotropic(int index, TestReporter reporter) {
        // published: Truesdell and Noll, material symmetry of an isotropic solid: psi(FQ) = psi(F), P(FQ) = P(F) Q
        assumeTrue(isotropic(), "law declares preferred directions");
        MaterialLaw law = createLaw();
        Random r = caseRandom(index);
        double[] f = store(randomDeformation(index));
        double[] q = store(RandomMatrices.rotation(new Random(r.nextLong() ^ 0x2545F4914F6CDD1DL)));
        double[] both = concat(f, mul(f, q));
        double[] psi = energy(law, both);
        double[] p = piola(law, both);
        double ePsi = Math.abs(psi[1] - psi[0]) / Math.max(Math.abs(psi[0]), STRESS_FLOOR * stiffness(law));
        double eP = stressError(law, mul(part(p, 0), q), part(p, 1));
        reporter.publishEntry("isotropy psi, P", ePsi + ", " + eP);
        assertTrue(ePsi <= OBJECTIVITY_TOLERANCE, "psi(FQ) vs psi(F): " + ePsi);
        assertTrue(eP <= OBJECTIVITY_TOLERANCE, "P(FQ) vs P(F) Q: " + eP);
    }

    /**
     * P = dpsi/dF by central differences on a random F with det F &gt; 0, relative error below
     * {@link #DERIVATIVE_TOLERANCE}.
     *
     * @param index    random case
     * @param reporter receives the measured error
     */
    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void stressIsTheEnergyDerivative(int index, TestReporter reporter) {
        // common practice, no source: P = dpsi/dF, checked by central differences
        MaterialLaw law = createLaw();
        double[] f = store(randomDeformation(index));
        assertTrue(det(f) > 0, "generator gave det F <= 0");
        double error = derivativeError(law, f);
        reporter.publishEntry("relative error of P against dpsi/dF", Double.toString(error));
        assertTrue(error < DERIVATIVE_TOLERANCE, "relative error " + error + " for F = " + Arrays.toString(f));
    }

    /**
     * The law's tau equals P F^T and is symmetric, on a random F and, for invertible laws, an inverted one.
     *
     * @param index    random case
     * @param reporter receives the measured errors
     */
    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void kirchhoffStressIsPFTransposeAndSymmetric(int index, TestReporter reporter) {
        // published: Bonet and Wood, tau = P F^T = J sigma, symmetric by balance of angular momentum
        MaterialLaw law = createLaw();
        double[] f = store(randomDeformation(index));
        checkKirchhoff(law, f, "", reporter);
        if (invertible()) {
            // the closed form must follow the law's inversion handling too
            checkKirchhoff(law, store(RandomMatrices.inverted(caseRandom(index))), ", inverted", reporter);
        }
    }

    private void checkKirchhoff(MaterialLaw law, double[] f, String label, TestReporter reporter) {
        double[] tau = kirchhoff(law, f);
        double eDef = stressError(law, mul(piola(law, f), transpose(f)), tau);
        double eSym = stressError(law, transpose(tau), tau);
        reporter.publishEntry("tau vs P F^T, asymmetry" + label, eDef + ", " + eSym);
        assertTrue(eDef <= KIRCHHOFF_TOLERANCE, "tau vs P F^T" + label + ": " + eDef);
        assertTrue(eSym <= KIRCHHOFF_TOLERANCE, "tau vs tau^T" + label + ": " + eSym);
    }

    /**
     * P = dpsi/dF by central differences on a random inverted F (det F &lt; 0), for laws whose
     * {@link #invertible()} is true.
     *
     * @param index    random case
     * @param reporter receives the measured error
     */
    /**
     * The two parts of {@link MaterialLaw#splitKirchhoffStress} add up to tau and psi, and each stress part is
     * symmetric.
     *
     * @param index    random case
     * @param reporter receives the measured errors
     */
    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void splitAddsUpToTheWhole(int index, TestReporter reporter) {
        // common practice, no source: a tension-compression split partitions stress and energy
        // (e.g. Miehe et al. 2010, Amor et al. 2009); only the sum is checked, not the choice of split
        MaterialLaw law = createLaw();
        double[] f = store(randomDeformation(index));
        ArrayMaterialState state = createState(f);
        double[] tauD = new double[9];
        double[] tauK = new double[9];
        double[] psiD = new double[1];
        double[] psiK = new double[1];
        law.splitKirchhoffStress(state, 0, 1, tauD, tauK, psiD, psiK);
        double[] sum = new double[9];
        for (int k = 0; k < 9; k++) {
            sum[k] = tauD[k] + tauK[k];
        }
        double psi = energy(law, f)[0];
        double eTau = stressError(law, kirchhoff(law, f), sum);
        double ePsi = Math.abs(psiD[0] + psiK[0] - psi) / Math.max(Math.abs(psi), STRESS_FLOOR * stiffness(law));
        double eSym = Math.max(stressError(law, transpose(tauD), tauD), stressError(law, transpose(tauK), tauK));
        reporter.publishEntry("split sum tau, psi, asymmetry", eTau + ", " + ePsi + ", " + eSym);
        assertTrue(eTau <= KIRCHHOFF_TOLERANCE, "degraded + kept tau vs tau: " + eTau);
        assertTrue(ePsi <= KIRCHHOFF_TOLERANCE, "degraded + kept psi vs psi: " + ePsi);
        assertTrue(eSym <= KIRCHHOFF_TOLERANCE, "asymmetric part of the split: " + eSym);
    }

    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void stressIsTheEnergyDerivativeWhenInverted(int index, TestReporter reporter) {
        // published: Irving, Teran and Fedkiw 2004, Invertible finite elements: an inverted element keeps a
        // consistent energy and stress, so the force pushes it back; checked by central differences
        assumeTrue(invertible(), "law does not promise finite stress for det F <= 0");
        MaterialLaw law = createLaw();
        double[] f = store(RandomMatrices.inverted(caseRandom(index)));
        assertTrue(det(f) < 0, "generator gave det F >= 0");
        double error = derivativeError(law, f);
        reporter.publishEntry("relative error of P against dpsi/dF, inverted", Double.toString(error));
        assertTrue(error < DERIVATIVE_TOLERANCE, "relative error " + error + " for F = " + Arrays.toString(f));
    }

    /** Finite psi, P and tau on inverted, near-singular and rank-deficient F, for invertible laws. */
    @Test
    public void finiteOnSingularAndInvertedDeformation() {
        // common practice, no source: MPM particles can be crushed or inverted; the law must not hand back NaN
        assumeTrue(invertible(), "law does not promise finite stress for det F <= 0");
        MaterialLaw law = createLaw();
        Mat3[] hard = new Mat3[4 * 4];
        for (int i = 0; i < 4; i++) {
            hard[4 * i] = RandomMatrices.inverted(rand);
            hard[4 * i + 1] = RandomMatrices.nearSingular(rand);
            hard[4 * i + 2] = RandomMatrices.rankDeficient(rand, i % 3);
            hard[4 * i + 3] = Mat3Ops.scale(-1.0, RandomMatrices.farFromIdentity(rand), new Mat3());
        }
        double[] f = new double[9 * hard.length];
        for (int i = 0; i < hard.length; i++) {
            hard[i].store(f, 9 * i);
        }
        assertAllFinite(energy(law, f), "psi");
        assertAllFinite(piola(law, f), "P");
        assertAllFinite(kirchhoff(law, f), "tau");
    }

    /** A range [p, p) writes no output, changes no F and no channel, and accepts a zero-length output. */
    @Test
    public void emptyRangeWritesNothing() {
        // common practice, no source: [p, p) is an empty batch, which a worker gets when particles run out
        MaterialLaw law = createLaw();
        int n = 5;
        double[] f = randomBatch(n);
        double[] fCopy = f.clone();
        ArrayMaterialState state = createState(f);
        List<double[]> channelsBefore = channelCopies(law, state);
        for (int p : new int[] {0, 2, n}) {
            double[] out = sentinels(9 * n);
            law.energyDensity(state, p, p, out);
            law.firstPiolaKirchhoff(state, p, p, out);
            law.kirchhoffStress(state, p, p, out);
            law.projectDeformation(state, p, p);
            assertArrayEquals(sentinels(9 * n), out, "output written for the empty range [" + p + ", " + p + ")");
            double[] tauD = sentinels(9 * n);
            double[] tauK = sentinels(9 * n);
            double[] psiD = sentinels(n);
            double[] psiK = sentinels(n);
            law.splitKirchhoffStress(state, p, p, tauD, tauK, psiD, psiK);
            assertArrayEquals(sentinels(9 * n), tauD, "degraded tau written for an empty range");
            assertArrayEquals(sentinels(9 * n), tauK, "kept tau written for an empty range");
            assertArrayEquals(sentinels(n), psiD, "degraded psi written for an empty range");
            assertArrayEquals(sentinels(n), psiK, "kept psi written for an empty range");
            // a zero-length output array is enough for an empty range
            law.energyDensity(state, p, p, new double[0]);
            law.firstPiolaKirchhoff(state, p, p, new double[0]);
            law.kirchhoffStress(state, p, p, new double[0]);
        }
        assertArrayEquals(fCopy, f, "F modified by an empty range");
        assertChannelsUnchanged(law, state, channelsBefore, 0, n);
    }

    /**
     * A batch [from, to) gives the same bits as one call per particle, writes nothing past 9 (to - from) and
     * modifies neither F nor channels.
     */
    @Test
    public void batchResultsDoNotDependOnBatchBoundaries() {
        // common practice, no source: results must be bitwise identical for any split of the particles into
        // batches (DESIGN.md: same bits for 1, 2 or N threads); also checks the out[p - from] layout
        MaterialLaw law = createLaw();
        int n = 7;
        int from = 2;
        int to = 6;
        double[] f = randomBatch(n);
        double[] fCopy = f.clone();
        ArrayMaterialState state = createState(f);
        List<double[]> channelsBefore = channelCopies(law, state);
        double[] psi = sentinels(to - from + 3);
        double[] p = sentinels(9 * (to - from) + 3);
        double[] tau = sentinels(9 * (to - from) + 3);
        law.energyDensity(state, from, to, psi);
        law.firstPiolaKirchhoff(state, from, to, p);
        law.kirchhoffStress(state, from, to, tau);
        for (int k = to - from; k < psi.length; k++) {
            assertEquals(SENTINEL, psi[k], "psi written past the range");
        }
        for (int k = 9 * (to - from); k < p.length; k++) {
            assertEquals(SENTINEL, p[k], "P written past the range");
            assertEquals(SENTINEL, tau[k], "tau written past the range");
        }
        for (int i = from; i < to; i++) {
            double[] one = new double[1];
            double[] nine = new double[9];
            law.energyDensity(state, i, i + 1, one);
            assertEquals(one[0], psi[i - from], 0.0, "psi of particle " + i);
            law.firstPiolaKirchhoff(state, i, i + 1, nine);
            assertArrayEquals(nine, Arrays.copyOfRange(p, 9 * (i - from), 9 * (i - from + 1)), "P of particle " + i);
            law.kirchhoffStress(state, i, i + 1, nine);
            assertArrayEquals(nine, Arrays.copyOfRange(tau, 9 * (i - from), 9 * (i - from + 1)),
                    "tau of particle " + i);
        }
        assertArrayEquals(fCopy, f, "energy or stress evaluation modified F");
        assertChannelsUnchanged(law, state, channelsBefore, 0, n);
    }

    /** Declared channels are distinct and valid, and the law reads no channel it did not declare. */
    @Test
    public void channelDeclarationsAreTruthful() {
        // common practice, no source: the solver allocates exactly the declared channels, so a law may read no other
        MaterialLaw law = createLaw();
        List<ChannelSpec> specs = law.channels();
        assertNotNull(specs, "channels()");
        Set<String> names = new HashSet<>();
        for (ChannelSpec spec : specs) {
            assertNotNull(spec, "null channel declaration");
            assertTrue(names.add(spec.name()), "channel \"" + spec.name() + "\" declared twice");
            assertTrue(spec.width() >= 1 && spec.width() <= 9, "width of " + spec.name());
        }
        int n = 4;
        double[] f = randomBatch(n);
        ArrayMaterialState inner = createState(f);
        MaterialState guarded = new MaterialState() {
            @Override
            public double[] deformation() {
                return inner.deformation();
            }

            @Override
            public double[] channel(String name) {
                if (!names.contains(name)) {
                    fail("law read channel \"" + name + "\" that it did not declare; declared: " + names);
                }
                return inner.channel(name);
            }
        };
        law.energyDensity(guarded, 0, n, new double[n]);
        law.firstPiolaKirchhoff(guarded, 0, n, new double[9 * n]);
        law.kirchhoffStress(guarded, 0, n, new double[9 * n]);
        law.splitKirchhoffStress(guarded, 0, n, new double[9 * n], new double[9 * n], new double[n], new double[n]);
        law.projectDeformation(guarded, 0, n);
    }

    /**
     * projectDeformation changes nothing when projectsDeformation() is false, and nothing outside its range
     * otherwise.
     */
    @Test
    public void projectionStaysInsideItsRangeAndMatchesItsCapability() {
        // common practice, no source: the solver skips projectDeformation when projectsDeformation() is false,
        // so a law that says false must not need it; a law that projects must keep to its range
        MaterialLaw law = createLaw();
        int n = 6;
        int from = 2;
        int to = 4;
        double[] f = randomBatch(n);
        double[] fCopy = f.clone();
        ArrayMaterialState state = createState(f);
        List<double[]> channelsBefore = channelCopies(law, state);
        law.projectDeformation(state, from, to);
        if (law.projectsDeformation()) {
            assertArrayEquals(Arrays.copyOfRange(fCopy, 0, 9 * from), Arrays.copyOfRange(f, 0, 9 * from),
                    "F modified before the range");
            assertArrayEquals(Arrays.copyOfRange(fCopy, 9 * to, 9 * n), Arrays.copyOfRange(f, 9 * to, 9 * n),
                    "F modified after the range");
            assertChannelsUnchanged(law, state, channelsBefore, 0, from);
            assertChannelsUnchanged(law, state, channelsBefore, to, n);
        } else {
            assertArrayEquals(fCopy, f, "projectsDeformation() is false but projectDeformation changed F");
            assertChannelsUnchanged(law, state, channelsBefore, 0, n);
        }
    }

    /**
     * On finite deformation gradients (det F &gt; 0) the projection reports success (-1) and leaves F and every
     * channel finite; a return mapping reports a failure instead of writing NaN.
     */
    @Test
    public void projectionOfFiniteStatesSucceedsAndStaysFinite() {
        // common practice, no source: the solver treats a reported index as a divergence, so a law must not report
        // one for a sound state, and must never hand back a non-finite F or plastic state
        MaterialLaw law = createLaw();
        int n = 8;
        double[] f = randomBatch(n);
        ArrayMaterialState state = createState(f);
        assertEquals(-1, law.projectDeformation(state, 0, n), "projection reported a failure on finite states");
        assertAllFinite(f, "F after projection");
        for (ChannelSpec spec : law.channels()) {
            assertAllFinite(state.channel(spec.name()), "channel \"" + spec.name() + "\" after projection");
        }
    }

    // ---------------------------------------------------------------------------------------------------------
    // helpers shared by subclasses

    /**
     * dP/dF against central differences of P on a random F with det F &gt; 0, undamaged and, for every split the
     * law offers, degraded (P = g P_degraded + P_kept at g = 0.3), relative error below
     * {@link #DIFFERENTIAL_TOLERANCE}; for laws that provide the differential.
     *
     * @param index    random case
     * @param reporter receives the measured errors
     */
    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void stressDifferentialMatchesCentralDifferences(int index, TestReporter reporter) {
        // common practice, no source: dP = (dP/dF) : dF, checked by central differences (VALIDATION.md F27)
        MaterialLaw law = createLaw();
        assumeTrue(law.hasStressDifferential(), "law does not provide its stress differential");
        double[] f = store(randomDeformation(index));
        assertTrue(det(f) > 0, "generator gave det F <= 0");
        double step = DIFFERENCE_STEP * norm(f);
        double floor = STRESS_FLOOR * stiffness(law);
        ArrayMaterialState state = createState(f);
        double worst = StressDifferentialChecks.differenceError(law, state, null, 1, step, floor);
        StringBuilder seen = new StringBuilder("undamaged " + worst);
        for (TensionSplit split : TensionSplit.values()) {
            if (law.supportsSplit(split)) {
                double e = StressDifferentialChecks.differenceError(law, state, split, 0.3, step, floor);
                seen.append(", ").append(split).append(' ').append(e);
                worst = Math.max(worst, e);
            }
        }
        reporter.publishEntry("relative error of dP/dF against central differences", seen.toString());
        assertTrue(worst < DIFFERENTIAL_TOLERANCE, seen + " for F = " + Arrays.toString(f));
    }

    /**
     * The projected differential has no eigenvalue below zero (EJML's eigenvalues, to rounding), and at a rigid
     * rotation, where the differential is that of linear elasticity and so semi-definite, the projection changes
     * nothing.
     *
     * @param index    random case
     * @param reporter receives the smallest eigenvalue
     */
    @ParameterizedTest(name = "case {0}")
    @MethodSource("randomCases")
    public void projectedStressDifferentialIsPositiveSemiDefinite(int index, TestReporter reporter) {
        // published: Teran, Sifakis, Irving and Fedkiw 2005, definiteness fix by eigenvalue clamping; EJML as the
        // reference eigen-decomposition; at a rotation every law linearises to linear elasticity, whose energy is convex (Bonet and Wood)
        MaterialLaw law = createLaw();
        assumeTrue(law.hasStressDifferential(), "law does not provide its stress differential");
        double m = stiffness(law);
        double[] f = store(randomDeformation(index));
        ArrayMaterialState state = createState(f);
        double[] projected = new double[MaterialLaw.DIFFERENTIAL_SIZE];
        law.stressDifferential(state, 0, 1, TensionSplit.LAW_DEFAULT, new double[] {0.5}, true, projected);
        double[] eig = StressDifferentialChecks.eigenvalues(projected);
        double smallest = Arrays.stream(eig).min().orElseThrow();
        double largest = Arrays.stream(eig).map(Math::abs).max().orElseThrow();
        reporter.publishEntry("smallest / largest eigenvalue", Double.toString(smallest / largest));
        // rounding of a 9x9 eigen-decomposition scales with the largest eigenvalue (a stretched exponential fiber
        // can make it 1e17 times the law's stiffness)
        assertTrue(smallest >= -1e-12 * Math.max(largest, m), "eigenvalue " + smallest + " Pa of the projected "
                + "differential, largest " + largest);
        double[] rest = store(RandomMatrices.rotation(caseRandom(index)));
        ArrayMaterialState near = createState(rest);
        double[] exact = new double[MaterialLaw.DIFFERENTIAL_SIZE];
        law.stressDifferential(near, 0, 1, null, null, false, exact);
        law.stressDifferential(near, 0, 1, null, null, true, projected);
        double d = 0;
        for (int i = 0; i < exact.length; i++) {
            d = Math.max(d, Math.abs(exact[i] - projected[i]));
        }
        assertTrue(d <= 1e-9 * m, "projection changed a convex differential by " + d + " Pa");
    }

    /**
     * Largest relative error, over the nine entries, between P(F) and the central difference of psi.
     *
     * @param law the law
     * @param f   F, 9 values row-major (input, not modified)
     * @return ||P_fd - P||_F / max(||P||_F, STRESS_FLOOR M)
     */
    protected double derivativeError(MaterialLaw law, double[] f) {
        double h = DIFFERENCE_STEP * norm(f);
        // all 18 perturbed copies in one batch: one call, as the solver makes it
        double[] shifted = new double[18 * 9];
        for (int k = 0; k < 9; k++) {
            System.arraycopy(f, 0, shifted, 9 * (2 * k), 9);
            System.arraycopy(f, 0, shifted, 9 * (2 * k + 1), 9);
            shifted[9 * (2 * k) + k] += h;
            shifted[9 * (2 * k + 1) + k] -= h;
        }
        double[] psi = energy(law, shifted);
        double[] numeric = new double[9];
        for (int k = 0; k < 9; k++) {
            // the actual step after rounding F + h, so the quotient is not biased by it
            double step = shifted[9 * (2 * k) + k] - shifted[9 * (2 * k + 1) + k];
            numeric[k] = (psi[2 * k] - psi[2 * k + 1]) / step;
        }
        return stressError(law, numeric, piola(law, f));
    }

    /**
     * @param law      the law, for its stiffness scale
     * @param expected reference 3x3 stress
     * @param actual   3x3 stress to check
     * @return ||actual - expected||_F / max(||expected||_F, STRESS_FLOOR M)
     */
    protected static double stressError(MaterialLaw law, double[] expected, double[] actual) {
        double d = 0;
        for (int k = 0; k < 9; k++) {
            double e = actual[k] - expected[k];
            d += e * e;
        }
        return Math.sqrt(d) / Math.max(norm(expected), STRESS_FLOOR * stiffness(law));
    }

    /**
     * @param law the law
     * @return stiffness scale M = density * waveSpeed^2, Pa (the P-wave modulus for isotropic laws)
     */
    protected static double stiffness(MaterialLaw law) {
        return law.density() * law.waveSpeed() * law.waveSpeed();
    }

    /**
     * @param law the law
     * @param f   deformation gradients, 9 per particle (input, not modified)
     * @return psi of each particle, J/m^3
     */
    protected double[] energy(MaterialLaw law, double[] f) {
        int n = f.length / 9;
        double[] out = new double[n];
        law.energyDensity(createState(f), 0, n, out);
        return out;
    }

    /**
     * @param law the law
     * @param f   deformation gradients, 9 per particle (input, not modified)
     * @return P of each particle, 9 per particle, Pa
     */
    protected double[] piola(MaterialLaw law, double[] f) {
        int n = f.length / 9;
        double[] out = new double[9 * n];
        law.firstPiolaKirchhoff(createState(f), 0, n, out);
        return out;
    }

    /**
     * @param law the law
     * @param f   deformation gradients, 9 per particle (input, not modified)
     * @return tau of each particle, 9 per particle, Pa
     */
    protected double[] kirchhoff(MaterialLaw law, double[] f) {
        int n = f.length / 9;
        double[] out = new double[9 * n];
        law.kirchhoffStress(createState(f), 0, n, out);
        return out;
    }

    /** @return the identity, 9 values row-major */
    protected static double[] identity() {
        return new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1};
    }

    /**
     * @param m matrix (input, not modified)
     * @return its 9 entries, row-major
     */
    protected static double[] store(Mat3 m) {
        double[] a = new double[9];
        m.store(a, 0);
        return a;
    }

    /**
     * @param a 3x3 row-major
     * @param b 3x3 row-major
     * @return a b, new array
     */
    protected static double[] mul(double[] a, double[] b) {
        double[] out = new double[9];
        Mat3Ops.mul(a, 0, b, 0, out, 0);
        return out;
    }

    /**
     * @param a 3x3 row-major
     * @return a^T, new array
     */
    protected static double[] transpose(double[] a) {
        return new double[] {a[0], a[3], a[6], a[1], a[4], a[7], a[2], a[5], a[8]};
    }

    /**
     * @param a 3x3 row-major
     * @return det a
     */
    protected static double det(double[] a) {
        return Mat3Ops.det(a, 0);
    }

    /**
     * @param a values
     * @return Frobenius (Euclidean) norm of all values
     */
    protected static double norm(double[] a) {
        double s = 0;
        for (double x : a) {
            s += x * x;
        }
        return Math.sqrt(s);
    }

    private double[] randomBatch(int n) {
        double[] f = new double[9 * n];
        for (int i = 0; i < n; i++) {
            RandomMatrices.farFromIdentity(rand).store(f, 9 * i);
        }
        return f;
    }

    private static double[] part(double[] a, int particle) {
        return Arrays.copyOfRange(a, 9 * particle, 9 * particle + 9);
    }

    private static double[] concat(double[] a, double[] b) {
        double[] out = Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, out, a.length, b.length);
        return out;
    }

    private static double[] sentinels(int n) {
        double[] a = new double[n];
        Arrays.fill(a, SENTINEL);
        return a;
    }

    private static void assertAllFinite(double[] a, String what) {
        for (int i = 0; i < a.length; i++) {
            assertTrue(Double.isFinite(a[i]), what + "[" + i + "] = " + a[i]);
        }
    }

    private static List<double[]> channelCopies(MaterialLaw law, ArrayMaterialState state) {
        return law.channels().stream().map(c -> state.channel(c.name()).clone()).toList();
    }

    private static void assertChannelsUnchanged(MaterialLaw law, ArrayMaterialState state, List<double[]> before,
            int from, int to) {
        List<ChannelSpec> specs = law.channels();
        for (int c = 0; c < specs.size(); c++) {
            int w = specs.get(c).width();
            double[] now = state.channel(specs.get(c).name());
            assertArrayEquals(Arrays.copyOfRange(before.get(c), w * from, w * to),
                    Arrays.copyOfRange(now, w * from, w * to),
                    "channel \"" + specs.get(c).name() + "\" modified at particles [" + from + ", " + to + ")");
        }
    }
}

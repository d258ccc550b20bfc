package dev.fray.core.math;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.RandomMatrices;
import java.util.Arrays;
import java.util.Random;
import java.util.function.Function;
import java.util.stream.IntStream;
import java.util.stream.Stream;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.SingularValueDecomposition_F64;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Checks {@link Svd3} against EJML's general SVD ({@code DecompositionFactory_DDRM.svd}, reference library:
 * EJML 0.46.1) and against the defining properties of the inversion-safe SVD and the polar decomposition
 * (published: Irving, Teran and Fedkiw 2004, <i>Invertible finite elements for robust simulation of large
 * deformation</i>). VALIDATION.md item A5.
 */
class Svd3Test extends FrayTestBase {
    /** Seeds per matrix family. */
    private static final int SEEDS_PER_FAMILY = 200;

    /**
     * ||U S V^T - a||_F / ||a||_F. The contract in VALIDATION.md A5 is 1e-12; tightened because the measured worst
     * case is 2e-15, so a regression by an order of magnitude already fails.
     */
    private static final double RECONSTRUCTION_TOL = 1e-14;
    /** ||Q^T Q - I||_F for U, V and R; measured worst 3e-15. Common practice, no source. */
    private static final double ORTHOGONALITY_TOL = 1e-14;
    /** |det Q - 1| for U, V and R. Common practice, no source. */
    private static final double DET_TOL = 1e-14;
    /**
     * |sigma_i - sigma_i(EJML)| / ||a||_F. Both are backward stable, so by Weyl's inequality each differs from the
     * exact value by a few ulps of ||a||. Reference library: EJML.
     */
    private static final double SINGULAR_VALUE_TOL = 1e-14;
    /**
     * The sign convention is checked against EJML's determinant (LU) only when |det a| exceeds this times
     * ||a||_F^3. Below that the sign is at the rounding level of the determinant itself. Common practice, no source.
     */
    private static final double DET_SIGN_MARGIN = 1e-12;
    /**
     * ||R - R(EJML)||_F per unit of sigma.x / (sigma.y + sigma.z). The orthogonal polar factor is unique for
     * nonsingular a, and its sensitivity to perturbations of a is about 2 / (sigma_2 + sigma_3). Published: Higham,
     * <i>Functions of Matrices</i> (SIAM 2008), chapter 8.
     */
    private static final double POLAR_FACTOR_TOL = 1e-14;

    /** Matrix families, with the sign of det(a) the generator guarantees (0: either sign or at rounding level). */
    enum Family {
        UNIFORM(0, RandomMatrices::uniform),
        ROTATION(1, RandomMatrices::rotation),
        NEAR_IDENTITY(1, r -> RandomMatrices.nearIdentity(r, 1e-3)),
        MODERATE_STRAIN(1, r -> RandomMatrices.nearIdentity(r, 0.3)),
        FAR_FROM_IDENTITY(1, RandomMatrices::farFromIdentity),
        NEAR_SINGULAR(1, RandomMatrices::nearSingular),
        NEAR_SINGULAR_INVERTED(-1, r -> RandomMatrices.withSingularValues(r, RandomMatrices.logUniform(r, 0.5, 2),
                RandomMatrices.logUniform(r, 0.5, 2), -Math.pow(10, -(9 + 5 * r.nextDouble())))),
        /**
         * Two small singular values: sigma = (1, 1e-4..1e-9, 1e-10..1e-14). This is where an SVD built on a^T a
         * loses the trailing singular vectors and fails the reconstruction bound.
         */
        TWO_SMALL(0, r -> RandomMatrices.withSingularValues(r, 1, Math.pow(10, -(4 + 5 * r.nextDouble())),
                Math.pow(10, -(10 + 4 * r.nextDouble())))),
        REPEATED(1, RandomMatrices::repeatedSingularValues),
        INVERTED(-1, RandomMatrices::inverted),
        RANK_ONE(0, r -> RandomMatrices.rankDeficient(r, 1)),
        RANK_TWO(0, r -> RandomMatrices.rankDeficient(r, 2)),
        HUGE(0, r -> Mat3Ops.scale(1e300, RandomMatrices.uniform(r), new Mat3())),
        TINY(0, r -> Mat3Ops.scale(1e-300, RandomMatrices.uniform(r), new Mat3()));

        final int detSign;
        final Function<Random, Mat3> generator;

        Family(int detSign, Function<Random, Mat3> generator) {
            this.detSign = detSign;
            this.generator = generator;
        }
    }

    static Stream<Arguments> familySeeds() {
        return Arrays.stream(Family.values())
                .flatMap(f -> IntStream.range(0, SEEDS_PER_FAMILY).mapToObj(i -> Arguments.of(f, SEED + i)));
    }

    // ----------------------------------------------------------------------------------------------------- SVD

    @ParameterizedTest(name = "{0} seed {1}")
    @MethodSource("familySeeds")
    void svdMatchesEjmlAndIsInversionSafe(Family family, long seed) {
        Mat3 a = family.generator.apply(new Random(seed));
        Mat3 aCopy = new Mat3(a);
        Mat3 u = new Mat3(), v = new Mat3();
        Vec3 s = new Vec3();
        assertTrue(Svd3.decompose(a, u, s, v), "decompose failed on finite input " + a);
        assertBits(aCopy, a, "input modified");
        checkSvd(a, u, s, v);

        // singular values against EJML's general SVD (reference library: EJML)
        SingularValueDecomposition_F64<DMatrixRMaj> ref = DecompositionFactory_DDRM.svd(3, 3, true, true, false);
        assertTrue(ref.decompose(ej(a)));
        double[] expected = Arrays.copyOf(ref.getSingularValues(), 3);
        Arrays.sort(expected);
        double[] actual = {Math.abs(s.z), s.y, s.x};
        double n = norm(a);
        assertArrayEquals(expected, actual, SINGULAR_VALUE_TOL * n, "singular values vs EJML for " + a);

        // sign convention: sigma.z < 0 exactly when det a < 0 (published: Irving et al. 2004)
        if (family.detSign != 0) {
            assertEquals(family.detSign < 0, s.z < 0, "sign of sigma.z vs the generator's det sign, sigma = " + s);
        }
        Mat3 unit = Mat3Ops.scale(Math.scalb(1.0, -Math.getExponent(maxAbs(a))), a, new Mat3()); // same det sign, no overflow
        double det = CommonOps_DDRM.det(ej(unit)); // reference library: EJML (LU)
        double nu = Mat3Ops.normF(unit);
        if (Math.abs(det) > DET_SIGN_MARGIN * nu * nu * nu) {
            assertEquals(det < 0, s.z < 0, "sign of sigma.z vs EJML det " + det + ", sigma = " + s);
        }
    }

    /** The properties every result must have, with or without a reference. */
    private static void checkSvd(Mat3 a, Mat3 u, Vec3 s, Mat3 v) {
        assertRotation(u, "U");
        assertRotation(v, "V");
        // ordering (published: Irving et al. 2004): only the smallest may be negative
        assertTrue(s.x >= s.y && s.y >= Math.abs(s.z), "sigma not ordered: " + s);
        assertTrue(s.y >= 0, "sigma.y negative: " + s);
        assertTrue(relErr(reconstruct(u, s, v), a) <= RECONSTRUCTION_TOL,
                "||U S V^T - a|| / ||a|| = " + relErr(reconstruct(u, s, v), a) + " for " + a);
    }

    // --------------------------------------------------------------------------------------------------- polar

    @ParameterizedTest(name = "{0} seed {1}")
    @MethodSource("familySeeds")
    void polarFactorsAreRotationAndSymmetric(Family family, long seed) {
        Mat3 a = family.generator.apply(new Random(seed));
        Mat3 r = new Mat3(), s = new Mat3();
        assertTrue(Svd3.polar(a, r, s));
        assertRotation(r, "R");
        assertBits(s, Mat3Ops.transpose(s, new Mat3()), "S must be exactly symmetric");
        assertTrue(relErr(Mat3Ops.mul(r, s, new Mat3()), a) <= RECONSTRUCTION_TOL,
                "||R S - a|| / ||a|| = " + relErr(Mat3Ops.mul(r, s, new Mat3()), a));

        // the same R from every entry point; rotation() shares the early exit
        Mat3 r2 = new Mat3(), r3 = new Mat3();
        assertTrue(Svd3.polar(a, r2, null));
        assertTrue(Svd3.rotation(a, r3));
        assertBits(r, r2, "polar without S");
        assertBits(r, r3, "rotation");

        // S = V diag(sigma) V^T: its trace is the sum of the signed singular values
        Mat3 u = new Mat3(), v = new Mat3();
        Vec3 sigma = new Vec3();
        assertTrue(Svd3.decompose(a, u, sigma, v));
        double n = norm(a);
        assertEquals(sigma.x + sigma.y + sigma.z, Mat3Ops.trace(s), 8 * RECONSTRUCTION_TOL * n, "trace S");

        // R against U V^T from EJML where the polar factor is unique and a rotation (reference library: EJML)
        if (family.detSign > 0 && sigma.z > 1e-6 * sigma.x) {
            SingularValueDecomposition_F64<DMatrixRMaj> ref = DecompositionFactory_DDRM.svd(3, 3, true, true, false);
            assertTrue(ref.decompose(ej(a)));
            DMatrixRMaj rRef = CommonOps_DDRM.multTransB(ref.getU(null, false), ref.getV(null, false),
                    new DMatrixRMaj(3, 3));
            double tol = POLAR_FACTOR_TOL * sigma.x / (sigma.y + sigma.z);
            assertArrayEquals(rRef.data, ej(r).data, tol, "R vs EJML U V^T");
        }
    }

    // ------------------------------------------------------------------------------------------- special cases

    @Test
    void exactSpecialCases() {
        // diagonal: singular values are the sorted absolute values, the sign moves to the smallest (Irving et al.)
        assertSigma(diag(3, 2, 1), 3, 2, 1);
        assertSigma(diag(1, 2, 3), 3, 2, 1);
        assertSigma(diag(1, 1, 1), 1, 1, 1);
        assertSigma(diag(-2, 1, 0.5), 2, 1, -0.5);
        assertSigma(diag(-1, -1, 1), 1, 1, 1);
        assertSigma(diag(-1, -1, -1), 1, 1, -1);
        assertSigma(diag(0, 5, 0), 5, 0, 0);
        // odd permutation: orthogonal with det -1
        assertSigma(new Mat3().set(0, 1, 0, 1, 0, 0, 0, 0, 1), 1, 1, -1);
        // exactly rank one: (1,2,3)^T (4,5,6) has sigma_1 = |x| |y| (common practice, no source)
        Mat3 outer = new Mat3().set(4, 5, 6, 8, 10, 12, 12, 15, 18);
        Vec3 s = svd(outer);
        assertEquals(Math.sqrt(14) * Math.sqrt(77), s.x, 1e-14 * s.x);
        assertEquals(0, s.y, 1e-15 * s.x);
        assertEquals(0, s.z, 1e-15 * s.x);
        // a zero column and two equal rows: exactly singular
        Mat3 zeroCol = RandomMatrices.uniform(rand);
        zeroCol.m01 = 0;
        zeroCol.m11 = 0;
        zeroCol.m21 = 0;
        assertEquals(0, svd(zeroCol).z, 1e-15 * norm(zeroCol));
        Mat3 twoRows = RandomMatrices.uniform(rand);
        twoRows.m20 = twoRows.m00;
        twoRows.m21 = twoRows.m01;
        twoRows.m22 = twoRows.m02;
        assertEquals(0, svd(twoRows).z, 1e-15 * norm(twoRows));
    }

    @Test
    void zeroMatrixGivesIdentityRotations() {
        Mat3 u = new Mat3(), v = new Mat3(), r = new Mat3(), s = new Mat3().set(9, 9, 9, 9, 9, 9, 9, 9, 9);
        Vec3 sigma = new Vec3(9, 9, 9);
        assertTrue(Svd3.decompose(new Mat3(), u, sigma, v));
        assertBits(new Mat3().setIdentity(), u, "U");
        assertBits(new Mat3().setIdentity(), v, "V");
        assertArrayEquals(new double[] {0, 0, 0}, new double[] {sigma.x, sigma.y, sigma.z}, 0);
        assertTrue(Svd3.polar(new Mat3(), r, s));
        assertBits(new Mat3().setIdentity(), r, "R");
        assertBits(new Mat3(), s, "S");
    }

    /** Failure is a return value and leaves the outputs alone (STYLE.md: kernels return a status). */
    @Test
    void nonFiniteInputIsReportedNotThrown() {
        double[] bad = {Double.NaN, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY};
        for (double x : bad) {
            for (int k = 0; k < 9; k++) {
                double[] d = new double[9];
                RandomMatrices.rotation(rand).store(d, 0);
                d[k] = x;
                Mat3 a = new Mat3().load(d, 0);
                Mat3 u = sentinel(), v = sentinel(), r = sentinel(), s = sentinel();
                Vec3 sigma = new Vec3(7, 7, 7);
                assertFalse(Svd3.decompose(a, u, sigma, v), "decompose must fail on " + a);
                assertFalse(Svd3.polar(a, r, s), "polar must fail on " + a);
                assertFalse(Svd3.rotation(a, r), "rotation must fail on " + a);
                for (Mat3 m : new Mat3[] {u, v, r, s}) {
                    assertBits(sentinel(), m, "output modified after failure");
                }
                assertArrayEquals(new double[] {7, 7, 7}, new double[] {sigma.x, sigma.y, sigma.z}, 0);
            }
        }
        // finite input whose singular values overflow
        Mat3 big = new Mat3().set(Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE,
                Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE);
        assertFalse(Svd3.decompose(big, new Mat3(), new Vec3(), new Mat3()));
    }

    /** Subnormal entries still give rotations; the accuracy is that of the subnormal input. */
    @Test
    void subnormalInput() {
        for (int i = 0; i < 50; i++) {
            Mat3 a = Mat3Ops.scale(1e-310, RandomMatrices.farFromIdentity(rand), new Mat3());
            Mat3 u = new Mat3(), v = new Mat3();
            Vec3 s = new Vec3();
            assertTrue(Svd3.decompose(a, u, s, v));
            assertRotation(u, "U");
            assertRotation(v, "V");
            // 1e-310 keeps about 44 of 53 bits, and subnormal products lose more
            assertTrue(relErr(reconstruct(u, s, v), a) <= 1e-9, "subnormal reconstruction");
        }
    }

    /** Outputs may be the same instance as the input: all reads happen before any write. */
    @Test
    void outputMayAliasInput() {
        for (int i = 0; i < 50; i++) {
            Mat3 a = RandomMatrices.farFromIdentity(rand);
            Mat3 u = new Mat3(), v = new Mat3(), r = new Mat3(), s = new Mat3();
            Vec3 sigma = new Vec3();
            Svd3.decompose(a, u, sigma, v);
            Svd3.polar(a, r, s);

            Mat3 x = new Mat3(a), v2 = new Mat3();
            Vec3 sigma2 = new Vec3();
            assertTrue(Svd3.decompose(x, x, sigma2, v2));
            assertBits(u, x, "u == a");
            x = new Mat3(a);
            Mat3 u2 = new Mat3();
            assertTrue(Svd3.decompose(x, u2, sigma2, x));
            assertBits(v, x, "v == a");
            x = new Mat3(a);
            Mat3 s2 = new Mat3();
            assertTrue(Svd3.polar(x, x, s2));
            assertBits(r, x, "r == a");
            x = new Mat3(a);
            Mat3 r2 = new Mat3();
            assertTrue(Svd3.polar(x, r2, x));
            assertBits(s, x, "s == a");
            x = new Mat3(a);
            assertTrue(Svd3.rotation(x, x));
            assertBits(r, x, "rotation r == a");
        }
    }

    /** Near-rotations take the early exit: R is a itself. A reflection must not take it. */
    @Test
    void rotationEarlyExit() {
        for (int i = 0; i < 100; i++) {
            Mat3 q = RandomMatrices.rotation(rand);
            Mat3 r = new Mat3(), s = new Mat3();
            assertTrue(Svd3.rotation(q, r));
            assertBits(q, r, "early exit returns a rotation unchanged");
            assertTrue(Svd3.polar(q, r, s));
            assertTrue(relErr(s, new Mat3().setIdentity()) <= 1e-14, "S of a rotation is I");

            // reflection: orthogonal, det -1; R must still be a rotation and S = diag(1, 1, -1) in some basis
            Mat3 refl = new Mat3(q);
            refl.m02 = -refl.m02;
            refl.m12 = -refl.m12;
            refl.m22 = -refl.m22;
            assertTrue(Svd3.polar(refl, r, s));
            assertRotation(r, "R of a reflection");
            assertTrue(relErr(Mat3Ops.mul(r, s, new Mat3()), refl) <= RECONSTRUCTION_TOL, "R S of a reflection");
            assertEquals(1, Mat3Ops.trace(s), 1e-14, "S of a reflection has eigenvalues 1, 1, -1");

            // just outside the early-exit tolerance: the general path, still a rotation close to q
            Mat3 near = Mat3Ops.mul(q, RandomMatrices.nearIdentity(rand, 1e-10), new Mat3());
            assertTrue(Svd3.rotation(near, r));
            assertRotation(r, "R of a near-rotation");
            assertTrue(relErr(r, q) <= 1e-9, "R of a near-rotation stays near q");
        }
    }

    /** No shared mutable state: many threads give bit-identical results to one thread. */
    @Test
    void threadSafe() {
        int n = 2000;
        Mat3[] in = new Mat3[n];
        for (int i = 0; i < n; i++) {
            in[i] = RandomMatrices.uniform(rand);
        }
        double[] serial = new double[n * 21];
        double[] parallel = new double[n * 21];
        IntStream.range(0, n).forEach(i -> run(in[i], serial, i));
        IntStream.range(0, n).parallel().forEach(i -> run(in[i], parallel, i));
        assertArrayEquals(serial, parallel, 0);
    }

    // -------------------------------------------------------------------------------------------------- helpers

    private static void run(Mat3 a, double[] out, int i) {
        Mat3 u = new Mat3(), v = new Mat3();
        Vec3 s = new Vec3();
        Svd3.decompose(a, u, s, v);
        u.store(out, 21 * i);
        v.store(out, 21 * i + 9);
        s.store(out, 21 * i + 18);
    }

    private static Vec3 svd(Mat3 a) {
        Mat3 u = new Mat3(), v = new Mat3();
        Vec3 s = new Vec3();
        assertTrue(Svd3.decompose(a, u, s, v));
        checkSvd(a, u, s, v);
        return s;
    }

    private static void assertSigma(Mat3 a, double x, double y, double z) {
        Vec3 s = svd(a);
        assertArrayEquals(new double[] {x, y, z}, new double[] {s.x, s.y, s.z}, 1e-15 * x, "sigma of " + a);
    }

    private static void assertRotation(Mat3 q, String name) {
        Mat3 qtq = Mat3Ops.mulTransA(q, q, new Mat3());
        double err = relErr(qtq, new Mat3().setIdentity()) * Math.sqrt(3); // ||Q^T Q - I||_F
        assertTrue(err <= ORTHOGONALITY_TOL, name + " not orthogonal: ||Q^T Q - I|| = " + err + " for " + q);
        assertEquals(1, Mat3Ops.det(q), DET_TOL, name + " is not a proper rotation: det = " + Mat3Ops.det(q));
    }

    private static Mat3 reconstruct(Mat3 u, Vec3 s, Mat3 v) {
        Mat3 d = new Mat3().set(s.x, 0, 0, 0, s.y, 0, 0, 0, s.z);
        return Mat3Ops.mulTransB(Mat3Ops.mul(u, d, new Mat3()), v, new Mat3());
    }

    /**
     * ||x - ref||_F / ||ref||_F, computed after an exact power-of-two scaling by ref's largest entry so that
     * 1e300, 1e-300 and subnormal matrices work (1 / 1e-310 would overflow).
     */
    private static double relErr(Mat3 x, Mat3 ref) {
        double m = maxAbs(ref);
        if (m == 0) {
            return Mat3Ops.normF(x) == 0 ? 0 : Double.POSITIVE_INFINITY;
        }
        double k = Math.scalb(1.0, -Math.getExponent(m));
        Mat3 d = Mat3Ops.sub(x, ref, new Mat3());
        return Mat3Ops.normF(Mat3Ops.scale(k, d, d)) / Mat3Ops.normF(Mat3Ops.scale(k, ref, new Mat3()));
    }

    /** ||a||_F without overflow or underflow. */
    private static double norm(Mat3 a) {
        double m = maxAbs(a);
        if (m == 0) {
            return 0;
        }
        int e = Math.getExponent(m);
        return Math.scalb(Mat3Ops.normF(Mat3Ops.scale(Math.scalb(1.0, -e), a, new Mat3())), e);
    }

    private static double maxAbs(Mat3 a) {
        double[] d = new double[9];
        a.store(d, 0);
        return Arrays.stream(d).map(Math::abs).max().orElse(0);
    }

    private static Mat3 diag(double x, double y, double z) {
        return new Mat3().set(x, 0, 0, 0, y, 0, 0, 0, z);
    }

    private static Mat3 sentinel() {
        return new Mat3().set(7, 7, 7, 7, 7, 7, 7, 7, 7);
    }

    private static DMatrixRMaj ej(Mat3 m) {
        double[] d = new double[9];
        m.store(d, 0);
        return new DMatrixRMaj(3, 3, true, d);
    }

    private static void assertBits(Mat3 expected, Mat3 actual, String what) {
        assertArrayEquals(ej(expected).data, ej(actual).data, 0, what);
    }
}

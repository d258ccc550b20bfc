package dev.fray.core.math;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.RandomMatrices;
import java.lang.reflect.Method;
import java.lang.reflect.Modifier;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Random;
import java.util.Set;
import java.util.TreeSet;
import java.util.stream.Collectors;
import java.util.stream.Stream;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.NormOps_DDRM;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Compares every public op of {@link Mat3Ops} with EJML's general row-major ops ({@code CommonOps_DDRM},
 * reference library: EJML 0.46.1) on seeded random inputs, checks that every op is alias-safe, and counts coverage
 * by reflection so that an op added without a comparison fails the build (EJML's {@code CompareFixed_DDRM} idea).
 */
class Mat3OpsTest extends FrayTestBase {
    /** Random inputs per op. */
    private static final int TRIALS = 200;
    /**
     * Products and sums: a few ulps of the operand scale. EJML's loops sum in the same order, so in practice the
     * results agree exactly; the slack allows a different summation order. Common practice, no source.
     */
    private static final double ROUNDING_TOL = 4e-16;
    /** Inverse: relative error per unit condition number, the usual forward error bound. Common practice. */
    private static final double INVERSE_TOL = 1e-14;

    /** One comparison against EJML, run on TRIALS random inputs. */
    @FunctionalInterface
    interface Check {
        void run(Random rand);
    }

    // ---------------------------------------------------------------------------------------------- comparisons

    /** Signature, as built by {@link #signature(Method)}, to its comparison with EJML. */
    private static Map<String, Check> comparisons() {
        Map<String, Check> m = new LinkedHashMap<>();
        m.put("mul(Mat3,Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = CommonOps_DDRM.mult(ej(a), ej(b), new DMatrixRMaj(3, 3));
            assertClose(ref, Mat3Ops.mul(a, b, new Mat3()), ROUNDING_TOL * scale(a, b), "mul");
        });
        m.put("mulTransA(Mat3,Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = CommonOps_DDRM.multTransA(ej(a), ej(b), new DMatrixRMaj(3, 3));
            assertClose(ref, Mat3Ops.mulTransA(a, b, new Mat3()), ROUNDING_TOL * scale(a, b), "mulTransA");
        });
        m.put("mulTransB(Mat3,Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = CommonOps_DDRM.multTransB(ej(a), ej(b), new DMatrixRMaj(3, 3));
            assertClose(ref, Mat3Ops.mulTransB(a, b, new Mat3()), ROUNDING_TOL * scale(a, b), "mulTransB");
        });
        m.put("mulAdd(Mat3,Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand), c = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = ej(c);
            CommonOps_DDRM.multAdd(ej(a), ej(b), ref);
            assertClose(ref, Mat3Ops.mulAdd(a, b, new Mat3(c)), ROUNDING_TOL * (scale(a, b) + Mat3Ops.normF(c)), "mulAdd");
        });
        m.put("add(Mat3,Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = CommonOps_DDRM.add(ej(a), ej(b), new DMatrixRMaj(3, 3));
            assertClose(ref, Mat3Ops.add(a, b, new Mat3()), 0, "add"); // one rounding each: exact
        });
        m.put("sub(Mat3,Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = CommonOps_DDRM.subtract(ej(a), ej(b), new DMatrixRMaj(3, 3));
            assertClose(ref, Mat3Ops.sub(a, b, new Mat3()), 0, "sub");
        });
        m.put("scale(double,Mat3,Mat3)", rand -> {
            double alpha = 10 * rand.nextGaussian();
            Mat3 a = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = new DMatrixRMaj(3, 3);
            CommonOps_DDRM.scale(alpha, ej(a), ref);
            assertClose(ref, Mat3Ops.scale(alpha, a, new Mat3()), 0, "scale");
        });
        m.put("addEquals(Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = ej(a);
            CommonOps_DDRM.addEquals(ref, ej(b));
            Mat3Ops.addEquals(a, b);
            assertClose(ref, a, 0, "addEquals");
        });
        m.put("det(Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            double n = Mat3Ops.normF(a);
            // EJML uses its own unrolled minor expansion for 3x3; the bound is the rounding of a cubic form
            assertEquals(CommonOps_DDRM.det(ej(a)), Mat3Ops.det(a), 8 * ROUNDING_TOL * n * n * n, "det");
        });
        m.put("det(double[],int)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            int off = rand.nextInt(10);
            double[] arr = junk(rand, off + 9 + rand.nextInt(5));
            a.store(arr, off);
            double n = Mat3Ops.normF(a);
            assertEquals(CommonOps_DDRM.det(ej(a)), Mat3Ops.det(arr, off), 8 * ROUNDING_TOL * n * n * n, "det[]");
            assertEquals(Mat3Ops.det(a), Mat3Ops.det(arr, off), 0, "det[] must round like det(Mat3)");
        });
        m.put("trace(Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            assertEquals(CommonOps_DDRM.trace(ej(a)), Mat3Ops.trace(a), 0, "trace");
        });
        m.put("transpose(Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            assertClose(CommonOps_DDRM.transpose(ej(a), null), Mat3Ops.transpose(a, new Mat3()), 0, "transpose");
        });
        m.put("invert(Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            DMatrixRMaj ref = new DMatrixRMaj(3, 3);
            assertTrue(CommonOps_DDRM.invert(ej(a), ref));
            Mat3 inv = new Mat3();
            assertTrue(Mat3Ops.invert(a, inv), "invert must succeed on a nonsingular matrix");
            double cond = NormOps_DDRM.conditionP2(ej(a));
            assertClose(ref, inv, INVERSE_TOL * cond * NormOps_DDRM.normF(ref), "invert");
        });
        m.put("copy(Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            assertClose(ej(a).copy(), Mat3Ops.copy(a, new Mat3()), 0, "copy");
        });
        m.put("normF(Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            double ref = NormOps_DDRM.normF(ej(a));
            assertEquals(ref, Mat3Ops.normF(a), 2 * ROUNDING_TOL * ref, "normF");
        });
        m.put("mulVec(Mat3,Vec3,Vec3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            Vec3 v = new Vec3(u(rand), u(rand), u(rand));
            DMatrixRMaj ref = CommonOps_DDRM.mult(ej(a), new DMatrixRMaj(3, 1, true, v.x, v.y, v.z), new DMatrixRMaj(3, 1));
            Vec3 out = Mat3Ops.mulVec(a, v, new Vec3());
            double tol = ROUNDING_TOL * Mat3Ops.normF(a) * Math.sqrt(v.x * v.x + v.y * v.y + v.z * v.z);
            assertArrayEquals(ref.data, new double[] {out.x, out.y, out.z}, tol, "mulVec");
        });
        m.put("mul(double[],int,double[],int,double[],int)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            int ao = rand.nextInt(10), bo = rand.nextInt(10), oo = rand.nextInt(10);
            double[] aa = junk(rand, ao + 9), ba = junk(rand, bo + 9), oa = junk(rand, oo + 12);
            a.store(aa, ao);
            b.store(ba, bo);
            double[] before = oa.clone();
            Mat3Ops.mul(aa, ao, ba, bo, oa, oo);
            DMatrixRMaj ref = CommonOps_DDRM.mult(ej(a), ej(b), new DMatrixRMaj(3, 3));
            assertClose(ref, new Mat3().load(oa, oo), ROUNDING_TOL * scale(a, b), "mul[]");
            for (int i = 0; i < oa.length; i++) {
                if (i < oo || i >= oo + 9) {
                    assertEquals(before[i], oa[i], 0, "mul[] wrote outside its block at " + i);
                }
            }
            assertClose(ej(Mat3Ops.mul(a, b, new Mat3())), new Mat3().load(oa, oo), 0, "mul[] must round like mul");
        });
        return m;
    }

    static Stream<Arguments> comparisonCases() {
        return comparisons().entrySet().stream().map(e -> Arguments.of(e.getKey(), e.getValue()));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("comparisonCases")
    void matchesEjml(String signature, Check check) {
        for (int trial = 0; trial < TRIALS; trial++) {
            check.run(rand);
        }
    }

    // ------------------------------------------------------------------------------------------------- aliasing

    /**
     * Signature to an aliasing check: the op run with its output equal to an input must give bit for bit what it
     * gives with a separate output. Common practice, no source (JOML's locals-first pattern).
     */
    private static Map<String, Check> aliasing() {
        Map<String, Check> m = new LinkedHashMap<>();
        m.put("mul(Mat3,Mat3,Mat3)", rand -> binary(rand, Mat3Ops::mul));
        m.put("mulTransA(Mat3,Mat3,Mat3)", rand -> binary(rand, Mat3Ops::mulTransA));
        m.put("mulTransB(Mat3,Mat3,Mat3)", rand -> binary(rand, Mat3Ops::mulTransB));
        m.put("add(Mat3,Mat3,Mat3)", rand -> binary(rand, Mat3Ops::add));
        m.put("sub(Mat3,Mat3,Mat3)", rand -> binary(rand, Mat3Ops::sub));
        m.put("mulAdd(Mat3,Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            // out == a: out starts as a, so the result is a + a b
            Mat3 expected = Mat3Ops.mulAdd(a, b, new Mat3(a));
            Mat3 x = new Mat3(a);
            assertBits(expected, Mat3Ops.mulAdd(x, b, x), "mulAdd out == a");
            expected = Mat3Ops.mulAdd(a, b, new Mat3(b));
            Mat3 y = new Mat3(b);
            assertBits(expected, Mat3Ops.mulAdd(a, y, y), "mulAdd out == b");
            expected = Mat3Ops.mulAdd(a, a, new Mat3(a));
            Mat3 z = new Mat3(a);
            assertBits(expected, Mat3Ops.mulAdd(z, z, z), "mulAdd out == a == b");
        });
        m.put("scale(double,Mat3,Mat3)", rand -> {
            double alpha = rand.nextGaussian();
            unary(rand, (a, out) -> Mat3Ops.scale(alpha, a, out));
        });
        m.put("addEquals(Mat3,Mat3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            Mat3 expected = Mat3Ops.add(a, a, new Mat3());
            Mat3Ops.addEquals(a, a);
            assertBits(expected, a, "addEquals b == a");
        });
        m.put("transpose(Mat3,Mat3)", rand -> unary(rand, Mat3Ops::transpose));
        m.put("copy(Mat3,Mat3)", rand -> unary(rand, Mat3Ops::copy));
        m.put("invert(Mat3,Mat3)", rand -> unary(rand, (a, out) -> {
            assertTrue(Mat3Ops.invert(a, out));
            return out;
        }));
        m.put("mulVec(Mat3,Vec3,Vec3)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand);
            Vec3 v = new Vec3(u(rand), u(rand), u(rand));
            Vec3 expected = Mat3Ops.mulVec(a, v, new Vec3());
            Vec3 got = Mat3Ops.mulVec(a, v, v);
            assertArrayEquals(new double[] {expected.x, expected.y, expected.z}, new double[] {got.x, got.y, got.z}, 0,
                    "mulVec out == v");
        });
        m.put("mul(double[],int,double[],int,double[],int)", rand -> {
            Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
            double[] expected = new double[9];
            double[] buf = new double[30];
            a.store(buf, 0);
            b.store(buf, 9);
            Mat3Ops.mul(buf, 0, buf, 9, expected, 0);
            // same array, same offset as a; as b; and overlapping a's block at a shifted offset
            for (int oo : new int[] {0, 9, 3, 14}) {
                double[] arr = buf.clone();
                Mat3Ops.mul(arr, 0, arr, 9, arr, oo);
                assertArrayEquals(expected, Arrays.copyOfRange(arr, oo, oo + 9), 0, "mul[] out offset " + oo);
            }
        });
        return m;
    }

    static Stream<Arguments> aliasingCases() {
        return aliasing().entrySet().stream().map(e -> Arguments.of(e.getKey(), e.getValue()));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("aliasingCases")
    void aliasSafe(String signature, Check check) {
        for (int trial = 0; trial < TRIALS; trial++) {
            check.run(rand);
        }
    }

    // ------------------------------------------------------------------------------------------------- coverage

    /** Every public static op is compared with EJML; no op is added untested (CompareFixed idea). */
    @Test
    void everyOpIsComparedWithEjml() {
        Set<String> ops = publicStaticOps();
        assertEquals(ops, new TreeSet<>(comparisons().keySet()), "ops in Mat3Ops vs ops compared with EJML");
        // the exact count, so a new overload shows up in review even if someone updates both sets
        assertEquals(17, ops.size(), "number of public static ops in Mat3Ops: " + ops);
    }

    /** Every op with an output argument, or an in-place op, has an aliasing check. */
    @Test
    void everyOpWithAnOutputHasAnAliasingCheck() {
        Set<String> withOutput = publicStaticOps().stream()
                .filter(s -> !s.startsWith("det(") && !s.startsWith("trace(") && !s.startsWith("normF("))
                .collect(Collectors.toCollection(TreeSet::new));
        assertEquals(withOutput, new TreeSet<>(aliasing().keySet()), "ops with an output vs ops with an aliasing check");
    }

    private static Set<String> publicStaticOps() {
        return Arrays.stream(Mat3Ops.class.getDeclaredMethods())
                .filter(mt -> Modifier.isPublic(mt.getModifiers()) && Modifier.isStatic(mt.getModifiers()))
                .map(Mat3OpsTest::signature)
                .collect(Collectors.toCollection(TreeSet::new));
    }

    private static String signature(Method mt) {
        return mt.getName() + Arrays.stream(mt.getParameterTypes()).map(Class::getSimpleName)
                .collect(Collectors.joining(",", "(", ")"));
    }

    // -------------------------------------------------------------------------------------- invert edge cases

    /** Failure is a return value, and a failed invert leaves out alone (EJML: boolean from a NaN/Inf check). */
    @Test
    void invertReportsSingularAndNonFiniteInput() {
        Mat3 zeroRow = RandomMatrices.uniform(rand);
        zeroRow.m10 = 0;
        zeroRow.m11 = 0;
        zeroRow.m12 = 0;
        Mat3 zeroCol = RandomMatrices.uniform(rand);
        zeroCol.m02 = 0;
        zeroCol.m12 = 0;
        zeroCol.m22 = 0;
        Mat3 nan = RandomMatrices.uniform(rand);
        nan.m11 = Double.NaN;
        Mat3 inf = RandomMatrices.uniform(rand);
        inf.m20 = Double.NEGATIVE_INFINITY;
        for (Mat3 bad : new Mat3[] {new Mat3(), zeroRow, zeroCol, nan, inf}) {
            Mat3 out = new Mat3().set(7, 7, 7, 7, 7, 7, 7, 7, 7);
            assertFalse(Mat3Ops.invert(bad, out), "invert must fail on " + bad);
            assertBits(new Mat3().set(7, 7, 7, 7, 7, 7, 7, 7, 7), out, "out unchanged after failure");
        }
    }

    /** Pre-scaling keeps badly scaled but well-conditioned matrices invertible (reference library: EJML). */
    @Test
    void invertHandlesExtremeScales() {
        for (double s : new double[] {1e-200, 1e-100, 1e100, 1e200}) {
            for (int i = 0; i < 20; i++) {
                Mat3 a = Mat3Ops.scale(s, RandomMatrices.nearIdentity(rand, 0.3), new Mat3());
                DMatrixRMaj ref = new DMatrixRMaj(3, 3);
                assertTrue(CommonOps_DDRM.invert(ej(a), ref));
                Mat3 inv = new Mat3();
                assertTrue(Mat3Ops.invert(a, inv), "scale " + s);
                assertClose(ref, inv, INVERSE_TOL * NormOps_DDRM.conditionP2(ej(a)) * NormOps_DDRM.normF(ref), "scale " + s);
            }
        }
    }

    // ----------------------------------------------------------------------------------- Mat3 / Vec3 storage

    /** mRC is row R, column C, and flat storage is row-major like EJML's DMatrixRMaj (reference library: EJML). */
    @Test
    void storageIsRowMajor() {
        double[] arr = junk(rand, 14);
        Mat3 m = new Mat3().load(arr, 3);
        DMatrixRMaj ref = new DMatrixRMaj(3, 3, true, Arrays.copyOfRange(arr, 3, 12));
        double[][] fields = {{m.m00, m.m01, m.m02}, {m.m10, m.m11, m.m12}, {m.m20, m.m21, m.m22}};
        for (int r = 0; r < 3; r++) {
            for (int c = 0; c < 3; c++) {
                assertEquals(ref.get(r, c), fields[r][c], 0, "m" + r + c);
            }
        }
        double[] back = new double[14];
        m.store(back, 3);
        assertArrayEquals(Arrays.copyOfRange(arr, 3, 12), Arrays.copyOfRange(back, 3, 12), 0);
        assertBits(m, new Mat3(m), "copy constructor");
        Mat3 s = new Mat3().set(arr[3], arr[4], arr[5], arr[6], arr[7], arr[8], arr[9], arr[10], arr[11]);
        assertBits(m, s, "set is row by row");
        assertBits(new Mat3().set(1, 0, 0, 0, 1, 0, 0, 0, 1), new Mat3(m).setIdentity(), "setIdentity");
        assertEquals("[[1.0, 2.0, 3.0], [4.0, 5.0, 6.0], [7.0, 8.0, 9.0]]",
                new Mat3().set(1, 2, 3, 4, 5, 6, 7, 8, 9).toString());

        Vec3 v = new Vec3().load(arr, 5);
        assertArrayEquals(new double[] {arr[5], arr[6], arr[7]}, new double[] {v.x, v.y, v.z}, 0);
        double[] vb = new double[8];
        v.store(vb, 5);
        assertArrayEquals(Arrays.copyOfRange(arr, 5, 8), Arrays.copyOfRange(vb, 5, 8), 0);
        Vec3 w = new Vec3(v);
        assertArrayEquals(new double[] {v.x, v.y, v.z}, new double[] {w.x, w.y, w.z}, 0, "copy constructor");
        assertEquals("[1.0, 2.0, 3.0]", new Vec3().set(1, 2, 3).toString());
        assertEquals("[1.0, 2.0, 3.0]", new Vec3().set(new Vec3(1, 2, 3)).toString());
    }

    // -------------------------------------------------------------------------------------------------- helpers

    private interface Binary {
        Mat3 apply(Mat3 a, Mat3 b, Mat3 out);
    }

    private interface Unary {
        Mat3 apply(Mat3 a, Mat3 out);
    }

    private static void binary(Random rand, Binary op) {
        Mat3 a = RandomMatrices.uniform(rand), b = RandomMatrices.uniform(rand);
        Mat3 expected = op.apply(a, b, new Mat3());
        Mat3 x = new Mat3(a);
        assertBits(expected, op.apply(x, b, x), "out == a");
        Mat3 y = new Mat3(b);
        assertBits(expected, op.apply(a, y, y), "out == b");
        Mat3 z = new Mat3(a);
        assertBits(op.apply(a, a, new Mat3()), op.apply(z, z, z), "out == a == b");
    }

    private static void unary(Random rand, Unary op) {
        Mat3 a = RandomMatrices.uniform(rand);
        Mat3 expected = op.apply(a, new Mat3());
        Mat3 x = new Mat3(a);
        assertBits(expected, op.apply(x, x), "out == a");
    }

    private static DMatrixRMaj ej(Mat3 m) {
        double[] d = new double[9];
        m.store(d, 0);
        return new DMatrixRMaj(3, 3, true, d);
    }

    /** ||a||_F ||b||_F, the scale of the rounding error of a product. */
    private static double scale(Mat3 a, Mat3 b) {
        return Mat3Ops.normF(a) * Mat3Ops.normF(b);
    }

    /** Entry-wise |expected - actual| &lt;= tol. */
    private static void assertClose(DMatrixRMaj expected, Mat3 actual, double tol, String what) {
        assertArrayEquals(expected.data, ej(actual).data, tol, what);
    }

    private static void assertBits(Mat3 expected, Mat3 actual, String what) {
        assertArrayEquals(ej(expected).data, ej(actual).data, 0, what);
    }

    private static double[] junk(Random rand, int n) {
        double[] a = new double[n];
        for (int i = 0; i < n; i++) {
            a[i] = 100 + rand.nextDouble();
        }
        return a;
    }

    private static double u(Random rand) {
        return 2 * rand.nextDouble() - 1;
    }
}

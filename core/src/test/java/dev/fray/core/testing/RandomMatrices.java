package dev.fray.core.testing;

import dev.fray.core.math.Mat3;
import dev.fray.core.math.Mat3Ops;
import java.util.Random;

/**
 * Seeded generators of 3x3 test matrices for property tests: general matrices, rotations, deformation gradients
 * near and far from the identity, and the hard cases for decompositions (near-singular, rank-deficient, repeated
 * singular values, inverted).
 *
 * <p>Every generator draws only from the given {@link Random}, so a seed reproduces the matrix. Every generator
 * returns a new {@link Mat3}; this is test code, where clarity beats allocation. The matrices with prescribed
 * singular values are built as Q<sub>1</sub> diag(s) Q<sub>2</sub> with random rotations. Rounding moves the stored
 * singular values by about 1e-16 times the largest one, so "zero" or "equal" singular values are zero or equal up to
 * that rounding.
 */
public final class RandomMatrices {
    private RandomMatrices() {
    }

    /**
     * A matrix with independent entries uniform in [-1, 1]. Mostly well conditioned; occasionally close to
     * singular, and its determinant has either sign.
     *
     * @param rand source of randomness
     * @return a new matrix
     */
    public static Mat3 uniform(Random rand) {
        return new Mat3().set(u(rand), u(rand), u(rand), u(rand), u(rand), u(rand), u(rand), u(rand), u(rand));
    }

    /**
     * A rotation drawn uniformly from SO(3): a unit quaternion from four independent normal deviates, normalised,
     * then turned into a matrix. The normal distribution is isotropic, so the quaternion is uniform on the 3-sphere.
     * Orthogonality error about 1e-16, det = +1 to rounding.
     *
     * @param rand source of randomness
     * @return a new rotation matrix
     */
    public static Mat3 rotation(Random rand) {
        double w, x, y, z, n2;
        do {
            w = rand.nextGaussian();
            x = rand.nextGaussian();
            y = rand.nextGaussian();
            z = rand.nextGaussian();
            n2 = w * w + x * x + y * y + z * z;
        } while (n2 < 1e-6); // keep normalisation accurate
        double inv = 1 / Math.sqrt(n2);
        w *= inv;
        x *= inv;
        y *= inv;
        z *= inv;
        return new Mat3().set(
                1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y),
                2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x),
                2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y));
    }

    /**
     * Q<sub>1</sub> diag(s0, s1, s2) Q<sub>2</sub> with independent random rotations Q<sub>1</sub>, Q<sub>2</sub>.
     * The singular values are |s0|, |s1|, |s2|, and det has the sign of s0 s1 s2.
     *
     * @param rand source of randomness
     * @param s0   first diagonal value
     * @param s1   second diagonal value
     * @param s2   third diagonal value
     * @return a new matrix
     */
    public static Mat3 withSingularValues(Random rand, double s0, double s1, double s2) {
        Mat3 q1 = rotation(rand);
        Mat3 q2 = rotation(rand);
        Mat3 d = new Mat3().set(s0, 0, 0, 0, s1, 0, 0, 0, s2);
        return Mat3Ops.mul(Mat3Ops.mul(q1, d, new Mat3()), q2, new Mat3());
    }

    /**
     * A deformation gradient near the identity: I + amplitude E with entries of E uniform in [-1, 1]. For
     * amplitude &lt; 1/3, ||amplitude E||<sub>2</sub> &le; ||amplitude E||<sub>F</sub> &lt; 1, so det &gt; 0
     * is guaranteed.
     *
     * @param rand      source of randomness
     * @param amplitude size of the perturbation, in [0, 1/3)
     * @return a new matrix with det &gt; 0
     * @throws IllegalArgumentException if amplitude is outside [0, 1/3)
     */
    public static Mat3 nearIdentity(Random rand, double amplitude) {
        if (!(amplitude >= 0 && amplitude < 1.0 / 3)) {
            throw new IllegalArgumentException("amplitude must be in [0, 1/3), got " + amplitude);
        }
        Mat3 e = uniform(rand);
        return new Mat3().set(
                1 + amplitude * e.m00, amplitude * e.m01, amplitude * e.m02,
                amplitude * e.m10, 1 + amplitude * e.m11, amplitude * e.m12,
                amplitude * e.m20, amplitude * e.m21, 1 + amplitude * e.m22);
    }

    /**
     * A deformation gradient far from the identity: random rotations around stretches drawn log-uniformly from
     * [0.2, 5] (compression to 20 %, extension to 500 %), so det &gt; 0.
     *
     * @param rand source of randomness
     * @return a new matrix with det &gt; 0
     */
    public static Mat3 farFromIdentity(Random rand) {
        return withSingularValues(rand, logUniform(rand, 0.2, 5), logUniform(rand, 0.2, 5), logUniform(rand, 0.2, 5));
    }

    /**
     * A near-singular matrix with det &gt; 0: two singular values log-uniform in [0.5, 2] and one equal to
     * 10<sup>-k</sup> with k uniform in [9, 14]. Rounding perturbs the small one by about 1e-16, so it stays
     * positive.
     *
     * @param rand source of randomness
     * @return a new matrix
     */
    public static Mat3 nearSingular(Random rand) {
        double small = Math.pow(10, -(9 + 5 * rand.nextDouble()));
        return withSingularValues(rand, logUniform(rand, 0.5, 2), logUniform(rand, 0.5, 2), small);
    }

    /**
     * A matrix with repeated singular values, det &gt; 0. One of three patterns, equally likely: all three equal
     * (a scaled rotation), the two largest equal, or the two smallest equal. The values are log-uniform in
     * [0.5, 2].
     *
     * @param rand source of randomness
     * @return a new matrix
     */
    public static Mat3 repeatedSingularValues(Random rand) {
        double s = logUniform(rand, 0.5, 2);
        double t = logUniform(rand, 0.5, 2);
        switch (rand.nextInt(3)) {
            case 0:
                return withSingularValues(rand, s, s, s);
            case 1:
                return withSingularValues(rand, Math.max(s, t), Math.max(s, t), Math.min(s, t));
            default:
                return withSingularValues(rand, Math.max(s, t), Math.min(s, t), Math.min(s, t));
        }
    }

    /**
     * An inverted matrix, det &lt; 0: singular values log-uniform in [0.2, 5], with one of the three diagonal
     * values, chosen at random, negated before the rotations are applied.
     *
     * @param rand source of randomness
     * @return a new matrix with det &lt; 0
     */
    public static Mat3 inverted(Random rand) {
        double[] s = {logUniform(rand, 0.2, 5), logUniform(rand, 0.2, 5), logUniform(rand, 0.2, 5)};
        int k = rand.nextInt(3);
        s[k] = -s[k];
        return withSingularValues(rand, s[0], s[1], s[2]);
    }

    /**
     * A matrix of the given rank in exact arithmetic. The nonzero singular values are log-uniform in [0.5, 2] and
     * the others are zero, up to rounding of about 1e-16. Rank 0 gives the zero matrix.
     *
     * @param rand source of randomness
     * @param rank 0 to 3
     * @return a new matrix
     * @throws IllegalArgumentException if rank is outside [0, 3]
     */
    public static Mat3 rankDeficient(Random rand, int rank) {
        if (rank < 0 || rank > 3) {
            throw new IllegalArgumentException("rank must be in [0, 3], got " + rank);
        }
        double s0 = rank >= 1 ? logUniform(rand, 0.5, 2) : 0;
        double s1 = rank >= 2 ? logUniform(rand, 0.5, 2) : 0;
        double s2 = rank >= 3 ? logUniform(rand, 0.5, 2) : 0;
        return withSingularValues(rand, s0, s1, s2);
    }

    /**
     * A number drawn log-uniformly from [lo, hi], so every factor of ten is equally likely.
     *
     * @param rand source of randomness
     * @param lo   lower bound, &gt; 0
     * @param hi   upper bound, &ge; lo
     * @return a number in [lo, hi]
     */
    public static double logUniform(Random rand, double lo, double hi) {
        return lo * Math.exp(rand.nextDouble() * Math.log(hi / lo));
    }

    private static double u(Random rand) {
        return 2 * rand.nextDouble() - 1;
    }
}

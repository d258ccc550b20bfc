/**
 * Fixed-size 3x3 linear algebra for kernels: the scratch types {@link dev.fray.core.math.Mat3} and
 * {@link dev.fray.core.math.Vec3} (public fields, row-major flat storage), the unrolled, alias-safe operations in
 * {@link dev.fray.core.math.Mat3Ops}, and the inversion-safe SVD and polar decomposition in
 * {@link dev.fray.core.math.Svd3}.
 *
 * <p>Nothing here allocates (except {@code toString}), keeps static mutable state or uses {@code Math.fma}. Numerical
 * failure is reported by a {@code boolean} return value and never thrown, so the particle loop stays exception-free.
 * The solver turns a failure into an error with context.
 */
package dev.fray.core.math;

package dev.fray.core.solve;

/**
 * A symmetric linear operator on grid-node vectors, applied matrix-free. Implementations must be deterministic:
 * the same input gives the same bits for any thread count.
 */
@FunctionalInterface
public interface LinearOperator {
    /**
     * out = A in.
     *
     * @param in  (input, not modified) the vector
     * @param out (output, overwritten) the product; never the same array as in
     */
    void apply(double[] in, double[] out);
}

package dev.fray.core.boundary;

/**
 * How material meets a boundary: a law applied to a grid node's (or a particle's) velocity, relative to the
 * boundary's own velocity at that point, given the boundary's outward unit normal. {@link Contact} is the stock
 * implementation (sticky, slip or separating with Coulomb friction).
 */
public interface ContactLaw {
    /** @return whether the law does anything at all (an open face does not) */
    boolean acts();

    /**
     * @return whether the law fixes every velocity component relative to the boundary (sticky), so that a
     *         velocity increment there is projected to zero
     */
    boolean fixesAll();

    /**
     * @return whether the law stops the normal component in both directions (material cannot leave), as opposed
     *         to only stopping motion into the boundary
     */
    boolean holdsNormal();

    /**
     * Applies the law to a velocity in place.
     *
     * @param v   (input and output) velocity at v[off..off+2], m/s
     * @param off offset into v
     * @param n   outward unit normal of the boundary at n[no..no+2]
     * @param no  offset into n
     * @param bx  boundary velocity x, m/s
     * @param by  boundary velocity y, m/s
     * @param bz  boundary velocity z, m/s
     */
    void apply(double[] v, int off, double[] n, int no, double bx, double by, double bz);
}

package dev.fray.core.grid;

import dev.fray.core.kernel.Kernel;

/**
 * One worker's interpolation stencil: the kernel weights (and their derivatives) of one particle per axis, and the
 * index arithmetic from a particle to the nodes of its stencil in a block-local buffer and in the grid. This is
 * the one copy of that arithmetic; transfers, the phase-field solve and field partitions all locate particles
 * through it. Never shared between threads.
 *
 * <p>Local indices are packed as (i L + j) L + l with L = {@link BlockLayout#LOCAL}, x slowest. Stencil node k of
 * a support-s kernel is (k / s^2, (k / s) % s, k % s) from the particle's first node.
 */
public final class Stencil {
    /** Derivatives are not computed. */
    public static final int NO_DERIVATIVES = 0;
    /** Derivatives with respect to the grid coordinate (dimensionless), as the kernel gives them. */
    public static final int RAW_DERIVATIVES = 1;
    /** Derivatives with respect to position, 1/m: the kernel's derivatives times 1/dx. */
    public static final int SPATIAL_DERIVATIVES = 2;
    private static final int L = BlockLayout.LOCAL;

    private final Kernel kernel;
    private final int support;
    private final double ox, oy, oz, invDx;
    /** Weights per axis of the last located particle. */
    public final double[] wx = new double[16], wy = new double[16], wz = new double[16];
    /** Weight derivatives per axis of the last located particle (see the derivative modes). */
    public final double[] dwx = new double[16], dwy = new double[16], dwz = new double[16];
    /** Full weights w_k of the stencil nodes (after {@link #products}). */
    public final double[] w = new double[64];
    /** Full weight gradients of the stencil nodes, 1/m (after {@link #products} with gradients). */
    public final double[] gx = new double[64], gy = new double[64], gz = new double[64];
    /** Fractional position of the last located particle in its first stencil cell, per axis (grid units). */
    public double fx, fy, fz;
    /** First stencil node of the last located particle, grid coordinates. */
    public int bx, by, bz;
    // Padding keeps the arrays of different workers off each other's cache lines.
    @SuppressWarnings("unused")
    private final double[] pad = new double[16];

    /**
     * @param kernel the interpolation kernel
     * @param ox     grid origin x, m
     * @param oy     grid origin y, m
     * @param oz     grid origin z, m
     * @param dx     cell size, m
     */
    public Stencil(Kernel kernel, double ox, double oy, double oz, double dx) {
        this.kernel = kernel;
        this.support = kernel.support();
        this.ox = ox;
        this.oy = oy;
        this.oz = oz;
        this.invDx = 1.0 / dx;
    }

    /** @return nodes per axis of the stencil */
    public int support() {
        return support;
    }

    /**
     * Locates particle p: its first stencil node, fractional offsets and weights per axis, and optionally the
     * derivatives.
     *
     * @param x           positions, 3 per particle, m
     * @param p           the particle
     * @param key         packed key of the particle block whose buffer the indices refer to
     * @param derivatives one of {@link #NO_DERIVATIVES}, {@link #RAW_DERIVATIVES}, {@link #SPATIAL_DERIVATIVES}
     * @return the packed local index of the particle's first stencil node in that block's buffer
     */
    public int locate(double[] x, int p, long key, int derivatives) {
        double xi = (x[3 * p] - ox) * invDx, yi = (x[3 * p + 1] - oy) * invDx, zi = (x[3 * p + 2] - oz) * invDx;
        int ix = kernel.base(xi), iy = kernel.base(yi), iz = kernel.base(zi);
        bx = ix;
        by = iy;
        bz = iz;
        double ax = xi - ix, ay = yi - iy, az = zi - iz;
        fx = ax;
        fy = ay;
        fz = az;
        kernel.weights(ax, wx, 0);
        kernel.weights(ay, wy, 0);
        kernel.weights(az, wz, 0);
        if (derivatives != NO_DERIVATIVES) {
            kernel.derivatives(ax, dwx, 0);
            kernel.derivatives(ay, dwy, 0);
            kernel.derivatives(az, dwz, 0);
            if (derivatives == SPATIAL_DERIVATIVES) {
                for (int i = 0; i < support; i++) {
                    dwx[i] *= invDx;
                    dwy[i] *= invDx;
                    dwz[i] *= invDx;
                }
            }
        }
        return localBase(ix, iy, iz, key);
    }

    /** @return the packed local index of first stencil node (ix, iy, iz) in the buffer of the block with this key */
    public static int localBase(int ix, int iy, int iz, long key) {
        int lx = ix - BlockLayout.localOrigin(SparseGrid.keyX(key));
        int ly = iy - BlockLayout.localOrigin(SparseGrid.keyY(key));
        int lz = iz - BlockLayout.localOrigin(SparseGrid.keyZ(key));
        return (lx * L + ly) * L + lz;
    }

    /**
     * Packed local index of particle p's first stencil node without computing weights.
     *
     * @return (i L + j) L + l
     */
    public int localBase(double[] x, int p, long key) {
        return localBase(kernel.base((x[3 * p] - ox) * invDx), kernel.base((x[3 * p + 1] - oy) * invDx),
                kernel.base((x[3 * p + 2] - oz) * invDx), key);
    }

    /**
     * Full weights w_k = wx_i wy_j wz_l of the located particle and, if asked, gradients
     * (dwx_i wy_j wz_l, ...) / dx from {@link #RAW_DERIVATIVES}, k = (i s + j) s + l.
     */
    public void products(boolean gradients) {
        int s = support;
        int k = 0;
        for (int i = 0; i < s; i++) {
            for (int j = 0; j < s; j++) {
                for (int l = 0; l < s; l++) {
                    w[k] = wx[i] * wy[j] * wz[l];
                    if (gradients) {
                        gx[k] = dwx[i] * wy[j] * wz[l] * invDx;
                        gy[k] = wx[i] * dwy[j] * wz[l] * invDx;
                        gz[k] = wx[i] * wy[j] * dwz[l] * invDx;
                    }
                    k++;
                }
            }
        }
    }

    /** @return the packed local index of stencil node k from packed first-node index lb */
    public int localIndex(int lb, int k) {
        int s = support;
        return lb + ((k / (s * s)) * L + (k / s) % s) * L + k % s;
    }

    /** @return the grid node of stencil node k from packed first-node index lb in particle block r's buffer */
    public int node(BlockLayout layout, int r, int lb, int k) {
        int s = support;
        return layout.node(r, lb / (L * L) + k / (s * s), (lb / L) % L + (k / s) % s, lb % L + k % s);
    }
}

package dev.fray.core.kernel;

/**
 * Interpolation kernel between particles and grid nodes: tensor-product B-splines. Quadratic (27 nodes) is the
 * default; cubic (64 nodes) is smoother and costs more.
 */
public enum Kernel {
    /** Quadratic B-spline, support 3 nodes per axis, D = dx^2/4 I (Jiang et al. 2015). */
    QUADRATIC(3, 0.5, 4.0),
    /** Cubic B-spline, support 4 nodes per axis, D = dx^2/3 I (Jiang et al. 2015). */
    CUBIC(4, 1.0, 3.0);

    private final int support;
    private final double baseShift;
    private final double inertiaFactor;

    Kernel(int support, double baseShift, double inertiaFactor) {
        this.support = support;
        this.baseShift = baseShift;
        this.inertiaFactor = inertiaFactor;
    }

    /** @return nodes per axis in the stencil */
    public int support() {
        return support;
    }

    /**
     * Index of the first stencil node along one axis.
     *
     * @param xi particle coordinate in cell units (position / dx)
     * @return floor(xi - shift)
     */
    public int base(double xi) {
        return (int) Math.floor(xi - baseShift);
    }

    /**
     * Inverse of the APIC inertia-like tensor D_p = sum_i w_ip (x_i - x_p)(x_i - x_p)^T, which is a multiple of
     * the identity for B-splines.
     *
     * @param dx cell size, m
     * @return the scalar of D^-1, 1/m^2
     */
    public double inverseInertia(double dx) {
        return inertiaFactor / (dx * dx);
    }

    /**
     * @param dx cell size, m
     * @return the scalar of D = dx^2/4 (quadratic) or dx^2/3 (cubic), m^2
     */
    public double inertia(double dx) {
        return dx * dx / inertiaFactor;
    }

    /**
     * Weights of the stencil nodes along one axis.
     *
     * @param fx  particle coordinate in cell units minus the base index (in [0.5,1.5) quadratic, [1,2) cubic)
     * @param out (output) support() weights; the weight of node base+i at out[off+i]
     * @param off offset into out
     */
    public void weights(double fx, double[] out, int off) {
        if (this == QUADRATIC) {
            double a = 1.5 - fx;
            double b = fx - 1.0;
            double c = fx - 0.5;
            out[off] = 0.5 * a * a;
            out[off + 1] = 0.75 - b * b;
            out[off + 2] = 0.5 * c * c;
        } else {
            for (int i = 0; i < 4; i++) {
                double d = Math.abs(fx - i);
                double w;
                if (d < 1.0) {
                    w = 0.5 * d * d * d - d * d + 2.0 / 3.0;
                } else if (d < 2.0) {
                    double e = 2.0 - d;
                    w = e * e * e / 6.0;
                } else {
                    w = 0.0;
                }
                out[off + i] = w;
            }
        }
    }

    /**
     * Derivatives of the stencil weights with respect to the particle coordinate in cell units; divide by dx for
     * the spatial gradient of the node's shape function.
     *
     * @param fx  as for {@link #weights}
     * @param out (output) support() derivatives at out[off+i]
     * @param off offset into out
     */
    public void derivatives(double fx, double[] out, int off) {
        if (this == QUADRATIC) {
            out[off] = fx - 1.5;
            out[off + 1] = -2.0 * (fx - 1.0);
            out[off + 2] = fx - 0.5;
        } else {
            for (int i = 0; i < 4; i++) {
                double r = fx - i;
                double d = Math.abs(r);
                double sign = r >= 0 ? 1.0 : -1.0;
                double dw;
                if (d < 1.0) {
                    dw = 1.5 * d * d - 2.0 * d;
                } else if (d < 2.0) {
                    double e = 2.0 - d;
                    dw = -0.5 * e * e;
                } else {
                    dw = 0.0;
                }
                out[off + i] = dw * sign;
            }
        }
    }
}

package dev.fray.damage.elastic;

import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;

/**
 * Compressible Neo-Hookean elasticity (Bonet and Wood, <i>Nonlinear Continuum Mechanics for Finite Element
 * Analysis</i>):
 * <pre>
 *   psi = mu/2 (tr(F^T F) - 3) - mu ln J + lambda/2 (ln J)^2
 *   P   = mu (F - F^-T) + lambda ln J F^-T
 *   tau = mu (F F^T - I) + lambda ln J I
 * </pre>
 * with J = det F and mu, lambda the Lamé parameters, all stresses in Pa and psi in J/m^3.
 *
 * <p>Inversion: ln J has no value for J &lt;= 0 and grows without bound as J tends to 0. Below
 * {@link #J_FLOOR} the law continues ln J by its tangent line at the floor,
 * l(J) = ln(J_FLOOR) + (J - J_FLOOR) / J_FLOOR, in energy and stress alike. The energy stays continuously
 * differentiable, P = dpsi/dF holds everywhere, compression keeps costing energy through J = 0 and beyond, so
 * an inverted particle is pushed back, and the solver never sees NaN. Above the floor the law is exact.
 * F^-T is formed as cof(F) / J, and the cofactor is finite for any finite F.
 *
 * <p>Immutable and thread-safe; no channels.
 */
public final class NeoHookean implements MaterialLaw {
    /** Registry name. */
    public static final String NAME = "neo-hookean";

    /**
     * Volume ratio J below which ln J is continued linearly (dimensionless). A material compressed to a millionth
     * of its volume is far outside any meaningful use, so the exact law covers every physical state.
     */
    public static final double J_FLOOR = 1e-6;

    private static final double LOG_J_FLOOR = Math.log(J_FLOOR);

    private final ElasticParameters parameters;
    private final double mu;
    private final double lambda;

    /**
     * @param parameters validated elastic constants (input, kept)
     * @throws dev.fray.core.error.InvalidInputException if parameters is null
     */
    public NeoHookean(ElasticParameters parameters) {
        this.parameters = Checks.notNull("elastic parameters", parameters);
        this.mu = parameters.mu();
        this.lambda = parameters.lambda();
    }

    /** @return the elastic constants this law was built from */
    public ElasticParameters parameters() {
        return parameters;
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** {@inheritDoc} */
    @Override
    public double density() {
        return parameters.density();
    }

    /** {@inheritDoc} Here the P-wave speed sqrt((lambda + 2 mu) / rho). */
    @Override
    public double waveSpeed() {
        return parameters.pWaveSpeed();
    }

    /** {@inheritDoc} */
    @Override
    public void energyDensity(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int i = 9 * p;
            double f00 = f[i], f01 = f[i + 1], f02 = f[i + 2];
            double f10 = f[i + 3], f11 = f[i + 4], f12 = f[i + 5];
            double f20 = f[i + 6], f21 = f[i + 7], f22 = f[i + 8];
            double j = f00 * (f11 * f22 - f12 * f21) + f01 * (f12 * f20 - f10 * f22) + f02 * (f10 * f21 - f11 * f20);
            double l = logJ(j);
            double trC = f00 * f00 + f01 * f01 + f02 * f02 + f10 * f10 + f11 * f11 + f12 * f12
                    + f20 * f20 + f21 * f21 + f22 * f22;
            out[p - from] = 0.5 * mu * (trC - 3.0) - mu * l + 0.5 * lambda * l * l;
        }
    }

    /** {@inheritDoc} */
    @Override
    public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int i = 9 * p;
            int o = 9 * (p - from);
            double f00 = f[i], f01 = f[i + 1], f02 = f[i + 2];
            double f10 = f[i + 3], f11 = f[i + 4], f12 = f[i + 5];
            double f20 = f[i + 6], f21 = f[i + 7], f22 = f[i + 8];
            // cofactor matrix cof(F) = dJ/dF = J F^-T, finite even where F is singular
            double c00 = f11 * f22 - f12 * f21, c01 = f12 * f20 - f10 * f22, c02 = f10 * f21 - f11 * f20;
            double c10 = f02 * f21 - f01 * f22, c11 = f00 * f22 - f02 * f20, c12 = f01 * f20 - f00 * f21;
            double c20 = f01 * f12 - f02 * f11, c21 = f02 * f10 - f00 * f12, c22 = f00 * f11 - f01 * f10;
            double j = f00 * c00 + f01 * c01 + f02 * c02;
            // dpsi/dJ = (lambda l - mu) l'(J), with l'(J) = 1 / max(J, J_FLOOR); NaN J stays NaN
            double a = (lambda * logJ(j) - mu) / (j >= J_FLOOR ? j : J_FLOOR);
            out[o] = mu * f00 + a * c00;
            out[o + 1] = mu * f01 + a * c01;
            out[o + 2] = mu * f02 + a * c02;
            out[o + 3] = mu * f10 + a * c10;
            out[o + 4] = mu * f11 + a * c11;
            out[o + 5] = mu * f12 + a * c12;
            out[o + 6] = mu * f20 + a * c20;
            out[o + 7] = mu * f21 + a * c21;
            out[o + 8] = mu * f22 + a * c22;
        }
    }

    /**
     * {@inheritDoc} Closed form tau = mu (F F^T - I) + lambda ln J I above the floor; below it,
     * tau = mu F F^T + (lambda l(J) - mu) (J / J_FLOOR) I, which is P F^T of the continued law.
     */
    @Override
    public void kirchhoffStress(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int i = 9 * p;
            int o = 9 * (p - from);
            double f00 = f[i], f01 = f[i + 1], f02 = f[i + 2];
            double f10 = f[i + 3], f11 = f[i + 4], f12 = f[i + 5];
            double f20 = f[i + 6], f21 = f[i + 7], f22 = f[i + 8];
            double j = f00 * (f11 * f22 - f12 * f21) + f01 * (f12 * f20 - f10 * f22) + f02 * (f10 * f21 - f11 * f20);
            double iso = j >= J_FLOOR ? lambda * Math.log(j) : (lambda * logJ(j) - mu) * (j / J_FLOOR) + mu;
            // b = F F^T, symmetric: compute the upper triangle once
            double b00 = f00 * f00 + f01 * f01 + f02 * f02;
            double b11 = f10 * f10 + f11 * f11 + f12 * f12;
            double b22 = f20 * f20 + f21 * f21 + f22 * f22;
            double b01 = f00 * f10 + f01 * f11 + f02 * f12;
            double b02 = f00 * f20 + f01 * f21 + f02 * f22;
            double b12 = f10 * f20 + f11 * f21 + f12 * f22;
            out[o] = mu * (b00 - 1.0) + iso;
            out[o + 1] = mu * b01;
            out[o + 2] = mu * b02;
            out[o + 3] = mu * b01;
            out[o + 4] = mu * (b11 - 1.0) + iso;
            out[o + 5] = mu * b12;
            out[o + 6] = mu * b02;
            out[o + 7] = mu * b12;
            out[o + 8] = mu * (b22 - 1.0) + iso;
        }
    }

    /** ln J above the floor, its tangent line below; NaN stays NaN. */
    private static double logJ(double j) {
        return j >= J_FLOOR ? Math.log(j) : LOG_J_FLOOR + (j - J_FLOOR) / J_FLOOR;
    }

    /** @return the law's name and constants, for diagnostics */
    @Override
    public String toString() {
        return NAME + parameters;
    }
}

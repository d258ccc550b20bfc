package dev.fray.core.testing;

import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;

/**
 * A compact compressible Neo-Hookean law for core's own tests, which need stress but must not depend on the damage
 * module (Bonet and Wood, <i>Nonlinear Continuum Mechanics for Finite Element Analysis</i>):
 * <pre>
 *   psi = mu/2 (tr(F^T F) - 3) - mu ln J + lambda/2 (ln J)^2
 *   P   = mu (F - F^-T) + lambda ln J F^-T
 * </pre>
 * and tau = P F^T (the interface's default), with J = det F and the Lamé parameters from Young's modulus and
 * Poisson ratio, mu = E / (2 (1 + nu)) and lambda = E nu / ((1 + nu)(1 - 2 nu)). Not defined for J &lt;= 0 (no
 * inversion handling): test scenes stay far from it. Stresses in Pa, energy densities in J/m^3.
 */
public final class SimpleNeoHookean implements MaterialLaw {
    private final double mu;
    private final double lambda;
    private final double density;

    /**
     * @param youngsModulus E, Pa
     * @param poissonRatio  nu, in (-1, 0.5)
     * @param density       rho, kg/m^3
     */
    public SimpleNeoHookean(double youngsModulus, double poissonRatio, double density) {
        this.mu = youngsModulus / (2 * (1 + poissonRatio));
        this.lambda = youngsModulus * poissonRatio / ((1 + poissonRatio) * (1 - 2 * poissonRatio));
        this.density = density;
    }

    @Override
    public String name() {
        return "test-neo-hookean";
    }

    @Override
    public double density() {
        return density;
    }

    /** P-wave speed sqrt((lambda + 2 mu) / rho), m/s. */
    @Override
    public double waveSpeed() {
        return Math.sqrt((lambda + 2 * mu) / density);
    }

    @Override
    public void energyDensity(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            double trC = 0;
            for (int k = 0; k < 9; k++) {
                trC += f[9 * p + k] * f[9 * p + k];
            }
            double l = Math.log(det(f, 9 * p));
            out[p - from] = 0.5 * mu * (trC - 3) - mu * l + 0.5 * lambda * l * l;
        }
    }

    @Override
    public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
        double[] f = state.deformation();
        for (int p = from; p < to; p++) {
            int i = 9 * p;
            int o = 9 * (p - from);
            double j = det(f, i);
            double c = (lambda * Math.log(j) - mu) / j;
            // F^-T = cof(F) / J; cofactor entry (r, s) from the rows r+1 and r+2 and columns s+1 and s+2 (mod 3).
            for (int r = 0; r < 3; r++) {
                int r1 = 3 * ((r + 1) % 3), r2 = 3 * ((r + 2) % 3);
                for (int s = 0; s < 3; s++) {
                    int s1 = (s + 1) % 3, s2 = (s + 2) % 3;
                    double cof = f[i + r1 + s1] * f[i + r2 + s2] - f[i + r1 + s2] * f[i + r2 + s1];
                    out[o + 3 * r + s] = mu * f[i + 3 * r + s] + c * cof;
                }
            }
        }
    }

    private static double det(double[] f, int i) {
        return f[i] * (f[i + 4] * f[i + 8] - f[i + 5] * f[i + 7])
                - f[i + 1] * (f[i + 3] * f[i + 8] - f[i + 5] * f[i + 6])
                + f[i + 2] * (f[i + 3] * f[i + 7] - f[i + 4] * f[i + 6]);
    }
}

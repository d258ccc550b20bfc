package dev.fray.examples.plugin;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialState;
import dev.fray.core.particles.ChannelSpec;

import java.util.List;

/**
 * A damage criterion written outside the library, as a third party would: maximum principal strain with linear
 * softening. The strain is e = lambda_1 - 1 with lambda_1 the largest principal stretch (square root of the
 * largest eigenvalue of C = F^T F). Its peak over time is kept in the model's own channel {@value #PEAK}, and
 * <pre>
 *   d = clamp((e_peak - e_c) / (e_f - e_c), 0, 1),     g = (1 - d)(1 - k) + k
 * </pre>
 * with e_c the strain where damage starts, e_f where the particle is fully broken and k the residual stiffness.
 * Damage never decreases because the peak never does. Local: no grid solve. Immutable and thread-safe.
 *
 * @param criticalStrain    e_c, dimensionless, &gt; 0
 * @param failureStrain     e_f, dimensionless, &gt; e_c
 * @param residualStiffness k, dimensionless, in [0, 0.1]
 */
public record MaxStrainDamage(double criticalStrain, double failureStrain, double residualStiffness)
        implements DamageModel {
    /** Registry name. */
    public static final String NAME = "max-strain";
    /** Name of the channel holding the peak principal strain. */
    public static final String PEAK = "strain-peak";

    private static final List<ChannelSpec> CHANNELS = List.of(
            new ChannelSpec(DAMAGE, 1, 0, "1", "max-strain damage d in [0, 1]; never decreases"),
            new ChannelSpec(PEAK, 1, 0, "1", "largest principal strain (stretch - 1) seen so far"));

    /** Checks the parameters and names the bad one. */
    public MaxStrainDamage {
        Checks.positive("criticalStrain", criticalStrain);
        Checks.inRange("failureStrain", failureStrain, criticalStrain, true, Double.POSITIVE_INFINITY, true);
        Checks.inRange("residualStiffness", residualStiffness, 0, false, 0.1, false);
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** {@inheritDoc} Here damage and strain-peak. */
    @Override
    public List<ChannelSpec> channels() {
        return CHANNELS;
    }

    /** {@inheritDoc} Raises the peak strain, then sets d from it and g from d. */
    @Override
    public void update(MaterialState state, int from, int to, double dt, double[] tauDegraded, double[] tauKept,
                       double[] psiDegraded, double[] g) {
        double[] f = state.deformation();
        double[] peak = state.channel(PEAK);
        double[] d = state.channel(DAMAGE);
        for (int p = from; p < to; p++) {
            double e = largestStretch(f, 9 * p) - 1;
            if (e > peak[p]) {
                peak[p] = e;
            }
            double target = Math.min(1, Math.max(0, (peak[p] - criticalStrain) / (failureStrain - criticalStrain)));
            d[p] = Math.max(d[p], target);
        }
        degradation(state, from, to, g);
    }

    /** {@inheritDoc} g = (1 - d)(1 - k) + k. */
    @Override
    public void degradation(MaterialState state, int from, int to, double[] g) {
        double[] d = state.channel(DAMAGE);
        for (int p = from; p < to; p++) {
            g[p - from] = (1 - d[p]) * (1 - residualStiffness) + residualStiffness;
        }
    }

    /**
     * Largest principal stretch of F: the square root of the largest eigenvalue of B = F F^T (the same as that of
     * F^T F), from the closed form for symmetric 3x3 matrices (trigonometric solution of the characteristic cubic;
     * common practice, no source).
     *
     * @param f row-major F (input)
     * @param o offset of F in f
     * @return lambda_1, dimensionless
     */
    static double largestStretch(double[] f, int o) {
        double f0 = f[o], f1 = f[o + 1], f2 = f[o + 2], f3 = f[o + 3], f4 = f[o + 4], f5 = f[o + 5];
        double f6 = f[o + 6], f7 = f[o + 7], f8 = f[o + 8];
        double xx = f0 * f0 + f1 * f1 + f2 * f2, yy = f3 * f3 + f4 * f4 + f5 * f5, zz = f6 * f6 + f7 * f7 + f8 * f8;
        double xy = f0 * f3 + f1 * f4 + f2 * f5, xz = f0 * f6 + f1 * f7 + f2 * f8, yz = f3 * f6 + f4 * f7 + f5 * f8;
        double q = (xx + yy + zz) / 3;
        double p2 = (xx - q) * (xx - q) + (yy - q) * (yy - q) + (zz - q) * (zz - q) + 2 * (xy * xy + xz * xz + yz * yz);
        if (p2 <= 1e-30 * q * q) {
            return Math.sqrt(q); // B is a multiple of the identity
        }
        double p = Math.sqrt(p2 / 6);
        double a = (xx - q) / p, b = (yy - q) / p, c = (zz - q) / p, u = xy / p, v = xz / p, w = yz / p;
        double r = 0.5 * (a * (b * c - w * w) - u * (u * c - w * v) + v * (u * w - b * v));
        return Math.sqrt(q + 2 * p * Math.cos(Math.acos(Math.max(-1, Math.min(1, r))) / 3));
    }
}

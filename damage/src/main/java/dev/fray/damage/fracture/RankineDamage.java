package dev.fray.damage.fracture;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.damage.UniaxialStrength;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelSpec;

import java.util.List;
import java.util.Locale;
import java.util.Optional;

/**
 * Local damage with the Rankine (maximum principal stress) criterion and exponential softening; no grid solve.
 *
 * <p>Onset: with sigma = tau/J the undamaged Cauchy stress (degradable plus kept part) and sigma_1 its largest
 * principal value, the history kappa = max over time of sigma_1 (channel {@value #HISTORY}, Pa) starts to damage
 * the particle when it reaches the critical stress sigma_c (published: Rankine's maximum principal stress
 * criterion).
 *
 * <p>Softening: the fraction of undamaged stiffness kept is
 * <pre>
 *   phi(kappa) = 1                                           for kappa &lt;= sigma_c
 *   phi(kappa) = (sigma_c/kappa) exp(-(kappa - sigma_c)/s)   for kappa &gt; sigma_c
 * </pre>
 * the exponential law of Peerlings, de Borst, Brekelmans and de Vree (IJNME 39, 1996; their form with alpha = 1)
 * and of Oliver (IJNME 39, 1996), written with the stress-like history. In uniaxial tension with Young's modulus E
 * the stress after onset is sigma_c exp(-(E eps - sigma_c)/s): s (Pa) is the softening stress, the initial
 * softening slope is -E sigma_c/s, and the energy dissipated per unit volume is sigma_c^2/(2E) + sigma_c s/E.
 * Given a fracture energy Gf (J/m^2) spread over a crack band of width h (published: Bazant and Oh, Mater. Struct.
 * 16, 1983; h defaults to one cell, where a band of damaged particles localises), s follows from
 * Gf = h (sigma_c^2/(2E) + sigma_c s/E):
 * <pre>
 *   s = E Gf/(h sigma_c) - sigma_c/2     (must be &gt; 0: otherwise the band would snap back)
 * </pre>
 *
 * <p>Degradation g = k + (1 - k) (1 - d)^n with residual stiffness k and n = 1 ({@link Degradation#LINEAR}) or
 * n = 2 ({@link Degradation#QUADRATIC}). The target damage is d* = 1 - phi for n = 1 and d* = 1 - sqrt(phi) for
 * n = 2, so the softening curve and the dissipated energy above hold for both; n only sets what d means (n = 2
 * matches the phase-field convention, for outputs and criteria that compare the two).
 *
 * <p>Rate: with viscosity (relaxation time) tau_d = 0 the damage jumps to d*; with tau_d &gt; 0 it follows
 * d_dot = (d* - d)/tau_d, integrated exactly over each step for d* held fixed,
 * d_new = d* + (d - d*) exp(-dt/tau_d), which is stable for any step and never overshoots. Damage never decreases
 * because kappa never does.
 *
 * <p>What g degrades: the solver applies g to the degradable part of the {@link TensionSplit} the model asks of
 * the material law ({@link Builder#tensionSplit}, by default the law's own split) and keeps the rest, so a broken
 * particle still resists compression. The onset criterion uses the whole undamaged stress whatever the split.
 *
 * <p>Channels: {@value DamageModel#DAMAGE} and {@value #HISTORY}. Immutable and thread-safe; build with
 * {@link dev.fray.damage.Fracture#rankine()}.
 */
public final class RankineDamage implements DamageModel {
    /** Registry name. */
    public static final String NAME = "rankine";
    /** Name of the history channel: largest principal undamaged Cauchy stress reached, Pa. */
    public static final String HISTORY = "stress-history";
    /** Default residual stiffness k (dimensionless). */
    public static final double DEFAULT_RESIDUAL_STIFFNESS = 1e-6;

    /** How damage degrades the stress. */
    public enum Degradation {
        /** g = k + (1 - k)(1 - d). */
        LINEAR,
        /** g = k + (1 - k)(1 - d)^2. */
        QUADRATIC
    }

    private static final ChannelSpec DAMAGE_SPEC = new ChannelSpec(DAMAGE, 1, 0, "1",
            "Rankine damage d in [0, 1], 0 intact, 1 broken; never decreases");
    private static final ChannelSpec HISTORY_SPEC = new ChannelSpec(HISTORY, 1, 0, "Pa",
            "largest principal undamaged Cauchy stress reached");

    private final double criticalStress;
    private final double softeningStress;
    private final double fractureEnergy;
    private final double youngsModulus;
    private final double bandWidth;
    private final double viscosity;
    private final Degradation degradation;
    private final double residual;
    private final TensionSplit split;

    private RankineDamage(double criticalStress, double softeningStress, double fractureEnergy,
                          double youngsModulus, double bandWidth, double viscosity, Degradation degradation,
                          double residual, TensionSplit split) {
        this.criticalStress = criticalStress;
        this.softeningStress = softeningStress;
        this.fractureEnergy = fractureEnergy;
        this.youngsModulus = youngsModulus;
        this.bandWidth = bandWidth;
        this.viscosity = viscosity;
        this.degradation = degradation;
        this.residual = residual;
        this.split = split;
    }

    /** @return a builder; the critical stress and one softening parameter are required */
    public static Builder builder() {
        return new Builder();
    }

    /** @return critical stress sigma_c, Pa */
    public double criticalStress() {
        return criticalStress;
    }

    /**
     * @return softening stress s, Pa; NaN until {@link #resolvedFor} derives it from the fracture energy when the
     *         band width defaults to the cell size
     */
    public double softeningStress() {
        return softeningStress;
    }

    /** @return fracture energy Gf, J/m^2, or NaN if the softening stress was given directly */
    public double fractureEnergy() {
        return fractureEnergy;
    }

    /** @return Young's modulus E that goes with the fracture energy, Pa, or NaN if the softening stress was given */
    public double youngsModulus() {
        return youngsModulus;
    }

    /** @return crack band width h, m, or NaN (one cell, or not used) */
    public double bandWidth() {
        return bandWidth;
    }

    /** @return relaxation time tau_d of damage growth, s; 0 for instantaneous */
    public double viscosity() {
        return viscosity;
    }

    /** @return the degradation function */
    public Degradation degradationFunction() {
        return degradation;
    }

    /** @return residual stiffness k, dimensionless */
    public double residualStiffness() {
        return residual;
    }

    /**
     * Damage a particle reaches, without viscosity, once its history is kappa.
     *
     * @param kappa largest principal undamaged Cauchy stress reached, Pa
     * @return d* in [0, 1]
     * @throws IllegalStateException if the softening stress is not known yet
     */
    public double targetDamage(double kappa) {
        requireResolved();
        return target(kappa, criticalStress, 1.0 / softeningStress, degradation == Degradation.QUADRATIC);
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** {@inheritDoc} As given to {@link Builder#tensionSplit}. */
    @Override
    public TensionSplit tensionSplit() {
        return split;
    }

    /**
     * {@inheritDoc} Derives the softening stress from the fracture energy over a band of one cell when no band
     * width was given.
     *
     * @throws InvalidInputException with key OUT_OF_RANGE if the fracture energy is too small for the band width
     *                               (the softening branch would snap back)
     */
    @Override
    public DamageModel resolvedFor(double cellSize) {
        if (!Double.isNaN(softeningStress)) {
            return this;
        }
        Checks.positive("cellSize (m)", cellSize);
        double h = Double.isNaN(bandWidth) ? cellSize : bandWidth;
        return new RankineDamage(criticalStress, softening(criticalStress, fractureEnergy, youngsModulus, h),
                fractureEnergy, youngsModulus, bandWidth, viscosity, degradation, residual, split);
    }

    /** s = E Gf/(h sigma_c) - sigma_c/2, which must be positive. */
    private static double softening(double sigmaC, double gf, double e, double h) {
        double s = e * gf / (h * sigmaC) - 0.5 * sigmaC;
        if (!(s > 0)) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "fractureEnergy (J/m^2)", gf,
                    "> h sigma_c^2/(2E) = " + h * sigmaC * sigmaC / (2 * e) + " J/m^2 for the band width h = " + h
                            + " m; a smaller fracture energy would make the softening branch snap back; lower the"
                            + " band width (cell size) or the critical stress");
        }
        return s;
    }

    /**
     * {@inheritDoc} Damage starts at the critical stress, which is also the peak: the softening branch only
     * falls (Rankine's criterion; the strain is sigma_c / E).
     */
    @Override
    public Optional<UniaxialStrength> uniaxialStrength(double youngsModulus) {
        Checks.positive("youngsModulus (Pa)", youngsModulus);
        return Optional.of(new UniaxialStrength(criticalStress, criticalStress, criticalStress / youngsModulus,
                String.format(Locale.ROOT, "Rankine: critical stress %.4g Pa", criticalStress)));
    }

    /** {@inheritDoc} Here {@value DamageModel#DAMAGE} and {@value #HISTORY}. */
    @Override
    public List<ChannelSpec> channels() {
        return List.of(DAMAGE_SPEC, HISTORY_SPEC);
    }

    /**
     * {@inheritDoc} Raises kappa to the largest principal stress of (tauDegraded + tauKept)/J, moves d towards
     * d*(kappa) and returns g(d).
     *
     * @throws IllegalStateException if the softening stress is not known yet (call {@link #resolvedFor} first)
     */
    @Override
    public void update(MaterialState state, int from, int to, double dt, double[] tauDegraded, double[] tauKept,
                       double[] psiDegraded, double[] g) {
        requireResolved();
        double[] f = state.deformation();
        double[] d = state.channel(DAMAGE);
        double[] kappa = state.channel(HISTORY);
        double sigmaC = criticalStress;
        double invS = 1.0 / softeningStress;
        boolean quadratic = degradation == Degradation.QUADRATIC;
        // exp(-dt/tau) is the same for every particle of the batch.
        double lag = viscosity > 0 ? Math.exp(-dt / viscosity) : 0.0;
        double keep = 1.0 - residual;
        for (int p = from; p < to; p++) {
            int i = 9 * (p - from);
            int fi = 9 * p;
            double j = f[fi] * (f[fi + 4] * f[fi + 8] - f[fi + 5] * f[fi + 7])
                    + f[fi + 1] * (f[fi + 5] * f[fi + 6] - f[fi + 3] * f[fi + 8])
                    + f[fi + 2] * (f[fi + 3] * f[fi + 7] - f[fi + 4] * f[fi + 6]);
            // An inverted particle is crushed, not torn: it gives no tensile stress.
            double invJ = j > 0 ? 1.0 / j : 0.0;
            double s00 = (tauDegraded[i] + tauKept[i]) * invJ;
            double s11 = (tauDegraded[i + 4] + tauKept[i + 4]) * invJ;
            double s22 = (tauDegraded[i + 8] + tauKept[i + 8]) * invJ;
            double s01 = 0.5 * (tauDegraded[i + 1] + tauKept[i + 1] + tauDegraded[i + 3] + tauKept[i + 3]) * invJ;
            double s02 = 0.5 * (tauDegraded[i + 2] + tauKept[i + 2] + tauDegraded[i + 6] + tauKept[i + 6]) * invJ;
            double s12 = 0.5 * (tauDegraded[i + 5] + tauKept[i + 5] + tauDegraded[i + 7] + tauKept[i + 7]) * invJ;
            double s1 = StressMeasures.largestEigenvalue(s00, s11, s22, s01, s02, s12);
            double k = kappa[p];
            // Written so that a NaN stress reaches the history (and the divergence check) instead of vanishing.
            if (!(s1 <= k)) {
                k = s1;
                kappa[p] = k;
            }
            double dp = d[p];
            double dt1 = target(k, sigmaC, invS, quadratic);
            if (!(dt1 <= dp)) {
                dp = dt1 + (dp - dt1) * lag;
                d[p] = dp;
            }
            double u = 1.0 - dp;
            g[p - from] = residual + keep * (quadratic ? u * u : u);
        }
    }

    /** d*(kappa) = 1 - phi or 1 - sqrt(phi); NaN stays NaN. */
    private static double target(double kappa, double sigmaC, double invS, boolean quadratic) {
        if (kappa <= sigmaC) {
            return 0.0;
        }
        double phi = sigmaC / kappa * Math.exp(-(kappa - sigmaC) * invS);
        return 1.0 - (quadratic ? Math.sqrt(phi) : phi);
    }

    /** {@inheritDoc} g = k + (1 - k)(1 - d)^n. */
    @Override
    public void degradation(MaterialState state, int from, int to, double[] g) {
        double[] d = state.channel(DAMAGE);
        boolean quadratic = degradation == Degradation.QUADRATIC;
        double keep = 1.0 - residual;
        for (int p = from; p < to; p++) {
            double u = 1.0 - d[p];
            g[p - from] = residual + keep * (quadratic ? u * u : u);
        }
    }

    private void requireResolved() {
        if (Double.isNaN(softeningStress)) {
            throw new IllegalStateException("damage model \"" + NAME + "\" has no softening stress yet; call"
                    + " resolvedFor(cellSize) first (the simulation does this) or give a band width");
        }
    }

    /** @return the name and parameters, for diagnostics */
    @Override
    public String toString() {
        return NAME + "[sigma_c=" + criticalStress + " Pa, s=" + softeningStress + " Pa, Gf=" + fractureEnergy
                + " J/m^2, h=" + bandWidth + " m, tau=" + viscosity + " s, " + degradation + ", k=" + residual + ", split=" + split + "]";
    }

    /** Fluent builder; {@link #build()} validates and names the field and its allowed range. */
    public static final class Builder {
        private double criticalStress = Double.NaN;
        private double softeningStress = Double.NaN;
        private double fractureEnergy = Double.NaN;
        private double youngsModulus = Double.NaN;
        private double bandWidth = Double.NaN;
        private double viscosity = 0.0;
        private Degradation degradation = Degradation.LINEAR;
        private double residual = DEFAULT_RESIDUAL_STIFFNESS;
        private TensionSplit split = TensionSplit.LAW_DEFAULT;

        private Builder() {
        }

        /**
         * @param split tension-compression split asked of the material law (which the body checks it offers):
         *              its degradable part is what damage takes away; default {@link TensionSplit#LAW_DEFAULT}
         * @return this
         */
        public Builder tensionSplit(TensionSplit split) {
            this.split = split;
            return this;
        }

        /**
         * @param pascals critical stress sigma_c, Pa, &gt; 0 (required)
         * @return this
         */
        public Builder criticalStress(double pascals) {
            this.criticalStress = pascals;
            return this;
        }

        /**
         * Sets the softening directly: after onset the uniaxial stress decays as sigma_c exp(-(E eps - sigma_c)/s).
         * Give this or {@link #fractureEnergy}, not both.
         *
         * @param pascals softening stress s, Pa, &gt; 0
         * @return this
         */
        public Builder softeningStress(double pascals) {
            this.softeningStress = pascals;
            return this;
        }

        /**
         * Sets the softening from the fracture energy over the crack band (see the class comment). Give this or
         * {@link #softeningStress}, not both.
         *
         * @param joulesPerSquareMetre fracture energy Gf, J/m^2, &gt; 0
         * @param youngsModulus        Young's modulus E of the material, Pa, &gt; 0
         * @return this
         */
        public Builder fractureEnergy(double joulesPerSquareMetre, double youngsModulus) {
            this.fractureEnergy = joulesPerSquareMetre;
            this.youngsModulus = youngsModulus;
            return this;
        }

        /**
         * @param metres crack band width h, m, &gt; 0; NaN (the default) means one cell. Used with
         *               {@link #fractureEnergy} only.
         * @return this
         */
        public Builder bandWidth(double metres) {
            this.bandWidth = metres;
            return this;
        }

        /**
         * @param seconds relaxation time tau_d of damage growth, s, &gt;= 0; 0 (the default) is instantaneous
         * @return this
         */
        public Builder viscosity(double seconds) {
            this.viscosity = seconds;
            return this;
        }

        /**
         * @param g degradation function; default {@link Degradation#LINEAR}
         * @return this
         */
        public Builder degradation(Degradation g) {
            this.degradation = g;
            return this;
        }

        /**
         * @param k residual stiffness, dimensionless, in [0, 0.1]; default {@link #DEFAULT_RESIDUAL_STIFFNESS}
         * @return this
         */
        public Builder residualStiffness(double k) {
            this.residual = k;
            return this;
        }

        /**
         * @return the model
         * @throws InvalidInputException with key MISSING for a missing critical stress, softening or split,
         *                               INCONSISTENT if both softening parameters are given, OUT_OF_RANGE or
         *                               NOT_FINITE for a bad value (including a fracture energy too small for the
         *                               band width)
         */
        public DamageModel build() {
            if (Double.isNaN(criticalStress)) {
                throw new InvalidInputException(FrayMessage.MISSING, "criticalStress (Pa)");
            }
            Checks.positive("criticalStress (Pa)", criticalStress);
            Checks.notNull("degradation", degradation);
            Checks.notNull("tensionSplit", split);
            Checks.nonNegative("viscosity (s)", viscosity);
            Checks.inRange("residualStiffness", residual, 0.0, false, PhaseFieldAT2.MAX_RESIDUAL_STIFFNESS, false);
            boolean direct = !Double.isNaN(softeningStress);
            boolean energy = !Double.isNaN(fractureEnergy);
            if (direct && energy) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, "softeningStress and fractureEnergy",
                        "give one of them, not both: each sets the softening on its own");
            }
            if (!direct && !energy) {
                throw new InvalidInputException(FrayMessage.MISSING,
                        "softeningStress (Pa) or fractureEnergy (J/m^2) with youngsModulus (Pa)");
            }
            if (direct) {
                Checks.positive("softeningStress (Pa)", softeningStress);
                if (!Double.isNaN(bandWidth)) {
                    throw new InvalidInputException(FrayMessage.INCONSISTENT, "bandWidth",
                            "is used only with fractureEnergy; softeningStress already fixes the softening");
                }
                return new RankineDamage(criticalStress, softeningStress, Double.NaN, Double.NaN, Double.NaN,
                        viscosity, degradation, residual, split);
            }
            Checks.positive("fractureEnergy (J/m^2)", fractureEnergy);
            Checks.positive("youngsModulus (Pa)", youngsModulus);
            double s = Double.NaN;
            if (!Double.isNaN(bandWidth)) {
                Checks.positive("bandWidth (m)", bandWidth);
                s = softening(criticalStress, fractureEnergy, youngsModulus, bandWidth);
            }
            return new RankineDamage(criticalStress, s, fractureEnergy, youngsModulus, bandWidth, viscosity,
                    degradation, residual, split);
        }
    }
}

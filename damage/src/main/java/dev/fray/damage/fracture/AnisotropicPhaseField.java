package dev.fray.damage.fracture;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.damage.UniaxialStrength;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.damage.fiber.FiberChannels;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import java.util.Locale;
import java.util.Optional;

/**
 * Anisotropic phase-field fracture for materials with one to three fiber families: the isotropic model of
 * {@link PhaseFieldAT2} or {@link PhaseFieldAT1} with the crack surface density built on a structural tensor
 * (published: Teichtmeister, Kienle, Aldakheel and Keip, Int. J. Non-Linear Mech. 97, 2017; Clayton and Knap,
 * Physica D 2014):
 * <pre>
 *   AT2 (default): gamma(d) = d^2/(2l) + l/2 grad d . A grad d,      A = I + sum_k alpha_k a_k (x) a_k,
 *   AT1:           gamma(d) = 3/8 (d/l + l grad d . A grad d),
 * </pre>
 * so the grid problem is a d - div(D grad d) = b with D = Gc l A (AT2) or (3/4) Gc l A (AT1) and a, b as in
 * {@link PhaseFieldSupport} ({@link Builder#crackDensity}).
 * a_k = F a0_k / |F a0_k| is the current direction of family k, computed from F and the reference direction in
 * channel "fiber-k" (see {@link FiberChannels}); a particle whose reference vector is zero has no fiber of that
 * family. alpha_k &gt;= 0 makes crack surfaces whose normal lies along a_k more costly (by sqrt(1 + alpha_k)), so
 * cracks run along the fibers; the damage profile decays over l sqrt(1 + alpha_k) along a_k and over l across it.
 *
 * <p>Crack driving force, one of:
 * <ul>
 *   <li>energy (default): H = max over time of psi_degraded, as in {@link PhaseFieldAT2};</li>
 *   <li>stress: the threshold form of Miehe, Schaenzel and Ulmer (CMAME 294, 2015), with the fiber-direction
 *   dependent failure surface
 *   <pre>
 *     D_k = &lt;(&lt;sigma_aa&gt;/sigma_along)^2 + (&lt;sigma_tt&gt;/sigma_across)^2 - 1&gt;,
 *   </pre>
 *   where sigma = tau/J is the undamaged Cauchy stress, sigma_aa = a_k . sigma a_k the normal stress on the fiber
 *   direction, sigma_tt the largest principal normal stress in the plane normal to a_k, and &lt;x&gt; = max(x, 0)
 *   (only tension counts). D is the largest D_k over the particle's families (the family that fails first sets the
 *   driving force; common practice, no source); a particle without fibers uses
 *   D = &lt;(&lt;sigma_1&gt;/sigma_across)^2 - 1&gt; with sigma_1 the largest principal stress. Miehe et al. write
 *   the rate-independent evolution as (1 - d) zeta D - (d - l^2 div(A grad d)) = 0 with a slope parameter
 *   zeta &gt; 0; multiplied by Gc/l it is the energy form above with the history H = max over time of
 *   (Gc/(2l)) zeta D, which is what the history channel holds (J/m^3). So the viscosity keeps its meaning (Pa s)
 *   and homogeneous damage is d = zeta D/(1 + zeta D), zero until the failure surface is reached. With AT1 the
 *   history is H = (3 Gc/(16 l)) (1 + zeta D) where D &gt; 0 and 0 elsewhere (our mapping: AT1's elastic limit is
 *   H = 3 Gc/(16 l), so damage starts on the failure surface and the homogeneous damage 1 - 3 Gc/(16 l H) is the
 *   same zeta D/(1 + zeta D)); below the failure surface the AT1 threshold also keeps the band from spreading, so
 *   material below its strength stays intact farther than 2 l from a crack.</li>
 * </ul>
 *
 * <p>Degradation g = (1 - d)^2 (1 - k) + k, applied to the degradable part of the {@link TensionSplit} the model
 * asks of the material law ({@link Builder#tensionSplit}, by default the law's own split); with the energy
 * driving force the split's psi_degraded also drives the crack. Channels: {@value DamageModel#DAMAGE}, {@value PhaseFieldAT2#HISTORY}
 * (J/m^3) and the read-only fiber-k reference directions. Immutable and thread-safe; build with
 * {@link dev.fray.damage.Fracture#anisotropicPhaseField()}.
 */
public final class AnisotropicPhaseField implements DamageModel {
    /** Registry name. */
    public static final String NAME = "phase-field-anisotropic";
    /** Default slope zeta of the stress-based driving force (dimensionless). */
    public static final double DEFAULT_STRESS_DRIVING_SLOPE = 1.0;

    private static final ChannelSpec HISTORY_SPEC = PhaseFieldSupport.historySpec(PhaseFieldAT2.HISTORY);

    private final PhaseFieldSupport.Settings settings;
    private final double[] strengths;
    private final boolean stressDriven;
    private final double sigmaAlong;
    private final double sigmaAcross;
    private final double slope;
    private final List<ChannelSpec> channels;

    private AnisotropicPhaseField(PhaseFieldSupport.Settings settings, double[] strengths, boolean stressDriven,
                                  double sigmaAlong, double sigmaAcross, double slope) {
        this.settings = settings;
        this.strengths = strengths.clone();
        this.stressDriven = stressDriven;
        this.sigmaAlong = sigmaAlong;
        this.sigmaAcross = sigmaAcross;
        this.slope = slope;
        List<ChannelSpec> c = new ArrayList<>();
        c.add(PhaseFieldSupport.DAMAGE_SPEC);
        c.add(HISTORY_SPEC);
        if (settings.density() == CrackDensity.AT1) {
            c.add(PhaseFieldSupport.TRIAL_SPEC);
        }
        for (int k = 1; k <= strengths.length; k++) {
            c.add(FiberChannels.referenceSpec(k));
        }
        this.channels = Collections.unmodifiableList(c);
    }

    /**
     * @return a builder with the defaults: no length scale (two cells), no viscosity, k = 1e-6, energy driving,
     *         the law's own split
     */
    public static Builder builder() {
        return new Builder();
    }

    /** @return the crack surface density, AT2 unless the builder chose AT1 */
    public CrackDensity crackDensity() {
        return settings.density();
    }

    /**
     * @return fracture energy Gc, J/m^2; NaN while it is still to be solved for from a strength at a length scale
     *         not yet resolved
     */
    public double fractureEnergy() {
        return settings.fractureEnergy();
    }

    /** @return the strength the fracture energy was solved for, Pa, or NaN if the fracture energy was given */
    public double strength() {
        return settings.strength();
    }

    /** @return Young's modulus that goes with {@link #strength()}, Pa, or NaN */
    public double strengthModulus() {
        return settings.strengthModulus();
    }

    /** @return length scale l across the fibers, m; NaN until {@link #resolvedFor} fills in the default */
    public double lengthScale() {
        return settings.lengthScale();
    }

    /** @return crack-speed viscosity eta, Pa s */
    public double viscosity() {
        return settings.viscosity();
    }

    /** @return residual stiffness k, dimensionless */
    public double residualStiffness() {
        return settings.residual();
    }

    /** @return number of fiber families, 1 to 3 */
    public int families() {
        return strengths.length;
    }

    /**
     * @param family family number, 1 to {@link #families()}
     * @return its anisotropy strength alpha (dimensionless)
     */
    public double fiberStrength(int family) {
        Checks.inRange("fiber family", family, 1, strengths.length);
        return strengths[family - 1];
    }

    /** @return whether the stress-based driving force is used instead of the energy */
    public boolean stressDriven() {
        return stressDriven;
    }

    /** @return critical normal stress along the fibers, Pa (NaN for energy driving) */
    public double criticalStressAlong() {
        return sigmaAlong;
    }

    /** @return critical normal stress across the fibers, Pa (NaN for energy driving) */
    public double criticalStressAcross() {
        return sigmaAcross;
    }

    /** @return slope zeta of the stress-based driving force, dimensionless */
    public double stressDrivingSlope() {
        return slope;
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** {@inheritDoc} As given to {@link Builder#tensionSplit}. */
    @Override
    public TensionSplit tensionSplit() {
        return settings.split();
    }

    /**
     * {@inheritDoc} Fills a missing length scale with {@link PhaseFieldAT2#DEFAULT_LENGTH_CELLS} cells (and
     * solves for the fracture energy when a strength was given). The check is on l, the shortest length (across
     * the fibers); along them it is longer.
     *
     * @throws InvalidInputException with key OUT_OF_RANGE if l is below one cell
     */
    @Override
    public DamageModel resolvedFor(double cellSize) {
        PhaseFieldSupport.Settings r = settings.resolvedFor(cellSize);
        return r.equals(settings) ? this
                : new AnisotropicPhaseField(r, strengths, stressDriven, sigmaAlong, sigmaAcross, slope);
    }

    /**
     * {@inheritDoc} Energy driving: the homogeneous response of the {@link CrackDensity} (the structural tensor
     * acts on gradients only). Stress driving: damage starts at the smaller critical stress sigma_s, and the
     * homogeneous damage zeta D/(1 + zeta D) with D = (sigma/sigma_s)^2 - 1 peaks at x = sigma/sigma_s =
     * max(1, sqrt((1 - zeta)/(3 zeta))) with the stress sigma_s x/(1 + zeta (x^2 - 1))^2 (derived here from the
     * driving force above, degradation (1 - d)^2, the undamaged stress E eps). Empty before {@link #resolvedFor}.
     */
    @Override
    public Optional<UniaxialStrength> uniaxialStrength(double youngsModulus) {
        if (!stressDriven) {
            return settings.uniaxialStrength(youngsModulus);
        }
        Checks.positive("youngsModulus (Pa)", youngsModulus);
        double onset = Math.min(sigmaAlong, sigmaAcross);
        double x = Math.max(1.0, Math.sqrt((1.0 - slope) / (3.0 * slope)));
        double u = 1.0 + slope * (x * x - 1.0);
        double peak = onset * x / (u * u);
        return Optional.of(new UniaxialStrength(onset, peak, onset * x / youngsModulus, String.format(Locale.ROOT,
                "stress driving: onset at the smaller critical stress (along %.4g Pa, across %.4g Pa), slope %.3g",
                sigmaAlong, sigmaAcross, slope)));
    }

    /** {@inheritDoc} Here damage, history and fiber-1 .. fiber-n. */
    @Override
    public List<ChannelSpec> channels() {
        return channels;
    }

    /** {@inheritDoc} Raises the history to the current driving force where it is larger; g from the damage. */
    @Override
    public void update(MaterialState state, int from, int to, double dt, double[] tauDegraded, double[] tauKept,
                       double[] psiDegraded, double[] g) {
        double[] h = state.channel(PhaseFieldAT2.HISTORY);
        double[] d = state.channel(DAMAGE);
        double residual = settings.residual();
        if (!stressDriven) {
            for (int p = from; p < to; p++) {
                double psi = psiDegraded[p - from];
                if (!(psi <= h[p])) {
                    h[p] = psi;
                }
            }
        } else {
            settings.requireResolved(NAME);
            // H = scale (offset + D) for D > 0: AT2 (Gc/(2l)) zeta D; AT1 (3 Gc/(16 l)) (1 + zeta D).
            boolean at1 = settings.density() == CrackDensity.AT1;
            double gcOverL = settings.fractureEnergy() / settings.lengthScale();
            double scale = at1 ? 0.1875 * gcOverL * slope : 0.5 * gcOverL * slope;
            double offset = at1 ? 1.0 / slope : 0.0;
            double[] f = state.deformation();
            int n = strengths.length;
            double[] fib1 = state.channel(FiberChannels.reference(1));
            double[] fib2 = n >= 2 ? state.channel(FiberChannels.reference(2)) : null;
            double[] fib3 = n >= 3 ? state.channel(FiberChannels.reference(3)) : null;
            double invAlong = 1.0 / sigmaAlong;
            double invAcross = 1.0 / sigmaAcross;
            for (int p = from; p < to; p++) {
                int i = 9 * (p - from);
                int fi = 9 * p;
                double f00 = f[fi], f01 = f[fi + 1], f02 = f[fi + 2];
                double f10 = f[fi + 3], f11 = f[fi + 4], f12 = f[fi + 5];
                double f20 = f[fi + 6], f21 = f[fi + 7], f22 = f[fi + 8];
                double j = f00 * (f11 * f22 - f12 * f21) + f01 * (f12 * f20 - f10 * f22)
                        + f02 * (f10 * f21 - f11 * f20);
                // An inverted particle is crushed, not torn: it gives no tensile driving force.
                double invJ = j > 0 ? 1.0 / j : 0.0;
                double s00 = (tauDegraded[i] + tauKept[i]) * invJ;
                double s11 = (tauDegraded[i + 4] + tauKept[i + 4]) * invJ;
                double s22 = (tauDegraded[i + 8] + tauKept[i + 8]) * invJ;
                double s01 = 0.5 * (tauDegraded[i + 1] + tauKept[i + 1] + tauDegraded[i + 3] + tauKept[i + 3]) * invJ;
                double s02 = 0.5 * (tauDegraded[i + 2] + tauKept[i + 2] + tauDegraded[i + 6] + tauKept[i + 6]) * invJ;
                double s12 = 0.5 * (tauDegraded[i + 5] + tauKept[i + 5] + tauDegraded[i + 7] + tauKept[i + 7]) * invJ;
                double drive = Double.NEGATIVE_INFINITY;
                for (int k = 0; k < n; k++) {
                    double[] fib = k == 0 ? fib1 : k == 1 ? fib2 : fib3;
                    double a0x = fib[3 * p], a0y = fib[3 * p + 1], a0z = fib[3 * p + 2];
                    double ax = f00 * a0x + f01 * a0y + f02 * a0z;
                    double ay = f10 * a0x + f11 * a0y + f12 * a0z;
                    double az = f20 * a0x + f21 * a0y + f22 * a0z;
                    double len2 = ax * ax + ay * ay + az * az;
                    if (!(len2 > 0)) {
                        continue; // no fiber of this family here
                    }
                    double inv = 1.0 / Math.sqrt(len2);
                    ax *= inv;
                    ay *= inv;
                    az *= inv;
                    double sa = StressMeasures.along(s00, s11, s22, s01, s02, s12, ax, ay, az);
                    double st = StressMeasures.largestAcross(s00, s11, s22, s01, s02, s12, ax, ay, az);
                    double ra = sa > 0 ? sa * invAlong : 0.0;
                    double rt = st > 0 ? st * invAcross : 0.0;
                    drive = Math.max(drive, ra * ra + rt * rt - 1.0);
                }
                if (drive == Double.NEGATIVE_INFINITY) {
                    double s1 = StressMeasures.largestEigenvalue(s00, s11, s22, s01, s02, s12);
                    double r = s1 > 0 ? s1 * invAcross : 0.0;
                    drive = r * r - 1.0;
                }
                double heq = drive > 0 ? scale * (offset + drive) : drive != drive ? drive : 0.0;
                if (!(heq <= h[p])) {
                    h[p] = heq;
                }
            }
        }
        PhaseFieldSupport.degradation(d, from, to, residual, g);
    }

    /** {@inheritDoc} g = (1 - d)^2 (1 - k) + k. */
    @Override
    public void degradation(MaterialState state, int from, int to, double[] g) {
        PhaseFieldSupport.degradation(state.channel(DAMAGE), from, to, settings.residual(), g);
    }

    /** {@inheritDoc} Always true. */
    @Override
    public boolean usesPhaseField() {
        return true;
    }

    /**
     * {@inheritDoc} a and b as in {@link PhaseFieldSupport} in J/m^3 (Pa);
     * D = c Gc l (I + sum_k alpha_k a_k (x) a_k) in J/m with the current fiber directions a_k, c = 1 (AT2) or
     * 3/4 (AT1).
     *
     * @throws IllegalStateException if the length scale was never resolved
     */
    @Override
    public void phaseFieldCoefficients(MaterialState state, int from, int to, double dt, double[] out) {
        settings.requireResolved(NAME);
        PhaseFieldSupport.reactionAndSource(settings, state, from, to, dt, out);
        double gcl = settings.diffusion();
        double[] f = state.deformation();
        int n = strengths.length;
        double[] fib1 = state.channel(FiberChannels.reference(1));
        double[] fib2 = n >= 2 ? state.channel(FiberChannels.reference(2)) : null;
        double[] fib3 = n >= 3 ? state.channel(FiberChannels.reference(3)) : null;
        for (int p = from; p < to; p++) {
            int fi = 9 * p;
            double dxx = gcl, dyy = gcl, dzz = gcl, dxy = 0, dxz = 0, dyz = 0;
            for (int k = 0; k < n; k++) {
                double[] fib = k == 0 ? fib1 : k == 1 ? fib2 : fib3;
                double a0x = fib[3 * p], a0y = fib[3 * p + 1], a0z = fib[3 * p + 2];
                double ax = f[fi] * a0x + f[fi + 1] * a0y + f[fi + 2] * a0z;
                double ay = f[fi + 3] * a0x + f[fi + 4] * a0y + f[fi + 5] * a0z;
                double az = f[fi + 6] * a0x + f[fi + 7] * a0y + f[fi + 8] * a0z;
                double len2 = ax * ax + ay * ay + az * az;
                if (!(len2 > 0)) {
                    continue;
                }
                // alpha gcl a (x) a / |a|^2 with a = F a0 unnormalised: one division instead of a square root.
                double w = gcl * strengths[k] / len2;
                dxx += w * ax * ax;
                dyy += w * ay * ay;
                dzz += w * az * az;
                dxy += w * ax * ay;
                dxz += w * ax * az;
                dyz += w * ay * az;
            }
            int o = COEFFICIENTS * (p - from);
            out[o + 2] = dxx;
            out[o + 3] = dyy;
            out[o + 4] = dzz;
            out[o + 5] = dxy;
            out[o + 6] = dxz;
            out[o + 7] = dyz;
        }
    }

    /** {@inheritDoc} d = max(d_old, clamp(solved, 0, 1)); AT1 also records the solved value. */
    @Override
    public void acceptPhaseField(MaterialState state, int from, int to, double[] solved) {
        PhaseFieldSupport.accept(settings, state, from, to, solved);
    }

    /** @return the name and parameters, for diagnostics */
    @Override
    public String toString() {
        return NAME + settings + "[alpha=" + Arrays.toString(strengths)
                + (stressDriven ? ", stress driving: along " + sigmaAlong + " Pa, across " + sigmaAcross
                + " Pa, zeta " + slope : ", energy driving") + "]";
    }

    /** Fluent builder; {@link #build()} validates and names the field and its allowed range. */
    public static final class Builder extends PhaseFieldBuilder<Builder> {
        private double[] strengths;
        private boolean stressDriven;
        private double sigmaAlong = Double.NaN;
        private double sigmaAcross = Double.NaN;
        private double slope = DEFAULT_STRESS_DRIVING_SLOPE;
        private CrackDensity density = CrackDensity.AT2;

        private Builder() {
        }

        /**
         * @param crackDensity {@link CrackDensity#AT2} (the default) or {@link CrackDensity#AT1}, which has an
         *                     elastic stage and a band of finite width
         * @return this
         */
        public Builder crackDensity(CrackDensity crackDensity) {
            this.density = crackDensity;
            return this;
        }

        @Override
        Builder self() {
            return this;
        }

        /**
         * @param alphas anisotropy strength alpha_k &gt;= 0 (dimensionless) of families 1, 2, 3 in order; one to
         *               three values (required); copied
         * @return this
         */
        public Builder fiberStrengths(double... alphas) {
            this.strengths = alphas == null ? null : alphas.clone();
            return this;
        }

        /**
         * Switches to the stress-based driving force with direction-dependent strengths.
         *
         * @param criticalStressAlong  critical normal stress along the fibers sigma_along, Pa, &gt; 0
         * @param criticalStressAcross critical normal stress across the fibers sigma_across, Pa, &gt; 0
         * @return this
         */
        public Builder stressDriving(double criticalStressAlong, double criticalStressAcross) {
            this.stressDriven = true;
            this.sigmaAlong = criticalStressAlong;
            this.sigmaAcross = criticalStressAcross;
            return this;
        }

        /**
         * @param zeta slope of the stress-based driving force (Miehe et al. 2015), dimensionless, &gt; 0; larger
         *             values make damage grow faster past the failure surface; default
         *             {@link #DEFAULT_STRESS_DRIVING_SLOPE}. Used only with {@link #stressDriving}.
         * @return this
         */
        public Builder stressDrivingSlope(double zeta) {
            this.slope = zeta;
            return this;
        }

        /**
         * @return the model
         * @throws InvalidInputException with key MISSING if the fracture energy (or a strength) or the fiber
         *                               strengths were not given, INCONSISTENT for a strength with the stress
         *                               driving force, OUT_OF_RANGE or NOT_FINITE for a bad value
         */
        public DamageModel build() {
            Checks.notNull("crackDensity", density);
            PhaseFieldSupport.Settings settings = PhaseFieldSupport.Settings.given(this, density);
            if (stressDriven && !Double.isNaN(strength)) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, "strength",
                        "sets the fracture energy of the energy driving force; with stressDriving the critical"
                                + " stresses are the strengths: give fractureEnergy");
            }
            if (strengths == null) {
                throw new InvalidInputException(FrayMessage.MISSING, "fiberStrengths");
            }
            Checks.inRange("number of fiberStrengths (fiber families)", strengths.length, 1,
                    FiberChannels.MAX_FAMILIES);
            for (int k = 0; k < strengths.length; k++) {
                Checks.nonNegative("fiberStrength" + (k + 1), strengths[k]);
            }
            if (stressDriven) {
                Checks.positive("criticalStressAlong (Pa)", sigmaAlong);
                Checks.positive("criticalStressAcross (Pa)", sigmaAcross);
                Checks.positive("stressDrivingSlope", slope);
            }
            return new AnisotropicPhaseField(settings, strengths, stressDriven, sigmaAlong, sigmaAcross, slope);
        }
    }
}

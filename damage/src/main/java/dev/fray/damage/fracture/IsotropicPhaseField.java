package dev.fray.damage.fracture;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.damage.UniaxialStrength;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelSpec;

import java.util.List;
import java.util.Optional;

/**
 * Isotropic phase-field fracture with the history field H = max over time of psi_degraded (Miehe, Hofacker and
 * Welschinger, CMAME 199, 2010) and optional viscous regularisation (Miehe, Welschinger and Hofacker, IJNME 83,
 * 2010), for the two crack surface densities of {@link CrackDensity}: {@link PhaseFieldAT2} and
 * {@link PhaseFieldAT1}. Degradation g(d) = (1 - d)^2 (1 - k) + k of the degradable part of the
 * {@link TensionSplit} the model asks of the material law; psi_degraded of that split drives the crack, so
 * compression never cracks a law that splits. The grid problem, its coefficients and the bounds are those of
 * {@link PhaseFieldSupport}.
 *
 * <p>The fracture energy is given directly or through a chosen strength (see {@link PhaseFieldBuilder#strength});
 * in the second case it is solved for at the length scale, which may default from the cell size, so
 * {@link #fractureEnergy()} is NaN until {@link #resolvedFor} fills it in. Immutable and thread-safe.
 */
public abstract sealed class IsotropicPhaseField implements DamageModel permits PhaseFieldAT1, PhaseFieldAT2 {
    /** Name of the history channel, J/m^3. */
    public static final String HISTORY = "history";
    private static final ChannelSpec HISTORY_SPEC = PhaseFieldSupport.historySpec(HISTORY);

    private final PhaseFieldSupport.Settings settings;
    private final List<ChannelSpec> channels;

    IsotropicPhaseField(PhaseFieldSupport.Settings settings) {
        this.settings = settings;
        this.channels = settings.density() == CrackDensity.AT1
                ? List.of(PhaseFieldSupport.DAMAGE_SPEC, HISTORY_SPEC, PhaseFieldSupport.TRIAL_SPEC)
                : List.of(PhaseFieldSupport.DAMAGE_SPEC, HISTORY_SPEC);
    }

    /** @return a model of the same crack density with other settings */
    private static IsotropicPhaseField of(PhaseFieldSupport.Settings s) {
        return s.density() == CrackDensity.AT1 ? new PhaseFieldAT1(s) : new PhaseFieldAT2(s);
    }

    /** @return the crack surface density, which sets the elastic stage and the band profile */
    public final CrackDensity crackDensity() {
        return settings.density();
    }

    /**
     * @return fracture energy (critical energy release rate) Gc, J/m^2; NaN while it is still to be solved for
     *         from a strength at a length scale not yet resolved
     */
    public final double fractureEnergy() {
        return settings.fractureEnergy();
    }

    /** @return the strength the fracture energy was solved for, Pa, or NaN if the fracture energy was given */
    public final double strength() {
        return settings.strength();
    }

    /** @return Young's modulus that goes with {@link #strength()}, Pa, or NaN */
    public final double strengthModulus() {
        return settings.strengthModulus();
    }

    /** @return length scale l, m; NaN until {@link #resolvedFor} fills in the default */
    public final double lengthScale() {
        return settings.lengthScale();
    }

    /** @return crack-speed viscosity eta, Pa s; 0 is rate-independent */
    public final double viscosity() {
        return settings.viscosity();
    }

    /** @return residual stiffness k, dimensionless */
    public final double residualStiffness() {
        return settings.residual();
    }

    /** {@inheritDoc} As given to the builder's {@code tensionSplit}. */
    @Override
    public final TensionSplit tensionSplit() {
        return settings.split();
    }

    /**
     * {@inheritDoc} Fills a missing length scale with {@link PhaseFieldAT2#DEFAULT_LENGTH_CELLS} cells, and solves
     * for the fracture energy when a strength was given.
     *
     * @throws dev.fray.core.error.InvalidInputException with key OUT_OF_RANGE if l is below one cell: the grid
     *                                                   cannot resolve a diffuse crack thinner than a cell
     */
    @Override
    public final DamageModel resolvedFor(double cellSize) {
        PhaseFieldSupport.Settings r = settings.resolvedFor(cellSize);
        return r.equals(settings) ? this : of(r);
    }

    /** {@inheritDoc} damage and history; AT1 also keeps {@value PhaseFieldSupport#TRIAL}. */
    @Override
    public final List<ChannelSpec> channels() {
        return channels;
    }

    /**
     * {@inheritDoc} The homogeneous uniaxial response of {@link CrackDensity}: onset, peak stress and strain.
     * Empty before {@link #resolvedFor}.
     */
    @Override
    public final Optional<UniaxialStrength> uniaxialStrength(double youngsModulus) {
        return settings.uniaxialStrength(youngsModulus);
    }

    /** {@inheritDoc} Raises the history H to psi_degraded where it is larger; g from the current damage. */
    @Override
    public final void update(MaterialState state, int from, int to, double dt, double[] tauDegraded,
                             double[] tauKept, double[] psiDegraded, double[] g) {
        double[] h = state.channel(HISTORY);
        for (int p = from; p < to; p++) {
            double psi = psiDegraded[p - from];
            // Written so that NaN energy reaches the history (and the divergence check), not silently dropped.
            if (!(psi <= h[p])) {
                h[p] = psi;
            }
        }
        PhaseFieldSupport.degradation(state.channel(DAMAGE), from, to, settings.residual(), g);
    }

    /** {@inheritDoc} g = (1 - d)^2 (1 - k) + k. */
    @Override
    public final void degradation(MaterialState state, int from, int to, double[] g) {
        PhaseFieldSupport.degradation(state.channel(DAMAGE), from, to, settings.residual(), g);
    }

    /** {@inheritDoc} Always true. */
    @Override
    public final boolean usesPhaseField() {
        return true;
    }

    /**
     * {@inheritDoc} a and b as in {@link PhaseFieldSupport#reactionAndSource}, D = c Gc l I with c = 1 (AT2) or
     * 3/4 (AT1), in J/m.
     *
     * @throws IllegalStateException if the length scale was never resolved
     */
    @Override
    public final void phaseFieldCoefficients(MaterialState state, int from, int to, double dt, double[] out) {
        settings.requireResolved(name());
        PhaseFieldSupport.reactionAndSource(settings, state, from, to, dt, out);
        double diffusion = settings.diffusion();
        for (int p = from; p < to; p++) {
            int o = COEFFICIENTS * (p - from);
            out[o + 2] = diffusion;
            out[o + 3] = diffusion;
            out[o + 4] = diffusion;
            out[o + 5] = 0.0;
            out[o + 6] = 0.0;
            out[o + 7] = 0.0;
        }
    }

    /** {@inheritDoc} d = max(d_old, clamp(solved, 0, 1)); AT1 also records the solved value. */
    @Override
    public final void acceptPhaseField(MaterialState state, int from, int to, double[] solved) {
        PhaseFieldSupport.accept(settings, state, from, to, solved);
    }

    /** @return the name and parameters, for diagnostics */
    @Override
    public final String toString() {
        return name() + settings;
    }

    /**
     * Fluent builder of {@link PhaseFieldAT2} or {@link PhaseFieldAT1} (from {@link dev.fray.damage.Fracture});
     * {@link #build()} validates and names the field and its allowed range.
     */
    public static final class Builder extends PhaseFieldBuilder<Builder> {
        private final CrackDensity density;

        Builder(CrackDensity density) {
            this.density = density;
        }

        @Override
        Builder self() {
            return this;
        }

        /**
         * @return the model
         * @throws dev.fray.core.error.InvalidInputException with key MISSING if neither the fracture energy nor a
         *                                                   strength was given, INCONSISTENT if both were,
         *                                                   OUT_OF_RANGE or NOT_FINITE for a bad value
         */
        public DamageModel build() {
            return of(PhaseFieldSupport.Settings.given(this, density));
        }
    }
}

package dev.fray.damage.fracture;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelSpec;

import java.util.List;

/**
 * Isotropic AT2 phase-field fracture (published: Bourdin, Francfort and Marigo, J. Mech. Phys. Solids 48, 2000,
 * and J. Elasticity 91, 2008) with the history field and viscous regularisation of Miehe, Hofacker and
 * Welschinger (CMAME 199, 2010) and Miehe, Welschinger and Hofacker (IJNME 83, 2010).
 *
 * <p>Crack surface density gamma(d) = d^2/(2l) + l/2 |grad d|^2 and degradation
 * g(d) = (1 - d)^2 (1 - k) + k. The damage solves, each step, the backward-Euler form of
 * <pre>
 *   (Gc/l) (d - l^2 lap d) + eta d_dot = 2 (1 - d) H,     H = max over time of psi_degraded
 * </pre>
 * that is a d - div(D grad d) = b with
 * <pre>
 *   a = Gc/l + 2H + eta/dt,   b = 2H + (eta/dt) d_old,   D = Gc l I.
 * </pre>
 * psi_degraded is the degradable (tensile) energy density of the material law's split, J/m^3 of reference volume,
 * so compression never cracks a law that splits. The solved field is clamped to [0, 1] and never decreases.
 * For homogeneous states and eta = 0 this gives d = H / (H + Gc/(2l)). Which part of the stress and energy is
 * degradable is the {@link TensionSplit} the model asks of the material law ({@link Builder#tensionSplit}, by
 * default the law's own split).
 *
 * <p>Channels: {@value DamageModel#DAMAGE} (d, dimensionless) and {@value #HISTORY} (H, J/m^3).
 * Immutable and thread-safe; build with {@link dev.fray.damage.Fracture#phaseField()}.
 */
public final class PhaseFieldAT2 implements DamageModel {
    /** Registry name. */
    public static final String NAME = "phase-field-at2";
    /** Name of the history channel, J/m^3. */
    public static final String HISTORY = "history";
    /** Default residual stiffness k (dimensionless): keeps a broken particle's stiffness matrix regular. */
    public static final double DEFAULT_RESIDUAL_STIFFNESS = 1e-6;
    /** Largest residual stiffness accepted (dimensionless); more would leave broken material carrying load. */
    public static final double MAX_RESIDUAL_STIFFNESS = 0.1;
    /** Default length scale in cells when none is given: two cells resolve the profile on quadratic B-splines. */
    public static final double DEFAULT_LENGTH_CELLS = 2.0;

    private static final ChannelSpec HISTORY_SPEC = PhaseFieldSupport.historySpec(HISTORY);

    private final double fractureEnergy;
    private final double lengthScale;
    private final double viscosity;
    private final double residual;
    private final TensionSplit split;

    private PhaseFieldAT2(double fractureEnergy, double lengthScale, double viscosity, double residual,
                          TensionSplit split) {
        PhaseFieldSupport.check(fractureEnergy, lengthScale, viscosity, residual);
        this.fractureEnergy = fractureEnergy;
        this.lengthScale = lengthScale;
        this.viscosity = viscosity;
        this.residual = residual;
        this.split = Checks.notNull("tensionSplit", split);
    }

    /**
     * @return a builder with the defaults: no length scale (two cells), no viscosity, k = 1e-6, the law's own
     *         split
     */
    public static Builder builder() {
        return new Builder();
    }

    /** @return fracture energy (critical energy release rate) Gc, J/m^2 */
    public double fractureEnergy() {
        return fractureEnergy;
    }

    /** @return length scale l, m; NaN until {@link #resolvedFor} fills in the default */
    public double lengthScale() {
        return lengthScale;
    }

    /** @return crack-speed viscosity eta, Pa s; 0 is rate-independent */
    public double viscosity() {
        return viscosity;
    }

    /** @return residual stiffness k, dimensionless */
    public double residualStiffness() {
        return residual;
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** {@inheritDoc} As given to {@link Builder#tensionSplit}; the psi_degraded of the split drives the crack. */
    @Override
    public TensionSplit tensionSplit() {
        return split;
    }

    /**
     * {@inheritDoc} Fills a missing length scale with {@link #DEFAULT_LENGTH_CELLS} cells.
     *
     * @throws InvalidInputException with key OUT_OF_RANGE if l is below one cell: the grid cannot resolve a
     *                               diffuse crack thinner than a cell
     */
    @Override
    public DamageModel resolvedFor(double cellSize) {
        double l = PhaseFieldSupport.resolveLength(lengthScale, cellSize);
        return l == lengthScale ? this : new PhaseFieldAT2(fractureEnergy, l, viscosity, residual, split);
    }

    /** {@inheritDoc} Here {@value DamageModel#DAMAGE} and {@value #HISTORY}. */
    @Override
    public List<ChannelSpec> channels() {
        return List.of(PhaseFieldSupport.DAMAGE_SPEC, HISTORY_SPEC);
    }

    /** {@inheritDoc} Raises the history H to psi_degraded where it is larger; g from the current damage. */
    @Override
    public void update(MaterialState state, int from, int to, double dt, double[] tauDegraded, double[] tauKept,
                       double[] psiDegraded, double[] g) {
        double[] h = state.channel(HISTORY);
        double[] d = state.channel(DAMAGE);
        for (int p = from; p < to; p++) {
            double psi = psiDegraded[p - from];
            // Written so that NaN energy reaches the history (and the divergence check), not silently dropped.
            if (!(psi <= h[p])) {
                h[p] = psi;
            }
        }
        PhaseFieldSupport.degradation(d, from, to, residual, g);
    }

    /** {@inheritDoc} g = (1 - d)^2 (1 - k) + k. */
    @Override
    public void degradation(MaterialState state, int from, int to, double[] g) {
        PhaseFieldSupport.degradation(state.channel(DAMAGE), from, to, residual, g);
    }

    /** {@inheritDoc} Always true. */
    @Override
    public boolean usesPhaseField() {
        return true;
    }

    /**
     * {@inheritDoc} a = Gc/l + 2H + eta/dt and b = 2H + (eta/dt) d_old in J/m^3 (Pa), D = Gc l I in J/m.
     *
     * @throws IllegalStateException if the length scale was never resolved
     */
    @Override
    public void phaseFieldCoefficients(MaterialState state, int from, int to, double dt, double[] out) {
        PhaseFieldSupport.requireResolved(NAME, lengthScale);
        double[] h = state.channel(HISTORY);
        double[] d = state.channel(DAMAGE);
        PhaseFieldSupport.reactionAndSource(d, h, from, to, dt, fractureEnergy / lengthScale, viscosity, out);
        double diffusion = fractureEnergy * lengthScale;
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

    /** {@inheritDoc} d = max(d_old, clamp(solved, 0, 1)). */
    @Override
    public void acceptPhaseField(MaterialState state, int from, int to, double[] solved) {
        PhaseFieldSupport.accept(state.channel(DAMAGE), from, to, solved);
    }

    /** @return the name and parameters, for diagnostics */
    @Override
    public String toString() {
        return NAME + "[Gc=" + fractureEnergy + " J/m^2, l=" + lengthScale + " m, eta=" + viscosity + " Pa s, k="
                + residual + ", split=" + split + "]";
    }

    /** Fluent builder; {@link #build()} validates and names the field and its allowed range. */
    public static final class Builder extends PhaseFieldBuilder<Builder> {
        private Builder() {
        }

        @Override
        Builder self() {
            return this;
        }

        /**
         * @return the model
         * @throws InvalidInputException with key MISSING if the fracture energy or the split was not given,
         *                               OUT_OF_RANGE or NOT_FINITE for a bad value
         */
        public DamageModel build() {
            if (Double.isNaN(fractureEnergy)) {
                throw new InvalidInputException(FrayMessage.MISSING, PhaseFieldSupport.FRACTURE_ENERGY);
            }
            return new PhaseFieldAT2(fractureEnergy, lengthScale, viscosity, residual, split);
        }
    }
}

package dev.fray.damage.fracture;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ChannelSpec;

/**
 * What the two phase-field models share: parameter checks, the length-scale default, the channels, the
 * degradation function, the reaction and source coefficients, and the irreversible acceptance of the solved field.
 * Static and stateless, so the model loops call it without a virtual call.
 */
final class PhaseFieldSupport {
    /** Field name of the fracture energy in messages. */
    static final String FRACTURE_ENERGY = "fractureEnergy (J/m^2)";
    /** Field name of the length scale in messages. */
    static final String LENGTH_SCALE = "lengthScale (m)";
    /** Field name of the crack-speed viscosity in messages. */
    static final String VISCOSITY = "viscosity (Pa s)";
    /** Field name of the residual stiffness in messages. */
    static final String RESIDUAL = "residualStiffness";

    /** Declaration of the damage channel. */
    static final ChannelSpec DAMAGE_SPEC = new ChannelSpec(DamageModel.DAMAGE, 1, 0, "1",
            "phase-field damage d in [0, 1], 0 intact, 1 broken; never decreases");

    private PhaseFieldSupport() {
    }

    /**
     * @param history name of the history channel
     * @return declaration of the history channel
     */
    static ChannelSpec historySpec(String history) {
        return new ChannelSpec(history, 1, 0, "J/m^3",
                "history field H = max over time of the crack driving energy density (reference volume)");
    }

    /** Checks the four shared parameters; the length scale may be NaN (default from the cell size). */
    static void check(double fractureEnergy, double lengthScale, double viscosity, double residual) {
        Checks.positive(FRACTURE_ENERGY, fractureEnergy);
        if (!Double.isNaN(lengthScale)) {
            Checks.positive(LENGTH_SCALE, lengthScale);
        }
        Checks.nonNegative(VISCOSITY, viscosity);
        Checks.inRange(RESIDUAL, residual, 0.0, false, PhaseFieldAT2.MAX_RESIDUAL_STIFFNESS, false);
    }

    /**
     * The length scale to use on a grid of cell size dx: the given one, or {@link PhaseFieldAT2#DEFAULT_LENGTH_CELLS}
     * cells when NaN.
     *
     * @throws InvalidInputException if l &lt; dx
     */
    static double resolveLength(double lengthScale, double cellSize) {
        Checks.positive("cellSize (m)", cellSize);
        double l = Double.isNaN(lengthScale) ? PhaseFieldAT2.DEFAULT_LENGTH_CELLS * cellSize : lengthScale;
        if (l < cellSize) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, LENGTH_SCALE, l,
                    ">= the cell size " + cellSize + " m: the grid cannot resolve a diffuse crack thinner than a"
                            + " cell; use a length scale of at least one cell (two or more recommended) or a finer"
                            + " grid");
        }
        return l;
    }

    /** Throws if a model is used before its length scale is known. Called once per batch. */
    static void requireResolved(String name, double lengthScale) {
        if (Double.isNaN(lengthScale)) {
            throw new IllegalStateException("damage model \"" + name + "\" has no length scale yet; call"
                    + " resolvedFor(cellSize) first (the simulation does this) or set lengthScale");
        }
    }

    /** g(d) = (1 - d)^2 (1 - k) + k for particles [from, to), written at p - from. */
    static void degradation(double[] damage, int from, int to, double residual, double[] g) {
        double keep = 1.0 - residual;
        for (int p = from; p < to; p++) {
            double u = 1.0 - damage[p];
            g[p - from] = u * u * keep + residual;
        }
    }

    /**
     * Writes a, b and zero off-diagonal D entries of Miehe et al. (2010): a = Gc/l + 2H + eta/dt,
     * b = 2H + (eta/dt) d_old; the diagonal of D is written by the caller.
     */
    static void reactionAndSource(double[] damage, double[] history, int from, int to, double dt,
                                  double gcOverL, double viscosity, double[] out) {
        // eta = 0 is the rate-independent model; skip the term so that dt never divides zero by zero.
        double rate = viscosity > 0 ? viscosity / dt : 0.0;
        for (int p = from; p < to; p++) {
            int o = DamageModel.COEFFICIENTS * (p - from);
            double h2 = 2.0 * history[p];
            out[o] = gcOverL + h2 + rate;
            out[o + 1] = h2 + rate * damage[p];
        }
    }

    /** d = max(d_old, clamp(solved, 0, 1)): bounds and irreversibility. NaN stays NaN so divergence is seen. */
    static void accept(double[] damage, int from, int to, double[] solved) {
        for (int p = from; p < to; p++) {
            double s = solved[p - from];
            double c = s < 0 ? 0 : s > 1 ? 1 : s;
            double old = damage[p];
            damage[p] = c >= old || c != c ? c : old;
        }
    }
}

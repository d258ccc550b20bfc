package dev.fray.damage.fracture;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.damage.UniaxialStrength;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelSpec;

import java.util.Locale;
import java.util.Optional;

/**
 * What the phase-field models share: their settings with the checks and the length-scale default, the channels,
 * the degradation function, the reaction and source coefficients of both crack surface densities, and the
 * bounded, irreversible acceptance of the solved field. Static and stateless, so the model loops call it without
 * a virtual call.
 *
 * <p><b>The grid problem.</b> Stationarity of g(d) H + Gc gamma(d) (history H, {@link CrackDensity}) plus the
 * viscous term eta d_dot, in backward Euler, is a d - div(D grad d) = b with
 * <pre>
 *   AT2:  a = Gc/l + 2H + eta/dt,   b = 2H + (eta/dt) d_old,            D = Gc l A
 *   AT1:  a = 2H + eta/dt,          b = 2H - 3 Gc/(8 l) + (eta/dt) d_old, D = (3/4) Gc l A
 * </pre>
 * (A = I for the isotropic models). For AT1 the local term is linear in d, so it enters as the constant sink
 * -3 Gc/(8 l) and the problem is only well posed with the bound d &gt;= d_old (&gt;= 0): that is what gives AT1 its
 * elastic stage (b &lt; 0 below 2H = 3 Gc/(8 l), that is below sigma_c = sqrt(3 E Gc/(8 l)) in uniaxial stress) and
 * its compact band. The lower bound d &gt;= 0 is enforced in the solve by a penalty term (gamma/2) &lt;d&gt;_-^2
 * (the penalty of Gerasimov and De Lorenzis, CMAME 354, 2019, there written for d &gt;= d_old), with its active set
 * lagged by one step: where the previous solve (channel {@value #TRIAL}) fell below zero, the particle adds gamma
 * to a. The one linear solve per explicit step is then one semi-smooth Newton iteration of the penalised problem,
 * and the set is consistent from step to step: a penalised particle stays penalised exactly while its
 * unconstrained residual pushes d below zero. Irreversibility (d &gt;= d_old) is enforced on acceptance, as for
 * AT2; holding d_old in the solve as well was tried and rejected: the lumped penalty pins grid nodes to particle
 * values, the B-spline interpolation of a convex profile then lands above them, and the maximum ratchets the band
 * wider step after step (the band of a fixed crack grew from 2.3 l to 3.1 l in 40 steps).
 * gamma = 3 Gc/(8 l) / {@link #AT1_PENALTY_TOLERANCE}, so an unloaded penalised particle solves to -0.01 (then
 * clamped to 0) and the penalised decay length is l sqrt(2 * 0.01), a seventh of l. Released particles without
 * load would have a = 0; a floor of a at {@link #AT1_PENALTY_TOLERANCE} times the sink keeps the matrix regular
 * wherever the set changes and shifts the band's profile by under 1%. The first step starts with every particle
 * penalised (the channel starts at -1).
 *
 * <p><b>Intact material costs no solve.</b> A penalised particle far from any damage solves to exactly -sink/gamma
 * each step, and with b &lt; 0 the simulation could never skip the solve of an intact body (it skips only while
 * every b/a is negligible). So a particle that is penalised, undamaged, below the threshold (2H &lt; sink) and
 * whose last trial is at least half that depth ("deep") is given b = 0: its solution is then 0 plus what flows in
 * from its neighbours, and acceptance takes solved - {@link #DEEP_OFFSET} x {@link #AT1_PENALTY_TOLERANCE} as its
 * value (trial and damage): the particle's own sink at its penalty (sink / gamma) once, and once more for the
 * sinks of its deep neighbours, which the B-splines share with it. An intact body is all deep, so its solve is
 * skipped as for AT2; near a crack the corrected value keeps the sign test of the penalised problem (a fixed
 * crack's band is the same as with every sink in place: within 1% in half-width, nothing beyond 1.1 x 2 l).
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

    /** Name of the channel holding the last solved phase field before the bounds (AT1 only). */
    static final String TRIAL = "damage-trial";
    /** Declaration of the trial channel; it starts below every damage, so the first AT1 solve is penalised. */
    static final ChannelSpec TRIAL_SPEC = new ChannelSpec(TRIAL, 1, -1.0, "1",
            "last solved phase field before the bounds d_old <= d <= 1; where it is below the damage the next"
                    + " solve holds the damage by a penalty (AT1)");
    /**
     * AT1: the depth, in damage, to which an unloaded penalised particle solves (gamma = sink / this), and the
     * floor of the reaction relative to the sink. Small enough for a profile within 1%, large enough that the
     * penalty does not dominate the conjugate-gradient solve.
     */
    static final double AT1_PENALTY_TOLERANCE = 0.01;
    /** How many penalised depths acceptance subtracts from a deep particle's solution (see the class comment). */
    static final double DEEP_OFFSET = 2.0;

    private PhaseFieldSupport() {
    }

    /**
     * The settings every phase-field model shares, validated on construction.
     *
     * @param density         crack surface density
     * @param fractureEnergy  Gc, J/m^2, or NaN while it is to be solved for from the strength
     * @param strength        chosen peak stress, Pa, or NaN when Gc was given
     * @param strengthModulus Young's modulus that goes with the strength, Pa, or NaN
     * @param lengthScale     l, m, or NaN for the default of two cells
     * @param viscosity       eta, Pa s
     * @param residual        residual stiffness k
     * @param split           tension-compression split
     */
    record Settings(CrackDensity density, double fractureEnergy, double strength, double strengthModulus,
                    double lengthScale, double viscosity, double residual, TensionSplit split) {
        Settings {
            Checks.notNull("crackDensity", density);
            Checks.notNull("tensionSplit", split);
            if (!Double.isNaN(lengthScale)) {
                Checks.positive(LENGTH_SCALE, lengthScale);
            }
            if (!Double.isNaN(strength)) {
                // The strength is what the user chose: the fracture energy always follows from it.
                Checks.positive("strength (Pa)", strength);
                Checks.positive("youngsModulus (Pa)", strengthModulus);
                fractureEnergy = Double.isNaN(lengthScale) ? Double.NaN
                        : density.fractureEnergyFor(strength, strengthModulus, lengthScale);
            } else {
                Checks.positive(FRACTURE_ENERGY, fractureEnergy);
            }
            Checks.nonNegative(VISCOSITY, viscosity);
            Checks.inRange(RESIDUAL, residual, 0.0, false, PhaseFieldAT2.MAX_RESIDUAL_STIFFNESS, false);
        }

        /**
         * Settings as a builder gives them: exactly one of the fracture energy and the strength.
         *
         * @throws InvalidInputException with key MISSING if neither is given, INCONSISTENT if both are
         */
        static Settings given(PhaseFieldBuilder<?> b, CrackDensity density) {
            boolean byStrength = !Double.isNaN(b.strength);
            boolean byEnergy = !Double.isNaN(b.fractureEnergy);
            if (byStrength && byEnergy) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, "fractureEnergy and strength",
                        "give one of them, not both: the strength sets the fracture energy at the length scale");
            }
            if (!byStrength && !byEnergy) {
                throw new InvalidInputException(FrayMessage.MISSING, FRACTURE_ENERGY);
            }
            return new Settings(density, b.fractureEnergy, b.strength, b.strengthModulus, b.lengthScale,
                    b.viscosity, b.residual, b.split);
        }

        /** @return the settings with the length scale and fracture energy known on a grid of this cell size */
        Settings resolvedFor(double cellSize) {
            double l = resolveLength(lengthScale, cellSize);
            return l == lengthScale ? this
                    : new Settings(density, fractureEnergy, strength, strengthModulus, l, viscosity, residual, split);
        }

        /** Throws if the model is used before its length scale is known. Called once per batch. */
        void requireResolved(String name) {
            PhaseFieldSupport.requireResolved(name, lengthScale);
        }

        /** @return the isotropic diffusion coefficient c Gc l, J/m (c = 1 for AT2, 3/4 for AT1) */
        double diffusion() {
            return (density == CrackDensity.AT1 ? 0.75 : 1.0) * fractureEnergy * lengthScale;
        }

        /** @return the homogeneous uniaxial response, empty before the length scale is resolved */
        Optional<UniaxialStrength> uniaxialStrength(double youngsModulus) {
            Checks.positive("youngsModulus (Pa)", youngsModulus);
            if (Double.isNaN(lengthScale) || Double.isNaN(fractureEnergy)) {
                return Optional.empty();
            }
            return Optional.of(new UniaxialStrength(
                    density.onsetStress(youngsModulus, fractureEnergy, lengthScale),
                    density.peakStress(youngsModulus, fractureEnergy, lengthScale),
                    density.peakStrain(youngsModulus, fractureEnergy, lengthScale),
                    String.format(Locale.ROOT, "%s with Gc = %.4g J/m^2, l = %.4g m", density.strengthFormula(),
                            fractureEnergy, lengthScale)));
        }

        @Override
        public String toString() {
            return "[" + density + ", Gc=" + fractureEnergy + " J/m^2"
                    + (Double.isNaN(strength) ? "" : " (strength " + strength + " Pa at E=" + strengthModulus
                    + " Pa)") + ", l=" + lengthScale + " m, eta=" + viscosity + " Pa s, k=" + residual
                    + ", split=" + split + "]";
        }
    }

    /**
     * @param history name of the history channel
     * @return declaration of the history channel
     */
    static ChannelSpec historySpec(String history) {
        return new ChannelSpec(history, 1, 0, "J/m^3",
                "history field H = max over time of the crack driving energy density (reference volume)");
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
     * Writes a and b of the grid problem (see the class comment) for particles [from, to) at
     * {@link DamageModel#COEFFICIENTS}(p - from); the caller writes D. Reads the damage, the history and, for AT1,
     * the trial channel.
     */
    static void reactionAndSource(Settings s, MaterialState state, int from, int to, double dt, double[] out) {
        double[] damage = state.channel(DamageModel.DAMAGE);
        double[] history = state.channel(IsotropicPhaseField.HISTORY);
        double gcOverL = s.fractureEnergy() / s.lengthScale();
        // eta = 0 is the rate-independent model; skip the term so that dt never divides zero by zero.
        double rate = s.viscosity() > 0 ? s.viscosity() / dt : 0.0;
        if (s.density() == CrackDensity.AT2) {
            for (int p = from; p < to; p++) {
                int o = DamageModel.COEFFICIENTS * (p - from);
                double h2 = 2.0 * history[p];
                out[o] = gcOverL + h2 + rate;
                out[o + 1] = h2 + rate * damage[p];
            }
            return;
        }
        double[] trial = state.channel(TRIAL);
        double sink = 0.375 * gcOverL;
        double penalty = sink / AT1_PENALTY_TOLERANCE;
        double floor = sink * AT1_PENALTY_TOLERANCE;
        for (int p = from; p < to; p++) {
            int o = DamageModel.COEFFICIENTS * (p - from);
            double h2 = 2.0 * history[p];
            double old = damage[p];
            double a = (h2 > floor ? h2 : floor) + rate;
            double b = h2 - sink + rate * old;
            if (trial[p] < 0) {
                a += penalty;
                if (deep(trial[p], old, h2, sink)) {
                    b = 0;
                }
            }
            out[o] = a;
            out[o + 1] = b;
        }
    }

    /**
     * Whether an AT1 particle is deep in the penalised, intact region (see the class comment): its last trial is
     * at least half the penalised depth below zero, it is undamaged and below the threshold. Undefined for NaN.
     */
    private static boolean deep(double trial, double damage, double h2, double sink) {
        return trial <= -0.5 * AT1_PENALTY_TOLERANCE && damage == 0 && h2 < sink;
    }

    /**
     * d = max(d_old, clamp(solved, 0, 1)): bounds and irreversibility; AT1 also records the solved value in the
     * trial channel; a deep particle, solved without its sink, is taken as its solution less
     * {@link #DEEP_OFFSET} penalised depths, for both. NaN stays NaN so divergence is seen.
     */
    static void accept(Settings settings, MaterialState state, int from, int to, double[] solved) {
        double[] damage = state.channel(DamageModel.DAMAGE);
        boolean at1 = settings.density() == CrackDensity.AT1;
        double[] trial = at1 ? state.channel(TRIAL) : null;
        double[] history = at1 ? state.channel(IsotropicPhaseField.HISTORY) : null;
        double sink = 0.375 * settings.fractureEnergy() / settings.lengthScale();
        for (int p = from; p < to; p++) {
            double s = solved[p - from];
            double old = damage[p];
            if (trial != null) {
                if (deep(trial[p], old, 2.0 * history[p], sink)) {
                    s -= DEEP_OFFSET * AT1_PENALTY_TOLERANCE;
                }
                trial[p] = s;
            }
            double c = s < 0 ? 0 : s > 1 ? 1 : s;
            damage[p] = c >= old || c != c ? c : old;
        }
    }
}

package dev.fray.core.damage;

import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelSpec;

import java.util.List;
import java.util.Optional;

/**
 * A damage model: from the undamaged stress and energy of a body's particles to a damage variable d in [0, 1] and
 * the stress degradation factor g(d). Like material laws, one immutable instance serves all particles of a body
 * and all threads; per-particle state lives in the channels it declares. Every model must declare the channel
 * {@link #DAMAGE} (width 1, dimensionless); writers export it like any other channel.
 *
 * <p>Each step, for each body with damage, the solver (1) asks the law for its tension-compression split of the
 * undamaged stress, (2) calls {@link #update} with it, which updates local state and returns g per particle,
 * (3) uses tau = g tau_degraded + tau_kept in the transfer. Models with a non-local part ({@link #usesPhaseField})
 * also give the coefficients of the screened Poisson problem a d - div(D grad d) = b, which the solver assembles
 * and solves on the active grid nodes, and receive the solution interpolated at their particles.
 */
public interface DamageModel {
    /** Name of the channel every damage model declares: damage d in [0, 1], 0 intact, 1 fully broken. */
    String DAMAGE = "damage";

    /** Number of phase-field coefficients per particle: a, b, then D as xx, yy, zz, xy, xz, yz. */
    int COEFFICIENTS = 8;

    /** @return the model's registry name, e.g. "phase-field-at2" */
    String name();

    /**
     * Adapts the model to the grid it runs on: a model whose length scale defaults from the cell size returns a
     * copy with it filled in, and a model whose length scale is too small for the grid throws, saying why. Called
     * once per body when a simulation is created. Default: returns this.
     *
     * @param cellSize grid cell size dx, m
     * @return the model to use
     * @throws dev.fray.core.error.InvalidInputException if the model cannot be resolved on this grid
     */
    default DamageModel resolvedFor(double cellSize) {
        return this;
    }

    /**
     * The tension-compression split this model asks of the material law; the solver passes it to
     * {@link dev.fray.core.material.MaterialLaw#splitKirchhoffStress(TensionSplit, MaterialState, int, int,
     * double[], double[], double[], double[])}.
     *
     * @return the split; default {@link TensionSplit#LAW_DEFAULT}
     */
    default TensionSplit tensionSplit() {
        return TensionSplit.LAW_DEFAULT;
    }

    /**
     * The strength these settings imply in uniaxial tension, from the model's homogeneous response (published
     * closed forms where they exist), so that a user can compare settings with the stresses a scene applies.
     * Call it on the model {@link #resolvedFor resolved} for the grid: length scales may default from the cell.
     *
     * @param youngsModulus Young's modulus E of the body's material, Pa, &gt; 0
     * @return the strength, or empty when the model cannot tell (the default)
     */
    default Optional<UniaxialStrength> uniaxialStrength(double youngsModulus) {
        return Optional.empty();
    }

    /** @return the channels the model needs, including {@link #DAMAGE} */
    List<ChannelSpec> channels();

    /**
     * Updates the local state and computes the stress degradation of each particle in [from, to).
     *
     * @param state       particle data: F and the model's channels (channels may be written in [from, to))
     * @param from        first particle, inclusive
     * @param to          last particle, exclusive
     * @param dt          time step, s
     * @param tauDegraded undamaged degradable Kirchhoff stress, Pa, 9 per particle at 9(p - from) (input)
     * @param tauKept     undamaged kept Kirchhoff stress, Pa, 9 per particle (input)
     * @param psiDegraded undamaged degradable energy density (crack driving energy), J/m^3, at p - from (input)
     * @param g           (output) degradation factor in [0, 1] at p - from
     */
    void update(MaterialState state, int from, int to, double dt, double[] tauDegraded, double[] tauKept,
                double[] psiDegraded, double[] g);

    /**
     * Degradation factor from the current state alone (no update), for energies and outputs.
     *
     * @param state particle data (input, not modified)
     * @param from  first particle, inclusive
     * @param to    last particle, exclusive
     * @param g     (output) degradation factor at p - from
     */
    void degradation(MaterialState state, int from, int to, double[] g);

    /**
     * Whether this model needs the grid phase-field solve. Tells the truth: the solver skips the solve and the
     * two methods below when false.
     *
     * @return true for non-local (phase-field) models
     */
    default boolean usesPhaseField() {
        return false;
    }

    /**
     * Coefficients of a d - div(D grad d) = b at each particle, integrated over the particle's volume by the
     * solver. Called after {@link #update} in the same step.
     *
     * @param state particle data (input)
     * @param from  first particle, inclusive
     * @param to    last particle, exclusive
     * @param dt    time step, s
     * @param out   (output) {@link #COEFFICIENTS} values per particle at 8(p - from): a (1/m^... model units),
     *              b, and the symmetric D as xx, yy, zz, xy, xz, yz
     */
    default void phaseFieldCoefficients(MaterialState state, int from, int to, double dt, double[] out) {
    }

    /**
     * Receives the solved field interpolated at each particle; the model enforces irreversibility and bounds and
     * writes its {@link #DAMAGE} channel. The solver skips the solve, and this call, in steps where no particle
     * of a phase-field body is damaged yet and every b / a is below a thousandth of the solver tolerance (the
     * field would stay below that everywhere).
     *
     * @param state  particle data; the model's channels may be written in [from, to)
     * @param from   first particle, inclusive
     * @param to     last particle, exclusive
     * @param solved interpolated solution at p - from (input)
     */
    default void acceptPhaseField(MaterialState state, int from, int to, double[] solved) {
    }
}

package dev.fray.damage.plastic;

import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.math.Mat3Ops;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.testing.RandomMatrices;

import java.util.Arrays;
import java.util.Random;

/**
 * One particle under a plastic law, for constitutive checks without a grid: its F, its channels, and the stress
 * invariants of the Kirchhoff stress its law gives.
 */
final class PlasticProbe {
    final MaterialLaw law;
    final double[] f;
    final ArrayMaterialState state;

    /**
     * @param law the law
     * @param f   F, 9 values row-major (kept)
     */
    PlasticProbe(MaterialLaw law, double[] f) {
        this.law = law;
        this.f = f;
        this.state = new ArrayMaterialState(f);
        for (ChannelSpec spec : law.channels()) {
            double[] values = new double[spec.width()];
            Arrays.fill(values, spec.initial());
            state.withChannel(spec.name(), values);
        }
    }

    /**
     * F = Q1 diag(exp e) Q2 with random rotations: a deformation with the given principal logarithmic strains.
     *
     * @param rand source of the rotations
     * @param e0   first principal log strain
     * @param e1   second
     * @param e2   third
     * @return 9 values row-major
     */
    static double[] deformation(Random rand, double e0, double e1, double e2) {
        double[] f = new double[9];
        RandomMatrices.withSingularValues(rand, Math.exp(e0), Math.exp(e1), Math.exp(e2)).store(f, 0);
        return f;
    }

    /** @return the value of the named channel */
    double channel(String name) {
        return state.channel(name)[0];
    }

    /** Sets the named channel. */
    PlasticProbe with(String name, double value) {
        state.channel(name)[0] = value;
        return this;
    }

    /** @return the law's return mapping status for this particle */
    int project() {
        return law.projectDeformation(state, 0, 1);
    }

    /** @return the Kirchhoff stress, Pa, 9 values row-major */
    double[] tau() {
        double[] t = new double[9];
        law.kirchhoffStress(state, 0, 1, t);
        return t;
    }

    /** @return tr tau, Pa */
    double traceTau() {
        double[] t = tau();
        return t[0] + t[4] + t[8];
    }

    /** @return |dev tau|, the Frobenius norm of the deviatoric Kirchhoff stress, Pa */
    double deviatorNorm() {
        double[] t = tau();
        double m = (t[0] + t[4] + t[8]) / 3.0;
        double s = 0;
        for (int k = 0; k < 9; k++) {
            double d = t[k] - (k % 4 == 0 ? m : 0.0);
            s += d * d;
        }
        return Math.sqrt(s);
    }

    /** @return det F */
    double det() {
        return Mat3Ops.det(f, 0);
    }
}

package dev.fray.damage.elastic;

import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.math.Mat3Ops;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.RandomMatrices;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * VALIDATION.md A2: at F = I + eps with |eps| = 1e-6 every elastic law reduces to Hooke's law,
 * P = lambda tr(eps) I + 2 mu sym(eps). Published: linear elasticity as the linearisation of hyperelasticity
 * (Bonet and Wood, Nonlinear Continuum Mechanics for Finite Element Analysis).
 */
class SmallStrainLimitTest extends FrayTestBase {
    /** Frobenius norm of the strain perturbation. */
    private static final double STRAIN = 1e-6;
    /**
     * VALIDATION.md target. The neglected terms are O((lambda / mu) |eps|) relative to the stress: about 1e-6 for
     * nu = 0.3 but 2e-5 for nu = 0.49, where lambda is 16 mu, so the target is kept rather than tightened.
     */
    private static final double HOOKE_RELATIVE = 1e-4;
    /** Random strains per law, parameter set and kind of perturbation. */
    private static final int CASES = 16;

    /** How the small strain enters F. */
    enum Kind {
        /** F = I + eps with eps symmetric. */
        SYMMETRIC,
        /** F = I + eps with eps general: its skew part is an infinitesimal rotation that must give no stress. */
        WITH_INFINITESIMAL_ROTATION,
        /** F = Q (I + eps), eps symmetric, Q a finite rotation that is removed again: compare Q^T P. */
        FINITE_ROTATION_REMOVED
    }

    static Stream<Arguments> cases() {
        double[][] constants = {{1e6, 0.3, 1000}, {2.1e11, 0.29, 7850}, {1e4, -0.5, 50}, {5e7, 0.49, 1100}};
        List<Arguments> out = new ArrayList<>();
        for (String name : Elastic.names()) {
            for (double[] c : constants) {
                for (Kind kind : Kind.values()) {
                    out.add(Arguments.of(name, c[0], c[1], c[2], kind));
                }
            }
        }
        return out.stream();
    }

    @ParameterizedTest(name = "{0}, E = {1} Pa, nu = {2}, {4}")
    @MethodSource("cases")
    void reducesToHookesLaw(String name, double e, double nu, double rho, Kind kind, TestReporter reporter) {
        MaterialLaw law = Elastic.byName(name, e, nu, rho);
        ElasticParameters c = new ElasticParameters(e, nu, rho);
        double mu = c.mu();
        double lambda = c.lambda();
        Random r = new Random(SEED + 31L * kind.ordinal() + name.hashCode() + Double.hashCode(e));
        double[] f = new double[9 * CASES];
        double[][] eps = new double[CASES][];
        double[][] rotations = new double[CASES][];
        for (int i = 0; i < CASES; i++) {
            double[] h = randomStrain(r, kind != Kind.WITH_INFINITESIMAL_ROTATION);
            eps[i] = h;
            double[] fi = {1 + h[0], h[1], h[2], h[3], 1 + h[4], h[5], h[6], h[7], 1 + h[8]};
            if (kind == Kind.FINITE_ROTATION_REMOVED) {
                double[] q = new double[9];
                RandomMatrices.rotation(r).store(q, 0);
                rotations[i] = q;
                double[] qf = new double[9];
                Mat3Ops.mul(q, 0, fi, 0, qf, 0);
                fi = qf;
            }
            System.arraycopy(fi, 0, f, 9 * i, 9);
        }
        double[] p = new double[9 * CASES];
        law.firstPiolaKirchhoff(new ArrayMaterialState(f), 0, CASES, p);

        double worst = 0;
        for (int i = 0; i < CASES; i++) {
            double[] pi = new double[9];
            System.arraycopy(p, 9 * i, pi, 0, 9);
            if (kind == Kind.FINITE_ROTATION_REMOVED) {
                // P(Q F) = Q P(F), so Q^T P recovers the stress of the unrotated strain
                double[] q = rotations[i];
                double[] qt = {q[0], q[3], q[6], q[1], q[4], q[7], q[2], q[5], q[8]};
                double[] back = new double[9];
                Mat3Ops.mul(qt, 0, pi, 0, back, 0);
                pi = back;
            }
            double[] h = eps[i];
            double tr = h[0] + h[4] + h[8];
            double err = 0;
            double ref = 0;
            for (int row = 0; row < 3; row++) {
                for (int col = 0; col < 3; col++) {
                    double sym = 0.5 * (h[3 * row + col] + h[3 * col + row]);
                    double hooke = 2 * mu * sym + (row == col ? lambda * tr : 0.0);
                    double d = pi[3 * row + col] - hooke;
                    err += d * d;
                    ref += hooke * hooke;
                }
            }
            worst = Math.max(worst, Math.sqrt(err / ref));
        }
        reporter.publishEntry("worst relative error against Hooke's law", Double.toString(worst));
        assertTrue(worst < HOOKE_RELATIVE, name + ": worst relative error " + worst);
    }

    /** A random strain of Frobenius norm STRAIN, symmetric or general. */
    private static double[] randomStrain(Random r, boolean symmetric) {
        double[] h = new double[9];
        for (int k = 0; k < 9; k++) {
            h[k] = r.nextGaussian();
        }
        if (symmetric) {
            for (int row = 0; row < 3; row++) {
                for (int col = row + 1; col < 3; col++) {
                    double s = 0.5 * (h[3 * row + col] + h[3 * col + row]);
                    h[3 * row + col] = s;
                    h[3 * col + row] = s;
                }
            }
        }
        double n = 0;
        for (double x : h) {
            n += x * x;
        }
        double scale = STRAIN / Math.sqrt(n);
        for (int k = 0; k < 9; k++) {
            h[k] *= scale;
        }
        return h;
    }
}

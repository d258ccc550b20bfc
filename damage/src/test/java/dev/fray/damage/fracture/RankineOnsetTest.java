package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.math.Mat3;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.RandomMatrices;
import dev.fray.damage.Fracture;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION A7: Rankine onset on uniaxial, biaxial and shear stress paths in random orientations, with a volume
 * change (the criterion is on Cauchy stress tau/J) and with the stress split between degraded and kept parts
 * (the criterion is on their sum). Plus the exponential softening curve and its dissipated energy.
 */
class RankineOnsetTest extends FrayTestBase {
    private static final double SIGMA_C = 2e5;
    private static final double SOFTENING = 5e4;
    /** Load increment as a fraction of sigma_c: the onset is located to within this. */
    private static final double LOAD_STEP = 1e-3;
    /** Tolerance of VALIDATION A7 on the onset stress. */
    private static final double ONSET_TOLERANCE = 0.01;
    private static final double DT = 1e-5;

    /** One particle driven through a Cauchy stress path. */
    private static final class Probe {
        final DamageModel model;
        final double[] f = new double[9];
        final double[] damage = new double[1];
        final double[] history = new double[1];
        final ArrayMaterialState state;
        final double[] tau = new double[9];
        final double[] kept = new double[9];
        final double[] psi = new double[1];
        final double[] g = new double[1];
        final Mat3 q;
        final double j;

        /** Orientation q and volume ratio j of the particle; F = j^(1/3) q (its J is j). */
        Probe(DamageModel model, Mat3 q, double j) {
            this.model = model;
            this.q = q;
            this.j = j;
            double c = Math.cbrt(j);
            double[] qa = new double[9];
            q.store(qa, 0);
            for (int i = 0; i < 9; i++) {
                f[i] = c * qa[i];
            }
            state = new ArrayMaterialState(f).withChannel(DamageModel.DAMAGE, damage)
                    .withChannel(RankineDamage.HISTORY, history);
        }

        /** Applies the Cauchy stress q diag(s1, s2, s3) q^T (plus shear t in the principal 0-1 plane). */
        void load(double s1, double s2, double s3, double t) {
            double[] m = {s1, t, 0, t, s2, 0, 0, 0, s3};
            double[] qa = new double[9];
            q.store(qa, 0);
            for (int r = 0; r < 3; r++) {
                for (int c = 0; c < 3; c++) {
                    double v = 0;
                    for (int a = 0; a < 3; a++) {
                        for (int b = 0; b < 3; b++) {
                            v += qa[3 * r + a] * m[3 * a + b] * qa[3 * c + b];
                        }
                    }
                    // tau = J sigma, split 70/30 between the degraded and the kept part.
                    tau[3 * r + c] = 0.7 * j * v;
                    kept[3 * r + c] = 0.3 * j * v;
                }
            }
            model.update(state, 0, 1, DT, tau, kept, psi, g);
        }
    }

    private static DamageModel model() {
        return Fracture.rankine().criticalStress(SIGMA_C).softeningStress(SOFTENING).build();
    }

    /** Path shapes: principal stresses (1, r2, r3) times the load s, plus a shear t s. */
    private static final double[][] PATHS = {
        {1, 0, 0, 0},      // uniaxial tension
        {1, 0.5, 0, 0},    // biaxial tension
        {1, 1, 0, 0},      // equibiaxial tension, repeated largest principal value
        {1, -0.8, -0.3, 0}, // tension with lateral compression
        {0, 0, 0, 1},      // pure shear: largest principal stress equals the shear stress
    };

    @ParameterizedTest
    @ValueSource(ints = {0, 1, 2, 3, 4})
    void damageStartsAtTheCriticalPrincipalStress(int path) {
        double[] shape = PATHS[path];
        for (int trial = 0; trial < 4; trial++) {
            Probe pr = new Probe(model(), RandomMatrices.rotation(rand), 0.8 + 0.4 * rand.nextDouble());
            double onset = Double.NaN;
            for (int i = 1; i <= 1200; i++) {
                double s = i * LOAD_STEP * SIGMA_C;
                pr.load(shape[0] * s, shape[1] * s, shape[2] * s, shape[3] * s);
                if (pr.damage[0] > 0) {
                    onset = s;
                    break;
                }
                assertEquals(1.0, pr.g[0], 1e-15, "no degradation below the onset, load " + s);
            }
            // published: Rankine maximum principal stress criterion; the largest principal stress is s on every
            // path (for pure shear, the shear stress)
            assertEquals(SIGMA_C, onset, ONSET_TOLERANCE * SIGMA_C, "onset on path " + path + ", trial " + trial);
            assertTrue(onset <= SIGMA_C * (1 + 1.01 * LOAD_STEP), "onset within one load step of sigma_c");
        }
    }

    @Test
    void damageNeverDecreasesOnUnloadingAndReloading() {
        Probe pr = new Probe(model(), RandomMatrices.rotation(rand), 1.1);
        pr.load(1.3 * SIGMA_C, 0.2 * SIGMA_C, 0, 0);
        double d = pr.damage[0];
        assertTrue(d > 0, "damaged");
        double[] path = {1.0, 0.5, 0.0, -1.0, 1.2, 1.29};
        for (double fraction : path) {
            pr.load(fraction * SIGMA_C, 0, 0, 0);
            // common practice, no source: damage is irreversible, and below the largest stress reached it stays
            assertEquals(d, pr.damage[0], 0.0, "damage after loading to " + fraction + " sigma_c");
        }
        pr.load(1.5 * SIGMA_C, 0, 0, 0);
        assertTrue(pr.damage[0] > d, "damage grows again past the largest stress reached");
    }

    @Test
    void uniaxialSofteningFollowsTheExponentialCurveForBothDegradations() {
        double youngs = 1e9;
        for (RankineDamage.Degradation deg : RankineDamage.Degradation.values()) {
            DamageModel m = Fracture.rankine().criticalStress(SIGMA_C).softeningStress(SOFTENING).degradation(deg)
                    .residualStiffness(0).build();
            Probe pr = new Probe(m, new Mat3().setIdentity(), 1.0);
            for (int i = 1; i <= 400; i++) {
                double eps = i * 1e-6;
                double undamaged = youngs * eps;
                pr.load(undamaged, 0, 0, 0);
                double sigma = pr.g[0] * undamaged;
                // published: exponential softening, Peerlings et al., IJNME 39 (1996) (alpha = 1); Oliver,
                // IJNME 39 (1996): sigma = sigma_c exp(-(E eps - sigma_c)/s) after onset
                double expected = undamaged <= SIGMA_C ? undamaged
                        : SIGMA_C * Math.exp(-(undamaged - SIGMA_C) / SOFTENING);
                assertEquals(expected, sigma, 1e-9 * SIGMA_C, deg + " stress at eps = " + eps);
            }
        }
    }

    @Test
    void fractureEnergyOverTheBandIsDissipated() {
        double youngs = 1e9;
        double gf = 20;
        double band = 0.01;
        DamageModel m = Fracture.rankine().criticalStress(SIGMA_C).fractureEnergy(gf, youngs).bandWidth(band)
                .residualStiffness(0).build();
        Probe pr = new Probe(m, new Mat3().setIdentity(), 1.0);
        // Trapezoidal integral of the uniaxial stress over strain, far into the tail.
        double s = ((RankineDamage) m).softeningStress();
        double epsEnd = (SIGMA_C + 60 * s) / youngs;
        int n = 400000;
        double de = epsEnd / n;
        double work = 0;
        double prev = 0;
        for (int i = 1; i <= n; i++) {
            double eps = i * de;
            pr.load(youngs * eps, 0, 0, 0);
            double sigma = pr.g[0] * youngs * eps;
            work += 0.5 * (prev + sigma) * de;
            prev = sigma;
        }
        // published: crack band model, Bazant and Oh, Mater. Struct. 16 (1983): Gf = h * dissipated energy density
        assertEquals(gf, band * work, 1e-3 * gf, "fracture energy dissipated over the band");
    }

    @Test
    void viscosityDelaysDamageGrowth() {
        double tau = 1e-3;
        DamageModel m = Fracture.rankine().criticalStress(SIGMA_C).softeningStress(SOFTENING).viscosity(tau).build();
        Probe pr = new Probe(m, new Mat3().setIdentity(), 1.0);
        double load = 1.2 * SIGMA_C;
        double target = ((RankineDamage) m).targetDamage(load);
        pr.load(load, 0, 0, 0);
        // common practice, no source: exact solution of d_dot = (d* - d)/tau over one step from d = 0
        assertEquals(target * (1 - Math.exp(-DT / tau)), pr.damage[0], 1e-12, "first step");
        double previous = pr.damage[0];
        for (int i = 0; i < 2000; i++) {
            pr.load(load, 0, 0, 0);
            assertTrue(pr.damage[0] >= previous, "monotone");
            previous = pr.damage[0];
        }
        assertEquals(target, pr.damage[0], 1e-6, "relaxes to the rate-independent damage");
    }
}

package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Fracture;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION A6: the local part of the AT2 model in 1D uniaxial stress. The energy density psi = E eps^2/2 is fed
 * to the model as its crack driving energy; the homogeneous damage comes from the model's own grid coefficients at
 * zero gradient (d = b/a with eta = 0), and the stress is g(d) E eps with the model's own degradation.
 */
class AT2HomogeneousTest extends FrayTestBase {
    private static final double E = 1e6;
    private static final double GC = 10;
    private static final double L = 0.01;
    private static final double DT = 1e-4;
    /** Tolerance of VALIDATION A6 on the peak stress and strain. */
    private static final double PEAK_TOLERANCE = 0.01;
    /** Rounding of the worked example, which is quoted to four significant digits. */
    private static final double WORKED_EXAMPLE_ROUNDING = 5e-4;
    /** The homogeneous formula and d = b/a are the same expression; only rounding separates them. */
    private static final double ROUNDING = 1e-12;

    /** Model and per-particle state for n homogeneous samples. */
    private static final class Samples {
        final int n;
        final DamageModel model;
        final ArrayMaterialState state;
        final double[] damage;
        final double[] history;
        final double[] tau;
        final double[] kept;
        final double[] psi;
        final double[] g;
        final double[] coef;

        Samples(DamageModel model, int n) {
            this.n = n;
            this.model = model;
            double[] f = new double[9 * n];
            for (int p = 0; p < n; p++) {
                // The isotropic model reads only energies, so F only has to be a valid deformation.
                f[9 * p] = 1;
                f[9 * p + 4] = 1;
                f[9 * p + 8] = 1;
            }
            damage = new double[n];
            history = new double[n];
            state = new ArrayMaterialState(f).withChannel(DamageModel.DAMAGE, damage)
                    .withChannel(PhaseFieldAT2.HISTORY, history);
            tau = new double[9 * n];
            kept = new double[9 * n];
            psi = new double[n];
            g = new double[n];
            coef = new double[DamageModel.COEFFICIENTS * n];
        }

        /** One step at the given strains: update, coefficients, homogeneous solve d = b/a, acceptance. */
        void step(double[] strain) {
            for (int p = 0; p < n; p++) {
                double eps = strain[p];
                psi[p] = 0.5 * E * eps * eps;
                tau[9 * p] = E * eps; // uniaxial stress; not read by the energy-driven model
            }
            model.update(state, 0, n, DT, tau, kept, psi, g);
            model.phaseFieldCoefficients(state, 0, n, DT, coef);
            double[] solved = new double[n];
            for (int p = 0; p < n; p++) {
                solved[p] = coef[DamageModel.COEFFICIENTS * p + 1] / coef[DamageModel.COEFFICIENTS * p];
            }
            model.acceptPhaseField(state, 0, n, solved);
            model.degradation(state, 0, n, g);
        }
    }

    private static DamageModel model() {
        return Fracture.phaseField().fractureEnergy(GC).lengthScale(L).residualStiffness(0).build();
    }

    @Test
    void homogeneousDamageFromTheCoefficientsIsPsiOverPsiPlusGcOverTwoL() {
        int n = 200;
        Samples s = new Samples(model(), n);
        double[] strain = new double[n];
        for (int p = 0; p < n; p++) {
            strain[p] = 0.1 * p / (n - 1);
        }
        s.step(strain);
        for (int p = 0; p < n; p++) {
            double psi = 0.5 * E * strain[p] * strain[p];
            // published: Bourdin, Francfort and Marigo, J. Elasticity 91 (2008); Borden et al., CMAME 217-220 (2012)
            double expected = psi / (psi + GC / (2 * L));
            assertEquals(expected, s.damage[p], ROUNDING * Math.max(expected, 1e-300), "d at eps = " + strain[p]);
            assertEquals(psi, s.history[p], ROUNDING * psi, "history H = psi at eps = " + strain[p]);
            double u = 1 - expected;
            assertEquals(u * u, s.g[p], ROUNDING, "g = (1 - d)^2 at eps = " + strain[p]);
        }
    }

    @Test
    void stressStrainCurvePeaksAtTheAnalyticCriticalStressAndStrain() {
        // Monotonic loading in one batch: sample p carries strain p * de, each sample loaded in one step, which
        // for eta = 0 and a history that only grows is the same as loading it gradually.
        int n = 20001;
        double de = 0.06 / (n - 1);
        Samples s = new Samples(model(), n);
        double[] strain = new double[n];
        for (int p = 0; p < n; p++) {
            strain[p] = p * de;
        }
        s.step(strain);
        int best = 0;
        double[] sigma = new double[n];
        for (int p = 0; p < n; p++) {
            sigma[p] = s.g[p] * E * strain[p];
            if (sigma[p] > sigma[best]) {
                best = p;
            }
        }
        assertTrue(best > 0 && best < n - 1, "peak inside the sampled range");
        // Parabola through the three samples around the maximum.
        double y0 = sigma[best - 1], y1 = sigma[best], y2 = sigma[best + 1];
        double shift = 0.5 * (y0 - y2) / (y0 - 2 * y1 + y2);
        double epsPeak = strain[best] + shift * de;
        double sigmaPeak = y1 - 0.25 * (y0 - y2) * shift;
        // published: Bourdin, Francfort and Marigo, J. Elasticity 91 (2008); Borden et al., CMAME 217-220 (2012)
        double sigmaC = 9.0 / 16.0 * Math.sqrt(E * GC / (3 * L));
        double epsC = Math.sqrt(GC / (3 * E * L));
        assertEquals(sigmaC, sigmaPeak, PEAK_TOLERANCE * sigmaC, "peak stress");
        assertEquals(epsC, epsPeak, PEAK_TOLERANCE * epsC, "strain at the peak");
        // published worked example (VALIDATION A6): 10.27 kPa at 0.01826 for E = 1e6 Pa, Gc = 10 J/m^2, l = 0.01 m
        assertEquals(10.27e3, sigmaPeak, WORKED_EXAMPLE_ROUNDING * 10.27e3, "worked example peak stress");
        assertEquals(0.01826, epsPeak, WORKED_EXAMPLE_ROUNDING * 0.01826, "worked example peak strain");
    }

    @Test
    void unloadingKeepsHistoryAndDamage() {
        Samples s = new Samples(model(), 1);
        s.step(new double[] {0.04});
        double d = s.damage[0];
        double h = s.history[0];
        assertTrue(d > 0.5, "damaged past the peak");
        for (double eps : new double[] {0.02, 0.0, -0.01, 0.035}) {
            s.step(new double[] {eps});
            // published: history field of Miehe, Hofacker and Welschinger, CMAME 199 (2010): H = max psi
            assertEquals(h, s.history[0], 0.0, "history after going to eps = " + eps);
            assertEquals(d, s.damage[0], 0.0, "damage after going to eps = " + eps);
        }
    }

    @Test
    void viscosityDelaysDamageTowardsTheRateIndependentValue() {
        double eta = 50;
        DamageModel viscous = Fracture.phaseField().fractureEnergy(GC).lengthScale(L).viscosity(eta)
                .residualStiffness(0).build();
        Samples s = new Samples(viscous, 1);
        double eps = 0.03;
        double psi = 0.5 * E * eps * eps;
        double rateIndependent = psi / (psi + GC / (2 * L));
        double previous = 0;
        s.step(new double[] {eps});
        // published: backward Euler of eta d_dot = 2 (1 - d) H - (Gc/l) d, Miehe, Welschinger and Hofacker,
        // IJNME 83 (2010): d1 = (2H + (eta/dt) d0)/(Gc/l + 2H + eta/dt) with d0 = 0
        double first = 2 * psi / (GC / L + 2 * psi + eta / DT);
        assertEquals(first, s.damage[0], ROUNDING * first, "first viscous step");
        for (int i = 0; i < 20000 && s.damage[0] < rateIndependent * (1 - 1e-9); i++) {
            assertTrue(s.damage[0] >= previous, "damage never decreases");
            previous = s.damage[0];
            s.step(new double[] {eps});
        }
        // common practice, no source: the viscous solution relaxes to the rate-independent one at constant load
        assertEquals(rateIndependent, s.damage[0], 1e-6, "relaxed damage");
    }
}

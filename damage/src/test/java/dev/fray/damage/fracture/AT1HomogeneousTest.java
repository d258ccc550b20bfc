package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.damage.UniaxialStrength;
import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Fracture;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION E21 (homogeneous part): the local response of the AT1 model in 1D uniaxial stress. A particle is
 * loaded in small strain increments, one step each, as the solver would: the energy psi = E eps^2/2 goes to the
 * model as its crack driving energy, the homogeneous grid problem is solved from the model's own coefficients at
 * zero gradient (d = b/a, eta = 0), and the result goes back through the model's acceptance with its bounds. The
 * stress is g(d) E eps with the model's own degradation.
 *
 * <p>Published (Pham, Amor, Marigo and Maurini, Int. J. Damage Mech. 20, 2011; Tanne et al., J. Mech. Phys.
 * Solids 110, 2018): no damage below sigma_c = sqrt(3 E Gc/(8 l)), reached at eps_c = sigma_c/E, which is also
 * the peak; above it d = 1 - (eps_c/eps)^2.
 */
class AT1HomogeneousTest extends FrayTestBase {
    private static final double E = 1e6;
    private static final double GC = 10;
    private static final double L = 0.01;
    private static final double DT = 1e-4;
    /** Tolerance of VALIDATION E21 on the peak stress and strain. */
    private static final double PEAK_TOLERANCE = 0.01;
    /** The closed form and the model's b/a are the same expression; only rounding separates them. */
    private static final double ROUNDING = 1e-12;
    /** sigma_c = sqrt(3 E Gc / (8 l)) for the values above, Pa (computed by hand: sqrt(3.75e8)). */
    private static final double SIGMA_C = 19364.916731037084;

    /** One particle and its state. */
    private static final class Bar {
        final DamageModel model;
        final double[] damage = new double[1];
        final double[] history = new double[1];
        final double[] trial = {-1};
        final ArrayMaterialState state;
        final double[] coef = new double[DamageModel.COEFFICIENTS];
        final double[] g = new double[1];

        Bar(DamageModel model) {
            this.model = model;
            state = new ArrayMaterialState(new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1})
                    .withChannel(DamageModel.DAMAGE, damage).withChannel(PhaseFieldAT2.HISTORY, history)
                    .withChannel(PhaseFieldSupport.TRIAL, trial);
        }

        /** One step at strain eps; returns the stress g(d) E eps after it, Pa. */
        double step(double eps) {
            double[] tau = new double[9];
            tau[0] = E * eps;
            model.update(state, 0, 1, DT, tau, new double[9], new double[] {0.5 * E * eps * eps}, g);
            model.phaseFieldCoefficients(state, 0, 1, DT, coef);
            model.acceptPhaseField(state, 0, 1, new double[] {coef[1] / coef[0]});
            model.degradation(state, 0, 1, g);
            return g[0] * E * eps;
        }
    }

    private static DamageModel model() {
        return Fracture.phaseFieldAT1().fractureEnergy(GC).lengthScale(L).residualStiffness(0).build();
    }

    @Test
    void noDamageBelowTheCriticalStressThenTheClosedForm() {
        Bar bar = new Bar(model());
        double epsC = SIGMA_C / E;
        int n = 2000;
        for (int i = 1; i <= n; i++) {
            double eps = 0.999 * epsC * i / n;
            bar.step(eps);
            // published: Pham et al. (2011): elastic stage up to sigma_c = sqrt(3 E Gc/(8 l))
            assertEquals(0.0, bar.damage[0], 0.0, "no damage at eps = " + eps);
        }
        for (int i = 1; i <= n; i++) {
            double eps = epsC * (1 + 2.0 * i / n);
            bar.step(eps);
            if (i > 1) {
                // published: Pham et al. (2011): homogeneous damage d = 1 - (eps_c/eps)^2 past the peak
                double expected = 1 - epsC * epsC / (eps * eps);
                assertEquals(expected, bar.damage[0], ROUNDING, "d at eps = " + eps);
            }
        }
    }

    @Test
    void stressPeaksAtTheAnalyticCriticalStress() {
        Bar bar = new Bar(model());
        double epsC = SIGMA_C / E;
        int n = 6000;
        double peak = 0;
        double epsPeak = 0;
        for (int i = 1; i <= n; i++) {
            double eps = 3 * epsC * i / n;
            double sigma = bar.step(eps);
            if (sigma > peak) {
                peak = sigma;
                epsPeak = eps;
            }
        }
        // published: Pham et al. (2011), Tanne et al. (2018): peak sigma_c = sqrt(3 E Gc/(8 l)) at eps_c
        assertEquals(SIGMA_C, peak, PEAK_TOLERANCE * SIGMA_C, "peak stress");
        assertEquals(epsC, epsPeak, PEAK_TOLERANCE * epsC, "strain at the peak");
        assertTrue(bar.step(3 * epsC) < 0.2 * SIGMA_C, "softened at three times the critical strain");
    }

    @Test
    void unloadingKeepsHistoryAndDamage() {
        Bar bar = new Bar(model());
        double eps = 2 * SIGMA_C / E;
        for (int i = 1; i <= 100; i++) {
            bar.step(eps * i / 100);
        }
        double d = bar.damage[0];
        assertEquals(0.75, d, ROUNDING, "1 - (1/2)^2 at twice the critical strain");
        for (double e : new double[] {eps / 2, 0, -eps, 0.9 * eps}) {
            bar.step(e);
            // published: history field of Miehe, Hofacker and Welschinger, CMAME 199 (2010): H = max psi
            assertEquals(d, bar.damage[0], 0.0, "damage after going to eps = " + e);
        }
    }

    @Test
    void strengthIsReportedAndCanBeChosen() {
        UniaxialStrength s = model().uniaxialStrength(E).orElseThrow();
        // published: Pham et al. (2011): onset = peak = sqrt(3 E Gc/(8 l)), eps_c = sigma_c/E
        assertEquals(SIGMA_C, s.peakStress(), ROUNDING * SIGMA_C);
        assertEquals(SIGMA_C, s.onsetStress(), ROUNDING * SIGMA_C);
        assertEquals(SIGMA_C / E, s.peakStrain(), ROUNDING * SIGMA_C / E);
        PhaseFieldAT1 chosen = (PhaseFieldAT1) Fracture.phaseFieldAT1().strength(SIGMA_C, E).lengthScale(L).build();
        assertEquals(GC, chosen.fractureEnergy(), ROUNDING * GC, "the strength shortcut inverts sigma_c(Gc)");
        // With the length scale left to the grid, the fracture energy follows the resolved length scale.
        DamageModel later = Fracture.phaseFieldAT1().strength(SIGMA_C, E).build();
        assertTrue(later.uniaxialStrength(E).isEmpty(), "unknown before the grid is known");
        PhaseFieldAT1 resolved = (PhaseFieldAT1) later.resolvedFor(L / 2);
        assertEquals(GC, resolved.fractureEnergy(), ROUNDING * GC, "Gc at l = 2 dx = " + L);
        assertEquals(SIGMA_C, resolved.uniaxialStrength(E).orElseThrow().peakStress(), ROUNDING * SIGMA_C);
        // AT2 the same way: published peak (9/16) sqrt(E Gc/(3 l)) (Bourdin, Francfort and Marigo 2008)
        double at2 = 9.0 / 16.0 * Math.sqrt(E * GC / (3 * L));
        PhaseFieldAT2 at2Chosen = (PhaseFieldAT2) Fracture.phaseField().strength(at2, E).lengthScale(L).build();
        assertEquals(GC, at2Chosen.fractureEnergy(), ROUNDING * GC, "AT2 strength shortcut");
        assertEquals(0.0, at2Chosen.uniaxialStrength(E).orElseThrow().onsetStress(), 0.0, "AT2 has no elastic stage");
    }
}

package dev.fray.damage.behaviour;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import org.junit.jupiter.api.Test;

/**
 * Damage must not make energy: with no gravity, kinetic plus (degraded) elastic energy never rises above its
 * initial value plus the work the boundaries did, checked after every step of a run that tears an edge-notched
 * strip apart (Neo-Hookean, E = 1e5 Pa, nu = 0.3, rho = 1000 kg/m^3; AT2 phase field, Gc = 5 J/m^2), at the
 * default Courant number. Energy balance of a mechanical system: E(t) &lt;= E(0) + W(t), with equality only without
 * dissipation; the explicit transfers and the crack both dissipate (common practice, no source).
 */
class EnergyBoundTest extends FrayTestBase {
    /** Allowed excess relative to the largest energy seen: roundoff. */
    private static final double ROUNDOFF = 1e-6;

    /**
     * @return the largest (E - E0 - W) / (largest of E and |W| seen so far) over every step of the run, and 1 if the
     *         strip tore (else 0)
     */
    static double[] worstExcess(Strip strip, int steps) {
        try (Simulation sim = new Simulation(strip.scene())) {
            Diagnostics d = sim.diagnostics();
            double e0 = d.kineticEnergy() + d.elasticEnergy();
            double largest = e0;
            double worst = Double.NEGATIVE_INFINITY;
            for (int i = 0; i < steps; i++) {
                sim.step();
                d = sim.diagnostics();
                double e = d.kineticEnergy() + d.elasticEnergy();
                largest = Math.max(largest, Math.max(e, Math.abs(d.boundaryWork())));
                worst = Math.max(worst, (e - e0 - d.boundaryWork()) / largest);
            }
            double torn = strip.front(sim.particles()) >= strip.left() + 0.95 * strip.widthMetres() ? 1 : 0;
            return new double[] {worst, torn};
        }
    }

    @Test
    void stripFlyingApartGainsNoEnergy() {
        // No grips: the strip starts stretching at 0.4 m/s per end and tears under its own inertia, so W = 0.
        Strip strip = new Strip(Elastic.neoHookean(1e5, 0.3, 1000), Fracture.phaseField().fractureEnergy(5).build())
                .notch(6).pull(0.4).free();
        double[] r = worstExcess(strip, 120);
        assertTrue(r[1] > 0, "the strip must tear for the check to mean anything");
        assertTrue(r[0] <= ROUNDOFF, "energy rose above the start by " + r[0] + " of the largest energy");
    }

    /**
     * The grips pull the strip apart until it tears; W is the solver's boundary work (impulse on each gripped node
     * times the velocity the grip imposes).
     */
    @Test
    void grippedTearStaysWithinBoundaryWork() {
        Strip strip = new Strip(Elastic.neoHookean(1e5, 0.3, 1000), Fracture.phaseField().fractureEnergy(5).build())
                .notch(6).pull(0.1);
        double[] r = worstExcess(strip, 160);
        assertTrue(r[1] > 0, "the strip must tear for the check to mean anything");
        assertTrue(r[0] <= ROUNDOFF, "energy rose above the start plus the boundary work by " + r[0]
                + " of the largest energy");
    }
}

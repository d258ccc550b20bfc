package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION E21 (profile part): the damage profile of a fully developed crack in a bar, on the grid at
 * l = 2 dx, with the shipped models' own coefficients. A bar along x at rest (no gravity, tiny fixed steps) has a
 * crack plane at x = x0: the particles within half a cell of it start with a history (driving energy) of 1e4 Gc/l,
 * which drives their damage to 1, and every other particle has none. The simulation runs a few dozen steps, so
 * that AT1's bound (whose active set is updated once per step) settles, and the profile d(s), s = |x - x0|, is
 * compared with the published closed forms (Pham, Amor, Marigo and Maurini, Int. J. Damage Mech. 20, 2011; Tanne
 * et al., J. Mech. Phys. Solids 110, 2018):
 * <ul>
 *   <li>AT1: d = (1 - s/(2l))^2 for s &lt;= 2 l and 0 beyond (compact support); the half-width W is fitted from
 *   the slope of the straight line sqrt(d) = 1 - (s - s0)/W over 0.05 &lt; d &lt; 0.7, and must be 2 l;</li>
 *   <li>AT2: d = exp(-s/l), with l fitted from the slope of ln d.</li>
 * </ul>
 * On the grid the crack is not a plane but a broken core: the driven particles span a cell and the B-splines
 * spread them over a few more nodes, so both fits use the slope only (as VALIDATION B15 does) and the AT1 offset
 * s0 is checked to be at most a cell. Tolerance 10% (VALIDATION E21).
 */
class CrackProfileTest extends FrayTestBase {
    private static final double DX = 0.01;
    private static final double L = 2 * DX;
    private static final double GC = 1.0;
    private static final double PLANE_X = 0.3;
    /** VALIDATION E21 tolerance. */
    private static final double PROFILE_TOLERANCE = 0.10;
    private static final int STEPS = 40;

    /** @return (s, d) of every particle on the far side of the plane's own cells, after the steps */
    private static List<double[]> profile(DamageModel model) {
        Body body = Body.named("bar").shape(Shapes.box(0.1, 0.1, 0.1, 0.5, 0.14, 0.14))
                .material(Elastic.neoHookean(1e9, 0.3, 1000)).damage(model)
                .initialChannel(PhaseFieldAT2.HISTORY,
                        (x, y, z, out) -> out[0] = Math.abs(x - PLANE_X) < 0.5 * DX ? 1e4 * GC / L : 0)
                .build();
        Scene scene = Scene.builder().domain(0, 0, 0, 0.6, 0.24, 0.24).cellSize(DX).gravity(0, 0, 0)
                .fixedTimeStep(1e-8).threads(2).phaseFieldSolver(1e-12, 20000).add(body).build();
        List<double[]> pts = new ArrayList<>();
        try (Simulation sim = new Simulation(scene)) {
            for (int i = 0; i < STEPS; i++) {
                sim.step();
            }
            ParticleView v = sim.particles();
            for (int p = 0; p < v.size(); p++) {
                double s = Math.abs(v.get(ParticleStore.POSITION, p, 0) - PLANE_X);
                pts.add(new double[] {s, v.get(DamageModel.DAMAGE, p, 0)});
            }
        }
        return pts;
    }

    @Test
    void at1BandHasHalfWidthTwoLengthScalesAndCompactSupport() {
        List<double[]> pts = profile(Fracture.phaseFieldAT1().fractureEnergy(GC).lengthScale(L).build());
        List<double[]> fit = new ArrayList<>();
        for (double[] q : pts) {
            if (q[1] > 0.05 && q[1] < 0.7) {
                fit.add(new double[] {q[0], Math.sqrt(q[1])});
            }
        }
        assertTrue(fit.size() > 20, "enough particles in the fit range: " + fit.size());
        // sqrt(d) = 1 - (s - s0)/W: W the half-width, s0 the half-thickness of the broken core on the grid.
        double[] line = LineFit.of(fit);
        double halfWidth = -1 / line[1];
        double core = (line[0] - 1) * halfWidth;
        // published: Pham et al. (2011), Tanne et al. (2018): AT1 profile (1 - |x|/(2l))^2, support |x| <= 2 l
        assertEquals(2 * L, halfWidth, PROFILE_TOLERANCE * 2 * L, "AT1 half-width");
        assertTrue(core >= 0 && core <= DX, "the broken core is at most a cell thick on each side: " + core);
        double beyond = 0;
        for (double[] q : pts) {
            if (q[0] > core + (1 + PROFILE_TOLERANCE) * 2 * L) {
                beyond = Math.max(beyond, q[1]);
            }
        }
        assertEquals(0.0, beyond, 0.0, "AT1: no damage at all beyond 1.1 x 2 l from the core");
    }

    @Test
    void at2ProfileDecaysOverTheLengthScaleWithoutCompactSupport() {
        List<double[]> pts = profile(Fracture.phaseField().fractureEnergy(GC).lengthScale(L).build());
        List<double[]> fit = new ArrayList<>();
        double beyond = 0;
        for (double[] q : pts) {
            // Past the plane's stencil, and at least three decay lengths from the bar's ends.
            if (q[0] > 1.5 * DX && q[0] < 0.2 - 3 * L) {
                fit.add(new double[] {q[0], Math.log(q[1])});
            }
            if (q[0] > (1 + PROFILE_TOLERANCE) * 2 * L) {
                beyond = Math.max(beyond, q[1]);
            }
        }
        double[] line = LineFit.of(fit);
        // published: Miehe, Hofacker and Welschinger (2010); Tanne et al. (2018): AT2 profile exp(-|x|/l)
        assertEquals(L, -1 / line[1], PROFILE_TOLERANCE * L, "AT2 decay length");
        assertTrue(beyond > 0.05, "AT2 damages beyond 2 l (exp(-2.2) = 0.11): " + beyond);
    }
}

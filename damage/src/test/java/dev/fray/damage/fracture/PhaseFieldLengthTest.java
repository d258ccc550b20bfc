package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.MaterialState;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import dev.fray.damage.fiber.FiberChannels;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * VALIDATION B15: the phase-field length scale on the grid. A real simulation of a resting slab solves, once,
 * a d - div(D grad d) = b with the coefficients of the shipped models at H = 0 (a = Gc/l, b = 0, D = Gc l A), that
 * is d - l^2 div(A grad d) = 0, except that a test-only wrapper pins d = 1 on the particles within half a cell of
 * a plane x = x0 by a penalty. Away from the plane and from the far end the profile is d = C exp(-s/l_eff); l_eff
 * is fitted from the slope of ln d over s.
 *
 * <p>Expected: l_eff = l for A = I (published: Miehe, Hofacker and Welschinger, CMAME 199, 2010); for
 * A = I + alpha a (x) a, l_eff = l sqrt(1 + alpha) along a and l across it. The anisotropic lengths follow from
 * the same equation: for d depending on s = n . x only, div(A grad d) = (n . A n) d'', so l_eff = l sqrt(n . A n).
 */
class PhaseFieldLengthTest extends FrayTestBase {
    private static final double DX = 0.01;
    /** VALIDATION B15 tolerance for l &gt;= 2 dx. */
    private static final double LENGTH_TOLERANCE = 0.03;
    private static final double GC = 1.0;
    /** Penalty of the pinned particles relative to Gc/l: large enough to hold d near 1, small enough for CG. */
    private static final double PENALTY = 1e4;
    private static final double SLAB_MIN_X = 0.1;
    private static final double SLAB_MAX_X = 0.5;
    private static final double PLANE_X = 0.12;
    private static final String PIN = "pin";

    /**
     * Test-only model: the wrapped model's coefficients, except a = b = penalty on pinned particles, which holds
     * d = 1 there.
     */
    private static final class PinnedPlane implements DamageModel {
        private final DamageModel inner;

        PinnedPlane(DamageModel inner) {
            this.inner = inner;
        }

        @Override
        public String name() {
            return "pinned-" + inner.name();
        }

        @Override
        public DamageModel resolvedFor(double cellSize) {
            return new PinnedPlane(inner.resolvedFor(cellSize));
        }

        @Override
        public List<ChannelSpec> channels() {
            List<ChannelSpec> c = new ArrayList<>(inner.channels());
            c.add(ChannelSpec.of(PIN, 1, "1"));
            return c;
        }

        @Override
        public void update(MaterialState state, int from, int to, double dt, double[] tauDegraded,
                           double[] tauKept, double[] psiDegraded, double[] g) {
            inner.update(state, from, to, dt, tauDegraded, tauKept, psiDegraded, g);
        }

        @Override
        public void degradation(MaterialState state, int from, int to, double[] g) {
            inner.degradation(state, from, to, g);
        }

        @Override
        public boolean usesPhaseField() {
            return true;
        }

        @Override
        public void phaseFieldCoefficients(MaterialState state, int from, int to, double dt, double[] out) {
            inner.phaseFieldCoefficients(state, from, to, dt, out);
            double[] pin = state.channel(PIN);
            for (int p = from; p < to; p++) {
                int o = COEFFICIENTS * (p - from);
                if (pin[p] > 0) {
                    double a = PENALTY * out[o];
                    out[o] = a;
                    out[o + 1] = a;
                }
            }
        }

        @Override
        public void acceptPhaseField(MaterialState state, int from, int to, double[] solved) {
            inner.acceptPhaseField(state, from, to, solved);
        }
    }

    /**
     * Solves once and fits l_eff.
     *
     * @param model  the shipped model whose coefficients are used
     * @param fiber  reference fiber direction of family 1, or null for none
     * @param expect the expected l_eff, m, which sets the fit range
     * @return fitted l_eff, m
     */
    private static double fittedLength(DamageModel model, double[] fiber, double expect) {
        Body.Builder body = Body.named("slab").shape(Shapes.box(SLAB_MIN_X, 0.1, 0.1, SLAB_MAX_X, 0.14, 0.14))
                .material(Elastic.neoHookean(1e9, 0.3, 1000)).damage(new PinnedPlane(model))
                .initialChannel(PIN, (x, y, z, out) -> out[0] = Math.abs(x - PLANE_X) < 0.5 * DX ? 1 : 0);
        if (fiber != null) {
            body.initialChannel(FiberChannels.reference(1), (x, y, z, out) -> {
                out[0] = fiber[0];
                out[1] = fiber[1];
                out[2] = fiber[2];
            });
        }
        Scene scene = Scene.builder().domain(0, 0, 0, 0.6, 0.24, 0.24).cellSize(DX).gravity(0, 0, 0)
                .fixedTimeStep(1e-7).threads(2).phaseFieldSolver(1e-12, 20000).add(body.build()).build();
        try (Simulation sim = new Simulation(scene)) {
            sim.step();
            ParticleView v = sim.particles();
            // Fit range: past the pinned band (whose stencil reaches 1.5 cells from the plane) and at least three
            // decay lengths from the free far end, where the profile bends into cosh((L - s)/l_eff).
            double sMin = 3 * DX;
            double sMax = Math.min(sMin + 5 * expect, SLAB_MAX_X - PLANE_X - 3 * expect);
            List<double[]> pts = new ArrayList<>();
            for (int p = 0; p < v.size(); p++) {
                double s = v.get(ParticleStore.POSITION, p, 0) - PLANE_X;
                if (s >= sMin && s <= sMax) {
                    pts.add(new double[] {s, Math.log(v.get(DamageModel.DAMAGE, p, 0))});
                }
            }
            double slope = LineFit.of(pts)[1];
            return -1.0 / slope;
        }
    }

    private static DamageModel at2(double l) {
        return Fracture.phaseField().fractureEnergy(GC).lengthScale(l).build();
    }

    private static DamageModel anisotropic(double l, double alpha) {
        return Fracture.anisotropicPhaseField().fractureEnergy(GC).lengthScale(l).fiberStrengths(alpha).build();
    }

    @Test
    void isotropicProfileDecaysOverTheLengthScale() {
        for (double cells : new double[] {2, 2.5, 3}) {
            double l = cells * DX;
            double got = fittedLength(at2(l), null, l);
            double tol = LENGTH_TOLERANCE;
            // published: Miehe, Hofacker and Welschinger, CMAME 199 (2010): d = exp(-|s|/l)
            assertEquals(l, got, tol * l, "isotropic l_eff at l = " + cells + " dx");
        }
    }

    @Test
    void anisotropicProfileIsLongerAlongTheFibers() {
        double l = 2 * DX;
        double alpha = 3;
        double along = fittedLength(anisotropic(l, alpha), new double[] {1, 0, 0}, l * Math.sqrt(1 + alpha));
        // published: Miehe et al. (2010) equation with A = I + alpha a (x) a: l_eff = l sqrt(n . A n)
        assertEquals(l * Math.sqrt(1 + alpha), along, LENGTH_TOLERANCE * l * Math.sqrt(1 + alpha),
                "l_eff along the fibers");
        double across = fittedLength(anisotropic(l, alpha), new double[] {0, 1, 0}, l);
        assertEquals(l, across, LENGTH_TOLERANCE * l, "l_eff across the fibers (l = 2 dx)");
        double wider = fittedLength(anisotropic(1.5 * l, alpha), new double[] {0, 0, 1}, 1.5 * l);
        assertEquals(1.5 * l, wider, LENGTH_TOLERANCE * 1.5 * l, "l_eff across the fibers (l = 3 dx)");
    }
}

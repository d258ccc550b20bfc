package dev.fray.io.result;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;
import dev.fray.damage.fracture.CrackDensity;
import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.api.Test;

/**
 * The crack-band figure on particles whose damage is set to the closed-form profile of a planar crack: the
 * measured width must be the closed-form band width (AT1 4 l (sqrt(0.95) - sqrt(0.05)), AT2 2 l ln 19; published
 * profiles of Pham, Amor, Marigo and Maurini, Int. J. Damage Mech. 20, 2011, and Tanne et al., J. Mech. Phys.
 * Solids 110, 2018), and the crack area the plane's cross-section of the body (geometry), for planes at random
 * orientations to the grid (seeded). No step is run: the particles are as sampled (about 8 per cell, jittered).
 */
class CrackBandTest extends FrayTestBase {
    private static final double DX = 0.01;
    private static final double L = 2 * DX;
    private static final double LX = 0.4;
    private static final double LY = 0.4;
    private static final double LZ = 0.12;
    /** Band width and area tolerance of the estimate on a jittered sampling at l = 2 dx. */
    private static final double TOLERANCE = 0.05;

    /** Particles of a box [0.1, 0.1 + LX] x ... whose damage is profile(distance to the plane n . x = n . c). */
    private static CrackBand.Measure measure(double[] n, DoubleUnaryOperator profile) {
        double cx = 0.1 + LX / 2, cy = 0.1 + LY / 2, cz = 0.1 + LZ / 2;
        Body body = Body.named("block").shape(Shapes.box(0.1, 0.1, 0.1, 0.1 + LX, 0.1 + LY, 0.1 + LZ))
                .material(Elastic.neoHookean(1e5, 0.3, 1000))
                .damage(Fracture.phaseField().fractureEnergy(1).build()).jitter(0.25).seed(3)
                .initialChannel(DamageModel.DAMAGE, (x, y, z, out) -> out[0] = profile.applyAsDouble(
                        Math.abs(n[0] * (x - cx) + n[1] * (y - cy) + n[2] * (z - cz))))
                .build();
        Scene scene = Scene.builder().domain(0, 0, 0, 0.6, 0.6, 0.32).cellSize(DX).add(body).build();
        try (Simulation sim = new Simulation(scene)) {
            return new CrackBand().measure(sim);
        }
    }

    private static double at1(double s) {
        return s < 2 * L ? (1 - s / (2 * L)) * (1 - s / (2 * L)) : 0;
    }

    @Test
    void widthOfClosedFormProfilesAtRandomOrientations() {
        for (int trial = 0; trial < 4; trial++) {
            double phi = 2 * Math.PI * rand.nextDouble();
            double psi = Math.toRadians(30) * (2 * rand.nextDouble() - 1);
            double[] n = {Math.cos(phi) * Math.cos(psi), Math.sin(phi) * Math.cos(psi), Math.sin(psi)};
            CrackBand.Measure a2 = measure(n, s -> Math.exp(-s / L));
            double expected2 = CrackDensity.AT2.bandWidth(L, CrackBand.LOW, CrackBand.HIGH);
            // published: AT2 profile exp(-|x|/l): 0.05 < d < 0.95 over 2 l ln(19)
            assertEquals(expected2, a2.width(), TOLERANCE * expected2, "AT2 width, normal " + str(n) + " " + a2);
            CrackBand.Measure a1 = measure(n, CrackBandTest::at1);
            double expected1 = CrackDensity.AT1.bandWidth(L, CrackBand.LOW, CrackBand.HIGH);
            // published: AT1 profile (1 - |x|/(2l))^2: 0.05 < d < 0.95 over 4 l (sqrt(0.95) - sqrt(0.05))
            assertEquals(expected1, a1.width(), TOLERANCE * expected1, "AT1 width, normal " + str(n));
        }
    }

    @Test
    void areaIsTheCrossSectionOfATiltedPlane() {
        for (double deg : new double[] {0, 17, 30, 45}) {
            double t = Math.toRadians(deg);
            double[] n = {Math.cos(t), Math.sin(t), 0};
            CrackBand.Measure m = measure(n, CrackBandTest::at1);
            // geometry: the line through the centre with direction (-sin t, cos t) crosses the LX x LY rectangle
            // over min(LX/|sin t|, LY/|cos t|); the cross-section is that times LZ
            double chord = Math.min(deg == 0 ? Double.POSITIVE_INFINITY : LX / Math.sin(t), LY / Math.cos(t));
            assertEquals(chord * LZ, m.crackArea(), TOLERANCE * chord * LZ, "area at " + deg + " degrees");
        }
    }

    @Test
    void noCrackWithoutDamageAboveOneHalf() {
        CrackBand.Measure smeared = measure(new double[] {1, 0, 0}, s -> 0.3);
        assertEquals(0.0, smeared.crackArea(), 0.0);
        assertTrue(Double.isNaN(smeared.width()), "no crack surface, no width");
        assertEquals(LX * LY * LZ, smeared.bandVolume(), 1e-9, "all of it partly damaged");
        Body plain = Body.named("b").shape(Shapes.box(0.1, 0.1, 0.1, 0.2, 0.2, 0.2))
                .material(Elastic.neoHookean(1e5, 0.3, 1000)).build();
        try (Simulation sim = new Simulation(Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(DX).add(plain)
                .build())) {
            assertSame(CrackBand.Measure.NONE, new CrackBand().measure(sim), "no damage channel");
        }
    }

    private static String str(double[] n) {
        return "(" + n[0] + ", " + n[1] + ", " + n[2] + ")";
    }
}

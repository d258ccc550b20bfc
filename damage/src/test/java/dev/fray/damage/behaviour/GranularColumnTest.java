package dev.fray.damage.behaviour;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shape;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Plastic;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestReporter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * VALIDATION.md G31: dry sand (Drucker-Prager, friction angle {@value #PHI} degrees, no cohesion; dry sand is 30 to
 * 35 degrees, value from memory as in VALIDATION.md D) on a table.
 *
 * <p>Both runs are axisymmetric and use a quarter of the space: the axis is the line x = z = 0 and the planes x = 0
 * and z = 0 are frictionless separating walls, which are mirror planes of the flow (separating, not slip: a slip
 * wall holds material that reaches it, a mirror plane must let it move away again). So a quarter of a column stands for the
 * whole, at a quarter of the particles. The table is the floor with Coulomb friction {@value #TABLE_FRICTION}, a
 * basal friction angle of about 22 degrees, typical of sand on a smooth table (value from memory). Young's modulus
 * is softened to {@value #YOUNGS} Pa for long steps; the sand then settles by 3% under its own weight, which the
 * run-out hardly notices.
 *
 * <ul>
 *   <li>Run-out of a collapsing column of radius r0 and height h0 (aspect ratio a = h0 / r0), to the final radius
 *       r: (r - r0) / r0 = 1.24 a for a &lt; 1.7 and 1.6 a^(1/2) for a &gt; 1.7. Published: Lube, Huppert, Sparks
 *       and Hallworth, J. Fluid Mech. 508 (2004); Lajeunesse, Mangeney-Castelnau and Vilotte, Phys. Fluids 16
 *       (2004) find the same two regimes; constants from memory. Within 25%, one aspect ratio in each regime, each
 *       with at least ten cells across the initial height (measured: the run-out grows by about 30% from five to
 *       ten cells, so coarser columns fall short).</li>
 *   <li>Angle of repose of a poured pile within 5 degrees of the friction angle (common practice, no source): sand
 *       runs from a hopper through an orifice onto the table and builds a cone under it. Drucker-Prager's cone
 *       matches Mohr-Coulomb's on the compressive meridian and is stronger elsewhere, so the pile may stand
 *       somewhat steeper than the friction angle; measured 33 degrees.</li>
 * </ul>
 */
class GranularColumnTest extends FrayTestBase {
    static final double PHI = 30;
    static final double TABLE_FRICTION = 0.4;
    static final double YOUNGS = 5e4;
    private static final double DENSITY = 1600;
    private static final double RUN_OUT_TOLERANCE = 0.25;
    private static final double REPOSE_TOLERANCE = 5;

    /** A quarter of an upright cylinder: x, z &gt;= 0, x^2 + z^2 &lt;= r^2, 0 &lt;= y &lt;= h. */
    private record QuarterColumn(double r, double h) implements Shape {
        @Override
        public double distance(double x, double y, double z) {
            return Math.max(Math.max(Math.hypot(x, z) - r, Math.max(-x, -z)), Math.max(-y, y - h));
        }

        @Override
        public void normal(double x, double y, double z, double[] out, int off) {
            // only filled with particles, never used as a boundary
            out[off] = 0;
            out[off + 1] = 1;
            out[off + 2] = 0;
        }

        @Override
        public Bounds bounds() {
            return new Bounds(0, 0, 0, r, h, r);
        }
    }

    private static Body sand(Shape shape) {
        return Body.named("sand").shape(shape).material(Plastic.druckerPrager(YOUNGS, 0.3, DENSITY, PHI, 0))
                .jitter(0.3).seed(5).build();
    }

    /** Mirror planes x = 0 and z = 0, the rough table below, nothing elsewhere. */
    private static Scene.Builder quarterSpace(double size, double height, double dx) {
        return Scene.builder().domain(0, 0, 0, size, height, size).cellSize(dx).threads(2).gravity(0, -9.81, 0)
                .walls(Contact.open()).wall("xMin", Contact.separating(0)).wall("zMin", Contact.separating(0))
                .wall("yMin", Contact.separating(TABLE_FRICTION));
    }

    /** @return the x, y, z of every particle, 3 per particle */
    private static double[] positions(Simulation sim) {
        double[] x = new double[3 * sim.particles().size()];
        sim.particles().copyById(ParticleStore.POSITION, x, 0);
        return x;
    }

    @ParameterizedTest(name = "a = {0}")
    @CsvSource({"1, 0.1, 0.6", "2, 0.075, 0.8"})
    void runOutFollowsThePublishedScaling(double a, double r0, double seconds, TestReporter reporter) {
        double h0 = a * r0;
        double dx = 0.01;
        double expected = a < 1.7 ? 1.24 * a : 1.6 * Math.sqrt(a);
        double size = r0 * (1 + expected) * 1.6 + 0.05;
        Scene scene = quarterSpace(size, h0 + 0.05, dx).add(sand(new QuarterColumn(r0, h0))).build();
        try (Simulation sim = new Simulation(scene)) {
            while (sim.time() < seconds) {
                sim.step();
            }
            double[] x = positions(sim);
            double r = 0;
            for (int p = 0; p < x.length / 3; p++) {
                r = Math.max(r, Math.hypot(x[3 * p], x[3 * p + 2]));
            }
            double runOut = (r - r0) / r0;
            double potential = DENSITY * Math.PI * r0 * r0 / 4 * h0 * 9.81 * h0 / 2;
            reporter.publishEntry("a, measured (r - r0)/r0, published", a + ", " + runOut + ", " + expected);
            assertTrue(sim.diagnostics().kineticEnergy() < 1e-4 * potential, "the heap has come to rest");
            assertTrue(Math.abs(runOut - expected) <= RUN_OUT_TOLERANCE * expected,
                    "a = " + a + ": (r - r0)/r0 = " + runOut + ", published " + expected);
        }
    }

    /**
     * A square hopper (in the quarter space: walls at x = 0.06 m and z = 0.06 m, 0.1 m of sand above a plate at
     * 0.16 m) empties through a square orifice 0.07 m wide at the axis onto the table, where the sand builds a cone.
     * After 1.5 s the flank is measured while the last of the sand still runs onto the summit: the upper envelope of
     * the particles in rings 5 mm wide, fitted with a straight line from twice the orifice's half-width outward,
     * beyond the stream, down to 2 cm above the table, above the thin layer that the first sand spread on the table.
     * (Measured on two lattices a rounding apart: 33.2 and 33.3 degrees.)
     */
    @Test
    @Tag("slow")
    void pouredPileStandsAtTheFrictionAngle(TestReporter reporter) {
        double dx = 0.02 / 3;
        double plate = 0.16, hopper = 0.06, orifice = 0.035, fill = 0.1, wall = 2 * dx;
        double top = plate + wall + fill;
        Contact c = Contact.separating(0.3);
        Scene scene = quarterSpace(0.26, top + 0.03, dx)
                .add(new Obstacle("plate-a", Shapes.box(orifice, plate, -dx, hopper + wall, plate + wall,
                        hopper + wall), c, null))
                .add(new Obstacle("plate-b", Shapes.box(-dx, plate, orifice, orifice, plate + wall, hopper + wall),
                        c, null))
                .add(new Obstacle("wall-a", Shapes.box(hopper, plate, -dx, hopper + wall, top + 0.03,
                        hopper + wall), c, null))
                .add(new Obstacle("wall-b", Shapes.box(-dx, plate, hopper, hopper, top + 0.03, hopper + wall), c,
                        null))
                .add(sand(Shapes.box(0, plate + wall, 0, hopper, top, hopper)))
                .build();
        try (Simulation sim = new Simulation(scene)) {
            while (sim.time() < 1.5) {
                sim.step();
            }
            double[] x = positions(sim);
            double ring = 0.005;
            double[] surface = new double[(int) (0.26 * Math.sqrt(2) / ring) + 1]; // the quarter domain's diagonal
            int poured = 0;
            for (int p = 0; p < x.length / 3; p++) {
                if (x[3 * p + 1] < plate) {
                    poured++;
                    int k = (int) (Math.hypot(x[3 * p], x[3 * p + 2]) / ring);
                    surface[k] = Math.max(surface[k], x[3 * p + 1]);
                }
            }
            double sr = 0, sh = 0, srr = 0, srh = 0;
            int n = 0;
            for (int k = 0; k < surface.length; k++) {
                double r = (k + 0.5) * ring;
                if (r >= 2 * orifice && surface[k] >= 0.02) {
                    sr += r;
                    sh += surface[k];
                    srr += r * r;
                    srh += r * surface[k];
                    n++;
                }
            }
            double slope = (n * srh - sr * sh) / (n * srr - sr * sr);
            double angle = Math.toDegrees(Math.atan(-slope));
            reporter.publishEntry("poured particles, rings fitted, angle of repose (degrees)",
                    poured + " of " + x.length / 3 + ", " + n + ", " + angle);
            assertTrue(poured > 0.7 * x.length / 3, "most of the hopper has run out: " + poured);
            assertTrue(n >= 10, "enough of the flank to fit: " + n);
            assertTrue(Math.abs(angle - PHI) <= REPOSE_TOLERANCE, "angle of repose " + angle + " degrees");
        }
    }
}

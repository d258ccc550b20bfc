package dev.fray.examples.bench;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Integration;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.step.ImplicitStatistics;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fracture;

/**
 * The stiff-solid benchmark of the implicit integrator: a glass-like plate (E = 70 GPa, nu = 0.22,
 * rho = 2500 kg/m^3, values from memory; AT1 phase field with a 50 MPa strength, value from memory) 0.2 m square
 * and two cells thick, held along two opposite edges by still grips, struck in its middle by a ball 6 cm across
 * driven down at 5 m/s, for a given simulated time (0.02 s by default), at one resolution, once with each
 * integrator; and the same plate at E = 1e6 Pa (same strength ratio) with the implicit integrator. Reports wall
 * time, steps, the fraction of the plate's particles with damage at least 0.5, and the implicit solver's
 * iteration counts. Timing includes the JIT's warm-up, equally for every run; setup is excluded.
 */
public final class StiffBench {
    /** Young's modulus of the glass-like plate, Pa (value from memory). */
    public static final double GLASS_E = 70e9;
    /** Strength of the glass-like plate, Pa (value from memory). */
    public static final double GLASS_STRENGTH = 50e6;
    /** Young's modulus of the soft variant, Pa. */
    public static final double SOFT_E = 1e6;
    /** Speed of the ball, m/s. */
    public static final double BALL_SPEED = 5;

    private StiffBench() {
    }

    /**
     * Figures of one run.
     *
     * @param label          what ran
     * @param seconds        wall time, s
     * @param simulated      simulated time, s
     * @param steps          steps taken
     * @param brokenFraction fraction of the plate's particles with damage &gt;= 0.5
     * @param newton         Newton iterations (0 explicit)
     * @param cg             conjugate-gradient iterations (0 explicit)
     * @param halvings       halved steps (0 explicit)
     * @param particles      particles
     */
    public record Run(String label, double seconds, double simulated, long steps, double brokenFraction,
                      long newton, long cg, long halvings, int particles) {
        /** @return wall seconds per simulated second */
        public double costPerSimulatedSecond() {
            return seconds / simulated;
        }
    }

    /**
     * The benchmark scene.
     *
     * @param youngs    Young's modulus of the plate, Pa
     * @param mode      integration
     * @param cellSize  grid cell, m
     * @param threads   worker threads
     * @param tolerance implicit tolerance (relative Newton residual)
     * @return the scene
     */
    public static Scene scene(double youngs, Integration mode, double cellSize, int threads, double tolerance) {
        double h = 2 * cellSize;
        double y0 = 0.1;
        DamageModel damage = Fracture.phaseFieldAT1().strength(GLASS_STRENGTH * youngs / GLASS_E, youngs).build();
        return Scene.builder()
                .domain(0, 0, 0, 0.3, 0.2, 0.3).cellSize(cellSize).gravity(0, -9.81, 0)
                .walls(Contact.separating(0.3)).threads(threads)
                .frameRate(1).integration(mode).implicitSolver(tolerance, 20)
                .phaseFieldSolver(1e-3, 100)
                .add(Body.named("plate").shape(Shapes.box(0.05, y0, 0.05, 0.25, y0 + h, 0.25))
                        .material(Elastic.fixedCorotated(youngs, 0.22, 2500)).damage(damage).seed(7).build())
                .add(new Grip("left", "plate", Shapes.box(0.05, 0, 0, 0.05 + cellSize, 0.2, 0.3), Motion.STILL))
                .add(new Grip("right", "plate", Shapes.box(0.25 - cellSize, 0, 0, 0.25, 0.2, 0.3), Motion.STILL))
                .add(new Obstacle("ball", Shapes.sphere(0.15, y0 + h + 0.03 + 0.2 * cellSize, 0.15, 0.03),
                        Contact.separating(0.2), Motion.linear(0, -BALL_SPEED, 0)))
                .build();
    }

    /**
     * Runs one configuration.
     *
     * @param label     what to call it
     * @param scene     the scene
     * @param simulated simulated time, s
     * @return the figures
     */
    public static Run run(String label, Scene scene, double simulated) {
        try (Simulation sim = new Simulation(scene)) {
            long t0 = System.nanoTime();
            while (sim.time() < simulated * (1 - 1e-9)) {
                sim.step();
            }
            double wall = (System.nanoTime() - t0) * 1e-9;
            double[] d = new double[sim.particles().size()];
            sim.particles().copyById(DamageModel.DAMAGE, d, 0);
            int broken = 0;
            for (double v : d) {
                broken += v >= 0.5 ? 1 : 0;
            }
            ImplicitStatistics st = sim.implicitStatistics();
            long steps = sim.diagnostics().step();
            return new Run(label, wall, sim.time(), steps, (double) broken / d.length,
                    st == null ? 0 : st.newtonIterations(), st == null ? 0 : st.cgIterations(),
                    st == null ? 0 : st.halvings(), d.length);
        }
    }
}

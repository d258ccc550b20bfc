package dev.fray.examples.bench;

import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayInternalException;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.particles.ChannelField;
import dev.fray.damage.Elastic;
import dev.fray.damage.Fibers;
import dev.fray.damage.Fracture;
import dev.fray.damage.fiber.FiberChannels;
import dev.fray.damage.fiber.FiberFields;
import dev.fray.damage.elastic.ElasticParameters;

import java.lang.management.ManagementFactory;
import java.lang.management.MemoryMXBean;
import java.util.List;

/**
 * The standard benchmark scenes, timed with plain {@link Simulation#step()} calls.
 *
 * <p>Scene "drop": a cube of fixed-corotated material (E = 1e5 Pa, nu = 0.3, rho = 1000 kg/m^3) in the unit box
 * with slip walls and gravity -9.81 m/s^2 along y. For a requested particle count N the cube spans m = round(cbrt(N
 * / 8)) cells per edge with 2x2x2 particles per cell (spacing dx/2, each jittered by up to dx/8 from seed
 * {@link #SEED}), so it holds exactly (2m)^3 particles. The grid has n = round(m / 0.4) cells per axis, dx = 1/n,
 * and the cube (edge m dx, about 0.4 m) has its min corner at (0.3, 0.5, 0.3) m. Quadratic kernel; fixed time
 * step dt = 0.4 dx / c with c = sqrt((lambda + 2 mu) / rho). The frame interval is set longer than the run so no
 * step is shortened to land on a frame time.
 *
 * <p>Scene "drop-damage": the same cube with AT2 phase-field damage (fracture energy {@value #GC} J/m^2, length
 * scale two cells, no crack-speed viscosity, the library's default phase-field solver settings); the impact breaks
 * it. Scene "drop-fibers": the same cube reinforced by one fiber family along x (quadratic fiber term, stiffness
 * {@value #FIBER_STIFFNESS} Pa) with the anisotropic phase field (same fracture energy, fiber strength
 * {@value #FIBER_STRENGTH}). The time step of both variants uses the fiber-stiffened wave speed the law reports.
 *
 * <p>Timing excludes setup (particle sampling, thread start). Heap use is read from {@link MemoryMXBean}: after a
 * garbage collection before setup, sampled (without collecting) about 20 times during the run, and after a final
 * collection with the simulation still open. The retained heap (after that collection, less the heap before
 * setup) per particle is what the simulation keeps; the peak of the samples also holds garbage not yet collected.
 * The JIT warms up during the first steps unless warm-up steps are asked for.
 */
public final class StandardBench {
    /** Name of the falling-cube scene. */
    public static final String DROP = "drop";
    /** The falling cube with AT2 phase-field damage. */
    public static final String DROP_DAMAGE = "drop-damage";
    /** The falling cube with one fiber family and the anisotropic phase field. */
    public static final String DROP_FIBERS = "drop-fibers";
    /** Fracture energy of the damage variants, J/m^2. */
    public static final double GC = 100;
    /** Fiber stiffness of drop-fibers, Pa. */
    public static final double FIBER_STIFFNESS = 2e5;
    /** Anisotropy strength of drop-fibers' phase field (dimensionless). */
    public static final double FIBER_STRENGTH = 10;
    /** Seed of the particle jitter. */
    public static final long SEED = 20240501L;
    /** Default particle count requested. */
    public static final int DEFAULT_PARTICLES = 100_000;
    /** Default number of timed steps. */
    public static final int DEFAULT_STEPS = 200;

    private static final List<String> SCENES = List.of(DROP, DROP_DAMAGE, DROP_FIBERS);
    private static final double E = 1e5;
    private static final double NU = 0.3;
    private static final double RHO = 1000;

    private StandardBench() {
    }

    /**
     * Result of one benchmark run.
     *
     * @param scene                  scene name
     * @param particles              particles simulated
     * @param steps                  timed steps
     * @param threads                worker threads
     * @param seconds                wall-clock time of the timed steps, s
     * @param particleStepsPerSecond particles times steps divided by seconds, 1/s
     * @param peakHeapBytes          largest heap use seen, bytes, garbage not yet collected included
     * @param bytesPerParticle       heap the simulation retains (after a collection at the end, less the heap
     *                               before setup) per particle, bytes
     * @param peakBytesPerParticle   (peak heap - heap before setup) / particles, bytes
     * @param gridBytes              memory of the sparse grid at the end, bytes (grows with occupied blocks)
     * @param phaseShares            share of the timed wall time per solver phase (sort, stress, scatter, grid,
     *                               solve, gather), summing to about 1
     */
    public record Result(String scene, int particles, int steps, int threads, double seconds,
                         double particleStepsPerSecond, long peakHeapBytes, double bytesPerParticle,
                         double peakBytesPerParticle, long gridBytes, java.util.Map<String, Double> phaseShares) {
    }

    /** @return the benchmark scene names */
    public static List<String> scenes() {
        return SCENES;
    }

    /**
     * Cells per cube edge for a requested particle count.
     *
     * @param particles requested count, &gt;= 8
     * @return m = round(cbrt(particles / 8)), at least 1
     */
    public static int cubeCells(int particles) {
        return Math.max(1, (int) Math.round(Math.cbrt(particles / 8.0)));
    }

    /**
     * Builds a benchmark scene.
     *
     * @param name      scene name, one of {@link #scenes()}
     * @param particles requested particle count, 8 to 50 000 000 (the cube holds (2m)^3, see the class comment)
     * @param steps     steps the scene will be run for (sets the frame interval beyond the run), &gt;= 1
     * @param threads   worker threads, 1 to 1024
     * @return the scene
     * @throws InvalidInputException with key UNKNOWN_NAME for an unknown scene, OUT_OF_RANGE for a bad count
     */
    public static Scene scene(String name, int particles, int steps, int threads) {
        Checks.notNull("bench scene", name);
        if (!SCENES.contains(name)) {
            throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "bench scene", name, String.join(", ", SCENES));
        }
        Checks.inRange("particles", particles, 8, 50_000_000);
        Checks.inRange("steps", steps, 1, 100_000_000);
        Checks.inRange("threads", threads, 1, 1024);
        int m = cubeCells(particles);
        int n = (int) Math.round(m / 0.4);
        double dx = 1.0 / n;
        MaterialLaw law = Elastic.fixedCorotated(E, NU, RHO);
        DamageModel damage = null;
        ChannelField fibers = null;
        if (name.equals(DROP_DAMAGE)) {
            damage = Fracture.phaseField().fractureEnergy(GC).build();
        } else if (name.equals(DROP_FIBERS)) {
            law = Fibers.reinforce(law).quadratic(FIBER_STIFFNESS).build();
            damage = Fracture.anisotropicPhaseField().fractureEnergy(GC).fiberStrengths(FIBER_STRENGTH).build();
            fibers = FiberFields.uniform(1, 0, 0);
        }
        double c = name.equals(DROP) ? ElasticParameters.of(E, NU, RHO).pWaveSpeed() : law.waveSpeed();
        double dt = 0.4 * dx / c;
        double x0 = 0.3, y0 = 0.5, z0 = 0.3;
        double edge = m * dx;
        Body.Builder cube = Body.named("cube")
                .shape(Shapes.box(x0, y0, z0, x0 + edge, y0 + edge, z0 + edge))
                .material(law)
                .damage(damage)
                .spacing(0.5 * dx)
                .jitter(0.25)
                .seed(SEED);
        if (fibers != null) {
            cube.initialChannel(FiberChannels.reference(1), fibers);
        }
        return Scene.builder()
                .domain(0, 0, 0, 1, 1, 1)
                .cellSize(dx)
                .gravity(0, -9.81, 0)
                .walls(Contact.slip(0))
                .kernel(Kernel.QUADRATIC)
                .fixedTimeStep(dt)
                // Frames only matter for output; keep the first frame time beyond the run.
                .frameRate(1.0 / (2.0 * steps * dt))
                .threads(threads)
                .add(cube.build())
                .build();
    }

    /**
     * Runs a benchmark.
     *
     * @param name        scene name, one of {@link #scenes()}
     * @param particles   requested particle count, 8 to 50 000 000
     * @param steps       timed steps, &gt;= 1
     * @param warmupSteps untimed steps taken first (for the JIT), &gt;= 0
     * @param threads     worker threads, 1 to 1024
     * @return the measurements
     * @throws InvalidInputException for a bad argument
     * @throws dev.fray.core.error.SimulationDivergedException if the scene blows up
     */
    public static Result run(String name, int particles, int steps, int warmupSteps, int threads) {
        Checks.inRange("warmup steps", warmupSteps, 0, 100_000_000);
        Scene scene = scene(name, particles, steps + warmupSteps, threads);
        MemoryMXBean memory = ManagementFactory.getMemoryMXBean();
        memory.gc();
        long before = memory.getHeapMemoryUsage().getUsed();
        try (Simulation sim = new Simulation(scene)) {
            int m = cubeCells(particles);
            int expected = 8 * m * m * m;
            if (sim.particles().size() != expected) {
                throw new FrayInternalException("bench cube holds " + sim.particles().size()
                        + " particles, expected (2m)^3 = " + expected, null);
            }
            for (int i = 0; i < warmupSteps; i++) {
                sim.step();
            }
            memory.gc();
            long peak = memory.getHeapMemoryUsage().getUsed();
            int sampleEvery = Math.max(1, steps / 20);
            java.util.Map<String, Double> phases0 = sim.phaseSeconds();
            long t0 = System.nanoTime();
            for (int i = 0; i < steps; i++) {
                sim.step();
                if (i % sampleEvery == 0) {
                    peak = Math.max(peak, memory.getHeapMemoryUsage().getUsed());
                }
            }
            double seconds = (System.nanoTime() - t0) * 1e-9;
            java.util.Map<String, Double> shares = new java.util.LinkedHashMap<>();
            sim.phaseSeconds().forEach((phase, total) -> shares.put(phase, (total - phases0.get(phase)) / seconds));
            memory.gc();
            long retained = memory.getHeapMemoryUsage().getUsed();
            peak = Math.max(peak, retained);
            int np = sim.particles().size();
            return new Result(name, np, steps, threads, seconds, (double) np * steps / seconds, peak,
                    (double) (retained - before) / np, (double) (peak - before) / np, sim.gridMemoryBytes(), shares);
        }
    }
}

package dev.fray.examples.bench;

import dev.fray.core.sim.Simulation;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

/**
 * JMH benchmark of one solver step of the standard scenes (see {@link StandardBench}). The score is the time
 * per step; divide the particle count by it for particle-steps per second. A fresh simulation per iteration keeps
 * the scene from settling into a different regime over long measurements (the cube falls, lands and bounces
 * within the first 1200 steps at 100k particles).
 *
 * <p>HOW TO RUN: {@code mvn -B -q package -DskipTests && java -cp examples/target/fray.jar org.openjdk.jmh.Main
 * DropBenchmark -p particles=100000 -p threads=2 -p scene=drop}
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(3)
public class DropBenchmark {
    /** Requested particle count. */
    @Param({"100000", "1000000"})
    public int particles;

    /** Worker threads. */
    @Param({"1", "2"})
    public int threads;

    /** Benchmark scene. */
    @Param({StandardBench.DROP, StandardBench.DROP_DAMAGE, StandardBench.DROP_FIBERS})
    public String scene;

    private Simulation sim;

    /** Builds a fresh scene and warms it past its first steps. */
    @Setup(Level.Iteration)
    public void setUp() {
        sim = new Simulation(StandardBench.scene(scene, particles, 100_000, threads));
        for (int i = 0; i < 5; i++) {
            sim.step();
        }
    }

    /** Stops the simulation's threads. */
    @TearDown(Level.Iteration)
    public void tearDown() {
        sim.close();
    }

    /**
     * @return the step's dt, so the work cannot be removed as dead code
     */
    @Benchmark
    public double step() {
        return sim.step();
    }
}

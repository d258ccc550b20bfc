package dev.fray.examples.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.fray.core.error.Checks;
import dev.fray.core.sim.MemoryEstimate;
import dev.fray.examples.bench.StandardBench;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code fray bench}: runs a standard benchmark scene and prints exactly one JSON line on standard output with the
 * keys scene, particles, steps, threads, seconds, particleStepsPerSecond, peakHeapBytes, bytesPerParticle (heap
 * retained per particle), peakBytesPerParticle (peak heap per particle, uncollected garbage included), gridBytes and
 * estimatedBytesPerParticle (the {@link MemoryEstimate} that run and check compare with the heap).
 */
@Command(name = "bench", mixinStandardHelpOptions = true,
        description = {"Run a standard benchmark and print one JSON line with the measurements.",
            "Scene 'drop': a fixed-corotated cube falling in the unit box; 'drop-damage' adds AT2 phase-field "
                + "damage, 'drop-fibers' one fiber family and the anisotropic phase field (see StandardBench)."})
public final class BenchCommand implements Callable<Integer> {
    private static final ObjectMapper JSON = new ObjectMapper();

    @Spec
    private CommandSpec spec;

    @Mixin
    private DebugOption debug;

    @Option(names = "--scene", paramLabel = "NAME", defaultValue = StandardBench.DROP,
            description = "Benchmark scene: drop, drop-damage or drop-fibers (default: ${DEFAULT-VALUE}).")
    private String scene;

    @Option(names = "--particles", paramLabel = "N", defaultValue = "100000",
            description = "Approximate particle count, 8 to 50000000 (default: ${DEFAULT-VALUE}); the cube holds "
                    + "(2m)^3 with m = round(cbrt(N/8)).")
    private int particles;

    @Option(names = "--steps", paramLabel = "S", defaultValue = "200",
            description = "Timed steps, 1 to 100000000 (default: ${DEFAULT-VALUE}).")
    private int steps;

    @Option(names = "--warmup", paramLabel = "W", defaultValue = "0",
            description = "Untimed steps before timing starts, 0 to 100000000 (default: ${DEFAULT-VALUE}).")
    private int warmup;

    @Option(names = "--breakdown",
            description = "Also report the share of time per solver phase (sort, stress, scatter, grid, solve, "
                    + "gather) under the key phaseShares.")
    private boolean breakdown;

    @Option(names = "--threads", paramLabel = "T",
            description = "Worker threads, 1 to 1024 (default: all cores).")
    private Integer threads;

    /** Created by picocli. */
    public BenchCommand() {
    }

    /**
     * Runs the benchmark and prints the JSON line.
     *
     * @return the exit code
     * @throws JsonProcessingException never in practice (plain values)
     */
    @Override
    public Integer call() throws JsonProcessingException {
        int t = threads == null ? Runtime.getRuntime().availableProcessors() : threads;
        Checks.inRange("--threads", t, 1, 1024);
        Checks.inRange("--particles", particles, 8, 50_000_000);
        Checks.inRange("--steps", steps, 1, 100_000_000);
        Checks.inRange("--warmup", warmup, 0, 100_000_000);
        StandardBench.Result r = StandardBench.run(scene, particles, steps, warmup, t);
        ObjectNode o = JSON.createObjectNode();
        o.put("scene", r.scene());
        o.put("particles", r.particles());
        o.put("steps", r.steps());
        o.put("threads", r.threads());
        o.put("seconds", r.seconds());
        o.put("particleStepsPerSecond", r.particleStepsPerSecond());
        o.put("peakHeapBytes", r.peakHeapBytes());
        o.put("bytesPerParticle", r.bytesPerParticle());
        o.put("peakBytesPerParticle", r.peakBytesPerParticle());
        o.put("gridBytes", r.gridBytes());
        // The estimate that run and check compare with the heap, beside the heap this run retained.
        o.put("estimatedBytesPerParticle", (double) MemoryEstimate.of(
                StandardBench.scene(scene, particles, steps + warmup, t)).bytes() / r.particles());
        if (breakdown) {
            ObjectNode phases = o.putObject("phaseShares");
            r.phaseShares().forEach(phases::put);
        }
        PrintWriter out = spec.commandLine().getOut();
        out.println(JSON.writeValueAsString(o));
        out.flush();
        return FrayCommand.OK;
    }
}

package dev.fray.examples.cli;

import dev.fray.core.error.Checks;
import dev.fray.core.sim.Integration;
import dev.fray.examples.bench.StiffBench;

import java.io.PrintWriter;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code fray bench-stiff}: the implicit integrator's benchmark ({@link StiffBench}): a glass-like plate struck by a
 * ball, explicit against implicit, and the same plate soft. Prints one line per run and the ratios.
 */
@Command(name = "bench-stiff", mixinStandardHelpOptions = true,
        description = {"Time a glass-like plate struck by a ball with the explicit and the implicit integrator, and "
            + "a soft plate with the implicit one; print wall times, broken fractions and iteration counts."})
public final class StiffBenchCommand implements Callable<Integer> {
    @Spec
    private CommandSpec spec;

    @Mixin
    private DebugOption debug;

    @Option(names = "--seconds", paramLabel = "S", defaultValue = "0.02",
            description = "Simulated time, s (default: ${DEFAULT-VALUE}).")
    private double seconds;

    @Option(names = "--cell", paramLabel = "M", defaultValue = "0.01",
            description = "Grid cell size, m; the plate is two cells thick (default: ${DEFAULT-VALUE}).")
    private double cell;

    @Option(names = "--tolerance", paramLabel = "T", defaultValue = "5e-2",
            description = "Implicit Newton tolerance, relative residual (default: ${DEFAULT-VALUE}).")
    private double tolerance;

    @Option(names = "--skip-explicit", description = "Skip the (slow) explicit run.")
    private boolean skipExplicit;

    @Option(names = "--threads", paramLabel = "T",
            description = "Worker threads, 1 to 1024 (default: all cores).")
    private Integer threads;

    /** Created by picocli. */
    public StiffBenchCommand() {
    }

    @Override
    public Integer call() {
        int t = threads == null ? Runtime.getRuntime().availableProcessors() : threads;
        Checks.inRange("--threads", t, 1, 1024);
        Checks.inRange("--seconds (s)", seconds, 0, true, 10, false);
        Checks.inRange("--cell (m)", cell, 1e-3, false, 0.05, false);
        Checks.inRange("--tolerance", tolerance, 0, true, 1, false);
        PrintWriter out = spec.commandLine().getOut();
        StiffBench.Run imp = StiffBench.run("implicit stiff", StiffBench.scene(StiffBench.GLASS_E,
                Integration.IMPLICIT, cell, t, tolerance), seconds);
        print(out, imp);
        StiffBench.Run soft = StiffBench.run("implicit soft", StiffBench.scene(StiffBench.SOFT_E,
                Integration.IMPLICIT, cell, t, tolerance), seconds);
        print(out, soft);
        out.printf(Locale.ROOT, "stiff / soft implicit cost per simulated second: %.3g%n",
                imp.costPerSimulatedSecond() / soft.costPerSimulatedSecond());
        if (!skipExplicit) {
            StiffBench.Run exp = StiffBench.run("explicit stiff", StiffBench.scene(StiffBench.GLASS_E,
                    Integration.EXPLICIT, cell, t, tolerance), seconds);
            print(out, exp);
            out.printf(Locale.ROOT, "explicit / implicit wall time: %.3g; broken fractions %.4f (explicit) and "
                    + "%.4f (implicit)%n", exp.seconds() / imp.seconds(), exp.brokenFraction(), imp.brokenFraction());
        }
        out.flush();
        return FrayCommand.OK;
    }

    private static void print(PrintWriter out, StiffBench.Run r) {
        out.printf(Locale.ROOT, "%-15s %7d particles, %8d steps, %9.2f s wall, %8.3g s per simulated s, broken %.4f, "
                        + "newton %d (%.2f per step), cg %d (%.1f per newton), halvings %d%n", r.label(), r.particles(),
                r.steps(), r.seconds(), r.costPerSimulatedSecond(), r.brokenFraction(), r.newton(),
                (double) r.newton() / Math.max(1, r.steps()), r.cg(), (double) r.cg() / Math.max(1, r.newton()),
                r.halvings());
        out.flush();
    }
}

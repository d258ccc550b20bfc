package dev.fray.examples.cli;

import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.error.Checks;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.MemoryEstimate;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.step.TimeStepPolicy;
import dev.fray.io.cache.PlyParticleWriter;
import dev.fray.io.cache.VtpParticleWriter;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.ModelDescription;
import dev.fray.io.scene.OutputFormat;
import dev.fray.io.scene.SceneReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;

/**
 * {@code fray check SCENE}: reads a scene file, reporting every problem at once, samples its bodies and prints a
 * summary (particles per body, the strength each damage setting implies against the stresses the scene applies
 * ({@link StrengthReport}), time step, steps, memory and output sizes) with warnings about settings that run but
 * will probably disappoint. Runs no step.
 */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Validate a scene file and print what a run of it would involve, without running it."})
public final class CheckCommand implements Callable<Integer> {
    /** Steps per frame above which a material counts as very stiff for its grid. */
    static final int STIFF_STEPS_PER_FRAME = 1000;
    /** Bodies with fewer particles are flagged. */
    static final int FEW_PARTICLES = 100;

    @Spec
    private CommandSpec spec;

    @Mixin
    private DebugOption debug;

    @Parameters(index = "0", paramLabel = "SCENE", description = "Scene file (JSON, see docs/scene-format.md).")
    private Path scene;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads for sampling, 1 to 1024.")
    private Integer threads;

    /** Created by picocli. */
    public CheckCommand() {
    }

    /**
     * Validates the scene and prints the summary.
     *
     * @return the exit code
     */
    @Override
    public Integer call() {
        LoadedScene loaded = new SceneReader().read(scene);
        if (threads != null) {
            loaded = loaded.withThreads(Checks.inRange("--threads", threads, 1, 1024));
        }
        PrintWriter out = spec.commandLine().getOut();
        try (Simulation sim = new Simulation(loaded.scene())) {
            report(out, loaded, sim);
        }
        out.flush();
        return FrayCommand.OK;
    }

    private static void report(PrintWriter out, LoadedScene loaded, Simulation sim) {
        Scene s = loaded.scene();
        ParticleView pv = sim.particles();
        List<String> warnings = new ArrayList<>();
        // Channels named in the output block must exist: checked the way the writers will check them.
        List<String> chosen = loaded.output().channels();
        List<String> channels = chosen == null ? PlyParticleWriter.withPluginChannels().channelsFor(pv)
                : PlyParticleWriter.withChannels(chosen).channelsFor(pv);
        if (chosen != null && loaded.output().formats().contains(OutputFormat.VTP)) {
            VtpParticleWriter.withChannels(chosen).channelsFor(pv);
        }

        double dx = s.cellSize();
        var d = s.domain();
        out.printf(Locale.ROOT, "scene %s: valid (%s)%n", loaded.name(), SceneReader.FORMAT);
        if (!loaded.description().text().isEmpty()) {
            out.printf(Locale.ROOT, "  %s%n", loaded.description().text());
        }
        out.printf(Locale.ROOT, "  domain %s, cell %.4g m (%d x %d x %d cells)%n", d, dx,
                Math.round((d.maxX() - d.minX()) / dx), Math.round((d.maxY() - d.minY()) / dx),
                Math.round((d.maxZ() - d.minZ()) / dx));
        int frames = loaded.output().frames();
        out.printf(Locale.ROOT, "  %d frames at %.4g frames/s (%.4g s simulated), threads: %d%n", frames,
                s.frameRate(), frames / s.frameRate(), s.threads());

        int[] counts = new int[s.bodies().size()];
        for (int p = 0; p < pv.size(); p++) {
            counts[pv.body(p)]++;
        }
        out.printf(Locale.ROOT, "  bodies (%d particles in all):%n", pv.size());
        for (int b = 0; b < counts.length; b++) {
            Body body = s.bodies().get(b);
            String damage = body.damage() == null ? "no damage" : "damage " + body.damage().name();
            String group = loaded.description().groupOf(body.name()).map(g -> ", layer of " + g).orElse("");
            out.printf(Locale.ROOT, "    %-16s %9d particles  %s, %s, wave speed %.4g m/s%s%n", body.name(),
                    counts[b], body.material().name(), damage, body.material().waveSpeed(), group);
            bodyWarnings(warnings, loaded, body, counts[b], dx);
        }
        for (Obstacle o : s.obstacles()) {
            out.printf(Locale.ROOT, "  obstacle %s: %s contact, friction %.3g%s%n", o.name(),
                    o.contact().type().name().toLowerCase(Locale.ROOT), o.contact().friction(),
                    o.motion().isStill() ? "" : ", moving");
        }
        StrengthReport.report(out, warnings, s, pv, frames);
        startingOverlaps(warnings, s, pv);
        gripCounts(warnings, s, pv);

        double dt = sim.estimatedTimeStep();
        double frameTime = 1 / s.frameRate();
        long perFrame = Math.max(1, (long) Math.ceil(frameTime / dt));
        long steps = perFrame * frames;
        out.printf(Locale.ROOT, "  time step about %.3g s (%s), about %d steps per frame, %d in all%n", dt,
                Double.isNaN(s.fixedTimeStep()) ? "adaptive, cfl " + s.cfl() + ", at rest" : "fixed", perFrame, steps);
        integrationCosts(out, sim, s, pv, frameTime);
        if (perFrame > STIFF_STEPS_PER_FRAME && !sim.implicit()) {
            int stiff = stiffestBody(s);
            warnings.add(String.format(Locale.ROOT, "very stiff for this grid: body \"%s\" carries waves at %.4g m/s, "
                    + "which limits the step to %.3g s, %d steps per frame; lower youngsModulus, raise density or "
                    + "use a larger cellSize, or run.integration implicit", s.bodies().get(stiff).name(),
                    s.bodies().get(stiff).material().waveSpeed(), dt, perFrame));
        }

        long particleBytes = sim.particleMemoryBytes();
        long extra = 0;
        for (String c : channels) {
            extra += pv.spec(c).width();
        }
        long ply = pv.size() * (8L * 6 + 8 + 8 * extra);
        long vtp = pv.size() * (8L * 6 + 8 + 16 + 8 * extra);
        long checkpoint = particleBytes;
        MemoryEstimate m = MemoryEstimate.of(s);
        out.printf(Locale.ROOT, "  memory: particles %s, grid about %s at the start (%d blocks of 4^3 nodes); about %s "
                + "while running, %s at the peak, of a Java heap limit of %s%n", bytes(m.particleBytes()),
                bytes(m.gridBytes()), m.gridBlocks(), bytes(m.bytes()), bytes(m.peakBytes()),
                bytes(Runtime.getRuntime().maxMemory()));
        StringBuilder files = new StringBuilder();
        if (loaded.output().formats().contains(OutputFormat.PLY)) {
            files.append(String.format(Locale.ROOT, "PLY %s per frame, ", bytes(ply)));
        }
        if (loaded.output().formats().contains(OutputFormat.VTP)) {
            files.append(String.format(Locale.ROOT, "VTP %s per frame, ", bytes(vtp)));
        }
        if (loaded.output().checkpointEvery() > 0) {
            files.append(String.format(Locale.ROOT, "checkpoint %s every %d frames, ", bytes(checkpoint),
                    loaded.output().checkpointEvery()));
        }
        out.printf(Locale.ROOT, "  output: %schannels %s%n", files, channels);
        if (warnings.isEmpty()) {
            out.println("  no warnings");
        } else {
            out.printf(Locale.ROOT, "  warnings (%d):%n", warnings.size());
            for (String w : warnings) {
                out.printf(Locale.ROOT, "    - %s%n", w);
            }
        }
    }

    private static void bodyWarnings(List<String> warnings, LoadedScene loaded, Body body, int count, double dx) {
        if (count < FEW_PARTICLES) {
            warnings.add(String.format(Locale.ROOT, "body \"%s\" holds only %d particles; its motion will be coarse "
                    + "(use a smaller spacing or cellSize)", body.name(), count));
        }
        if (!Double.isNaN(body.spacing()) && body.spacing() > dx) {
            warnings.add(String.format(Locale.ROOT, "body \"%s\": particle spacing %s m exceeds the cell size "
                    + "%s m; with less than one particle per cell the body tears apart numerically",
                    body.name(), body.spacing(), dx));
        }
        if (body.damage() != null) {
            ModelDescription md = loaded.description().of(body.damage()).orElse(null);
            Object l = md == null ? null : md.parameters().get("lengthScale");
            if (l instanceof Double length && length < 2 * dx) {
                warnings.add(String.format(Locale.ROOT, "body \"%s\": damage length scale %s m is under two cells "
                        + "(2 x %s m); cracks will be poorly resolved and grid-dependent (use a finer cellSize or "
                        + "a larger lengthScale)", body.name(), length, dx));
            }
        }
    }

    private static void startingOverlaps(List<String> warnings, Scene s, ParticleView pv) {
        double[] x = new double[3 * pv.size()];
        pv.copyById(ParticleStore.POSITION, x, 0);
        for (Obstacle o : s.obstacles()) {
            int inside = 0;
            for (int i = 0; i < pv.size(); i++) {
                if (o.shape().distance(x[3 * i], x[3 * i + 1], x[3 * i + 2]) < 0) {
                    inside++;
                }
            }
            if (inside > 0) {
                warnings.add(String.format(Locale.ROOT, "%d particles start inside obstacle \"%s\"; they will be "
                        + "pushed out violently", inside, o.name()));
            }
        }
    }

    private static void gripCounts(List<String> warnings, Scene s, ParticleView pv) {
        if (s.grips().isEmpty()) {
            return;
        }
        int[] held = new int[s.grips().size()];
        for (int p = 0; p < pv.size(); p++) {
            int g = (int) pv.get("grip", p, 0);
            if (g >= 0) {
                held[g]++;
            }
        }
        for (int g = 0; g < held.length; g++) {
            Grip grip = s.grips().get(g);
            if (held[g] == 0) {
                warnings.add(String.format(Locale.ROOT, "grip \"%s\" holds no particle of body \"%s\"; check its "
                        + "region", grip.name(), grip.body()));
            }
        }
    }

    private static int stiffestBody(Scene s) {
        int best = 0;
        for (int b = 1; b < s.bodies().size(); b++) {
            if (s.bodies().get(b).material().waveSpeed() > s.bodies().get(best).material().waveSpeed()) {
                best = b;
            }
        }
        return best;
    }

    static String bytes(long b) {
        return MemoryEstimate.bytesText(b);
    }

    /**
     * The step and expected cost of each integrator, in particle passes per frame (a pass: one scatter and gather
     * of every particle's stencil, the work of one explicit step). The implicit estimate assumes two Newton
     * iterations per step and about 8 sqrt(c dt / dx) conjugate-gradient iterations each, as measured with the
     * block-Jacobi preconditioner on the implicit benchmark, plus four passes per Newton iteration for the energy,
     * gradient, differentials and line search.
     */
    private static void integrationCosts(PrintWriter out, Simulation sim, Scene s, ParticleView pv,
                                         double frameTime) {
        int particles = pv.size();
        double c = sim.maxWaveSpeed();
        double moving = TimeStepPolicy.motionSpeed(s, prescribedSpeed(s, pv));
        double dx = s.cellSize();
        double dtExplicit = TimeStepPolicy.stepAt(s, c, moving, false);
        double dtImplicit = TimeStepPolicy.stepAt(s, c, moving, true);
        double explicitSteps = Math.ceil(frameTime / dtExplicit);
        double implicitSteps = Math.ceil(frameTime / dtImplicit);
        double cg = 8 * Math.sqrt(c * dtImplicit / dx);
        double implicitPasses = implicitSteps * 2 * (4 + cg);
        out.printf(Locale.ROOT, "  integration %s, runs %s; per frame at a planning speed of %.3g m/s:%n",
                s.integration().key(), sim.implicit() ? "implicit" : "explicit", moving);
        out.printf(Locale.ROOT, "    explicit: step %.3g s, %.0f steps, about %.3g particle passes%n", dtExplicit,
                explicitSteps, explicitSteps * (double) particles);
        out.printf(Locale.ROOT, "    implicit: step %.3g s, %.0f steps, about %.0f CG iterations per Newton "
                        + "iteration, about %.3g particle passes (%.2gx explicit)%n", dtImplicit, implicitSteps, cg,
                implicitPasses * particles, implicitPasses / explicitSteps);
    }

    private static double prescribedSpeed(Scene s, ParticleView pv) {
        double v = 0;
        for (var o : s.obstacles()) {
            v = Math.max(v, o.motion().linearSpeed());
        }
        for (var g : s.grips()) {
            v = Math.max(v, g.motion().linearSpeed());
        }
        double[] vel = new double[3 * pv.size()];
        pv.copyById(ParticleStore.VELOCITY, vel, 0);
        for (int p = 0; p < pv.size(); p++) {
            v = Math.max(v, Math.sqrt(vel[3 * p] * vel[3 * p] + vel[3 * p + 1] * vel[3 * p + 1]
                    + vel[3 * p + 2] * vel[3 * p + 2]));
        }
        return v;
    }
}

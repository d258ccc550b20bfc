package dev.fray.core.sim;

import dev.fray.core.boundary.GridBoundaries;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.ParticleObstacleContact;
import dev.fray.core.contact.DamageGradientPartition;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.error.SimulationDivergedException;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.FieldSet;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.grid.Stencil;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.parallel.Workers;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.particles.ParticleSampler;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.step.DivergenceGuard;
import dev.fray.core.step.ExplicitStep;
import dev.fray.core.step.ImplicitStatistics;
import dev.fray.core.step.ImplicitStep;
import dev.fray.core.step.Integrator;
import dev.fray.core.step.StepContext;
import dev.fray.core.step.TimeStepPolicy;
import dev.fray.core.transfer.FieldRouting;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * A simulation of a scene: the facade over the step's rooms. It samples the bodies, wires the phases of the step
 * (see {@link ExplicitStep}), runs the loop that lands on frame times and sends step and frame events, and offers
 * read-only views of the particles and the grid, diagnostics, and capture and restore of the run state.
 *
 * <p>Results are bitwise identical for 1 or N threads (every parallel sum has a fixed partition and order). Not
 * thread-safe: drive one simulation from one thread; only {@link #requestStop()} may be called from another.
 */
public final class Simulation implements SimulationView, AutoCloseable {
    private final Scene scene;
    private final ParticleStore store;
    private final SparseGrid grid = new SparseGrid();
    private final FieldSet fields;
    private final Workers workers;
    private final StepContext ctx;
    private final Integrator integrator;
    private final TimeStepPolicy policy;
    private final boolean implicit;
    private final DiagnosticsMeter meter;
    private final List<String> bodyNames;
    private final List<StepListener> stepListeners = new CopyOnWriteArrayList<>();
    private final List<FrameListener> frameListeners = new CopyOnWriteArrayList<>();
    private final ParticleView particleView;
    private final GridView gridView;
    private volatile boolean stopRequested;
    private double dt;
    private int frame;
    private boolean frameZeroSent;

    /**
     * Samples the bodies into particles and prepares the solver, with the scene's own run options.
     *
     * @param scene the scene
     * @throws InvalidInputException if a body holds no particle
     */
    public Simulation(Scene scene) {
        this(scene, RunOptions.of(Checks.notNull("scene", scene)));
    }

    /**
     * Samples the bodies into particles and prepares the solver.
     *
     * @param scene   the scene
     * @param options how to run it (threads); results do not depend on them
     * @throws InvalidInputException if a body holds no particle, or the scene's {@link MemoryEstimate} exceeds the
     *                               heap the JVM may use
     */
    public Simulation(Scene scene, RunOptions options) {
        this.scene = Checks.notNull("scene", scene);
        Checks.notNull("run options", options);
        // Refuse before allocating: a scene that cannot fit should end now with advice, not in out-of-memory.
        MemoryEstimate.of(scene).requireFits(Runtime.getRuntime().maxMemory());
        double dx = scene.cellSize();
        List<Body> bodies = scene.bodies();
        MaterialLaw[] laws = new MaterialLaw[bodies.size()];
        DamageModel[] damage = new DamageModel[bodies.size()];
        List<String> names = new ArrayList<>();
        double c = 0;
        for (int b = 0; b < bodies.size(); b++) {
            laws[b] = bodies.get(b).material();
            damage[b] = bodies.get(b).damage() == null ? null : bodies.get(b).damage().resolvedFor(dx);
            names.add(bodies.get(b).name());
            c = Math.max(c, laws[b].waveSpeed());
        }
        bodyNames = Collections.unmodifiableList(names);
        store = ParticleSampler.sample(scene);
        declareChannels(laws, damage);
        ParticleSampler.applyInitialChannels(store, bodies);
        double prescribed = 0;
        for (Obstacle o : scene.obstacles()) {
            prescribed = Math.max(prescribed, o.motion().linearSpeed());
        }
        for (Grip g : scene.grips()) {
            prescribed = Math.max(prescribed, g.motion().linearSpeed());
        }
        double speedLimit = Double.isNaN(scene.speedLimit())
                ? Math.max(100.0, Math.max(20 * c, 20 * prescribed)) : scene.speedLimit();
        workers = new Workers(options.threads());
        double[] origin = {scene.domain().minX(), scene.domain().minY(), scene.domain().minZ()};
        BlockLayout layout = new BlockLayout(grid, scene.kernel(), origin[0], origin[1], origin[2], dx);
        GridBoundaries boundaries = new GridBoundaries(scene.domain(), scene.walls(), scene.obstacles(),
                scene.grips(), origin, dx);
        ParticleObstacleContact particleContact = new ParticleObstacleContact(scene.obstacles(), origin, dx);
        Stencil[] stencils = StepContext.stencils(scene, workers.threads());
        FieldRouting routing = scene.separates() ? new DamageGradientPartition(store, layout, grid, stencils,
                workers, scene.separationThreshold()) : FieldRouting.SINGLE;
        fields = new FieldSet(grid, routing.fieldCount());
        ctx = new StepContext(scene, store, grid, layout, fields, routing, boundaries, particleContact, workers,
                laws, damage, bodyNames, stencils);
        implicit = resolveImplicit(scene, laws, c, Math.max(prescribed, currentMaxSpeed()));
        DivergenceGuard guard = new DivergenceGuard(scene, speedLimit);
        integrator = implicit ? new ImplicitStep(ctx, guard) : new ExplicitStep(ctx, guard);
        policy = new TimeStepPolicy(scene, c, implicit, prescribed);
        meter = new DiagnosticsMeter(ctx, integrator.constitutive());
        particleView = new StoreView(store);
        gridView = new FieldGridView(grid, fields, origin, dx);
        integrator.setMaxSpeed(currentMaxSpeed());
        ctx.tallies().setInitialEnergy(meter.measure(0).totalEnergy());
    }

    private void declareChannels(MaterialLaw[] laws, DamageModel[] damage) {
        for (int b = 0; b < laws.length; b++) {
            for (ChannelSpec spec : laws[b].channels()) {
                store.declare(spec);
            }
            if (damage[b] != null) {
                boolean hasDamage = false;
                for (ChannelSpec spec : damage[b].channels()) {
                    store.declare(spec);
                    hasDamage |= spec.name().equals(DamageModel.DAMAGE) && spec.width() == 1;
                }
                if (!hasDamage) {
                    throw new InvalidInputException(FrayMessage.INCONSISTENT, "damage model \""
                            + damage[b].name() + "\"", "must declare the channel \"" + DamageModel.DAMAGE
                            + "\" of width 1");
                }
            }
        }
    }

    // ------------------------------------------------------------------ listeners

    /** @param l listener to add; called after every step, in the order added */
    public void addStepListener(StepListener l) {
        stepListeners.add(Checks.notNull("step listener", l));
    }

    /** @return the step listeners (unmodifiable) */
    public List<StepListener> getStepListeners() {
        return Collections.unmodifiableList(stepListeners);
    }

    /** Removes all step listeners. */
    public void clearStepListeners() {
        stepListeners.clear();
    }

    /** @param l frame listener to add; called at frame times after the step listeners */
    public void addFrameListener(FrameListener l) {
        frameListeners.add(Checks.notNull("frame listener", l));
    }

    /** @return the frame listeners (unmodifiable) */
    public List<FrameListener> getFrameListeners() {
        return Collections.unmodifiableList(frameListeners);
    }

    /** Removes all frame listeners. */
    public void clearFrameListeners() {
        frameListeners.clear();
    }

    /** Asks a running {@link #run} to stop after the current step; safe to call from any thread. */
    public void requestStop() {
        stopRequested = true;
    }

    // ------------------------------------------------------------------ run loop

    /**
     * Advances the simulation by a duration, sending step and frame events.
     *
     * @param duration simulated seconds to advance, &gt; 0
     * @return what the run did
     * @throws SimulationDivergedException if the state becomes non-finite or a speed runs away
     */
    public RunSummary run(double duration) {
        Checks.positive("duration (s)", duration);
        return runUntil(time() + duration);
    }

    /**
     * Advances by whole frames.
     *
     * @param frames number of frames, &gt;= 1
     * @return what the run did
     */
    public RunSummary runFrames(int frames) {
        Checks.inRange("frames", frames, 1, Integer.MAX_VALUE);
        // The end is the frame time itself, not time + (frame time - time), which can miss it by an ulp.
        return runUntil(frameTime(frame + frames));
    }

    private RunSummary runUntil(double endTime) {
        long startStep = ctx.step();
        double startTime = ctx.time();
        long wall0 = System.nanoTime();
        stopRequested = false;
        boolean stopped = false;
        for (StepListener l : stepListeners) {
            l.init(this, endTime);
        }
        try {
            if (!frameZeroSent) {
                frameZeroSent = true;
                for (FrameListener f : frameListeners) {
                    f.onFrame(0, ctx.time(), this, false);
                }
            }
            while (!reached(endTime)) {
                if (stopRequested) {
                    stopped = true;
                    break;
                }
                long t0 = System.nanoTime();
                boolean landed = advance(endTime);
                StepInfo info = new StepInfo(ctx.step() - 1, ctx.time(), dt, (System.nanoTime() - t0) * 1e-9, this);
                for (StepListener l : stepListeners) {
                    if (l.afterStep(info) == StepAction.STOP) {
                        stopped = true;
                    }
                }
                stopped |= stopRequested;
                if (landed) {
                    boolean last = stopped || reached(endTime);
                    for (FrameListener f : frameListeners) {
                        f.onFrame(frame, ctx.time(), this, last);
                    }
                }
                if (stopped) {
                    break;
                }
            }
        } finally {
            for (StepListener l : stepListeners) {
                l.finish(this);
            }
            for (FrameListener f : frameListeners) {
                f.finish(this);
            }
        }
        return new RunSummary(ctx.step() - startStep, ctx.time() - startTime, (System.nanoTime() - wall0) * 1e-9,
                stopped);
    }

    private boolean reached(double endTime) {
        return ctx.time() >= endTime - 1e-12 * Math.max(1.0, Math.abs(endTime));
    }

    private double frameTime(int k) {
        return k / scene.frameRate();
    }

    /**
     * Takes one step without sending events (frame times are still landed on exactly).
     *
     * @return the time step taken, s
     */
    public double step() {
        advance(Double.POSITIVE_INFINITY);
        return dt;
    }

    /** @return whether the step landed on a frame time */
    private boolean advance(double endTime) {
        double time = ctx.time();
        double next = frameTime(frame + 1);
        double target = Math.min(next, endTime);
        double remaining = target - time;
        double h = policy.next(integrator.maxSpeed(), remaining);
        boolean landing = h == remaining;
        if (!(h > 0) || !Double.isFinite(h)) {
            throw new SimulationDivergedException("time step " + h + " s", bodyNames.get(0), -1, ctx.step(), time,
                    "check material stiffness and density, and the cell size");
        }
        dt = h;
        integrator.step(h);
        boolean onFrame = landing && target == next;
        ctx.setClock(landing ? target : time + h, ctx.step() + 1);
        if (onFrame) {
            frame++;
        }
        return onFrame;
    }

    /**
     * Which integrator runs: the scene's choice, with auto resolved to implicit when every law provides its stress
     * differential, separation is off, and the elastic step limit is well below the motion limit.
     */
    private static boolean resolveImplicit(Scene scene, MaterialLaw[] laws, double waveSpeed, double moved) {
        switch (scene.integration()) {
            case IMPLICIT:
                return true;
            case EXPLICIT:
                return false;
            default:
                if (scene.separates()) {
                    return false;
                }
                for (MaterialLaw l : laws) {
                    if (!l.hasStressDifferential()) {
                        return false;
                    }
                }
                return TimeStepPolicy.prefersImplicit(waveSpeed, TimeStepPolicy.motionSpeed(scene, moved));
        }
    }

    /** @return whether this simulation integrates implicitly (the scene's choice, with auto resolved) */
    public boolean implicit() {
        return implicit;
    }

    /** @return the implicit solver's running counts (iterations, halvings), or null for an explicit run */
    public ImplicitStatistics implicitStatistics() {
        return integrator.statistics();
    }

    private double currentMaxSpeed() {
        double[] v = store.velocity();
        double best = 0;
        for (int p = 0; p < store.size(); p++) {
            double s2 = v[3 * p] * v[3 * p] + v[3 * p + 1] * v[3 * p + 1] + v[3 * p + 2] * v[3 * p + 2];
            best = Math.max(best, s2);
        }
        return Math.sqrt(best);
    }

    // ------------------------------------------------------------------ views

    /**
     * Wall time spent per phase since the simulation was created, s: sort (sorting and block activation), stress
     * (material and damage laws, summed over workers and scaled to wall time), scatter (P2G without the stress),
     * grid (grid update and boundaries), solve (non-local damage), gather (G2P, advection, return mapping).
     *
     * @return phase names mapped to seconds, in step order
     */
    public Map<String, Double> phaseSeconds() {
        return integrator.phaseSeconds();
    }

    @Override
    public double time() {
        return ctx.time();
    }

    @Override
    public long stepCount() {
        return ctx.step();
    }

    @Override
    public double dt() {
        return dt;
    }

    /** @return the current frame index (frames whose time has been reached) */
    public int frame() {
        return frame;
    }

    @Override
    public Scene scene() {
        return scene;
    }

    @Override
    public List<String> bodyNames() {
        return bodyNames;
    }

    @Override
    public ParticleView particles() {
        return particleView;
    }

    /** @return the background grid after the last step (read-only; valid until the next step) */
    public GridView grid() {
        return gridView;
    }

    /** @return conjugate-gradient iterations of the last phase-field solve (0 without phase-field damage) */
    public int phaseFieldIterations() {
        return integrator.phaseFieldIterations();
    }

    /** @return relative residual reached by the last phase-field solve (0 without phase-field damage) */
    public double phaseFieldResidual() {
        return integrator.phaseFieldResidual();
    }

    /** @return the largest elastic wave speed over the bodies, m/s, used by the time-step bound */
    public double maxWaveSpeed() {
        return policy.waveSpeed();
    }

    /**
     * The time step the solver would take now if no frame time were near: CFL dx / (max speed + wave speed).
     *
     * @return the step, s
     */
    public double estimatedTimeStep() {
        return policy.unclipped(integrator.maxSpeed());
    }

    @Override
    public long gridMemoryBytes() {
        return grid.memoryBytes() + fields.extraBytes() + ctx.boundaries().memoryBytes()
                + ctx.routing().memoryBytes();
    }

    @Override
    public long particleMemoryBytes() {
        return store.memoryBytes();
    }

    @Override
    public Diagnostics diagnostics() {
        return meter.measure(dt);
    }

    // ------------------------------------------------------------------ state

    /**
     * Captures the run state between steps, for checkpoints. Copies every array.
     *
     * @return the state
     */
    public SimulationState captureState() {
        Map<String, double[]> ch = new LinkedHashMap<>();
        for (String name : store.channelNames()) {
            ch.put(name, store.channel(name).clone());
        }
        BlockLayout layout = ctx.layout();
        boolean sort = layout.sortNeeded();
        double[] tallies = ctx.tallies().toArray();
        return new SimulationState(ctx.time(), ctx.step(), dt, frame, frameZeroSent, integrator.maxSpeed(),
                tallies[0], ch, store.body().clone(), store.id().clone(), sort ? new long[0] : layout.keysCopy(),
                sort ? new int[0] : layout.startsCopy(), java.util.Arrays.copyOfRange(tallies, 1, tallies.length));
    }

    /**
     * Resumes from a captured state. The simulation must have been made from the same scene; the next steps are
     * then bitwise identical to those of the run that was captured.
     *
     * @param s a state from {@link #captureState()} of a simulation of the same scene
     * @throws InvalidInputException if particle count or channels do not match
     */
    public void restoreState(SimulationState s) {
        Checks.notNull("simulation state", s);
        store.restore(s.channels(), s.body(), s.id());
        restoreBlocks(s.blockKeys(), s.blockStarts());
        ctx.setClock(s.time(), s.step());
        dt = s.dt();
        frame = s.frame();
        frameZeroSent = s.frameZeroSent();
        integrator.setMaxSpeed(s.maxSpeed());
        double[] t = new double[1 + s.tallies().length];
        t[0] = s.boundaryWork();
        System.arraycopy(s.tallies(), 0, t, 1, s.tallies().length);
        ctx.tallies().restore(t);
    }

    private void restoreBlocks(long[] keysIn, int[] startsIn) {
        BlockLayout layout = ctx.layout();
        int nb = keysIn.length;
        if (nb == 0 && startsIn.length == 0) {
            layout.requestSort();
            return;
        }
        if (!layout.restore(keysIn, startsIn, store, workers)) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "saved particle blocks",
                    "the block table does not fit the saved particles (" + nb + " blocks for " + store.size()
                            + " particles)");
        }
    }

    /** Stops the worker threads. The simulation cannot run afterwards. */
    @Override
    public void close() {
        workers.close();
    }
}

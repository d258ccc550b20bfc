package dev.fray.core.sim;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Contact;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.boundary.Shape;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.error.SimulationDivergedException;
import dev.fray.core.grid.KeyIndex;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.parallel.Workers;
import dev.fray.core.particles.ChannelField;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.particles.ParticleStore;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import java.util.SplittableRandom;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * An explicit MLS-MPM simulation with APIC transfers on a sparse blocked grid (Hu et al. 2018; Jiang et al. 2015).
 * Each step: sort particles by grid block, activate blocks, scatter mass, momentum and stress force (P2G), update
 * grid velocities (gravity, damping, grips, walls, obstacles), gather velocities and the affine matrix (G2P),
 * advect particles and update F.
 *
 * <p>The scatter runs in 8 colour phases by block-coordinate parity, each block's particles in sorted order, so
 * no two threads write the same node and the sum at every node is formed in the same order for any thread count:
 * results are bitwise identical for 1 or N threads. Not thread-safe: drive one simulation from one thread; only
 * {@link #requestStop()} may be called from another.
 */
public final class Simulation implements SimulationView, AutoCloseable {
    static final String GRIP_CHANNEL = "grip";
    private static final int DIAG_CHUNK = 4096;
    static final int GRID_TASK_BLOCKS = 16;

    final Scene scene;
    final ParticleStore store;
    final SparseGrid grid = new SparseGrid();
    final Workers workers;
    final MaterialLaw[] laws;
    final DamageModel[] damage;
    private final boolean phaseField;
    private final boolean anyProjection;
    private final PhaseFieldSolve phaseFieldSolve;
    /** Two velocity fields per node near cracks, or null when the scene does not ask for it. */
    private final Separation separation;
    private final List<String> bodyNames;
    final Kernel kernel;
    final double dx;
    final double invDx;
    final double ox, oy, oz;
    private final double maxWaveSpeed;
    private final double speedLimit;
    final Scratch[] scratch;
    private final List<StepListener> stepListeners = new CopyOnWriteArrayList<>();
    private final List<FrameListener> frameListeners = new CopyOnWriteArrayList<>();
    private final ParticleView particleView = new View();
    private volatile boolean stopRequested;

    // Sorting and block bookkeeping, reused every step.
    private final long[] keys;
    private final int[] order;
    private int[] ints;
    int blockCount;
    long[] blockKeys = new long[64];
    int[] blockStart = new int[65];
    private int[] blockCounts = new int[64];
    private int[] blockRank = new int[64];
    /** Grid block of each of the 27 blocks around a particle block (offsets -1, 0, 1 per axis, x slowest). */
    int[] neighbours = new int[64 * NEIGHBOURS];
    /** Per particle block: smallest and largest stencil base of its particles, local coordinates (x, y, z). */
    private int[] blockRange = new int[64 * 6];
    private boolean[] blockLeft = new boolean[64];
    /** Whether a particle left the reach of its block since the last sort, so the next step must sort. */
    private boolean sortNeeded = true;
    final int[] colourStart = new int[9];
    private final int[] colourCursor = new int[9];
    int[] colourBlocks = new int[64];
    private double[] blockMaxSpeed = new double[64];
    private int[] blockBad = new int[64];
    private int[] blockFastest = new int[64];
    private final KeyIndex lookup = new KeyIndex();
    private final double[] obstaclePose;
    private final double[] gripPose;

    private double time;
    private long step;
    private double dt;
    private int frame;
    private boolean frameZeroSent;
    private double maxSpeed;

    /**
     * Samples the bodies into particles and prepares the solver.
     *
     * @param scene the scene
     * @throws InvalidInputException if a body holds no particle
     */
    public Simulation(Scene scene) {
        this.scene = scene;
        this.kernel = scene.kernel();
        this.dx = scene.cellSize();
        this.invDx = 1.0 / dx;
        Bounds d = scene.domain();
        this.ox = d.minX();
        this.oy = d.minY();
        this.oz = d.minZ();
        List<Body> bodies = scene.bodies();
        laws = new MaterialLaw[bodies.size()];
        damage = new DamageModel[bodies.size()];
        List<String> names = new ArrayList<>();
        double c = 0;
        boolean pf = false;
        for (int b = 0; b < bodies.size(); b++) {
            laws[b] = bodies.get(b).material();
            damage[b] = bodies.get(b).damage() == null ? null : bodies.get(b).damage().resolvedFor(dx);
            names.add(bodies.get(b).name());
            c = Math.max(c, laws[b].waveSpeed());
            pf |= damage[b] != null && damage[b].usesPhaseField();
        }
        phaseField = pf;
        boolean projects = false;
        for (MaterialLaw law : laws) {
            projects |= law.projectsDeformation();
        }
        anyProjection = projects;
        bodyNames = Collections.unmodifiableList(names);
        maxWaveSpeed = c;
        store = sample(scene);
        for (int b = 0; b < bodies.size(); b++) {
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
        applyInitialChannels(bodies);
        int n = store.size();
        keys = new long[n];
        order = new int[n];
        ints = new int[n];
        obstaclePose = new double[12 * scene.obstacles().size()];
        obstaclePoseEnd = new double[12 * scene.obstacles().size()];
        obstacleBoxEnd = new double[6 * scene.obstacles().size()];
        gripPose = new double[12 * scene.grips().size()];
        double prescribed = 0;
        for (Obstacle o : scene.obstacles()) {
            prescribed = Math.max(prescribed, o.motion().linearSpeed());
        }
        for (Grip g : scene.grips()) {
            prescribed = Math.max(prescribed, g.motion().linearSpeed());
        }
        speedLimit = Double.isNaN(scene.speedLimit())
                ? Math.max(100.0, Math.max(20 * maxWaveSpeed, 20 * prescribed)) : scene.speedLimit();
        workers = new Workers(scene.threads());
        scratch = new Scratch[scene.threads()];
        for (int i = 0; i < scratch.length; i++) {
            scratch[i] = new Scratch();
        }
        maxSpeed = currentMaxSpeed();
        phaseFieldSolve = phaseField ? new PhaseFieldSolve(this) : null;
        separation = scene.separates() ? new Separation(this) : null;
    }

    private void applyInitialChannels(List<Body> bodies) {
        double[] x = store.position();
        int[] bodyOf = store.body();
        for (int b = 0; b < bodies.size(); b++) {
            for (java.util.Map.Entry<String, ChannelField> e : bodies.get(b).initialChannels().entrySet()) {
                ChannelSpec spec = store.spec(e.getKey());
                if (spec == null) {
                    throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "channel of body \""
                            + bodies.get(b).name() + "\"", e.getKey(), store.channelNames());
                }
                int w = spec.width();
                double[] a = store.channel(e.getKey());
                double[] out = new double[w];
                for (int p = 0; p < store.size(); p++) {
                    if (bodyOf[p] != b) {
                        continue;
                    }
                    Arrays.fill(out, spec.initial());
                    e.getValue().value(x[3 * p], x[3 * p + 1], x[3 * p + 2], out);
                    for (int k = 0; k < w; k++) {
                        if (!Double.isFinite(out[k])) {
                            throw new InvalidInputException(FrayMessage.NOT_FINITE, "initial value of channel \""
                                    + e.getKey() + "\" of body \"" + bodies.get(b).name() + "\" at particle " + p,
                                    out[k]);
                        }
                    }
                    System.arraycopy(out, 0, a, w * p, w);
                }
            }
        }
    }

    private ParticleStore sample(Scene scene) {
        List<Body> bodies = scene.bodies();
        double[][] pos = new double[bodies.size()][];
        int[] counts = new int[bodies.size()];
        int total = 0;
        for (int b = 0; b < bodies.size(); b++) {
            Body body = bodies.get(b);
            double s = Double.isNaN(body.spacing()) ? 0.5 * dx : body.spacing();
            Bounds bb = body.shape().bounds();
            long nx = Math.max(1, (long) Math.floor((bb.maxX() - bb.minX()) / s + 1e-9));
            long ny = Math.max(1, (long) Math.floor((bb.maxY() - bb.minY()) / s + 1e-9));
            long nz = Math.max(1, (long) Math.floor((bb.maxZ() - bb.minZ()) / s + 1e-9));
            if (nx * ny * nz > 200_000_000L) {
                throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "body \"" + body.name()
                        + "\" lattice points", nx * ny * nz, "<= 2e8 (use a larger spacing)");
            }
            // Centre the lattice in the bounds so a box is filled symmetrically.
            double x0 = 0.5 * (bb.minX() + bb.maxX()) - 0.5 * (nx - 1) * s;
            double y0 = 0.5 * (bb.minY() + bb.maxY()) - 0.5 * (ny - 1) * s;
            double z0 = 0.5 * (bb.minZ() + bb.maxZ()) - 0.5 * (nz - 1) * s;
            SplittableRandom rng = new SplittableRandom(body.seed());
            double j = body.jitter() * s;
            Shape shape = body.shape();
            double[] out = new double[3 * 1024];
            int k = 0;
            for (long ix = 0; ix < nx; ix++) {
                for (long iy = 0; iy < ny; iy++) {
                    for (long iz = 0; iz < nz; iz++) {
                        double x = x0 + ix * s + j * (2 * rng.nextDouble() - 1);
                        double y = y0 + iy * s + j * (2 * rng.nextDouble() - 1);
                        double z = z0 + iz * s + j * (2 * rng.nextDouble() - 1);
                        if (shape.distance(x, y, z) <= 0) {
                            if (3 * k + 3 > out.length) {
                                out = Arrays.copyOf(out, out.length * 2);
                            }
                            out[3 * k] = x;
                            out[3 * k + 1] = y;
                            out[3 * k + 2] = z;
                            k++;
                        }
                    }
                }
            }
            if (k == 0) {
                throw new InvalidInputException(FrayMessage.BODY_EMPTY, body.name(), s);
            }
            pos[b] = out;
            counts[b] = k;
            total = Math.addExact(total, k);
        }
        ParticleStore ps = new ParticleStore(total);
        boolean grips = !scene.grips().isEmpty();
        if (grips) {
            ps.declare(new ChannelSpec(GRIP_CHANNEL, 1, -1, "1", "index of the grip holding the particle, -1 none"));
        }
        double[] x = ps.position();
        double[] v = ps.velocity();
        double[] m = ps.mass();
        double[] vol = ps.volume();
        int[] bodyOf = ps.body();
        double[] gripOf = grips ? ps.channel(GRIP_CHANNEL) : null;
        double[] field = new double[3];
        int p = 0;
        for (int b = 0; b < bodies.size(); b++) {
            Body body = bodies.get(b);
            double s = Double.isNaN(body.spacing()) ? 0.5 * dx : body.spacing();
            double v0 = s * s * s;
            double rho = body.material().density();
            Bounds bb = body.shape().bounds();
            double cx = 0.5 * (bb.minX() + bb.maxX()), cy = 0.5 * (bb.minY() + bb.maxY());
            double cz = 0.5 * (bb.minZ() + bb.maxZ());
            double[] lv = body.linearVelocity();
            double[] av = body.angularVelocity();
            for (int k = 0; k < counts[b]; k++, p++) {
                double px = pos[b][3 * k], py = pos[b][3 * k + 1], pz = pos[b][3 * k + 2];
                x[3 * p] = px;
                x[3 * p + 1] = py;
                x[3 * p + 2] = pz;
                double rx = px - cx, ry = py - cy, rz = pz - cz;
                double vx = lv[0] + av[1] * rz - av[2] * ry;
                double vy = lv[1] + av[2] * rx - av[0] * rz;
                double vz = lv[2] + av[0] * ry - av[1] * rx;
                if (body.velocityField() != null) {
                    field[0] = field[1] = field[2] = 0;
                    body.velocityField().velocity(px, py, pz, field);
                    vx += field[0];
                    vy += field[1];
                    vz += field[2];
                }
                v[3 * p] = vx;
                v[3 * p + 1] = vy;
                v[3 * p + 2] = vz;
                m[p] = rho * v0;
                vol[p] = v0;
                bodyOf[p] = b;
                if (grips) {
                    List<Grip> gl = scene.grips();
                    for (int g = 0; g < gl.size(); g++) {
                        if (gl.get(g).body().equals(body.name())
                                && gl.get(g).region().distance(px, py, pz) <= 0) {
                            gripOf[p] = g;
                            break;
                        }
                    }
                }
            }
        }
        return ps;
    }

    // ------------------------------------------------------------------ listeners

    /** @param l listener to add; called after every step, in the order added */
    public void addStepListener(StepListener l) {
        stepListeners.add(l);
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
        frameListeners.add(l);
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
        dev.fray.core.error.Checks.positive("duration (s)", duration);
        return runUntil(time + duration);
    }

    private RunSummary runUntil(double endTime) {
        long startStep = step;
        double startTime = time;
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
                    f.onFrame(0, time, this, false);
                }
            }
            while (!reached(endTime)) {
                if (stopRequested) {
                    stopped = true;
                    break;
                }
                long t0 = System.nanoTime();
                boolean landed = advance(endTime);
                StepInfo info = new StepInfo(step - 1, time, dt, (System.nanoTime() - t0) * 1e-9, this);
                for (StepListener l : stepListeners) {
                    if (l.afterStep(info) == StepAction.STOP) {
                        stopped = true;
                    }
                }
                stopped |= stopRequested;
                if (landed) {
                    boolean last = stopped || reached(endTime);
                    for (FrameListener f : frameListeners) {
                        f.onFrame(frame, time, this, last);
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
        return new RunSummary(step - startStep, time - startTime, (System.nanoTime() - wall0) * 1e-9, stopped);
    }

    /**
     * Advances by whole frames.
     *
     * @param frames number of frames, &gt;= 1
     * @return what the run did
     */
    public RunSummary runFrames(int frames) {
        dev.fray.core.error.Checks.inRange("frames", frames, 1, Integer.MAX_VALUE);
        // The end is the frame time itself, not time + (frame time - time), which can miss it by an ulp.
        return runUntil(frameTime(frame + frames));
    }

    private boolean reached(double endTime) {
        return time >= endTime - 1e-12 * Math.max(1.0, Math.abs(endTime));
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
        double next = frameTime(frame + 1);
        double target = Math.min(next, endTime);
        double h;
        if (!Double.isNaN(scene.fixedTimeStep())) {
            h = scene.fixedTimeStep();
        } else {
            h = scene.cfl() * dx / (maxSpeed + maxWaveSpeed);
        }
        h = Math.min(h, scene.maxTimeStep());
        double remaining = target - time;
        boolean landing = false;
        if (h >= remaining * (1 - 1e-9)) {
            h = remaining;
            landing = true;
        } else if (Double.isNaN(scene.fixedTimeStep()) && h > 0.5 * remaining) {
            // Split what is left in two equal steps instead of leaving a sliver.
            h = 0.5 * remaining;
        }
        if (!(h > 0) || !Double.isFinite(h)) {
            throw new SimulationDivergedException("time step " + h + " s", bodyNames.get(0), -1, step, time,
                    "check material stiffness and density, and the cell size");
        }
        dt = h;
        stepOnce(h);
        step++;
        boolean onFrame = landing && target == next;
        time = landing ? target : time + h;
        if (onFrame) {
            frame++;
        }
        return onFrame;
    }

    // ------------------------------------------------------------------ the step

    private void stepOnce(double h) {
        long t0 = System.nanoTime();
        if (sortNeeded) {
            sortParticles();
            activateBlocks();
            sortNeeded = false;
        }
        zeroGrid();
        long t1 = System.nanoTime();
        if (separation != null) {
            separation.partition();
        }
        scatter(h);
        long t2 = System.nanoTime();
        updateGrid(h);
        long t3 = System.nanoTime();
        if (phaseFieldSolve != null) {
            phaseFieldSolve.solve(h);
        }
        long t3b = System.nanoTime();
        gather(h);
        checkDivergence(h);
        long t4 = System.nanoTime();
        phaseNanos[0] += t1 - t0;
        phaseNanos[2] += t2 - t1;
        phaseNanos[3] += t3 - t2;
        phaseNanos[4] += t3b - t3;
        phaseNanos[5] += t4 - t3b;
    }

    /**
     * Wall time spent per phase since the simulation was created, s: sort (sorting and block activation), stress
     * (material and damage laws, summed over workers and scaled to wall time), scatter (P2G without the stress),
     * grid (grid update and boundaries), solve (non-local damage), gather (G2P, advection, return mapping).
     *
     * @return phase names mapped to seconds, in step order
     */
    public java.util.Map<String, Double> phaseSeconds() {
        long stressCpu = 0;
        for (Scratch sc : scratch) {
            stressCpu += sc.stressNanos;
        }
        // Stress runs inside the scatter on all workers; attribute its share of the scatter's wall time.
        long scatterCpu = 0;
        for (Scratch sc : scratch) {
            scatterCpu += sc.scatterNanos;
        }
        double stressShare = scatterCpu > 0 ? (double) stressCpu / scatterCpu : 0;
        java.util.Map<String, Double> m = new java.util.LinkedHashMap<>();
        m.put("sort", phaseNanos[0] * 1e-9);
        m.put("stress", phaseNanos[2] * stressShare * 1e-9);
        m.put("scatter", phaseNanos[2] * (1 - stressShare) * 1e-9);
        m.put("grid", phaseNanos[3] * 1e-9);
        m.put("solve", phaseNanos[4] * 1e-9);
        m.put("gather", phaseNanos[5] * 1e-9);
        return m;
    }

    private final long[] phaseNanos = new long[6];

    private int blockOf(double xi) {
        return kernel.base(xi) >> 2;
    }

    /**
     * Sorts the particles by block: counting sort on the block of each particle's first stencil node, stable so
     * that particles keep their order within a block. Run only when some particle has left the reach of its block
     * (see {@link #MARGIN}): moving every particle array costs as much as a scatter.
     */
    private void sortParticles() {
        int n = store.size();
        double[] x = store.position();
        // Keys per particle: the block holding the particle's first stencil node.
        int tasks = (n + DIAG_CHUNK - 1) / DIAG_CHUNK;
        workers.forEach(tasks, (w, t) -> {
            int a = t * DIAG_CHUNK;
            int b = Math.min(n, a + DIAG_CHUNK);
            for (int p = a; p < b; p++) {
                keys[p] = SparseGrid.key(blockOf((x[3 * p] - ox) * invDx), blockOf((x[3 * p + 1] - oy) * invDx),
                        blockOf((x[3 * p + 2] - oz) * invDx));
            }
        });
        // Dense ids in first-appearance order, then ranks by key so blocks are in key order.
        lookup.clear();
        int[] ids = ints;
        long lastKey = Long.MIN_VALUE;
        int lastId = -1;
        for (int p = 0; p < n; p++) {
            long k = keys[p];
            if (k != lastKey) {
                lastId = lookup.id(k);
                lastKey = k;
            }
            ids[p] = lastId;
        }
        blockCount = lookup.size();
        ensureBlockCapacity(blockCount);
        long[] uniq = lookup.keys();
        System.arraycopy(uniq, 0, blockKeys, 0, blockCount);
        Arrays.sort(blockKeys, 0, blockCount);
        for (int i = 0; i < blockCount; i++) {
            blockRank[i] = Arrays.binarySearch(blockKeys, 0, blockCount, uniq[i]);
        }
        Arrays.fill(blockCounts, 0, blockCount, 0);
        for (int p = 0; p < n; p++) {
            blockCounts[blockRank[ids[p]]]++;
        }
        blockStart[0] = 0;
        for (int r = 0; r < blockCount; r++) {
            blockStart[r + 1] = blockStart[r] + blockCounts[r];
        }
        System.arraycopy(blockStart, 0, blockCounts, 0, blockCount);
        for (int p = 0; p < n; p++) {
            order[blockCounts[blockRank[ids[p]]]++] = p;
        }
        store.permute(order, workers);
    }

    /**
     * From the particle blocks (keys and starts): activates the grid blocks their stencils reach (each particle
     * block and its 26 neighbours, since particles may drift {@link #MARGIN} node beyond their block), sorts the
     * blocks into colour classes, and finds each block's range of stencil bases.
     *
     * @return false if some particle lies beyond the reach of its block (the table does not fit the particles)
     */
    private boolean activateBlocks() {
        grid.clear();
        for (int r = 0; r < blockCount; r++) {
            long k = blockKeys[r];
            int bx = SparseGrid.keyX(k), by = SparseGrid.keyY(k), bz = SparseGrid.keyZ(k);
            for (int nbr = 0; nbr < NEIGHBOURS; nbr++) {
                neighbours[NEIGHBOURS * r + nbr] = grid.activate(SparseGrid.key(bx + nbr / 9 - 1,
                        by + (nbr / 3) % 3 - 1, bz + nbr % 3 - 1));
            }
        }
        grid.allocateNodes();
        workers.forEach(blockCount, (w, r) -> blockLeft[r] = !measureBlock(r));
        boolean fits = true;
        for (int r = 0; r < blockCount; r++) {
            fits &= !blockLeft[r];
        }
        // Colour classes by block parity.
        int[] cc = colourCursor;
        Arrays.fill(cc, 0);
        for (int r = 0; r < blockCount; r++) {
            cc[colour(blockKeys[r]) + 1]++;
        }
        for (int c = 0; c < 8; c++) {
            cc[c + 1] += cc[c];
        }
        System.arraycopy(cc, 0, colourStart, 0, 9);
        for (int r = 0; r < blockCount; r++) {
            colourBlocks[cc[colour(blockKeys[r])]++] = r;
        }
        return fits;
    }

    private void zeroGrid() {
        int gb = grid.blockCount();
        if (separation != null) {
            separation.ensureNodes(gb * SparseGrid.NODES_PER_BLOCK);
        }
        workers.forEach((gb + GRID_TASK_BLOCKS - 1) / GRID_TASK_BLOCKS, (w, t) -> {
            grid.zero(t * GRID_TASK_BLOCKS, Math.min(gb, (t + 1) * GRID_TASK_BLOCKS));
            if (separation != null) {
                separation.zero(t * GRID_TASK_BLOCKS, Math.min(gb, (t + 1) * GRID_TASK_BLOCKS));
            }
        });
    }

    /**
     * How far, in nodes, a particle's first stencil node may lie outside its block before the particles are sorted
     * again. With the block-local buffer of {@link #LOCAL} nodes starting one node below the block, blocks of one
     * colour (8 nodes apart) still write disjoint nodes.
     */
    static final int MARGIN = 1;

    /** Neighbour blocks held per particle block. */
    static final int NEIGHBOURS = 27;

    /** Local coordinate (0 to LOCAL - 1) of block-relative node coordinate 0: the buffer starts MARGIN below. */
    static int localOrigin(int blockCoord) {
        return 4 * blockCoord - MARGIN;
    }

    /** Largest local stencil base a particle may have and still be scattered from its block's buffer. */
    private int maxLocalBase() {
        return LOCAL - kernel.support();
    }

    /**
     * Grid node at local coordinates (lx, ly, lz), each in [0, LOCAL), of particle block r's buffer.
     */
    int node(int r, int lx, int ly, int lz) {
        int gx = lx - MARGIN, gy = ly - MARGIN, gz = lz - MARGIN;
        int nbr = 9 * ((gx >> 2) + 1) + 3 * ((gy >> 2) + 1) + (gz >> 2) + 1;
        return (neighbours[NEIGHBOURS * r + nbr] << 6) + ((gx & 3) << 4) + ((gy & 3) << 2) + (gz & 3);
    }

    /**
     * Records the range of local stencil bases of block r's particles.
     *
     * @return false if a particle lies beyond the block's reach
     */
    private boolean measureBlock(int r) {
        long key = blockKeys[r];
        int baseX = localOrigin(SparseGrid.keyX(key)), baseY = localOrigin(SparseGrid.keyY(key));
        int baseZ = localOrigin(SparseGrid.keyZ(key));
        double[] x = store.position();
        int loX = LOCAL, loY = LOCAL, loZ = LOCAL, hiX = -1, hiY = -1, hiZ = -1;
        for (int p = blockStart[r]; p < blockStart[r + 1]; p++) {
            int bx = kernel.base((x[3 * p] - ox) * invDx) - baseX;
            int by = kernel.base((x[3 * p + 1] - oy) * invDx) - baseY;
            int bz = kernel.base((x[3 * p + 2] - oz) * invDx) - baseZ;
            loX = Math.min(loX, bx);
            loY = Math.min(loY, by);
            loZ = Math.min(loZ, bz);
            hiX = Math.max(hiX, bx);
            hiY = Math.max(hiY, by);
            hiZ = Math.max(hiZ, bz);
        }
        return setRange(r, loX, loY, loZ, hiX, hiY, hiZ);
    }

    private boolean setRange(int r, int loX, int loY, int loZ, int hiX, int hiY, int hiZ) {
        int top = maxLocalBase();
        boolean fits = loX >= 0 && loY >= 0 && loZ >= 0 && hiX <= top && hiY <= top && hiZ <= top;
        int[] br = blockRange;
        br[6 * r] = Math.max(0, loX);
        br[6 * r + 1] = Math.max(0, loY);
        br[6 * r + 2] = Math.max(0, loZ);
        br[6 * r + 3] = Math.min(top, hiX);
        br[6 * r + 4] = Math.min(top, hiY);
        br[6 * r + 5] = Math.min(top, hiZ);
        return fits;
    }

    private static int colour(long key) {
        return ((SparseGrid.keyX(key) & 1) << 2) | ((SparseGrid.keyY(key) & 1) << 1) | (SparseGrid.keyZ(key) & 1);
    }

    private void ensureBlockCapacity(int nb) {
        if (blockKeys.length < nb) {
            int cap = Math.max(nb, blockKeys.length * 2);
            blockKeys = new long[cap];
            blockStart = new int[cap + 1];
            blockCounts = new int[cap];
            blockRank = new int[cap];
            neighbours = new int[NEIGHBOURS * cap];
            blockRange = new int[6 * cap];
            blockLeft = new boolean[cap];
            colourBlocks = new int[cap];
            blockMaxSpeed = new double[cap];
            blockTouches = new boolean[cap];
            blockContactWork = new double[cap];
            blockBad = new int[cap];
            blockFastest = new int[cap];
        }
    }

    private void scatter(double h) {
        for (int c = 0; c < 8; c++) {
            final int from = colourStart[c];
            workers.forEach(colourStart[c + 1] - from, (w, t) -> scatterBlock(scratch[w], colourBlocks[from + t], h));
        }
    }

    private void scatterBlock(Scratch sc, int r, double h) {
        long t0 = System.nanoTime();
        scatterParticles(sc, r, h);
        sc.scatterNanos += System.nanoTime() - t0;
    }

    /** Edge of the block-local node buffer: a block's 4 nodes plus the stencil's reach into the next block. */
    static final int LOCAL = 8;

    private void scatterParticles(Scratch sc, int r, double h) {
        int start = blockStart[r];
        int end = blockStart[r + 1];
        int s = kernel.support();
        int[] body = store.body();
        // Scatter into a dense block-local buffer (mass and momentum per node), then add it to the sparse grid
        // once: the inner loop needs no neighbour lookup and the grid sees one write per node per block.
        double[] loc = sc.local;
        clearLocal(loc, r, s);
        for (int runStart = start; runStart < end; ) {
            int b = body[runStart];
            int runEnd = runStart + 1;
            while (runEnd < end && body[runEnd] == b) {
                runEnd++;
            }
            double[] tau = sc.tau(runEnd - runStart);
            long s0 = System.nanoTime();
            stress(sc, b, runStart, runEnd, h, tau);
            sc.stressNanos += System.nanoTime() - s0;
            if (separation == null) {
                scatterRange(sc, r, h, tau, runStart, runStart, runEnd);
            } else {
                separation.scatterRun(sc, r, h, tau, runStart, runEnd);
            }
            runStart = runEnd;
        }
        if (separation == null) {
            flushLocal(loc, r, s);
        }
    }

    /**
     * Adds the mass, APIC momentum and MLS force of particles [from, to) of block r to the block-local buffer.
     *
     * @param tau     Kirchhoff stress of particles from tauFrom on, 9 per particle
     * @param tauFrom particle whose stress sits at the start of tau
     */
    void scatterRange(Scratch sc, int r, double h, double[] tau, int tauFrom, int from, int to) {
        long key = blockKeys[r];
        int baseX = localOrigin(SparseGrid.keyX(key)), baseY = localOrigin(SparseGrid.keyY(key));
        int baseZ = localOrigin(SparseGrid.keyZ(key));
        int s = kernel.support();
        double dinv = kernel.inverseInertia(dx);
        double[] x = store.position();
        double[] v = store.velocity();
        double[] cm = store.affine();
        double[] mass = store.mass();
        double[] vol = store.volume();
        double[] gripOf = scene.grips().isEmpty() ? null : store.channel(GRIP_CHANNEL);
        double[] loc = sc.local;
        double[] wx = sc.wx, wy = sc.wy, wz = sc.wz;
        for (int p = from; p < to; p++) {
            double xi = (x[3 * p] - ox) * invDx, yi = (x[3 * p + 1] - oy) * invDx;
            double zi = (x[3 * p + 2] - oz) * invDx;
            int bx = kernel.base(xi), by = kernel.base(yi), bz = kernel.base(zi);
            double fx = xi - bx, fy = yi - by, fz = zi - bz;
            kernel.weights(fx, wx, 0);
            kernel.weights(fy, wy, 0);
            kernel.weights(fz, wz, 0);
            double m = mass[p];
            int o = 9 * (p - tauFrom);
            double k = -h * vol[p] * dinv;
            int c9 = 9 * p;
            double a00 = m * cm[c9] + k * tau[o], a01 = m * cm[c9 + 1] + k * tau[o + 1];
            double a02 = m * cm[c9 + 2] + k * tau[o + 2];
            double a10 = m * cm[c9 + 3] + k * tau[o + 3], a11 = m * cm[c9 + 4] + k * tau[o + 4];
            double a12 = m * cm[c9 + 5] + k * tau[o + 5];
            double a20 = m * cm[c9 + 6] + k * tau[o + 6], a21 = m * cm[c9 + 7] + k * tau[o + 7];
            double a22 = m * cm[c9 + 8] + k * tau[o + 8];
            // Momentum at offset d from the particle is m v + A d; write d = (node - f) dx and expand.
            double ex = -fx * dx, ey = -fy * dx, ez = -fz * dx;
            double q0x = m * v[3 * p] + a00 * ex + a01 * ey + a02 * ez;
            double q0y = m * v[3 * p + 1] + a10 * ex + a11 * ey + a12 * ez;
            double q0z = m * v[3 * p + 2] + a20 * ex + a21 * ey + a22 * ez;
            double sx0 = a00 * dx, sx1 = a10 * dx, sx2 = a20 * dx;
            double sy0 = a01 * dx, sy1 = a11 * dx, sy2 = a21 * dx;
            double sz0 = a02 * dx, sz1 = a12 * dx, sz2 = a22 * dx;
            int base = 4 * (((bx - baseX) * LOCAL + (by - baseY)) * LOCAL + (bz - baseZ));
            if (s == 3) {
                // Quadratic stencil with constant trip counts, so the compiler unrolls all 27 nodes.
                for (int i = 0; i < 3; i++) {
                    double wi = wx[i];
                    double qix = q0x + i * sx0, qiy = q0y + i * sx1, qiz = q0z + i * sx2;
                    int oi = base + i * (4 * LOCAL * LOCAL);
                    for (int j = 0; j < 3; j++) {
                        double wij = wi * wy[j];
                        double qjx = qix + j * sy0, qjy = qiy + j * sy1, qjz = qiz + j * sy2;
                        int oj = oi + j * (4 * LOCAL);
                        double w0 = wij * wz[0], w1 = wij * wz[1], w2 = wij * wz[2];
                        loc[oj] += w0 * m;
                        loc[oj + 1] += w0 * qjx;
                        loc[oj + 2] += w0 * qjy;
                        loc[oj + 3] += w0 * qjz;
                        loc[oj + 4] += w1 * m;
                        loc[oj + 5] += w1 * (qjx + sz0);
                        loc[oj + 6] += w1 * (qjy + sz1);
                        loc[oj + 7] += w1 * (qjz + sz2);
                        loc[oj + 8] += w2 * m;
                        loc[oj + 9] += w2 * (qjx + 2 * sz0);
                        loc[oj + 10] += w2 * (qjy + 2 * sz1);
                        loc[oj + 11] += w2 * (qjz + 2 * sz2);
                    }
                }
            } else {
                for (int i = 0; i < s; i++) {
                    for (int j = 0; j < s; j++) {
                        double wij = wx[i] * wy[j];
                        int oj = base + 4 * ((i * LOCAL + j) * LOCAL);
                        for (int l = 0; l < s; l++) {
                            double w = wij * wz[l];
                            int q = oj + 4 * l;
                            loc[q] += w * m;
                            loc[q + 1] += w * (q0x + i * sx0 + j * sy0 + l * sz0);
                            loc[q + 2] += w * (q0y + i * sx1 + j * sy1 + l * sz1);
                            loc[q + 3] += w * (q0z + i * sx2 + j * sy2 + l * sz2);
                        }
                    }
                }
            }
            if (gripOf != null && gripOf[p] >= 0) {
                markGrip(r, (int) gripOf[p], bx - baseX, by - baseY, bz - baseZ, s);
            }
        }
    }

    /** Zeroes the part of the block-local buffer that block r's stencils reach. */
    private void clearLocal(double[] loc, int r, int s) {
        int[] br = blockRange;
        int zFrom = br[6 * r + 2], zTo = br[6 * r + 5] + s;
        for (int i = br[6 * r], iEnd = br[6 * r + 3] + s; i < iEnd; i++) {
            for (int j = br[6 * r + 1], jEnd = br[6 * r + 4] + s; j < jEnd; j++) {
                int o = 4 * ((i * LOCAL + j) * LOCAL);
                Arrays.fill(loc, o + 4 * zFrom, o + 4 * zTo, 0.0);
            }
        }
    }

    /** Adds the block-local buffer to the grid nodes it covers. */
    private void flushLocal(double[] loc, int r, int s) {
        double[] gm = grid.mass();
        double[] gp = grid.momentum();
        int[] br = blockRange;
        for (int i = br[6 * r], iEnd = br[6 * r + 3] + s; i < iEnd; i++) {
            for (int j = br[6 * r + 1], jEnd = br[6 * r + 4] + s; j < jEnd; j++) {
                for (int l = br[6 * r + 2], lEnd = br[6 * r + 5] + s; l < lEnd; l++) {
                    int q = 4 * ((i * LOCAL + j) * LOCAL + l);
                    double m = loc[q];
                    if (m == 0) {
                        continue;
                    }
                    int node = node(r, i, j, l);
                    gm[node] += m;
                    gp[3 * node] += loc[q + 1];
                    gp[3 * node + 1] += loc[q + 2];
                    gp[3 * node + 2] += loc[q + 3];
                }
            }
        }
    }

    /** Tags the stencil nodes of a gripped particle with the smallest grip index touching them. */
    private void markGrip(int r, int g, int lx, int ly, int lz, int s) {
        int[] gg = grid.grip();
        for (int i = lx; i < lx + s; i++) {
            for (int j = ly; j < ly + s; j++) {
                for (int l = lz; l < lz + s; l++) {
                    int node = node(r, i, j, l);
                    if (g < gg[node]) {
                        gg[node] = g;
                    }
                }
            }
        }
    }

    /** Kirchhoff stress of particles [from, to) of body b, degraded by its damage model if it has one. */
    private void stress(Scratch sc, int b, int from, int to, double h, double[] tau) {
        DamageModel dm = damage[b];
        if (dm == null) {
            laws[b].kirchhoffStress(store, from, to, tau);
            return;
        }
        int n = to - from;
        double[] kept = sc.kept(n);
        double[] psiD = sc.psiDegraded(n);
        double[] psiK = sc.psiKept(n);
        double[] g = sc.g(n);
        laws[b].splitKirchhoffStress(dm.tensionSplit(), store, from, to, tau, kept, psiD, psiK);
        dm.update(store, from, to, h, tau, kept, psiD, g);
        for (int i = 0; i < n; i++) {
            double gi = g[i];
            int o = 9 * i;
            for (int k = 0; k < 9; k++) {
                tau[o + k] = gi * tau[o + k] + kept[o + k];
            }
        }
    }

    private void updateGrid(double h) {
        int gb = grid.blockCount();
        double[] g = scene.gravity();
        double gx = g[0] * h, gy = g[1] * h, gz = g[2] * h;
        double decay = Math.exp(-scene.damping() * h);
        List<Obstacle> obstacles = scene.obstacles();
        List<Grip> grips = scene.grips();
        for (int i = 0; i < obstacles.size(); i++) {
            obstacles.get(i).motion().pose(time, scratchPose);
            System.arraycopy(scratchPose, 0, obstaclePose, 12 * i, 12);
        }
        for (int i = 0; i < grips.size(); i++) {
            grips.get(i).motion().pose(time, scratchPose);
            System.arraycopy(scratchPose, 0, gripPose, 12 * i, 12);
        }
        Bounds d = scene.domain();
        List<Contact> walls = scene.walls();
        double[] wallAt = {d.minX(), d.maxX(), d.minY(), d.maxY(), d.minZ(), d.maxZ()};
        double tol = 1e-6 * dx;
        int tasks = (gb + GRID_TASK_BLOCKS - 1) / GRID_TASK_BLOCKS;
        if (boundaryPartial.length < tasks) {
            boundaryPartial = new double[Math.max(tasks, 2 * boundaryPartial.length)];
        }
        workers.forEach(tasks, (w, t) -> {
            Scratch sc = scratch[w];
            int b0 = t * GRID_TASK_BLOCKS, b1 = Math.min(gb, b0 + GRID_TASK_BLOCKS);
            double work = updateNodes(sc, b0, b1, grid.mass(), grid.momentum(), gx, gy, gz, decay, walls, wallAt,
                    tol);
            if (separation != null) {
                work += updateNodes(sc, b0, b1, separation.massB(), separation.momentumB(), gx, gy, gz, decay,
                        walls, wallAt, tol);
                separation.contact(b0, b1);
            }
            boundaryPartial[t] = work;
        });
        double sum = 0;
        for (int t = 0; t < tasks; t++) {
            sum += boundaryPartial[t];
        }
        boundaryWork += sum;
    }

    /**
     * Turns the momenta of one velocity field on grid blocks [b0, b1) into velocities, adds gravity and damping,
     * then applies grips, walls and obstacles.
     *
     * @param gm node masses of the field, kg
     * @param gv node momenta of the field, kg m/s, overwritten with velocities, m/s
     * @return work done by grips and moving obstacles on these nodes, J
     */
    private double updateNodes(Scratch sc, int b0, int b1, double[] gm, double[] gv, double gx, double gy, double gz,
                               double decay, List<Contact> walls, double[] wallAt, double tol) {
        int[] coords = grid.blockCoords();
        List<Obstacle> obstacles = scene.obstacles();
        List<Grip> grips = scene.grips();
        double work = 0;
        int[] gg = grid.grip();
        double[] nrm = sc.normal;
        for (int b = b0; b < b1; b++) {
            int bx = 4 * coords[3 * b], by = 4 * coords[3 * b + 1], bz = 4 * coords[3 * b + 2];
            for (int l = 0; l < SparseGrid.NODES_PER_BLOCK; l++) {
                int node = (b << 6) + l;
                double m = gm[node];
                int n3 = 3 * node;
                if (m <= 0) {
                    gv[n3] = 0;
                    gv[n3 + 1] = 0;
                    gv[n3 + 2] = 0;
                    continue;
                }
                double inv = 1.0 / m;
                gv[n3] = (gv[n3] * inv + gx) * decay;
                gv[n3 + 1] = (gv[n3 + 1] * inv + gy) * decay;
                gv[n3 + 2] = (gv[n3 + 2] * inv + gz) * decay;
                double px = ox + (bx + (l >> 4)) * dx;
                double py = oy + (by + ((l >> 2) & 3)) * dx;
                double pz = oz + (bz + (l & 3)) * dx;
                int grip = gg[node];
                if (grip != Integer.MAX_VALUE) {
                    double vx0 = gv[n3], vy0 = gv[n3 + 1], vz0 = gv[n3 + 2];
                    frameVelocity(grips.get(grip).motion(), gripPose, 12 * grip, px, py, pz, gv, n3);
                    // Work of the grip: its impulse on the node times the velocity it imposes.
                    work += m * ((gv[n3] - vx0) * gv[n3] + (gv[n3 + 1] - vy0) * gv[n3 + 1]
                            + (gv[n3 + 2] - vz0) * gv[n3 + 2]);
                } else {
                    work += m * applyWallsAndObstacles(walls, wallAt, tol, obstacles, px, py, pz, gv, n3, nrm);
                }
            }
        }
        return work;
    }

    /** @return work per unit node mass done by moving obstacles: velocity change . obstacle velocity, m^2/s^2 */
    private double applyWallsAndObstacles(List<Contact> walls, double[] wallAt, double tol, List<Obstacle> obstacles,
                                          double px, double py, double pz, double[] gv, int n3, double[] nrm) {
        for (int f = 0; f < 6; f++) {
            Contact c = walls.get(f);
            if (c.type() == Contact.Type.OPEN) {
                continue;
            }
            int axis = f >> 1;
            double coord = axis == 0 ? px : axis == 1 ? py : pz;
            boolean lower = (f & 1) == 0;
            if (lower ? coord - wallAt[f] <= tol : wallAt[f] - coord <= tol) {
                nrm[0] = 0;
                nrm[1] = 0;
                nrm[2] = 0;
                nrm[axis] = lower ? 1 : -1;
                c.apply(gv, n3, nrm, 0, 0, 0, 0);
            }
        }
        double work = 0;
        for (int o = 0; o < obstacles.size(); o++) {
            work += applyObstacle(obstacles.get(o), 12 * o, px, py, pz, gv, n3, nrm);
        }
        return work;
    }

    private double applyObstacle(Obstacle ob, int q, double px, double py, double pz, double[] gv, int n3,
                                 double[] nrm) {
        if (obstacleContactFrame(ob, obstaclePose, q, px, py, pz, nrm) > 0) {
            return 0;
        }
        double vx0 = gv[n3], vy0 = gv[n3 + 1], vz0 = gv[n3 + 2];
        ob.contact().apply(gv, n3, nrm, 0, nrm[6], nrm[7], nrm[8]);
        // Power of the contact force is its impulse times the obstacle's velocity; a still obstacle does no work.
        return (gv[n3] - vx0) * nrm[6] + (gv[n3 + 1] - vy0) * nrm[7] + (gv[n3 + 2] - vz0) * nrm[8];
    }

    /**
     * Signed distance of a point to an obstacle in the given pose; where it is not positive, also the obstacle's
     * outward normal (world frame, nrm[0..2]) and its velocity at the point (nrm[6..8]).
     *
     * @return signed distance, m
     */
    private static double obstacleContactFrame(Obstacle ob, double[] pose, int q, double px, double py, double pz,
                                               double[] nrm) {
        Motion mo = ob.motion();
        // Point in the obstacle's frame at time 0: x0 = c0 + R^T (x - c(t)).
        double rx = px - pose[q + 9], ry = py - pose[q + 10], rz = pz - pose[q + 11];
        double lx = mo.cx() + pose[q] * rx + pose[q + 3] * ry + pose[q + 6] * rz;
        double ly = mo.cy() + pose[q + 1] * rx + pose[q + 4] * ry + pose[q + 7] * rz;
        double lz = mo.cz() + pose[q + 2] * rx + pose[q + 5] * ry + pose[q + 8] * rz;
        double dist = ob.shape().distance(lx, ly, lz);
        if (dist > 0) {
            return dist;
        }
        ob.shape().normal(lx, ly, lz, nrm, 3);
        nrm[0] = pose[q] * nrm[3] + pose[q + 1] * nrm[4] + pose[q + 2] * nrm[5];
        nrm[1] = pose[q + 3] * nrm[3] + pose[q + 4] * nrm[4] + pose[q + 5] * nrm[5];
        nrm[2] = pose[q + 6] * nrm[3] + pose[q + 7] * nrm[4] + pose[q + 8] * nrm[5];
        frameVelocity(mo, pose, q, px, py, pz, nrm, 6);
        return dist;
    }

    /**
     * Particle-level obstacle contact: a particle that ends the step inside an obstacle (in its end-of-step pose)
     * is put back on the surface along the outward normal, and the obstacle's contact law is applied to its
     * velocity as to a node's. Grid-node contact alone lets particles pass between nodes where an obstacle is
     * thinner than a cell (a wedge's edge); the same body-collision step on particles after the grid update is
     * published for MPM by Stomakhin et al. (SIGGRAPH 2013, section 8; from memory).
     *
     * @return work done on the particle by the obstacles, J
     */
    private double touchObstacles(double[] nrm, int p) {
        double[] x = store.position();
        double[] v = store.velocity();
        List<Obstacle> obstacles = scene.obstacles();
        double work = 0;
        for (int o = 0; o < obstacles.size(); o++) {
            Obstacle ob = obstacles.get(o);
            if (ob.contact().type() == Contact.Type.OPEN) {
                continue;
            }
            int b = 6 * o;
            double px = x[3 * p], py = x[3 * p + 1], pz = x[3 * p + 2];
            if (px < obstacleBoxEnd[b] || py < obstacleBoxEnd[b + 1] || pz < obstacleBoxEnd[b + 2]
                    || px > obstacleBoxEnd[b + 3] || py > obstacleBoxEnd[b + 4] || pz > obstacleBoxEnd[b + 5]) {
                continue;
            }
            double dist = obstacleContactFrame(ob, obstaclePoseEnd, 12 * o, px, py, pz, nrm);
            if (dist > 0) {
                continue;
            }
            x[3 * p] = px - dist * nrm[0];
            x[3 * p + 1] = py - dist * nrm[1];
            x[3 * p + 2] = pz - dist * nrm[2];
            double vx0 = v[3 * p], vy0 = v[3 * p + 1], vz0 = v[3 * p + 2];
            ob.contact().apply(v, 3 * p, nrm, 0, nrm[6], nrm[7], nrm[8]);
            work += store.mass()[p] * ((v[3 * p] - vx0) * nrm[6] + (v[3 * p + 1] - vy0) * nrm[7]
                    + (v[3 * p + 2] - vz0) * nrm[8]);
        }
        return work;
    }

    /** Poses and world boxes of the obstacles at time t + h, and which blocks' buffers reach one. */
    private boolean prepareParticleContact(double h) {
        List<Obstacle> obstacles = scene.obstacles();
        if (obstacles.isEmpty()) {
            return false;
        }
        for (int i = 0; i < obstacles.size(); i++) {
            Obstacle ob = obstacles.get(i);
            ob.motion().pose(time + h, scratchPose);
            System.arraycopy(scratchPose, 0, obstaclePoseEnd, 12 * i, 12);
            worldBox(ob, scratchPose, obstacleBoxEnd, 6 * i);
        }
        boolean any = false;
        double span = LOCAL * dx;
        for (int r = 0; r < blockCount; r++) {
            long key = blockKeys[r];
            double x0 = ox + localOrigin(SparseGrid.keyX(key)) * dx;
            double y0 = oy + localOrigin(SparseGrid.keyY(key)) * dx;
            double z0 = oz + localOrigin(SparseGrid.keyZ(key)) * dx;
            boolean touches = false;
            for (int b = 0; b < obstacleBoxEnd.length && !touches; b += 6) {
                touches = x0 <= obstacleBoxEnd[b + 3] && x0 + span >= obstacleBoxEnd[b]
                        && y0 <= obstacleBoxEnd[b + 4] && y0 + span >= obstacleBoxEnd[b + 1]
                        && z0 <= obstacleBoxEnd[b + 5] && z0 + span >= obstacleBoxEnd[b + 2];
            }
            blockTouches[r] = touches;
            any |= touches;
        }
        return any;
    }

    /** World box of an obstacle's shape in a pose (its corners moved and boxed; infinite stays infinite). */
    private static void worldBox(Obstacle ob, double[] pose, double[] out, int off) {
        Bounds b = ob.shape().bounds();
        Motion mo = ob.motion();
        if (!b.isFinite()) {
            for (int k = 0; k < 3; k++) {
                out[off + k] = Double.NEGATIVE_INFINITY;
                out[off + 3 + k] = Double.POSITIVE_INFINITY;
            }
            return;
        }
        for (int k = 0; k < 3; k++) {
            out[off + k] = Double.POSITIVE_INFINITY;
            out[off + 3 + k] = Double.NEGATIVE_INFINITY;
        }
        for (int c = 0; c < 8; c++) {
            // x = c(t) + R (x0 - c0), with R stored so that R^T maps world to body (see obstacleContactFrame).
            double ax = ((c & 1) == 0 ? b.minX() : b.maxX()) - mo.cx();
            double ay = ((c & 2) == 0 ? b.minY() : b.maxY()) - mo.cy();
            double az = ((c & 4) == 0 ? b.minZ() : b.maxZ()) - mo.cz();
            for (int k = 0; k < 3; k++) {
                double w = pose[9 + k] + pose[3 * k] * ax + pose[3 * k + 1] * ay + pose[3 * k + 2] * az;
                out[off + k] = Math.min(out[off + k], w);
                out[off + 3 + k] = Math.max(out[off + 3 + k], w);
            }
        }
    }

    private final double[] scratchPose = new double[12];
    /** Obstacle poses at the end of the step (12 per obstacle), for the particle contact of the gather. */
    private final double[] obstaclePoseEnd;
    /** World boxes (6 per obstacle) at the end of the step, m; a block whose buffer misses all skips the check. */
    private final double[] obstacleBoxEnd;
    private boolean[] blockTouches = new boolean[64];
    /** Whether this step's gather checks particles against obstacles (some block reaches one). */
    private boolean touching;
    private double[] blockContactWork = new double[64];
    private double[] boundaryPartial = new double[64];
    private double boundaryWork;

    /** Velocity of a moving frame at a point: v + w x (x - c(t)). */
    private static void frameVelocity(Motion mo, double[] pose, int q, double px, double py, double pz,
                                      double[] out, int off) {
        double rx = px - pose[q + 9], ry = py - pose[q + 10], rz = pz - pose[q + 11];
        out[off] = mo.vx() + mo.wy() * rz - mo.wz() * ry;
        out[off + 1] = mo.vy() + mo.wz() * rx - mo.wx() * rz;
        out[off + 2] = mo.vz() + mo.wx() * ry - mo.wy() * rx;
    }

    private void gather(double h) {
        touching = prepareParticleContact(h);
        workers.forEach(blockCount, (w, r) -> gatherBlock(scratch[w], r, h));
        if (touching) {
            double sum = 0;
            for (int r = 0; r < blockCount; r++) {
                sum += blockContactWork[r];
            }
            boundaryWork += sum;
        }
    }

    private void gatherBlock(Scratch sc, int r, double h) {
        int start = blockStart[r];
        int end = blockStart[r + 1];
        int[] acc = sc.gatherRange;
        acc[0] = LOCAL;
        acc[1] = LOCAL;
        acc[2] = LOCAL;
        acc[3] = -1;
        acc[4] = -1;
        acc[5] = -1;
        acc[6] = start;
        acc[7] = -1;
        sc.gatherFastest = 0;
        sc.contactWork = 0;
        if (separation == null) {
            loadLocal(sc.local, r, kernel.support());
            gatherRange(sc, r, h, start, end);
        } else {
            separation.gatherBlock(sc, r, h);
        }
        int[] body = store.body();
        for (int runStart = start; anyProjection && runStart < end; ) {
            int b = body[runStart];
            int runEnd = runStart + 1;
            while (runEnd < end && body[runEnd] == b) {
                runEnd++;
            }
            int failed = laws[b].projectsDeformation() ? laws[b].projectDeformation(store, runStart, runEnd) : -1;
            if (failed >= 0 && acc[7] < 0) {
                acc[7] = failed;
            }
            runStart = runEnd;
        }
        blockContactWork[r] = sc.contactWork;
        blockMaxSpeed[r] = Math.sqrt(sc.gatherFastest);
        blockFastest[r] = acc[6];
        blockBad[r] = acc[7];
        blockLeft[r] = !setRange(r, acc[0], acc[1], acc[2], acc[3], acc[4], acc[5]);
    }

    /**
     * Gathers velocity and affine matrix of particles [from, to) of block r from the block-local buffer, moves
     * them and updates F. Folds their stencil range, speed and health into the worker's running block totals
     * ({@link Scratch#gatherRange}, {@link Scratch#gatherFastest}).
     */
    void gatherRange(Scratch sc, int r, double h, int from, int to) {
        long key = blockKeys[r];
        int baseX = localOrigin(SparseGrid.keyX(key)), baseY = localOrigin(SparseGrid.keyY(key));
        int baseZ = localOrigin(SparseGrid.keyZ(key));
        int s = kernel.support();
        double dinv = kernel.inverseInertia(dx);
        double[] x = store.position();
        double[] v = store.velocity();
        double[] cm = store.affine();
        double[] f = store.deformation();
        double[] wx = sc.wx, wy = sc.wy, wz = sc.wz;
        double[] loc = sc.local;
        int[] acc = sc.gatherRange;
        int loX = acc[0], loY = acc[1], loZ = acc[2], hiX = acc[3], hiY = acc[4], hiZ = acc[5];
        double fastest = sc.gatherFastest;
        int fastestP = acc[6];
        int bad = acc[7];
        boolean touch = touching && blockTouches[r];
        for (int p = from; p < to; p++) {
            double xi = (x[3 * p] - ox) * invDx, yi = (x[3 * p + 1] - oy) * invDx, zi = (x[3 * p + 2] - oz) * invDx;
            int bx = kernel.base(xi), by = kernel.base(yi), bz = kernel.base(zi);
            double fx = xi - bx, fy = yi - by, fz = zi - bz;
            kernel.weights(fx, wx, 0);
            kernel.weights(fy, wy, 0);
            kernel.weights(fz, wz, 0);
            int base = 4 * (((bx - baseX) * LOCAL + (by - baseY)) * LOCAL + (bz - baseZ));
            // Accumulate sum w v and sum w v (node index)^T; the offsets from the particle follow afterwards.
            double vx = 0, vy = 0, vz = 0;
            double b00 = 0, b01 = 0, b02 = 0, b10 = 0, b11 = 0, b12 = 0, b20 = 0, b21 = 0, b22 = 0;
            boolean quadratic = s == 3;
            // Constant trip counts for the quadratic stencil, so the compiler unrolls all 27 nodes; the branch
            // is the same for every particle.
            for (int i = 0; quadratic ? i < 3 : i < s; i++) {
                double wi = wx[i];
                int oi = base + i * (4 * LOCAL * LOCAL);
                for (int j = 0; quadratic ? j < 3 : j < s; j++) {
                    double wij = wi * wy[j];
                    int oj = oi + j * (4 * LOCAL);
                    double sx = 0, sy = 0, sz = 0, tx = 0, ty = 0, tz = 0;
                    if (quadratic) {
                        double w1 = wz[1], w2 = wz[2], w0 = wz[0];
                        double u1x = w1 * loc[oj + 5], u1y = w1 * loc[oj + 6], u1z = w1 * loc[oj + 7];
                        double u2x = w2 * loc[oj + 9], u2y = w2 * loc[oj + 10], u2z = w2 * loc[oj + 11];
                        sx = w0 * loc[oj + 1] + u1x + u2x;
                        sy = w0 * loc[oj + 2] + u1y + u2y;
                        sz = w0 * loc[oj + 3] + u1z + u2z;
                        tx = u1x + 2 * u2x;
                        ty = u1y + 2 * u2y;
                        tz = u1z + 2 * u2z;
                    } else {
                        for (int l = 0; l < s; l++) {
                            double wgt = wz[l];
                            int q = oj + 4 * l;
                            double ux = wgt * loc[q + 1], uy = wgt * loc[q + 2], uz = wgt * loc[q + 3];
                            sx += ux;
                            sy += uy;
                            sz += uz;
                            tx += l * ux;
                            ty += l * uy;
                            tz += l * uz;
                        }
                    }
                    sx *= wij;
                    sy *= wij;
                    sz *= wij;
                    vx += sx;
                    vy += sy;
                    vz += sz;
                    b00 += i * sx;
                    b01 += j * sx;
                    b02 += wij * tx;
                    b10 += i * sy;
                    b11 += j * sy;
                    b12 += wij * ty;
                    b20 += i * sz;
                    b21 += j * sz;
                    b22 += wij * tz;
                }
            }
            // B = sum w v (d)^T with d = (node - f) dx.
            b00 = (b00 - fx * vx) * dx;
            b01 = (b01 - fy * vx) * dx;
            b02 = (b02 - fz * vx) * dx;
            b10 = (b10 - fx * vy) * dx;
            b11 = (b11 - fy * vy) * dx;
            b12 = (b12 - fz * vy) * dx;
            b20 = (b20 - fx * vz) * dx;
            b21 = (b21 - fy * vz) * dx;
            b22 = (b22 - fz * vz) * dx;
            v[3 * p] = vx;
            v[3 * p + 1] = vy;
            v[3 * p + 2] = vz;
            double nx = x[3 * p] + h * vx, ny = x[3 * p + 1] + h * vy, nz = x[3 * p + 2] + h * vz;
            x[3 * p] = nx;
            x[3 * p + 1] = ny;
            x[3 * p + 2] = nz;
            if (touch) {
                sc.contactWork += touchObstacles(sc.normal, p);
                vx = v[3 * p];
                vy = v[3 * p + 1];
                vz = v[3 * p + 2];
                nx = x[3 * p];
                ny = x[3 * p + 1];
                nz = x[3 * p + 2];
            }
            // Where the next step's stencil starts, to keep the block's node range and see if a sort is due.
            int sx = kernel.base((nx - ox) * invDx) - baseX;
            int sy = kernel.base((ny - oy) * invDx) - baseY;
            int sz = kernel.base((nz - oz) * invDx) - baseZ;
            loX = Math.min(loX, sx);
            loY = Math.min(loY, sy);
            loZ = Math.min(loZ, sz);
            hiX = Math.max(hiX, sx);
            hiY = Math.max(hiY, sy);
            hiZ = Math.max(hiZ, sz);
            int c9 = 9 * p;
            double c00 = dinv * b00, c01 = dinv * b01, c02 = dinv * b02;
            double c10 = dinv * b10, c11 = dinv * b11, c12 = dinv * b12;
            double c20 = dinv * b20, c21 = dinv * b21, c22 = dinv * b22;
            cm[c9] = c00;
            cm[c9 + 1] = c01;
            cm[c9 + 2] = c02;
            cm[c9 + 3] = c10;
            cm[c9 + 4] = c11;
            cm[c9 + 5] = c12;
            cm[c9 + 6] = c20;
            cm[c9 + 7] = c21;
            cm[c9 + 8] = c22;
            // F <- (I + h C) F
            double f00 = f[c9], f01 = f[c9 + 1], f02 = f[c9 + 2];
            double f10 = f[c9 + 3], f11 = f[c9 + 4], f12 = f[c9 + 5];
            double f20 = f[c9 + 6], f21 = f[c9 + 7], f22 = f[c9 + 8];
            f[c9] = f00 + h * (c00 * f00 + c01 * f10 + c02 * f20);
            f[c9 + 1] = f01 + h * (c00 * f01 + c01 * f11 + c02 * f21);
            f[c9 + 2] = f02 + h * (c00 * f02 + c01 * f12 + c02 * f22);
            f[c9 + 3] = f10 + h * (c10 * f00 + c11 * f10 + c12 * f20);
            f[c9 + 4] = f11 + h * (c10 * f01 + c11 * f11 + c12 * f21);
            f[c9 + 5] = f12 + h * (c10 * f02 + c11 * f12 + c12 * f22);
            f[c9 + 6] = f20 + h * (c20 * f00 + c21 * f10 + c22 * f20);
            f[c9 + 7] = f21 + h * (c20 * f01 + c21 * f11 + c22 * f21);
            f[c9 + 8] = f22 + h * (c20 * f02 + c21 * f12 + c22 * f22);
            double speed2 = vx * vx + vy * vy + vz * vz;
            if (!(speed2 <= Double.MAX_VALUE) || !Double.isFinite(f[c9] + f[c9 + 4] + f[c9 + 8])) {
                if (bad < 0) {
                    bad = p;
                }
            } else if (speed2 > fastest) {
                fastest = speed2;
                fastestP = p;
            }
        }
        acc[0] = loX;
        acc[1] = loY;
        acc[2] = loZ;
        acc[3] = hiX;
        acc[4] = hiY;
        acc[5] = hiZ;
        acc[6] = fastestP;
        acc[7] = bad;
        sc.gatherFastest = fastest;
    }

    /** Copies the grid velocities a block's stencils reach into the block-local buffer. */
    private void loadLocal(double[] loc, int r, int s) {
        double[] gv = grid.momentum();
        int[] br = blockRange;
        for (int i = br[6 * r], iEnd = br[6 * r + 3] + s; i < iEnd; i++) {
            for (int j = br[6 * r + 1], jEnd = br[6 * r + 4] + s; j < jEnd; j++) {
                for (int l = br[6 * r + 2], lEnd = br[6 * r + 5] + s; l < lEnd; l++) {
                    int q = 4 * ((i * LOCAL + j) * LOCAL + l);
                    int node = node(r, i, j, l);
                    loc[q + 1] = gv[3 * node];
                    loc[q + 2] = gv[3 * node + 1];
                    loc[q + 3] = gv[3 * node + 2];
                }
            }
        }
    }

    private void checkDivergence(double h) {
        double fastest = 0;
        int fastestP = -1;
        for (int r = 0; r < blockCount; r++) {
            sortNeeded |= blockLeft[r];
            if (blockBad[r] >= 0) {
                int p = blockBad[r];
                throw new SimulationDivergedException("non-finite velocity or deformation, or a failed return mapping",
                        bodyNames.get(store.body()[p]), store.id()[p], step, time, suggestion());
            }
            if (blockMaxSpeed[r] > fastest) {
                fastest = blockMaxSpeed[r];
                fastestP = blockFastest[r];
            }
        }
        if (fastest > speedLimit) {
            throw new SimulationDivergedException("speed " + fastest + " m/s above the limit " + speedLimit
                    + " m/s", bodyNames.get(store.body()[fastestP]), store.id()[fastestP], step, time, suggestion());
        }
        if (fastest * h > dx) {
            throw new SimulationDivergedException("particle moved " + fastest * h / dx + " cells in one step",
                    bodyNames.get(store.body()[fastestP]), store.id()[fastestP], step, time,
                    "use a smaller fixedTimeStep or the adaptive step");
        }
        maxSpeed = fastest;
    }

    private String suggestion() {
        return "try a smaller cfl (now " + scene.cfl() + "), a smaller maxTimeStep, softer or denser material, "
                + "or check for bodies that start overlapping obstacles";
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

    // ------------------------------------------------------------------ view and diagnostics

    @Override
    public double time() {
        return time;
    }

    @Override
    public long stepCount() {
        return step;
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

    /**
     * @return conjugate-gradient iterations of the last phase-field solve (0 without phase-field damage)
     */
    public int phaseFieldIterations() {
        return phaseFieldSolve == null ? 0 : phaseFieldSolve.lastIterations();
    }

    /**
     * @return relative residual reached by the last phase-field solve (0 without phase-field damage)
     */
    public double phaseFieldResidual() {
        return phaseFieldSolve == null ? 0 : phaseFieldSolve.lastResidual();
    }

    /** @return the largest elastic wave speed over the bodies, m/s, used by the time-step bound */
    public double maxWaveSpeed() {
        return maxWaveSpeed;
    }

    /**
     * The time step the solver would take now if no frame time were near: CFL dx / (max speed + wave speed).
     *
     * @return the step, s
     */
    public double estimatedTimeStep() {
        if (!Double.isNaN(scene.fixedTimeStep())) {
            return Math.min(scene.fixedTimeStep(), scene.maxTimeStep());
        }
        return Math.min(scene.maxTimeStep(), scene.cfl() * dx / (maxSpeed + maxWaveSpeed));
    }

    @Override
    public long gridMemoryBytes() {
        return grid.memoryBytes();
    }

    @Override
    public long particleMemoryBytes() {
        return store.memoryBytes();
    }

    @Override
    public Diagnostics diagnostics() {
        int n = store.size();
        int tasks = (n + DIAG_CHUNK - 1) / DIAG_CHUNK;
        double[] part = new double[10 * tasks];
        double inertia = kernel.inertia(dx);
        double[] gravity = scene.gravity();
        workers.forEach(tasks, (w, t) -> {
            int a = t * DIAG_CHUNK;
            int b = Math.min(n, a + DIAG_CHUNK);
            double[] x = store.position();
            double[] v = store.velocity();
            double[] c = store.affine();
            double[] m = store.mass();
            double[] vol = store.volume();
            int[] body = store.body();
            double ke = 0, ee = 0, px = 0, py = 0, pz = 0, lx = 0, ly = 0, lz = 0, vmax = 0, pe = 0;
            for (int p = a; p < b; p++) {
                double mp = m[p];
                double vx = v[3 * p], vy = v[3 * p + 1], vz = v[3 * p + 2];
                double rx = x[3 * p], ry = x[3 * p + 1], rz = x[3 * p + 2];
                double s2 = vx * vx + vy * vy + vz * vz;
                ke += 0.5 * mp * s2;
                pe -= mp * (gravity[0] * rx + gravity[1] * ry + gravity[2] * rz);
                vmax = Math.max(vmax, s2);
                px += mp * vx;
                py += mp * vy;
                pz += mp * vz;
                // x cross v plus the APIC spin m D eps:(C^T) (Jiang et al. 2015).
                lx += mp * (ry * vz - rz * vy + inertia * (c[9 * p + 7] - c[9 * p + 5]));
                ly += mp * (rz * vx - rx * vz + inertia * (c[9 * p + 2] - c[9 * p + 6]));
                lz += mp * (rx * vy - ry * vx + inertia * (c[9 * p + 3] - c[9 * p + 1]));
            }
            Scratch sc = scratch[w];
            double[] psi = sc.psiKept(b - a);
            for (int runStart = a; runStart < b; ) {
                int bd = body[runStart];
                int runEnd = runStart + 1;
                while (runEnd < b && body[runEnd] == bd) {
                    runEnd++;
                }
                if (damage[bd] == null) {
                    laws[bd].energyDensity(store, runStart, runEnd, psi);
                } else {
                    // psi = g psi_degraded + psi_kept, the energy the degraded stress derives from.
                    int len = runEnd - runStart;
                    double[] psiD = sc.psiDegraded(len);
                    double[] g = sc.g(len);
                    laws[bd].splitKirchhoffStress(damage[bd].tensionSplit(), store, runStart, runEnd, sc.tau(len),
                            sc.kept(len), psiD, psi);
                    damage[bd].degradation(store, runStart, runEnd, g);
                    for (int i = 0; i < len; i++) {
                        psi[i] += g[i] * psiD[i];
                    }
                }
                for (int p = runStart; p < runEnd; p++) {
                    ee += vol[p] * psi[p - runStart];
                }
                runStart = runEnd;
            }
            int o = 10 * t;
            part[o] = ke;
            part[o + 1] = ee;
            part[o + 2] = px;
            part[o + 3] = py;
            part[o + 4] = pz;
            part[o + 5] = lx;
            part[o + 6] = ly;
            part[o + 7] = lz;
            part[o + 8] = vmax;
            part[o + 9] = pe;
        });
        double[] sum = new double[10];
        for (int t = 0; t < tasks; t++) {
            for (int k = 0; k < 8; k++) {
                sum[k] += part[10 * t + k];
            }
            sum[8] = Math.max(sum[8], part[10 * t + 8]);
            sum[9] += part[10 * t + 9];
        }
        return new Diagnostics(step, time, dt, sum[0], sum[1], sum[2], sum[3], sum[4], sum[5], sum[6], sum[7],
                Math.sqrt(sum[8]), sum[9], boundaryWork);
    }

    /**
     * Captures the run state between steps, for checkpoints. Copies every array.
     *
     * @return the state
     */
    public SimulationState captureState() {
        java.util.Map<String, double[]> ch = new java.util.LinkedHashMap<>();
        for (String name : store.channelNames()) {
            ch.put(name, store.channel(name).clone());
        }
        long[] keysNow = sortNeeded ? new long[0] : Arrays.copyOf(blockKeys, blockCount);
        int[] startsNow = sortNeeded ? new int[0] : Arrays.copyOf(blockStart, blockCount + 1);
        return new SimulationState(time, step, dt, frame, frameZeroSent, maxSpeed, boundaryWork, ch,
                store.body().clone(), store.id().clone(), keysNow, startsNow);
    }

    /**
     * Resumes from a captured state. The simulation must have been made from the same scene; the next steps are
     * then bitwise identical to those of the run that was captured.
     *
     * @param s a state from {@link #captureState()} of a simulation of the same scene
     * @throws InvalidInputException if particle count or channels do not match
     */
    public void restoreState(SimulationState s) {
        store.restore(s.channels(), s.body(), s.id());
        restoreBlocks(s.blockKeys(), s.blockStarts());
        time = s.time();
        step = s.step();
        dt = s.dt();
        frame = s.frame();
        frameZeroSent = s.frameZeroSent();
        maxSpeed = s.maxSpeed();
        boundaryWork = s.boundaryWork();
    }

    private void restoreBlocks(long[] keysIn, int[] startsIn) {
        int nb = keysIn.length;
        if (nb == 0 && startsIn.length == 0) {
            sortNeeded = true;
            return;
        }
        boolean ok = startsIn.length == nb + 1 && nb > 0 && startsIn[0] == 0 && startsIn[nb] == store.size();
        for (int r = 0; ok && r < nb; r++) {
            ok = startsIn[r + 1] > startsIn[r] && (r == 0 || keysIn[r] > keysIn[r - 1]);
        }
        if (ok) {
            ensureBlockCapacity(nb);
            blockCount = nb;
            System.arraycopy(keysIn, 0, blockKeys, 0, nb);
            System.arraycopy(startsIn, 0, blockStart, 0, nb + 1);
            ok = activateBlocks();
        }
        if (!ok) {
            sortNeeded = true;
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "saved particle blocks",
                    "the block table does not fit the saved particles (" + nb + " blocks for " + store.size()
                            + " particles)");
        }
        sortNeeded = false;
    }

    /** Stops the worker threads. The simulation cannot run afterwards. */
    @Override
    public void close() {
        workers.close();
    }

    /** Per-worker scratch space; never shared between threads. */
    static final class Scratch {
        final double[] wx = new double[16];
        final double[] wy = new double[16];
        final double[] wz = new double[16];
        final double[] dwx = new double[16];
        final double[] dwy = new double[16];
        final double[] dwz = new double[16];
        final double[] normal = new double[9];
        final double[] pair = new double[2];
        final double[] local = new double[4 * LOCAL * LOCAL * LOCAL];
        final int[] node = new int[64];
        final double[] w = new double[64];
        final double[] gx = new double[64];
        final double[] gy = new double[64];
        final double[] gz = new double[64];
        // Padding keeps the small arrays of different workers off each other's cache lines.
        final double[] pad = new double[16];
        /** Running totals of a block's gather: lowest and highest stencil base (x, y, z), fastest, first bad. */
        final int[] gatherRange = new int[8];
        /** Running largest squared particle speed of a block's gather, m^2/s^2. */
        double gatherFastest;
        /** Running work of the particle contact with obstacles in a block's gather, J. */
        double contactWork;
        private double[] tau = new double[9 * 1024];
        private double[] kept = new double[0];
        private double[] psiDegraded = new double[0];
        private double[] psiKept = new double[0];
        private double[] g = new double[0];
        double[] work = new double[0];

        double[] kept(int particles) {
            if (kept.length < 9 * particles) {
                kept = new double[Math.max(9 * particles, 2 * kept.length)];
            }
            return kept;
        }

        double[] psiDegraded(int particles) {
            if (psiDegraded.length < particles) {
                psiDegraded = new double[Math.max(particles, 2 * psiDegraded.length)];
            }
            return psiDegraded;
        }

        double[] psiKept(int particles) {
            if (psiKept.length < particles) {
                psiKept = new double[Math.max(particles, 2 * psiKept.length)];
            }
            return psiKept;
        }

        double[] g(int particles) {
            if (g.length < particles) {
                g = new double[Math.max(particles, 2 * g.length)];
            }
            return g;
        }

        double[] work(int size) {
            if (work.length < size) {
                work = new double[Math.max(size, 2 * work.length)];
            }
            return work;
        }
        long stressNanos;
        long scatterNanos;

        double[] tau(int particles) {
            if (tau.length < 9 * particles) {
                tau = new double[Math.max(9 * particles, tau.length * 2)];
            }
            return tau;
        }
    }

    private final class View implements ParticleView {
        @Override
        public int size() {
            return store.size();
        }

        @Override
        public int id(int p) {
            return store.id()[p];
        }

        @Override
        public int body(int p) {
            return store.body()[p];
        }

        @Override
        public List<String> channelNames() {
            return store.channelNames();
        }

        @Override
        public ChannelSpec spec(String name) {
            ChannelSpec s = store.spec(name);
            if (s == null) {
                throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, "particle channel", name,
                        store.channelNames());
            }
            return s;
        }

        @Override
        public double get(String name, int p, int component) {
            int w = spec(name).width();
            return store.channel(name)[w * p + component];
        }

        @Override
        public void copyById(String name, double[] dst, int off) {
            int w = spec(name).width();
            double[] src = store.channel(name);
            int[] id = store.id();
            for (int p = 0; p < store.size(); p++) {
                System.arraycopy(src, w * p, dst, off + w * id[p], w);
            }
        }
    }
}

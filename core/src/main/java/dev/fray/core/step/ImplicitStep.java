package dev.fray.core.step;

import dev.fray.core.boundary.GridBoundaries;
import dev.fray.core.boundary.WallHold;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.FieldSet;
import dev.fray.core.parallel.Reductions;
import dev.fray.core.parallel.Workers;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.solve.BlockPCG;
import dev.fray.core.transfer.GridToParticle;
import dev.fray.core.transfer.ParticleToGrid;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * One implicit step: backward Euler on grid velocities as the minimisation of the incremental potential (Gast,
 * Schroeder, Stomakhin, Jiang and Teran, IEEE TVCG 21(10), 2015), see {@link IncrementalPotential}. Sort and
 * activate, scatter mass and APIC momentum only, advance damage from the step's start deformation and solve the
 * phase field (staggered: the velocity solve then holds the degradation fixed), form v* = p/m + g dt with damping
 * and the boundaries ({@link GridVelocityUpdate}), then Newton's method with a backtracking (Armijo) line search on
 * E(v), each direction from {@link BlockPCG} with a 3x3 block-Jacobi preconditioner. Walls, obstacles and grips are
 * constraints: every increment is projected so that what they fix stays as v* has it. Then gather, move and update
 * F as in the explicit step.
 *
 * <p>Stopping rule: the residual (the gradient of E, a momentum) in the lumped-mass metric,
 * ||r|| = sqrt(sum |r_i|^2 / m_i), at most {@code tolerance} times its value at v = v* (the step's elastic impulse),
 * or small enough that, scaled by dt / sqrt(total mass), the RMS velocity error would move material less than
 * {@code tolerance} / 1000 cells in the step, whichever is larger (the second rule ends steps of a body at rest). A step
 * whose Newton iteration does not converge is halved and retried (damage state restored), at most
 * {@link #MAX_HALVINGS} times; the count is reported by {@link #statistics()}.
 */
public final class ImplicitStep implements Integrator {
    /** How many times a failing step is halved before its last iterate is taken as it is. */
    public static final int MAX_HALVINGS = 4;
    private static final double ARMIJO = 1e-4;
    private static final int LINE_SEARCH_STEPS = 12;
    /** Residual reduction asked of each linear solve (inexact Newton, Dembo, Eisenstat and Steihaug 1982). */
    private static final double CG_REDUCTION = 1e-3;

    private final StepContext ctx;
    private final ConstitutiveUpdate constitutive;
    private final ParticleToGrid p2g;
    private final GridToParticle g2p;
    private final GridVelocityUpdate gridUpdate;
    private final ParticleUpdate particleUpdate;
    private final PhaseFieldSolve phaseField;
    private final DivergenceGuard guard;
    private final IncrementalPotential potential;
    private final BlockPCG cg;
    private final double tolerance;
    private final int maxNewton;
    private final int maxCg;
    private final List<String> damageChannels = new ArrayList<>();
    private final long[] phaseNanos = new long[5];
    private final ImplicitStatistics stats = new ImplicitStatistics();
    private double maxSpeed;
    private double[] vStar = new double[0];
    private double[] v = new double[0];
    private double[] vTry = new double[0];
    private double[] res = new double[0];
    private double[] dir = new double[0];
    private double[] invDiag = new double[0];
    private double[] proj = new double[0];
    private byte[] con = new byte[0];
    private double[][] snapshot = new double[0][];

    /**
     * @param ctx   the step context
     * @param guard the divergence guard
     */
    public ImplicitStep(StepContext ctx, DivergenceGuard guard) {
        this.ctx = ctx;
        this.guard = guard;
        Workers workers = ctx.workers();
        this.constitutive = new ConstitutiveUpdate(ctx);
        this.p2g = new ParticleToGrid(ctx.store(), ctx.layout(), ctx.fields(), ctx.stencils(), ctx.workspaces(),
                workers, ctx.scene().kernel(), ctx.scene().cellSize());
        this.g2p = new GridToParticle(ctx.store(), ctx.layout(), ctx.fields(), ctx.stencils(), workers.threads(),
                ctx.scene().kernel(), ctx.origin(), ctx.scene().cellSize(), ctx.particleContact(),
                new WallHold(ctx.scene().domain(), ctx.scene().walls(), ctx.scene().cellSize()));
        this.gridUpdate = new GridVelocityUpdate(ctx, true);
        this.particleUpdate = new ParticleUpdate(ctx);
        boolean pf = false;
        for (DamageModel d : ctx.damage()) {
            pf |= d != null && d.usesPhaseField();
            if (d != null) {
                for (ChannelSpec c : d.channels()) {
                    if (!damageChannels.contains(c.name())) {
                        damageChannels.add(c.name());
                    }
                }
            }
        }
        this.phaseField = pf ? new PhaseFieldSolve(ctx) : null;
        this.potential = new IncrementalPotential(ctx);
        this.cg = new BlockPCG(workers);
        this.tolerance = ctx.scene().implicitTolerance();
        this.maxNewton = ctx.scene().implicitMaxIterations();
        this.maxCg = 1000;
    }

    @Override
    public void step(double h) {
        stats.steps++;
        attempt(h, 0);
    }

    private void attempt(double h, int depth) {
        long t0 = System.nanoTime();
        BlockLayout layout = ctx.layout();
        layout.prepare(ctx.store(), ctx.workers());
        zeroGrid();
        ctx.routing().partition();
        p2g.scatter(h, null, ctx.routing(), ctx.boundaries().gripTags(), ctx.gripOf());
        long t1 = System.nanoTime();
        saveDamage();
        advanceDamage(h);
        if (phaseField != null) {
            phaseField.solve(h);
        }
        long t2 = System.nanoTime();
        gridUpdate.update(h);
        potential.prepare(h);
        boolean converged = solve(h);
        long t3 = System.nanoTime();
        phaseNanos[0] += t1 - t0;
        phaseNanos[1] += t2 - t1;
        phaseNanos[2] += t3 - t2;
        if (!converged && depth < MAX_HALVINGS) {
            stats.halvings++;
            restoreDamage();
            double start = ctx.time;
            attempt(0.5 * h, depth + 1);
            ctx.time = start + 0.5 * h;
            attempt(0.5 * h, depth + 1);
            ctx.time = start;
            return;
        }
        if (!converged) {
            stats.unconverged++;
        }
        long t4 = System.nanoTime();
        System.arraycopy(v, 0, ctx.fields().momentum(0), 0, 3 * ctx.grid().nodeCount());
        gather(h);
        layout.collectLeft();
        maxSpeed = guard.check(g2p, layout, ctx.store(), ctx.bodyNames(), h, ctx.step, ctx.time);
        phaseNanos[3] += System.nanoTime() - t4;
    }

    /** Newton with line search from v = v*; returns whether the stopping rule was met. */
    private boolean solve(double h) {
        int nodes = ctx.grid().nodeCount();
        int gb = ctx.grid().blockCount();
        ensure(nodes);
        double[] mass = ctx.fields().mass(0);
        double[] grid = ctx.fields().momentum(0);
        System.arraycopy(grid, 0, vStar, 0, 3 * nodes);
        System.arraycopy(grid, 0, v, 0, 3 * nodes);
        double totalMass = constraints(gb, mass);
        double floor = 1e-3 * tolerance * ctx.scene().cellSize() / h * Math.sqrt(totalMass);
        double tol = floor;
        double e = potential.energy(v, vStar, mass);
        if (!Double.isFinite(e)) {
            return false;
        }
        BlockPCG.Nodes sys = new BlockPCG.Nodes() {
            @Override
            public double[] mass() {
                return mass;
            }

            @Override
            public double[] inverseDiagonal() {
                return invDiag;
            }

            @Override
            public double[] projector() {
                return proj;
            }

            @Override
            public byte[] constrained() {
                return con;
            }
        };
        for (int it = 0; ; it++) {
            potential.gradient(v, vStar, mass, res);
            double norm = projectAndNorm(gb, mass, res);
            if (it == 0) {
                tol = Math.max(floor, tolerance * norm);
            }
            if (norm <= tol) {
                stats.lastNewton = it;
                return true;
            }
            if (it >= maxNewton) {
                stats.lastNewton = it;
                return false;
            }
            stats.newton++;
            potential.tangents(mass, invDiag);
            negate(gb, res);
            // inexact Newton: three digits per linear solve, so a near-linear step needs two Newton iterations at the
            // default tolerance, and never more than the stopping rule asks for
            double cgTol = Math.max(CG_REDUCTION * norm, 0.5 * tol);
            int cgIt = cg.solve((in, out) -> potential.apply(mass, in, out), res, dir, sys, gb, cgTol, maxCg);
            stats.cg += cgIt;
            stats.lastCg = cgIt;
            double slope = -dot(gb, res, dir); // res holds -gradient
            if (!(slope < 0)) {
                return false;
            }
            double alpha = 1;
            boolean accepted = false;
            for (int ls = 0; ls < LINE_SEARCH_STEPS; ls++) {
                axpy(gb, v, alpha, dir, vTry);
                double eTry = potential.energy(vTry, vStar, mass);
                if (eTry <= e + ARMIJO * alpha * slope + 1e-12 * Math.abs(e)) {
                    e = eTry;
                    accepted = true;
                    break;
                }
                alpha *= 0.5;
            }
            if (!accepted) {
                potential.energy(v, vStar, mass);
                return false;
            }
            double[] t = v;
            v = vTry;
            vTry = t;
        }
    }

    private void ensure(int nodes) {
        if (vStar.length < 3 * nodes) {
            int cap = Math.max(3 * nodes, vStar.length + vStar.length / 2);
            vStar = new double[cap];
            v = new double[cap];
            vTry = new double[cap];
            res = new double[cap];
            dir = new double[cap];
            invDiag = new double[3 * cap];
            proj = new double[3 * cap];
            con = new byte[cap / 3];
        }
    }

    /**
     * Per-node projectors of the boundaries: the linear map {@link GridBoundaries#projectIncrement} applies, read
     * off by applying it to the three unit vectors (in the free direction array). Returns the total node mass.
     */
    private double constraints(int gb, double[] mass) {
        GridBoundaries bounds = ctx.boundaries();
        int[] coords = ctx.grid().blockCoords();
        int tasks = Reductions.gridTasks(gb);
        double[] part = new double[tasks];
        double[][] nrm = new double[ctx.workers().threads()][9];
        double[] u = dir;
        Reductions.overNodes(ctx.workers(), gb, (w, t, s, e) -> {
            double m = 0;
            for (int i = s; i < e; i++) {
                con[i] = 0;
                if (!(mass[i] > 0)) {
                    continue;
                }
                m += mass[i];
                int b = i >> 6;
                int bx = 4 * coords[3 * b], by = 4 * coords[3 * b + 1], bz = 4 * coords[3 * b + 2];
                for (int k = 0; k < 3; k++) {
                    u[3 * i] = 0;
                    u[3 * i + 1] = 0;
                    u[3 * i + 2] = 0;
                    u[3 * i + k] = 1;
                    if (!bounds.projectIncrement(i, bx, by, bz, u, nrm[w], vStar)) {
                        break;
                    }
                    con[i] = 1;
                    proj[9 * i + k] = u[3 * i];
                    proj[9 * i + 3 + k] = u[3 * i + 1];
                    proj[9 * i + 6 + k] = u[3 * i + 2];
                }
            }
            part[t] = m;
        });
        return Reductions.sum(part, tasks);
    }

    private double projectAndNorm(int gb, double[] mass, double[] r) {
        int tasks = Reductions.gridTasks(gb);
        double[] part = new double[tasks];
        Reductions.overNodes(ctx.workers(), gb, (w, t, s, e) -> {
            double sum = 0;
            for (int i = s; i < e; i++) {
                if (mass[i] > 0) {
                    BlockPCG.project(r, 3 * i, proj, con, i);
                    sum += (r[3 * i] * r[3 * i] + r[3 * i + 1] * r[3 * i + 1] + r[3 * i + 2] * r[3 * i + 2]) / mass[i];
                }
            }
            part[t] = sum;
        });
        return Math.sqrt(Reductions.sum(part, tasks));
    }

    private void negate(int gb, double[] a) {
        Reductions.overNodes(ctx.workers(), gb, (w, t, s, e) -> {
            for (int i = 3 * s; i < 3 * e; i++) {
                a[i] = -a[i];
            }
        });
    }

    private double dot(int gb, double[] a, double[] b) {
        int tasks = Reductions.gridTasks(gb);
        double[] part = new double[tasks];
        Reductions.overNodes(ctx.workers(), gb, (w, t, s, e) -> {
            double sum = 0;
            for (int i = 3 * s; i < 3 * e; i++) {
                sum += a[i] * b[i];
            }
            part[t] = sum;
        });
        return Reductions.sum(part, tasks);
    }

    private void axpy(int gb, double[] x, double alpha, double[] d, double[] out) {
        Reductions.overNodes(ctx.workers(), gb, (w, t, s, e) -> {
            for (int i = 3 * s; i < 3 * e; i++) {
                out[i] = x[i] + alpha * d[i];
            }
        });
    }

    /** Advances damage from the step's start deformation (the damage half of the staggered scheme). */
    private void advanceDamage(double h) {
        boolean any = false;
        for (DamageModel d : ctx.damage()) {
            any |= d != null;
        }
        if (!any) {
            return;
        }
        BlockLayout layout = ctx.layout();
        int[] body = ctx.store().body();
        ctx.workers().forEach(layout.blockCount(), (w, r) -> {
            int end = layout.end(r);
            for (int from = layout.start(r); from < end; ) {
                int b = body[from];
                int to = from + 1;
                while (to < end && body[to] == b) {
                    to++;
                }
                if (ctx.damage()[b] != null) {
                    constitutive.stress(w, b, from, to, h,
                            ctx.workspaces()[w].get(dev.fray.core.parallel.Workspace.TAU, 9 * (to - from)));
                }
                from = to;
            }
        });
    }

    private void saveDamage() {
        if (snapshot.length != damageChannels.size()) {
            snapshot = new double[damageChannels.size()][];
        }
        for (int k = 0; k < snapshot.length; k++) {
            double[] c = ctx.store().channel(damageChannels.get(k));
            if (snapshot[k] == null || snapshot[k].length < c.length) {
                snapshot[k] = new double[c.length];
            }
            System.arraycopy(c, 0, snapshot[k], 0, c.length);
        }
    }

    private void restoreDamage() {
        for (int k = 0; k < snapshot.length; k++) {
            double[] c = ctx.store().channel(damageChannels.get(k));
            System.arraycopy(snapshot[k], 0, c, 0, c.length);
        }
    }

    private void zeroGrid() {
        FieldSet fields = ctx.fields();
        GridBoundaries bounds = ctx.boundaries();
        fields.ensureNodes();
        bounds.ensureNodes(ctx.grid());
        ctx.routing().ensureNodes();
        int gb = ctx.grid().blockCount();
        ctx.workers().forEach(Reductions.gridTasks(gb), (w, t) -> {
            int b0 = t * Reductions.GRID_TASK_BLOCKS, b1 = Math.min(gb, b0 + Reductions.GRID_TASK_BLOCKS);
            fields.zero(b0, b1);
            bounds.clearTags(b0, b1);
            ctx.routing().zeroNodes(b0, b1);
        });
    }

    private void gather(double h) {
        BlockLayout layout = ctx.layout();
        boolean touching = ctx.particleContact().prepare(ctx.time, h, layout);
        g2p.prepare();
        ctx.workers().forEach(layout.blockCount(), (w, r) -> {
            g2p.gatherBlock(w, r, h, ctx.routing());
            g2p.flagFailure(r, particleUpdate.project(r));
        });
        if (touching) {
            double sum = 0;
            for (int r = 0; r < layout.blockCount(); r++) {
                sum += g2p.blockContactWork(r);
            }
            ctx.tallies().boundaryWork += sum;
        }
    }

    @Override
    public double maxSpeed() {
        return maxSpeed;
    }

    @Override
    public void setMaxSpeed(double speed) {
        maxSpeed = speed;
    }

    /** {@inheritDoc} Transfer (sort and P2G), damage (damage update and phase field), solve (Newton), gather. */
    @Override
    public Map<String, Double> phaseSeconds() {
        Map<String, Double> m = new LinkedHashMap<>();
        m.put("transfer", phaseNanos[0] * 1e-9);
        m.put("damage", phaseNanos[1] * 1e-9);
        m.put("solve", phaseNanos[2] * 1e-9);
        m.put("gather", phaseNanos[3] * 1e-9);
        return m;
    }

    @Override
    public ConstitutiveUpdate constitutive() {
        return constitutive;
    }

    @Override
    public int phaseFieldIterations() {
        return phaseField == null ? 0 : phaseField.lastIterations();
    }

    @Override
    public double phaseFieldResidual() {
        return phaseField == null ? 0 : phaseField.lastResidual();
    }

    @Override
    public ImplicitStatistics statistics() {
        return stats;
    }
}

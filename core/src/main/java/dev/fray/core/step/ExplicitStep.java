package dev.fray.core.step;

import dev.fray.core.boundary.GridBoundaries;
import dev.fray.core.boundary.ParticleObstacleContact;
import dev.fray.core.boundary.WallHold;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.grid.FieldSet;
import dev.fray.core.parallel.Reductions;
import dev.fray.core.parallel.Workers;
import dev.fray.core.transfer.FieldRouting;
import dev.fray.core.transfer.GridToParticle;
import dev.fray.core.transfer.ParticleToGrid;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * One explicit MLS-MPM step (Hu et al. 2018) with APIC transfers (Jiang et al. 2015): sort and activate blocks if
 * due ({@link BlockLayout}), zero the fields, partition them ({@link FieldRouting}), scatter mass, momentum and
 * stress force ({@link ParticleToGrid} with the {@link ConstitutiveUpdate}), update grid velocities with gravity,
 * damping, boundaries and field contact ({@link GridVelocityUpdate}), solve the phase field if a damage model asks
 * for it ({@link PhaseFieldSolve}), gather, move and update F ({@link GridToParticle}), project F
 * ({@link ParticleUpdate}), and check for divergence ({@link DivergenceGuard}). The step must stay below the
 * elastic wave's limit dx / c; the {@link TimeStepPolicy} sees to that.
 */
public final class ExplicitStep implements Integrator {
    private final StepContext ctx;
    private final ConstitutiveUpdate constitutive;
    private final ParticleToGrid p2g;
    private final GridToParticle g2p;
    private final GridVelocityUpdate gridUpdate;
    private final ParticleUpdate particleUpdate;
    private final PhaseFieldSolve phaseField;
    private final DivergenceGuard guard;
    private final long[] phaseNanos = new long[5];
    private double maxSpeed;

    /**
     * @param ctx   the step context
     * @param guard the divergence guard
     */
    public ExplicitStep(StepContext ctx, DivergenceGuard guard) {
        this.ctx = ctx;
        this.guard = guard;
        Workers workers = ctx.workers();
        this.constitutive = new ConstitutiveUpdate(ctx);
        this.p2g = new ParticleToGrid(ctx.store(), ctx.layout(), ctx.fields(), ctx.stencils(), ctx.workspaces(),
                workers, ctx.scene().kernel(), ctx.scene().cellSize());
        this.g2p = new GridToParticle(ctx.store(), ctx.layout(), ctx.fields(), ctx.stencils(), workers.threads(),
                ctx.scene().kernel(), ctx.origin(), ctx.scene().cellSize(), ctx.particleContact(),
                new WallHold(ctx.scene().domain(), ctx.scene().walls(), ctx.scene().cellSize()));
        this.gridUpdate = new GridVelocityUpdate(ctx);
        this.particleUpdate = new ParticleUpdate(ctx);
        boolean pf = false;
        for (var d : ctx.damage()) {
            pf |= d != null && d.usesPhaseField();
        }
        this.phaseField = pf ? new PhaseFieldSolve(ctx) : null;
    }

    @Override
    public void step(double h) {
        long t0 = System.nanoTime();
        BlockLayout layout = ctx.layout();
        Workers workers = ctx.workers();
        layout.prepare(ctx.store(), workers);
        zeroGrid();
        long t1 = System.nanoTime();
        FieldRouting routing = ctx.routing();
        routing.partition();
        p2g.scatter(h, constitutive, routing, ctx.boundaries().gripTags(), ctx.gripOf());
        long t2 = System.nanoTime();
        gridUpdate.update(h);
        long t3 = System.nanoTime();
        if (phaseField != null) {
            phaseField.solve(h);
        }
        long t4 = System.nanoTime();
        gather(h);
        layout.collectLeft();
        maxSpeed = guard.check(g2p, layout, ctx.store(), ctx.bodyNames(), h, ctx.step, ctx.time);
        long t5 = System.nanoTime();
        phaseNanos[0] += t1 - t0;
        phaseNanos[1] += t2 - t1;
        phaseNanos[2] += t3 - t2;
        phaseNanos[3] += t4 - t3;
        phaseNanos[4] += t5 - t4;
    }

    private void zeroGrid() {
        FieldSet fields = ctx.fields();
        GridBoundaries bounds = ctx.boundaries();
        fields.ensureNodes();
        bounds.ensureNodes(ctx.grid());
        FieldRouting routing = ctx.routing();
        routing.ensureNodes();
        int gb = ctx.grid().blockCount();
        ctx.workers().forEach(Reductions.gridTasks(gb), (w, t) -> {
            int b0 = t * Reductions.GRID_TASK_BLOCKS, b1 = Math.min(gb, b0 + Reductions.GRID_TASK_BLOCKS);
            fields.zero(b0, b1);
            bounds.clearTags(b0, b1);
            routing.zeroNodes(b0, b1);
        });
    }

    private void gather(double h) {
        BlockLayout layout = ctx.layout();
        ParticleObstacleContact contact = ctx.particleContact();
        boolean touching = contact.prepare(ctx.time, h, layout);
        g2p.prepare();
        FieldRouting routing = ctx.routing();
        ctx.workers().forEach(layout.blockCount(), (w, r) -> {
            g2p.gatherBlock(w, r, h, routing);
            g2p.flagFailure(r, particleUpdate.project(r));
        });
        if (touching) {
            Tallies tl = ctx.tallies();
            double sum = 0;
            for (int r = 0; r < layout.blockCount(); r++) {
                sum += g2p.blockContactWork(r);
            }
            tl.boundaryWork += sum;
            int no = contact.obstacleCount();
            int ng = tl.grips();
            double[] imp = g2p.blockImpulses();
            for (int o = 0; o < no; o++) {
                for (int k = 0; k < 4; k++) {
                    double s = 0;
                    for (int r = 0; r < layout.blockCount(); r++) {
                        s += imp[4 * (no * r + o) + k];
                    }
                    tl.perBoundary[4 * (ng + o) + k] += s;
                }
            }
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

    @Override
    public int phaseFieldIterations() {
        return phaseField == null ? 0 : phaseField.lastIterations();
    }

    @Override
    public double phaseFieldResidual() {
        return phaseField == null ? 0 : phaseField.lastResidual();
    }

    /**
     * {@inheritDoc} Sort (sorting and block activation), stress (material and damage laws, summed over workers and
     * scaled to wall time), scatter (P2G without the stress), grid (grid update and boundaries), solve (non-local
     * damage), gather (G2P, advection, return mapping).
     */
    @Override
    public Map<String, Double> phaseSeconds() {
        long[] cpu = p2g.cpuNanos();
        // Stress runs inside the scatter on all workers; attribute its share of the scatter's wall time.
        double stressShare = cpu[1] > 0 ? (double) cpu[0] / cpu[1] : 0;
        Map<String, Double> m = new LinkedHashMap<>();
        m.put("sort", phaseNanos[0] * 1e-9);
        m.put("stress", phaseNanos[1] * stressShare * 1e-9);
        m.put("scatter", phaseNanos[1] * (1 - stressShare) * 1e-9);
        m.put("grid", phaseNanos[2] * 1e-9);
        m.put("solve", phaseNanos[3] * 1e-9);
        m.put("gather", phaseNanos[4] * 1e-9);
        return m;
    }

    @Override
    public ConstitutiveUpdate constitutive() {
        return constitutive;
    }
}

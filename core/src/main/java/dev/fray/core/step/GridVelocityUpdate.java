package dev.fray.core.step;

import dev.fray.core.boundary.GridBoundaries;
import dev.fray.core.contact.FieldContact;
import dev.fray.core.grid.FieldSet;
import dev.fray.core.grid.SparseGrid;
import dev.fray.core.parallel.Reductions;
import dev.fray.core.parallel.Workers;

/**
 * The explicit grid update: each field's node momentum becomes a velocity, v = (p / m + g dt) e^{-c dt} (gravity g,
 * damping rate c), then the boundaries act ({@link GridBoundaries}), then fields in contact exchange momentum
 * ({@link FieldContact}). Runs over fixed tasks of grid blocks; the work, losses and boundary impulses of each task
 * are combined in task order into the {@link Tallies}.
 */
final class GridVelocityUpdate {
    private final StepContext ctx;
    private final FieldContact fieldContact;
    private final double[][] normals;
    private double[] partial = new double[0];
    private double[] accumulators = new double[0];

    private final boolean dampMomentumOnly;

    GridVelocityUpdate(StepContext ctx) {
        this(ctx, false);
    }

    /**
     * @param ctx              the step context
     * @param dampMomentumOnly damp p / m but not the gravity increment: v = (p / m) e^{-c dt} + g dt. The implicit
     *                         step needs it: at its long steps, damping gravity too would scale the weight a body
     *                         at rest carries by e^{-c dt}
     */
    GridVelocityUpdate(StepContext ctx, boolean dampMomentumOnly) {
        this.dampMomentumOnly = dampMomentumOnly;
        this.ctx = ctx;
        this.fieldContact = ctx.fields().count() > 1 ? new FieldContact(ctx.scene().separationFriction()) : null;
        this.normals = new double[ctx.workers().threads()][9];
    }

    void update(double h) {
        SparseGrid grid = ctx.grid();
        FieldSet fields = ctx.fields();
        GridBoundaries bounds = ctx.boundaries();
        Workers workers = ctx.workers();
        int gb = grid.blockCount();
        double[] g = ctx.scene().gravity();
        double gx = g[0] * h, gy = g[1] * h, gz = g[2] * h;
        double decay = Math.exp(-ctx.scene().damping() * h);
        bounds.begin(ctx.time, h);
        int tasks = Reductions.gridTasks(gb);
        int acc = bounds.accumulatorLength();
        if (partial.length < 3 * tasks) {
            partial = new double[Math.max(3 * tasks, 2 * partial.length)];
        }
        if (accumulators.length < acc * tasks) {
            accumulators = new double[Math.max(acc * tasks, 2 * accumulators.length)];
        }
        java.util.Arrays.fill(accumulators, 0, acc * tasks, 0.0);
        workers.forEach(tasks, (w, t) -> {
            int b0 = t * Reductions.GRID_TASK_BLOCKS, b1 = Math.min(gb, b0 + Reductions.GRID_TASK_BLOCKS);
            partial[3 * t + 1] = 0;
            double work = 0;
            for (int f = 0; f < fields.count(); f++) {
                work += updateNodes(w, t, b0, b1, fields.mass(f), fields.momentum(f), gx, gy, gz, decay);
            }
            double loss = 0;
            if (fieldContact != null) {
                loss = fieldContact.apply(fields, ctx.routing().normals(), ctx.routing().normalLengths2(), b0, b1);
            }
            partial[3 * t] = work;
            partial[3 * t + 2] = loss;
        });
        Tallies tl = ctx.tallies();
        tl.boundaryWork += Reductions.sum(partial, tasks, 3, 0);
        tl.dampingLoss += Reductions.sum(partial, tasks, 3, 1);
        tl.contactLoss += Reductions.sum(partial, tasks, 3, 2) + Reductions.sum(accumulators, tasks, acc,
                bounds.lossSlot());
        int nb = bounds.gripCount() + bounds.obstacleCount();
        for (int i = 0; i < nb; i++) {
            int s = i < bounds.gripCount() ? bounds.gripSlot(i) : bounds.obstacleSlot(i - bounds.gripCount());
            for (int k = 0; k < 3; k++) {
                tl.perBoundary[4 * i + k] = Reductions.sum(accumulators, tasks, acc, s + k);
            }
            tl.perBoundary[4 * i + 3] += Reductions.sum(accumulators, tasks, acc, s + 3);
        }
    }

    /**
     * Turns the momenta of one field on grid blocks [b0, b1) into velocities, adds gravity and damping, then
     * applies the boundaries.
     *
     * @return work done by grips and moving obstacles on these nodes, J
     */
    private double updateNodes(int w, int t, int b0, int b1, double[] gm, double[] gv, double gx, double gy,
                               double gz, double decay) {
        int[] coords = ctx.grid().blockCoords();
        GridBoundaries bounds = ctx.boundaries();
        int acc = bounds.accumulatorLength();
        double[] tally = accumulators;
        double[] nrm = normals[w];
        double work = 0;
        double damped = 0;
        boolean damping = decay != 1;
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
                double ux, uy, uz;
                if (dampMomentumOnly) {
                    ux = gv[n3] * inv;
                    uy = gv[n3 + 1] * inv;
                    uz = gv[n3 + 2] * inv;
                    gv[n3] = ux * decay + gx;
                    gv[n3 + 1] = uy * decay + gy;
                    gv[n3 + 2] = uz * decay + gz;
                } else {
                    ux = gv[n3] * inv + gx;
                    uy = gv[n3 + 1] * inv + gy;
                    uz = gv[n3 + 2] * inv + gz;
                    gv[n3] = ux * decay;
                    gv[n3 + 1] = uy * decay;
                    gv[n3 + 2] = uz * decay;
                }
                if (damping) {
                    damped += 0.5 * m * (ux * ux + uy * uy + uz * uz) * (1 - decay * decay);
                }
                work += bounds.applyNode(node, bx, by, bz, m, gv, nrm, tally, acc * t);
            }
        }
        partial[3 * t + 1] += damped;
        return work;
    }
}

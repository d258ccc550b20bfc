package dev.fray.core.sim;

import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.grid.BlockLayout;
import dev.fray.core.parallel.Workspace;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.step.ConstitutiveUpdate;
import dev.fray.core.step.StepContext;
import dev.fray.core.step.Tallies;

import java.util.ArrayList;
import java.util.List;

/**
 * Whole-scene sums over the particles (energies, momenta, fastest speed), each formed per fixed chunk of particles
 * and combined in chunk order, so they are bitwise identical for any thread count.
 */
final class DiagnosticsMeter {
    private static final int CHUNK = BlockLayout.PARTICLE_CHUNK;
    private static final int VALUES = 15;
    private final StepContext ctx;
    private final ConstitutiveUpdate constitutive;
    private final double inertia;

    DiagnosticsMeter(StepContext ctx, ConstitutiveUpdate constitutive) {
        this.ctx = ctx;
        this.constitutive = constitutive;
        this.inertia = ctx.scene().kernel().inertia(ctx.scene().cellSize());
    }

    Diagnostics measure(double dt) {
        ParticleStore store = ctx.store();
        int n = store.size();
        int tasks = (n + CHUNK - 1) / CHUNK;
        double[] part = new double[VALUES * tasks];
        double[] gravity = ctx.scene().gravity();
        double[] damage = store.spec(DamageModel.DAMAGE) == null ? null : store.channel(DamageModel.DAMAGE);
        ctx.workers().forEach(tasks, (w, t) -> {
            int a = t * CHUNK;
            int b = Math.min(n, a + CHUNK);
            double[] x = store.position();
            double[] v = store.velocity();
            double[] c = store.affine();
            double[] m = store.mass();
            double[] vol = store.volume();
            int[] body = store.body();
            double ke = 0, ka = 0, ee = 0, px = 0, py = 0, pz = 0, lx = 0, ly = 0, lz = 0, vmax = 0, pe = 0;
            for (int p = a; p < b; p++) {
                double mp = m[p];
                double vx = v[3 * p], vy = v[3 * p + 1], vz = v[3 * p + 2];
                double rx = x[3 * p], ry = x[3 * p + 1], rz = x[3 * p + 2];
                double s2 = vx * vx + vy * vy + vz * vz;
                int c9 = 9 * p;
                double cc = 0;
                for (int k = 0; k < 9; k++) {
                    cc += c[c9 + k] * c[c9 + k];
                }
                ke += 0.5 * mp * s2;
                // The affine part m D |C|^2 / 2 is what the grid sees of the velocity gradient.
                ka += 0.5 * mp * inertia * cc;
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
            double[] psi = ctx.workspaces()[w].get(Workspace.PSI_KEPT, b - a);
            double[] rel = ctx.workspaces()[w].get(Workspace.WORK, b - a);
            double released = 0;
            for (int runStart = a; runStart < b; ) {
                int bd = body[runStart];
                int runEnd = runStart + 1;
                while (runEnd < b && body[runEnd] == bd) {
                    runEnd++;
                }
                constitutive.energy(w, bd, runStart, runEnd, psi, rel);
                for (int p = runStart; p < runEnd; p++) {
                    ee += vol[p] * psi[p - runStart];
                    released += vol[p] * rel[p - runStart];
                }
                runStart = runEnd;
            }
            double broken = 0, total = 0, dmax = 0;
            for (int p = a; p < b; p++) {
                total += vol[p];
            }
            if (damage != null) {
                for (int p = a; p < b; p++) {
                    if (damage[p] > 0.5) {
                        broken += vol[p];
                    }
                    dmax = Math.max(dmax, damage[p]);
                }
            }
            int o = VALUES * t;
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
            part[o + 10] = released;
            part[o + 11] = broken;
            part[o + 12] = total;
            part[o + 13] = dmax;
            part[o + 14] = ka;
        });
        double[] sum = new double[VALUES];
        for (int t = 0; t < tasks; t++) {
            for (int k = 0; k < 8; k++) {
                sum[k] += part[VALUES * t + k];
            }
            sum[8] = Math.max(sum[8], part[VALUES * t + 8]);
            sum[9] += part[VALUES * t + 9];
            for (int k = 10; k < 13; k++) {
                sum[k] += part[VALUES * t + k];
            }
            sum[13] = Math.max(sum[13], part[VALUES * t + 13]);
            sum[14] += part[VALUES * t + 14];
        }
        Tallies tl = ctx.tallies();
        List<BoundaryLoad> loads = new ArrayList<>();
        List<Grip> grips = ctx.scene().grips();
        List<Obstacle> obstacles = ctx.scene().obstacles();
        double inv = dt > 0 ? 1 / dt : 0;
        for (int i = 0; i < grips.size() + obstacles.size(); i++) {
            boolean grip = i < grips.size();
            loads.add(new BoundaryLoad(grip ? "grip" : "obstacle",
                    grip ? grips.get(i).name() : obstacles.get(i - grips.size()).name(),
                    tl.boundary(i, 0) * inv, tl.boundary(i, 1) * inv, tl.boundary(i, 2) * inv, tl.boundary(i, 3)));
        }
        return new Diagnostics(ctx.step(), ctx.time(), dt, sum[0], sum[1], sum[2], sum[3], sum[4], sum[5], sum[6],
                sum[7], Math.sqrt(sum[8]), sum[9], sum[14], tl.boundaryWork(), tl.dampingLoss(), tl.contactLoss(), sum[10],
                tl.initialEnergy(), sum[12] > 0 ? sum[11] / sum[12] : 0, sum[13], loads);
    }
}

package dev.fray.core.step;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.parallel.Workspace;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.transfer.ParticleToGrid;

/**
 * Stress and energy of the particles from their material laws and damage models. Without damage the stress is the
 * law's Kirchhoff stress; with damage the law splits it into a part damage degrades and a part it keeps, the damage
 * model updates its state from them and returns the degradation g, and tau = g tau_degraded + tau_kept. The energy
 * density is psi = g psi_degraded + psi_kept, the energy the degraded stress derives from.
 */
public final class ConstitutiveUpdate implements ParticleToGrid.StressSource {
    private final ParticleStore store;
    private final MaterialLaw[] laws;
    private final DamageModel[] damage;
    private final Workspace[] workspaces;

    /** @param ctx the step context */
    public ConstitutiveUpdate(StepContext ctx) {
        this.store = ctx.store();
        this.laws = ctx.laws();
        this.damage = ctx.damage();
        this.workspaces = ctx.workspaces();
    }

    /** {@inheritDoc} Also advances the damage state of the particles by one step. */
    @Override
    public void stress(int worker, int b, int from, int to, double h, double[] tau) {
        DamageModel dm = damage[b];
        if (dm == null) {
            laws[b].kirchhoffStress(store, from, to, tau);
            return;
        }
        int n = to - from;
        Workspace ws = workspaces[worker];
        double[] kept = ws.get(Workspace.KEPT, 9 * n);
        double[] psiD = ws.get(Workspace.PSI_DEGRADED, n);
        double[] psiK = ws.get(Workspace.PSI_KEPT, n);
        double[] g = ws.get(Workspace.DEGRADATION, n);
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

    /**
     * Energy densities of particles [from, to) of body b without changing any state.
     *
     * @param worker   the worker (for its workspace)
     * @param b        the body
     * @param from     first particle
     * @param to       end particle, exclusive
     * @param psi      (output) stored energy density per particle from index 0, J/m^3
     * @param released (output, may be null) energy density damage has taken out, (1 - g) psi_degraded, J/m^3
     */
    public void energy(int worker, int b, int from, int to, double[] psi, double[] released) {
        int len = to - from;
        if (damage[b] == null) {
            laws[b].energyDensity(store, from, to, psi);
            if (released != null) {
                java.util.Arrays.fill(released, 0, len, 0.0);
            }
            return;
        }
        Workspace ws = workspaces[worker];
        double[] psiD = ws.get(Workspace.PSI_DEGRADED, len);
        double[] g = ws.get(Workspace.DEGRADATION, len);
        laws[b].splitKirchhoffStress(damage[b].tensionSplit(), store, from, to, ws.get(Workspace.TAU, 9 * len),
                ws.get(Workspace.KEPT, 9 * len), psiD, psi);
        damage[b].degradation(store, from, to, g);
        for (int i = 0; i < len; i++) {
            psi[i] += g[i] * psiD[i];
        }
        if (released != null) {
            for (int i = 0; i < len; i++) {
                released[i] = (1 - g[i]) * psiD[i];
            }
        }
    }
}

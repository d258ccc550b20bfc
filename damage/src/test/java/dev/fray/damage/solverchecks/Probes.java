package dev.fray.damage.solverchecks;

import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.ParticleView;

/** Whole-body measurements taken from a particle view in tests. */
final class Probes {
    private Probes() {
    }

    /** @return mass-weighted mean of component k of a 3-wide channel */
    static double massMean(ParticleView v, String channel, int k) {
        double sm = 0;
        double s = 0;
        for (int p = 0; p < v.size(); p++) {
            double m = v.get(ParticleStore.MASS, p, 0);
            sm += m;
            s += m * v.get(channel, p, k);
        }
        return s / sm;
    }

    /** @return channel values in stable-id order */
    static double[] byId(ParticleView v, String channel) {
        double[] out = new double[v.size() * v.spec(channel).width()];
        v.copyById(channel, out, 0);
        return out;
    }

    /** Least-squares slope of y over t. */
    static double slope(double[] t, double[] y, int n) {
        double st = 0, sy = 0;
        for (int i = 0; i < n; i++) {
            st += t[i];
            sy += y[i];
        }
        double mt = st / n, my = sy / n;
        double num = 0, den = 0;
        for (int i = 0; i < n; i++) {
            num += (t[i] - mt) * (y[i] - my);
            den += (t[i] - mt) * (t[i] - mt);
        }
        return num / den;
    }
}

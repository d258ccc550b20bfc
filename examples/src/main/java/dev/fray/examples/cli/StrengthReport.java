package dev.fray.examples.cli;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Obstacle;
import dev.fray.core.damage.UniaxialStrength;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.damage.elastic.FixedCorotated;
import dev.fray.damage.elastic.HenckyStVK;
import dev.fray.damage.elastic.NeoHookean;
import dev.fray.damage.fiber.FiberReinforced;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * The part of {@code fray check} that translates each damaged body's settings into a strength and compares it
 * with rough estimates of the stresses the scene applies, warning when a body will break everywhere or never.
 *
 * <p>Strength: {@link dev.fray.core.damage.DamageModel#uniaxialStrength} of the model resolved for the grid, with
 * Young's modulus of the body's elastic law (of its matrix for a fiber-reinforced law; for other laws rho c^2, the
 * P-wave modulus, an upper bound of E).
 *
 * <p>Stresses (order-of-magnitude estimates; common practice, no source):
 * <ul>
 *   <li>a grip that starts moving at speed v sends a plane wave of stress rho c v through the body (acoustic
 *   impedance times particle velocity), with c the body's wave speed;</li>
 *   <li>two grips moving apart at relative speed v_rel across a free span L stretch it by v_rel t / L: stress
 *   E v_rel t / L at time t;</li>
 *   <li>a body that is not held and falls (or is thrown) through a height h onto a wall or obstacle hits it at
 *   v = sqrt(|v0|^2 + 2 g h): stress rho c v; h is the shortest free path of its particles along gravity
 *   (sphere tracing of the obstacles' signed distances, the domain walls);</li>
 *   <li>a moving obstacle pushes with rho c v_obstacle where it touches, and the body's own weight gives
 *   rho g H over its height H.</li>
 * </ul>
 * Grip waves and impacts load the whole body: if one reaches {@link #SHATTER_RATIO} times the peak strength
 * during the run, or the grips' stretch does within the first {@link #FIRST_FRAMES} frames, the body will break
 * everywhere. If no estimate reaches {@link #NEVER_RATIO} times the peak strength over the whole run, it will not
 * break at all. Both ratios were set on scenes of our own (a jelly dropped on a ball shattered at 1.8 times its
 * strength and cracked at 1.2) and leave room for the notches and stress concentrations the estimates ignore.
 */
final class StrengthReport {
    /** Whole-body load over peak strength above which the body breaks everywhere. */
    static final double SHATTER_RATIO = 1.5;
    /** Largest load over peak strength below which the body never breaks. */
    static final double NEVER_RATIO = 0.5;
    /** The grips' stretch counts toward breaking everywhere when reached within this many frames. */
    static final int FIRST_FRAMES = 2;
    /** Rays traced per body for the fall height, at most. */
    private static final int MAX_RAYS = 4000;

    /** One estimated stress: what causes it, Pa, when (s), and whether it loads the whole body. */
    private record Load(String what, double stress, double time, boolean wholeBody) {
    }

    private StrengthReport() {
    }

    /**
     * Prints the strength and the load estimates of every damaged body and adds the warnings.
     *
     * @param out      where the report goes
     * @param warnings (output) warnings are appended
     * @param s        the scene
     * @param pv       its particles as sampled
     * @param frames   frames the run will cover
     */
    static void report(PrintWriter out, List<String> warnings, Scene s, ParticleView pv, int frames) {
        double duration = frames / s.frameRate();
        for (int b = 0; b < s.bodies().size(); b++) {
            Body body = s.bodies().get(b);
            if (body.damage() == null) {
                continue;
            }
            MaterialLaw law = body.material();
            double e = youngsModulus(law);
            boolean estimated = Double.isNaN(e);
            if (estimated) {
                e = law.density() * law.waveSpeed() * law.waveSpeed();
            }
            UniaxialStrength st = body.damage().resolvedFor(s.cellSize()).uniaxialStrength(e).orElse(null);
            if (st == null) {
                out.printf(Locale.ROOT, "  strength of %s: not reported by damage model %s%n", body.name(),
                        body.damage().name());
                continue;
            }
            out.printf(Locale.ROOT, "  strength of %s (E = %.4g Pa%s): damage from %.4g Pa, peak %.4g Pa at strain"
                            + " %.3g (%s)%n", body.name(), e, estimated ? ", rho c^2" : "", st.onsetStress(),
                    st.peakStress(), st.peakStrain(), st.basis());
            List<Load> loads = loads(s, pv, b, e, duration);
            Load worstWhole = null;
            Load worst = null;
            for (Load l : loads) {
                out.printf(Locale.ROOT, "    load: %s: about %.4g Pa at t = %.3g s (%.2f x peak)%n", l.what(),
                        l.stress(), l.time(), l.stress() / st.peakStress());
                if (l.wholeBody() && (worstWhole == null || l.stress() > worstWhole.stress())) {
                    worstWhole = l;
                }
                if (worst == null || l.stress() > worst.stress()) {
                    worst = l;
                }
            }
            if (worstWhole != null && worstWhole.stress() >= SHATTER_RATIO * st.peakStress()) {
                warnings.add(String.format(Locale.ROOT, "body \"%s\" will likely break everywhere: %s loads it to"
                        + " about %.3g Pa at t = %.3g s (frame %d), %.1f times its strength %.3g Pa; raise the"
                        + " strength (fractureEnergy, criticalStress) or soften the load", body.name(),
                        worstWhole.what(), worstWhole.stress(), worstWhole.time(),
                        (int) Math.floor(worstWhole.time() * s.frameRate()), worstWhole.stress() / st.peakStress(),
                        st.peakStress()));
            }
            double most = worst == null ? 0 : worst.stress();
            if (most < NEVER_RATIO * st.peakStress()) {
                warnings.add(String.format(Locale.ROOT, "body \"%s\" will likely never break: the largest stress"
                        + " this scene applies is about %.3g Pa (%s), under half its strength %.3g Pa; lower the"
                        + " strength or load it harder", body.name(), most, worst == null ? "no load" : worst.what(),
                        st.peakStress()));
            }
        }
    }

    /** Young's modulus of a built-in elastic law (of the matrix of a fiber-reinforced one), Pa, or NaN. */
    static double youngsModulus(MaterialLaw law) {
        MaterialLaw m = law instanceof FiberReinforced fr ? fr.base() : law;
        if (m instanceof NeoHookean n) {
            return n.parameters().youngsModulus();
        }
        if (m instanceof FixedCorotated f) {
            return f.parameters().youngsModulus();
        }
        if (m instanceof HenckyStVK h) {
            return h.parameters().youngsModulus();
        }
        return Double.NaN;
    }

    private static List<Load> loads(Scene s, ParticleView pv, int body, double e, double duration) {
        MaterialLaw law = s.bodies().get(body).material();
        double impedance = law.density() * law.waveSpeed();
        List<Load> loads = new ArrayList<>();
        int n = pv.size();
        boolean gripped = false;
        int grips = s.grips().size();
        double[][] held = new double[grips][]; // centroid (3), count, and later the span bounds
        double[] reach = new double[grips];
        for (int g = 0; g < grips; g++) {
            held[g] = new double[4];
        }
        // Bodies share one velocity field where they touch, so a grip on one body pulls on the bodies bonded to it:
        // every body's held particles count.
        for (int p = 0; p < n && grips > 0; p++) {
            int g = (int) pv.get("grip", p, 0);
            if (g >= 0) {
                gripped = true;
                Motion m = s.grips().get(g).motion();
                for (int a = 0; a < 3; a++) {
                    held[g][a] += pv.get(ParticleStore.POSITION, p, a);
                }
                held[g][3]++;
                double dx = pv.get(ParticleStore.POSITION, p, 0) - m.cx();
                double dy = pv.get(ParticleStore.POSITION, p, 1) - m.cy();
                double dz = pv.get(ParticleStore.POSITION, p, 2) - m.cz();
                reach[g] = Math.max(reach[g], Math.sqrt(dx * dx + dy * dy + dz * dz));
            }
        }
        for (int g = 0; g < grips; g++) {
            Grip grip = s.grips().get(g);
            if (held[g][3] == 0) {
                continue;
            }
            for (int a = 0; a < 3; a++) {
                held[g][a] /= held[g][3];
            }
            double v = grip.motion().linearSpeed() + grip.motion().angularSpeed() * reach[g];
            if (v > 0) {
                loads.add(new Load("grip \"" + grip.name() + "\" starting at " + fmt(v) + " m/s (rho c v)",
                        impedance * v, 0, true));
            }
        }
        for (int i = 0; i < grips; i++) {
            for (int j = i + 1; j < grips; j++) {
                if (held[i][3] > 0 && held[j][3] > 0) {
                    stretch(s, pv, body, i, j, held, e, duration, loads);
                }
            }
        }
        if (!gripped) {
            impact(s, pv, body, impedance, duration, loads);
        }
        for (Obstacle o : s.obstacles()) {
            if (!o.motion().isStill()) {
                Bounds bb = o.shape().bounds();
                double r = 0.5 * Math.sqrt(sq(bb.maxX() - bb.minX()) + sq(bb.maxY() - bb.minY())
                        + sq(bb.maxZ() - bb.minZ()));
                // An unbounded obstacle that turns sweeps at no finite speed: count its translation only.
                double v = o.motion().linearSpeed()
                        + (o.motion().angularSpeed() > 0 && Double.isFinite(r) ? o.motion().angularSpeed() * r : 0);
                loads.add(new Load("obstacle \"" + o.name() + "\" pushing at " + fmt(v) + " m/s where it touches"
                        + " (rho c v)", impedance * v, 0, false));
            }
        }
        double[] g = s.gravity();
        double gn = Math.sqrt(g[0] * g[0] + g[1] * g[1] + g[2] * g[2]);
        if (gn > 0) {
            double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
            for (int p = 0; p < n; p++) {
                if (pv.body(p) == body) {
                    double h = project(pv, p, g) / gn;
                    lo = Math.min(lo, h);
                    hi = Math.max(hi, h);
                }
            }
            loads.add(new Load("own weight over its height (rho g H)", law.density() * gn * (hi - lo), 0, false));
        }
        return loads;
    }

    /** The stretch of the free span between two grips moving apart. */
    private static void stretch(Scene s, ParticleView pv, int body, int i, int j, double[][] held, double e,
                                double duration, List<Load> loads) {
        double[] axis = {held[j][0] - held[i][0], held[j][1] - held[i][1], held[j][2] - held[i][2]};
        double len = Math.sqrt(sq(axis[0]) + sq(axis[1]) + sq(axis[2]));
        if (len == 0) {
            return;
        }
        Motion mi = s.grips().get(i).motion();
        Motion mj = s.grips().get(j).motion();
        double vRel = ((mj.vx() - mi.vx()) * axis[0] + (mj.vy() - mi.vy()) * axis[1]
                + (mj.vz() - mi.vz()) * axis[2]) / len;
        if (!(vRel > 0)) {
            return;
        }
        double maxI = Double.NEGATIVE_INFINITY, minJ = Double.POSITIVE_INFINITY;
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (int p = 0; p < pv.size(); p++) {
            int g = (int) pv.get("grip", p, 0);
            double proj = project(pv, p, axis) / len;
            if (g == i) {
                maxI = Math.max(maxI, proj);
            } else if (g == j) {
                minJ = Math.min(minJ, proj);
            }
            if (pv.body(p) == body) {
                lo = Math.min(lo, proj);
                hi = Math.max(hi, proj);
            }
        }
        double span = minJ > maxI ? minJ - maxI : len;
        if (minJ > maxI && (hi < maxI || lo > minJ)) {
            return; // the body lies outside the stretched span
        }
        String what = "grips \"" + s.grips().get(i).name() + "\" and \"" + s.grips().get(j).name()
                + "\" stretching " + fmt(span) + " m at " + fmt(vRel) + " m/s";
        double early = Math.min(duration, FIRST_FRAMES / s.frameRate());
        loads.add(new Load(what + " (E v t / L, by frame " + FIRST_FRAMES + ")", e * vRel * early / span, early,
                true));
        loads.add(new Load(what + " (E v t / L, by the end)", e * vRel * duration / span, duration, false));
    }

    /** Impact after a fall or throw onto a wall or obstacle within the run. */
    private static void impact(Scene s, ParticleView pv, int body, double impedance, double duration,
                               List<Load> loads) {
        double[] g = s.gravity();
        double gn = Math.sqrt(g[0] * g[0] + g[1] * g[1] + g[2] * g[2]);
        double[] mean = new double[3];
        double vmax = 0;
        int count = 0;
        for (int p = 0; p < pv.size(); p++) {
            if (pv.body(p) == body) {
                double v2 = 0;
                for (int a = 0; a < 3; a++) {
                    double v = pv.get(ParticleStore.VELOCITY, p, a);
                    mean[a] += v;
                    v2 += v * v;
                }
                vmax = Math.max(vmax, Math.sqrt(v2));
                count++;
            }
        }
        double v0 = Math.sqrt(sq(mean[0]) + sq(mean[1]) + sq(mean[2])) / count;
        double[] dir = gn > 0 ? new double[] {g[0] / gn, g[1] / gn, g[2] / gn}
                : v0 > 0 ? new double[] {mean[0] / (count * v0), mean[1] / (count * v0), mean[2] / (count * v0)}
                : null;
        if (dir == null) {
            return;
        }
        int stride = Math.max(1, count / MAX_RAYS);
        double h = Double.POSITIVE_INFINITY;
        int k = 0;
        for (int p = 0; p < pv.size(); p++) {
            if (pv.body(p) == body && k++ % stride == 0) {
                h = Math.min(h, freePath(s, pv.get(ParticleStore.POSITION, p, 0),
                        pv.get(ParticleStore.POSITION, p, 1), pv.get(ParticleStore.POSITION, p, 2), dir));
            }
        }
        if (h < s.cellSize()) {
            return; // resting on a wall or obstacle already
        }
        double u0 = (mean[0] * dir[0] + mean[1] * dir[1] + mean[2] * dir[2]) / count;
        double t = gn > 0 ? (-u0 + Math.sqrt(u0 * u0 + 2 * gn * h)) / gn : h / v0;
        if (!(t <= duration)) {
            return;
        }
        double v = Math.sqrt(vmax * vmax + 2 * gn * h);
        loads.add(new Load("impact at " + fmt(v) + " m/s after " + fmt(h) + " m (rho c v)", impedance * v, t, true));
    }

    /** Distance from a point along a unit direction to the first obstacle surface or domain wall, m. */
    private static double freePath(Scene s, double x, double y, double z, double[] dir) {
        Bounds d = s.domain();
        double wall = Double.POSITIVE_INFINITY;
        double[] pos = {x, y, z};
        double[] lo = {d.minX(), d.minY(), d.minZ()};
        double[] hi = {d.maxX(), d.maxY(), d.maxZ()};
        for (int a = 0; a < 3; a++) {
            if (dir[a] > 0) {
                wall = Math.min(wall, (hi[a] - pos[a]) / dir[a]);
            } else if (dir[a] < 0) {
                wall = Math.min(wall, (pos[a] - lo[a]) / -dir[a]);
            }
        }
        double contact = 0.5 * s.cellSize();
        double t = 0;
        while (t < wall) {
            double px = x + t * dir[0], py = y + t * dir[1], pz = z + t * dir[2];
            double near = Double.POSITIVE_INFINITY;
            for (Obstacle o : s.obstacles()) {
                near = Math.min(near, o.shape().distance(px, py, pz));
            }
            if (near < contact) {
                return t;
            }
            t += near;
        }
        return Math.max(0, wall);
    }

    private static double project(ParticleView pv, int p, double[] dir) {
        return pv.get(ParticleStore.POSITION, p, 0) * dir[0] + pv.get(ParticleStore.POSITION, p, 1) * dir[1]
                + pv.get(ParticleStore.POSITION, p, 2) * dir[2];
    }

    private static double sq(double v) {
        return v * v;
    }

    private static String fmt(double v) {
        return String.format(Locale.ROOT, "%.3g", v);
    }
}

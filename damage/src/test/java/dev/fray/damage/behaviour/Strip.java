package dev.fray.damage.behaviour;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Motion;
import dev.fray.core.boundary.Shape;
import dev.fray.core.boundary.Shapes;
import dev.fray.core.damage.DamageModel;
import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.particles.ChannelField;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.ParticleView;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.sim.VelocityField;
import dev.fray.damage.fiber.FiberChannels;
import dev.fray.damage.fiber.FiberFields;

/**
 * The specimen of the fracture-behaviour tests: a thin strip in the x-y plane, one cell thick in z so it behaves
 * nearly in 2D, pulled apart along y. Three bodies on one grid: the gauge (body 0, which may break) between two end
 * tabs (bodies 1 and 2, the same law but no damage model). The grid glues them into one solid; the tabs keep the
 * stress concentrations at the grip edges out of the gauge, as tabs do on a tensile specimen. Grips hold the outer
 * two cells of each tab and move at -v and +v along y; the strip starts with the matching linear velocity
 * profile, so loading starts without a shock. Optional: an edge notch (pre-damaged, from the left edge along
 * y = centre), a round hole at the centre, and uniform fibers at an angle in the x-y plane. SI units throughout.
 */
final class Strip {
    /** Grid cell size of every specimen, m. */
    static final double CELL = 1.0 / 48;
    /** Centre of the strip, x, m. */
    static final double CX = 0.5;
    /** Centre of the strip, y, m. */
    static final double CY = 0.5;
    /** Centre of the strip, z, m. */
    static final double CZ = 0.5;
    /**
     * Worker threads. Results do not depend on it (DESIGN.md section 3); 2 matches the test machines.
     */
    static final int THREADS = 2;

    private final MaterialLaw law;
    private final DamageModel damage;
    /** Width along x, m. */
    private final double width = 20 * CELL;
    /** Height of the gauge along y, m. */
    private final double gauge = 16 * CELL;
    /** Height of each tab along y, m. */
    private final double tab = 4 * CELL;
    private double pull = 0.1;
    private double notch;
    private double hole;
    private double fiberAngle = Double.NaN;
    private boolean gripped = true;

    /**
     * @param law    law of gauge and tabs
     * @param damage damage model of the gauge
     */
    Strip(MaterialLaw law, DamageModel damage) {
        this.law = law;
        this.damage = damage;
    }

    /** @param metresPerSecond speed of each grip, m/s; @return this */
    Strip pull(double metresPerSecond) {
        pull = metresPerSecond;
        return this;
    }

    /** @param cells length of a fully damaged edge notch from the left edge, in cells; @return this */
    Strip notch(double cells) {
        notch = cells * CELL;
        return this;
    }

    /** @param cells radius of a round hole through the centre, in cells; @return this */
    Strip hole(double cells) {
        hole = cells * CELL;
        return this;
    }

    /** @param degrees fiber direction in the x-y plane, from the x axis; @return this */
    Strip fibers(double degrees) {
        fiberAngle = degrees;
        return this;
    }

    /**
     * Leaves out the grips: the strip then only stretches under its initial velocity profile and flies apart, with
     * nothing doing work on it.
     *
     * @return this
     */
    Strip free() {
        gripped = false;
        return this;
    }

    /** @return left edge of the strip, m */
    double left() {
        return CX - width / 2;
    }

    /** @return width of the strip, m */
    double widthMetres() {
        return width;
    }

    /** @return the scene */
    Scene scene() {
        double h = CELL / 2;
        double yb = CY - gauge / 2 - tab;
        double yt = CY + gauge / 2 + tab;
        // Grips sit on the outer two cells of each tab; the profile reaches +-pull there on average.
        double rate = pull / (gauge / 2 + tab - CELL);
        VelocityField profile = (x, y, z, out) -> out[1] = rate * (y - CY);
        Shape box = Shapes.box(left(), CY - gauge / 2, CZ - h, left() + width, CY + gauge / 2, CZ + h);
        Body.Builder g = Body.named("gauge").shape(hole > 0 ? new Holed(box, CX, CY, hole) : box)
                .material(law).damage(damage).jitter(0.3).seed(5).velocityField(profile);
        if (notch > 0) {
            double end = left() + notch;
            // Two particle rows (spacing half a cell) straddle y = CY.
            g.initialChannel(DamageModel.DAMAGE,
                    (x, y, z, out) -> out[0] = x < end && Math.abs(y - CY) < 0.6 * CELL ? 1.0 : 0.0);
        }
        Body.Builder bottom = Body.named("tab-bottom").material(law).jitter(0.3).seed(6).velocityField(profile)
                .shape(Shapes.box(left(), yb, CZ - h, left() + width, CY - gauge / 2, CZ + h));
        Body.Builder top = Body.named("tab-top").material(law).jitter(0.3).seed(7).velocityField(profile)
                .shape(Shapes.box(left(), CY + gauge / 2, CZ - h, left() + width, yt, CZ + h));
        if (!Double.isNaN(fiberAngle)) {
            double a = Math.toRadians(fiberAngle);
            ChannelField f = FiberFields.uniform(Math.cos(a), Math.sin(a), 0);
            g.initialChannel(FiberChannels.reference(1), f);
            if (law.channels().stream().anyMatch(c -> c.name().equals(FiberChannels.reference(1)))) {
                bottom.initialChannel(FiberChannels.reference(1), f);
                top.initialChannel(FiberChannels.reference(1), f);
            }
        }
        Scene.Builder s = Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(CELL).gravity(0, 0, 0)
                // A loose, capped phase-field solve: with its warm start it is plenty for trends and keeps the
                // tests fast (common practice, no source).
                .threads(THREADS).phaseFieldSolver(1e-3, 15)
                .add(g.build()).add(bottom.build()).add(top.build());
        if (gripped) {
            s.add(new Grip("bottom", "tab-bottom", Shapes.box(0, 0, 0, 1, yb + 2 * CELL, 1),
                    Motion.linear(0, -pull, 0)));
            s.add(new Grip("top", "tab-top", Shapes.box(0, yt - 2 * CELL, 0, 1, 1, 1), Motion.linear(0, pull, 0)));
        }
        return s.build();
    }

    /**
     * Largest x of gauge particles with d &gt; 0.5 within four cells of the notch line y = CY: the crack front.
     *
     * @param v particles
     * @return front position, m (the left edge if nothing is broken there)
     */
    double front(ParticleView v) {
        double front = left();
        for (int p = 0; p < v.size(); p++) {
            if (v.body(p) == 0 && v.get(DamageModel.DAMAGE, p, 0) > 0.5
                    && Math.abs(v.get(ParticleStore.POSITION, p, 1) - CY) < 4 * CELL) {
                front = Math.max(front, v.get(ParticleStore.POSITION, p, 0));
            }
        }
        return front;
    }

    /**
     * Volume average of the Cauchy stress sigma_yy over one body, damage included: sum V0 tau_yy / sum V0 J with
     * tau = g tau_degraded + tau_kept, as the solver forms it (the tabs have no damage, and their damage channel
     * stays 0). In uniaxial pulling this is the mean load per area.
     *
     * @param sim   the simulation
     * @param model the gauge's damage model (for its degradation)
     * @param which body index: 0 gauge, 1 bottom tab, 2 top tab
     * @return sigma_yy, Pa
     */
    double meanStressYY(Simulation sim, DamageModel model, int which) {
        ParticleView v = sim.particles();
        int n = v.size();
        double[] f = new double[9 * n];
        v.copyById(ParticleStore.DEFORMATION, f, 0);
        ArrayMaterialState state = new ArrayMaterialState(f);
        for (String ch : v.channelNames()) {
            if (!ch.equals(ParticleStore.DEFORMATION)) {
                double[] a = new double[n * v.spec(ch).width()];
                v.copyById(ch, a, 0);
                state.withChannel(ch, a);
            }
        }
        double[] tauD = new double[9 * n];
        double[] tauK = new double[9 * n];
        double[] psiD = new double[n];
        double[] psiK = new double[n];
        double[] g = new double[n];
        law.splitKirchhoffStress(state, 0, n, tauD, tauK, psiD, psiK);
        model.degradation(state, 0, n, g);
        int[] body = new int[n];
        for (int p = 0; p < n; p++) {
            body[v.id(p)] = v.body(p);
        }
        double tau = 0, volume = 0;
        for (int i = 0; i < n; i++) {
            if (body[i] != which) {
                continue;
            }
            int o = 9 * i;
            tau += g[i] * tauD[o + 4] + tauK[o + 4];
            volume += f[o] * (f[o + 4] * f[o + 8] - f[o + 5] * f[o + 7])
                    - f[o + 1] * (f[o + 3] * f[o + 8] - f[o + 5] * f[o + 6])
                    + f[o + 2] * (f[o + 3] * f[o + 7] - f[o + 4] * f[o + 6]);
        }
        return tau / volume;
    }

    /**
     * Mean y velocity of the upper piece (gauge above y = CY and the top tab) relative to its grip: after the cut,
     * this swings as the piece rings.
     *
     * @param v particles
     * @return velocity, m/s
     */
    double upperPieceVelocity(ParticleView v) {
        double s = 0;
        int n = 0;
        for (int p = 0; p < v.size(); p++) {
            if (v.body(p) == 2 || v.body(p) == 0 && v.get(ParticleStore.POSITION, p, 1) > CY) {
                s += v.get(ParticleStore.VELOCITY, p, 1);
                n++;
            }
        }
        return s / n - pull;
    }

    /**
     * Direction of the crack near the centre: the principal axis of the x-y positions of gauge particles with
     * d &gt; 0.5 within a radius of the centre.
     *
     * @param v      particles
     * @param radius radius of the disc, m
     * @return {angle of the axis from x in degrees in (-90, 90], number of particles used, largest distance of
     *         one from the centre divided by the radius}
     */
    static double[] crackAxis(ParticleView v, double radius) {
        double sx = 0, sy = 0, sxx = 0, syy = 0, sxy = 0, reach = 0;
        int n = 0;
        for (int p = 0; p < v.size(); p++) {
            double x = v.get(ParticleStore.POSITION, p, 0) - CX;
            double y = v.get(ParticleStore.POSITION, p, 1) - CY;
            double r = Math.hypot(x, y);
            if (v.body(p) == 0 && v.get(DamageModel.DAMAGE, p, 0) > 0.5 && r < radius) {
                n++;
                sx += x;
                sy += y;
                sxx += x * x;
                syy += y * y;
                sxy += x * y;
                reach = Math.max(reach, r / radius);
            }
        }
        if (n < 2) {
            return new double[] {Double.NaN, n, reach};
        }
        double mx = sx / n, my = sy / n;
        double cxx = sxx / n - mx * mx, cyy = syy / n - my * my, cxy = sxy / n - mx * my;
        double angle = Math.toDegrees(0.5 * Math.atan2(2 * cxy, cxx - cyy));
        return new double[] {angle, n, reach};
    }

    /** @return number of gauge particles within a radius of the centre */
    static int gaugeParticlesWithin(ParticleView v, double radius) {
        int n = 0;
        for (int p = 0; p < v.size(); p++) {
            if (v.body(p) == 0 && Math.hypot(v.get(ParticleStore.POSITION, p, 0) - CX,
                    v.get(ParticleStore.POSITION, p, 1) - CY) < radius) {
                n++;
            }
        }
        return n;
    }

    /** @return the smallest difference between two line directions, degrees in [0, 90] */
    static double lineAngleBetween(double a, double b) {
        double d = Math.abs(a - b) % 180;
        return Math.min(d, 180 - d);
    }

    /** A box with a round hole along z: particles are sampled only where the hole is not. */
    private record Holed(Shape box, double cx, double cy, double radius) implements Shape {
        @Override
        public double distance(double x, double y, double z) {
            return Math.max(box.distance(x, y, z), radius - Math.hypot(x - cx, y - cy));
        }

        @Override
        public void normal(double x, double y, double z, double[] out, int off) {
            // Only bodies use this shape, and sampling needs the distance alone.
            throw new UnsupportedOperationException("normal of a sampling shape");
        }

        @Override
        public Bounds bounds() {
            return box.bounds();
        }
    }
}

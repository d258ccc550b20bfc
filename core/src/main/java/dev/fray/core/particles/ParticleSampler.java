package dev.fray.core.particles;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.boundary.Grip;
import dev.fray.core.boundary.Shape;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;

import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;

/** Turns the bodies of a scene into particles. */
public final class ParticleSampler {
    /** Name of the particle channel holding the index of the grip that holds a particle (-1 none). */
    public static final String GRIP_CHANNEL = "grip";

    /** Lattice points one body may hold. */
    public static final double MAX_LATTICE_POINTS = 2e8;

    private ParticleSampler() {
    }

    /**
     * @param body a body
     * @param dx   the grid's cell size, m
     * @return the body's particle spacing, m: its own, or half a cell
     */
    public static double spacing(Body body, double dx) {
        return Double.isNaN(body.spacing()) ? 0.5 * dx : body.spacing();
    }

    /**
     * Lattice points along x, y and z over a body's bounds, counted in floating point so that no product wraps
     * around.
     *
     * @param body    a body
     * @param spacing its particle spacing, m
     * @return the three counts, each at least 1 (whole numbers)
     * @throws InvalidInputException if the lattice would hold more than {@link #MAX_LATTICE_POINTS} points
     */
    public static double[] latticeCounts(Body body, double spacing) {
        Bounds bb = body.shape().bounds();
        double[] n = {count(bb.maxX() - bb.minX(), spacing), count(bb.maxY() - bb.minY(), spacing),
            count(bb.maxZ() - bb.minZ(), spacing)};
        double points = n[0] * n[1] * n[2];
        if (!(points <= MAX_LATTICE_POINTS)) {
            throw new InvalidInputException(FrayMessage.INCONSISTENT, "body \"" + body.name() + "\"",
                    String.format(java.util.Locale.ROOT, "its bounds (%.4g x %.4g x %.4g m) at particle spacing "
                            + "%.4g m make %s lattice points, more than the %.0e allowed per body; use a larger "
                            + "spacing or cellSize, or a smaller body", bb.maxX() - bb.minX(), bb.maxY() - bb.minY(),
                            bb.maxZ() - bb.minZ(), spacing,
                            Double.isFinite(points) ? String.format(java.util.Locale.ROOT, "%.3g", points)
                                    : "too many", MAX_LATTICE_POINTS));
        }
        return n;
    }

    private static double count(double extent, double spacing) {
        double n = Math.floor(extent / spacing + 1e-9);
        return n >= 1 ? n : 1;   // also for NaN
    }

    /**
     * Fills the channels a body gives initial values for (after the laws and damage models declared theirs).
     *
     * @param store  the particles
     * @param bodies the bodies, in scene order
     * @throws InvalidInputException if a channel is unknown or a value is not finite
     */
    public static void applyInitialChannels(ParticleStore store, List<Body> bodies) {
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

    /**
     * Samples every body of a scene: a lattice of the body's spacing (half a cell by default), centred in its bounds,
     * jittered by its seeded generator, kept where the shape's signed distance is not positive. Mass is density times
     * spacing cubed; velocity from the body's linear and angular velocity and velocity field; particles inside a
     * grip's region are tagged with the grip's index in the {@link #GRIP_CHANNEL} channel.
     *
     * @param scene the scene
     * @return the particles, body by body
     * @throws InvalidInputException if a body holds no particle or too many lattice points
     */
    public static ParticleStore sample(Scene scene) {
        double dx = scene.cellSize();
        List<Body> bodies = scene.bodies();
        double[][] pos = new double[bodies.size()][];
        int[] counts = new int[bodies.size()];
        int total = 0;
        for (int b = 0; b < bodies.size(); b++) {
            Body body = bodies.get(b);
            double s = spacing(body, dx);
            Bounds bb = body.shape().bounds();
            double[] n = latticeCounts(body, s);
            long nx = (long) n[0], ny = (long) n[1], nz = (long) n[2];
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
            double s = spacing(body, dx);
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
}

package dev.fray.core.boundary;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.kernel.Kernel;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.GridFixture;
import org.junit.jupiter.api.Test;

import java.util.List;

/**
 * Particle-level obstacle contact: a particle that ends a step inside a sphere is put back on the sphere's surface
 * along the radius through it (the nearest surface point of a ball; elementary geometry, no source), and the contact
 * law then acts on its velocity as on a node's.
 */
class ParticleObstacleContactTest extends FrayTestBase {
    private static final double[] CENTRE = {0.5, 0.5, 0.5};
    private static final double RADIUS = 0.2;

    @Test
    void particleInsideASphereGoesBackOnItsSurface() {
        ParticleStore store = new ParticleStore(3);
        double[][] start = {{0.6, 0.55, 0.48}, {0.45, 0.36, 0.5}, {0.9, 0.9, 0.9}};
        double[][] velocity = {{-1, -0.5, 0.2}, {-0.3, 0.8, 0.1}, {-1, -1, -1}};
        for (int p = 0; p < 3; p++) {
            System.arraycopy(start[p], 0, store.position(), 3 * p, 3);
            System.arraycopy(velocity[p], 0, store.velocity(), 3 * p, 3);
            store.mass()[p] = 0.002;
        }
        Obstacle ball = new Obstacle("ball", Shapes.sphere(CENTRE[0], CENTRE[1], CENTRE[2], RADIUS),
                Contact.separating(0), Motion.STILL);
        try (GridFixture fx = new GridFixture(store, Kernel.QUADRATIC, new double[3], 0.05, 1)) {
            ParticleObstacleContact contact = new ParticleObstacleContact(List.of(ball), fx.origin, fx.dx);
            assertTrue(contact.prepare(0, 1e-3, fx.layout), "some block reaches the ball");
            double[] acc = new double[4];
            double[] x = store.position();
            double[] v = store.velocity();
            for (int p = 0; p < 3; p++) {
                double work = contact.touch(x, v, store.mass(), p, new double[9], acc);
                assertEquals(0.0, work, "a still obstacle does no work");
                int id = store.id()[p];
                double[] r0 = {start[id][0] - CENTRE[0], start[id][1] - CENTRE[1], start[id][2] - CENTRE[2]};
                double d0 = Math.sqrt(dot(r0, r0));
                double[] after = {x[3 * p], x[3 * p + 1], x[3 * p + 2]};
                double[] vAfter = {v[3 * p], v[3 * p + 1], v[3 * p + 2]};
                if (d0 > RADIUS) {
                    assertArrayEquals(start[id], after, 0.0, "particle outside stays");
                    assertArrayEquals(velocity[id], vAfter, 0.0);
                    continue;
                }
                double[] n = {r0[0] / d0, r0[1] / d0, r0[2] / d0};
                double[] onSurface = {CENTRE[0] + RADIUS * n[0], CENTRE[1] + RADIUS * n[1], CENTRE[2] + RADIUS * n[2]};
                assertArrayEquals(onSurface, after, 1e-15, "particle " + id + " on the radius, at the surface");
                double vn = dot(velocity[id], n);
                double[] expected = velocity[id].clone();
                if (vn < 0) {
                    for (int k = 0; k < 3; k++) {
                        expected[k] -= vn * n[k];
                    }
                }
                assertArrayEquals(expected, vAfter, 1e-15, "separating contact on particle " + id);
            }
            // Both inner particles move inwards, so the impulse is the sum of m |vn| n over them.
            double[] impulse = new double[3];
            for (int id = 0; id < 2; id++) {
                double[] r0 = {start[id][0] - CENTRE[0], start[id][1] - CENTRE[1], start[id][2] - CENTRE[2]};
                double d0 = Math.sqrt(dot(r0, r0));
                double vn = dot(velocity[id], r0) / d0;
                assertTrue(vn < 0, "particle " + id + " moves inwards");
                for (int k = 0; k < 3; k++) {
                    impulse[k] -= 0.002 * vn * r0[k] / d0;
                }
            }
            assertArrayEquals(impulse, new double[] {acc[0], acc[1], acc[2]}, 1e-15, "impulse m (v' - v)");
        }
    }

    private static double dot(double[] a, double[] b) {
        return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    }
}

package dev.fray.io.mesh;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Bounds;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import dev.fray.io.mesh.MeshFixtures.Raw;

import org.junit.jupiter.api.Test;

/**
 * Bodies sampled from mesh shapes by the simulation's own lattice sampler: the particle count matches the
 * enclosed volume over spacing^3 (published: volume of the shape; a lattice of spacing h has one point per h^3),
 * and a 20 480-triangle mesh fills with 100 000 particles quickly.
 */
class MeshSamplingTest extends FrayTestBase {
    /** Lattice counts match volume / h^3 to this relative tolerance at these resolutions (about 30 points across). */
    private static final double COUNT_TOLERANCE = 0.02;
    /** Upper bound on the time to build the 100 000-particle simulation, s; measured about 2 s on 2 cores. */
    private static final double SAMPLING_BUDGET_S = 30;

    private static Simulation fill(MeshShape shape, double spacing, double jitter) {
        Bounds b = shape.bounds();
        double pad = 4 * spacing;
        Scene scene = Scene.builder()
                .domain(b.minX() - pad, b.minY() - pad, b.minZ() - pad, b.maxX() + pad, b.maxY() + pad,
                        b.maxZ() + pad)
                .cellSize(2 * spacing)
                .threads(2)
                .add(Body.named("mesh").shape(shape).material(Elastic.fixedCorotated(1e5, 0.3, 1000))
                        .spacing(spacing).jitter(jitter).seed(11).build())
                .build();
        return new Simulation(scene);
    }

    @Test
    void sphereLikeMeshFillsWithItsVolume() {
        Raw sphere = MeshFixtures.icosphere(0.02, -0.01, 0.03, 0.1, 4);
        MeshShape shape = MeshShape.of(sphere.mesh());
        double volume = MeshFixtures.volume(sphere); // divergence theorem, computed independently of MeshShape
        double h = 0.0052;
        try (Simulation sim = fill(shape, h, 0.3)) {
            double expected = volume / (h * h * h);
            int n = sim.particles().size();
            assertEquals(expected, n, COUNT_TOLERANCE * expected, "particles " + n + ", volume / h^3 " + expected);
        }
    }

    @Test
    void torusFillsWithItsVolume() {
        Raw torus = MeshFixtures.torus(0.3, 0.1, 96, 24);
        MeshShape shape = MeshShape.of(torus.mesh());
        double volume = MeshFixtures.volume(torus);
        double h = 0.0125;
        try (Simulation sim = fill(shape, h, 0.0)) {
            double expected = volume / (h * h * h);
            int n = sim.particles().size();
            assertEquals(expected, n, COUNT_TOLERANCE * expected, "particles " + n + ", volume / h^3 " + expected);
        }
    }

    @Test
    void twentyThousandTrianglesFillWithOneHundredThousandParticlesQuickly() {
        Raw sphere = MeshFixtures.icosphere(0, 0, 0, 0.1, 5);
        assertEquals(20480, sphere.triangles());
        long t0 = System.nanoTime();
        MeshShape shape = MeshShape.of(sphere.mesh());
        double h = Math.cbrt(MeshFixtures.volume(sphere) / 100_000);
        try (Simulation sim = fill(shape, h, 0.25)) {
            double seconds = (System.nanoTime() - t0) * 1e-9;
            int n = sim.particles().size();
            assertEquals(100_000, n, COUNT_TOLERANCE * 100_000);
            assertTrue(seconds < SAMPLING_BUDGET_S, "sampling took " + seconds + " s");
        }
    }
}

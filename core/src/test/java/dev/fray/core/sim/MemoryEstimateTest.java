package dev.fray.core.sim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ParticleSampler;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.SimpleNeoHookean;
import org.junit.jupiter.api.Test;

/**
 * The memory estimate counts lattices without wrapping around and refuses scenes that cannot fit before anything
 * is allocated. How close the estimate comes to the heap a run retains is shown by {@code fray bench}, which prints
 * both (a retained-heap figure is too noisy for a unit test).
 */
class MemoryEstimateTest extends FrayTestBase {
    private static Scene slab(double spacing) {
        return Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(0.05)
                .add(Body.named("slab").shape(Shapes.box(0.1, 0.1, 0.1, 0.9, 0.9, 0.5))
                        .material(new SimpleNeoHookean(1e5, 0.3, 1000)).spacing(spacing).build())
                .build();
    }

    @Test
    void aTinySpacingIsRefusedWithoutWrapAround() {
        // 0.8 x 0.8 x 0.4 m at 1e-7 m: 2.56e20 points, which wraps around as a product of longs.
        long nx = 8_000_000L, ny = 8_000_000L, nz = 4_000_000L;
        assertTrue(nx * ny * nz < 200_000_000L, "the long product wraps around: " + nx * ny * nz);
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> MemoryEstimate.of(slab(1e-7)));
        assertTrue(e.getMessage().contains("2.56e+20 lattice points"), e.getMessage());
        assertThrows(InvalidInputException.class, () -> new Simulation(slab(1e-7)));
    }

    @Test
    void anEnormousBodyIsRefused() {
        // No domain holds such a body, but the count itself must not overflow: 2e300 / 0.025 is no long at all.
        Body huge = Body.named("slab").shape(Shapes.box(-1e300, 0.1, 0.1, 1e300, 0.9, 0.5))
                .material(new SimpleNeoHookean(1e5, 0.3, 1000)).build();
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> ParticleSampler.latticeCounts(huge, 0.025));
        assertTrue(e.getMessage().contains("4.10e+304 lattice points"), e.getMessage());
    }

    @Test
    void aSceneOverTheHeapIsRefusedNamingEstimateHeapAndRemedy() {
        // 0.8 x 0.8 x 0.4 m at 2 mm: 3.2e7 particles of 26 doubles, about 7 GiB.
        MemoryEstimate m = MemoryEstimate.of(slab(0.002));
        assertEquals(400L * 400 * 200, m.particles());
        assertEquals(26, m.doublesPerParticle());
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> m.requireFits(1L << 30));
        assertTrue(e.getMessage().contains("1.00 GiB") && e.getMessage().contains("-Xmx")
                && e.getMessage().contains("fewer particles"), e.getMessage());
        m.requireFits(Long.MAX_VALUE);
    }

    @Test
    void aSphereCountsItsShareOfTheBounds() {
        Scene s = Scene.builder().domain(0, 0, 0, 1, 1, 1).cellSize(0.02)
                .add(Body.named("ball").shape(Shapes.sphere(0.5, 0.5, 0.5, 0.3))
                        .material(new SimpleNeoHookean(1e5, 0.3, 1000)).build())
                .build();
        MemoryEstimate m = MemoryEstimate.of(s);
        try (Simulation sim = new Simulation(s, new RunOptions(1))) {
            // The lattice's share inside a sphere tends to pi/6 of its bounding cube (elementary geometry).
            assertEquals(sim.particles().size(), m.particles(), 0.05 * sim.particles().size());
            assertEquals(sim.particleMemoryBytes(), m.particleBytes() - 16L * m.particles(),
                    0.05 * sim.particleMemoryBytes());
        }
    }
}

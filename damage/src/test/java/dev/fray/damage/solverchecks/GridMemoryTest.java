package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;

/**
 * The sparse grid's memory grows with the blocks the particles occupy, not with the domain or the bounding box of
 * the bodies (a design property, common practice for sparse-block grids, no source).
 */
class GridMemoryTest extends FrayTestBase {
    private static final double DX = 1.0 / 128;
    private static final double EDGE = 0.1;

    @Test
    void twoCubesFarApartUseAboutTwiceTheGridOfOne() {
        long one = gridBytes(false);
        long two = gridBytes(true);
        double ratio = (double) two / one;
        assertEquals(2.0, ratio, 0.2, "grid bytes: one cube " + one + ", two cubes " + two);
        // A dense grid over the bounding box of the two cubes (corner to corner of the unit domain) would hold
        // about 128^3 nodes of 36 bytes (mass, momentum, grip tag): 75 MB. The sparse grid holds a few percent.
        double dense = Math.pow(0.8 / DX, 3) * 36;
        assertTrue(two < 0.05 * dense, "two cubes use " + two + " bytes against " + dense + " for a dense box");
    }

    private static long gridBytes(boolean both) {
        Scene.Builder b = Scene.builder().cellSize(DX).gravity(0, 0, 0).threads(1)
                .add(cube("near", 0.1));
        if (both) {
            b.add(cube("far", 0.8));
        }
        try (Simulation sim = new Simulation(b.build())) {
            sim.step();
            return sim.gridMemoryBytes();
        }
    }

    private static Body cube(String name, double corner) {
        return Body.named(name).shape(Shapes.box(corner, corner, corner, corner + EDGE, corner + EDGE, corner + EDGE))
                .material(Elastic.fixedCorotated(1e5, 0.3, 1000)).build();
    }
}

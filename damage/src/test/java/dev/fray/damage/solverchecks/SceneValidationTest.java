package dev.fray.damage.solverchecks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.boundary.Shapes;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.Body;
import dev.fray.core.sim.Scene;
import dev.fray.core.sim.Simulation;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

/** Bad scene parameters fail at build time, naming the field and its allowed range. */
class SceneValidationTest extends FrayTestBase {
    private static void assertNames(InvalidInputException e, FrayMessage key, String field) {
        assertEquals(key, e.key(), e.getMessage());
        assertTrue(Arrays.toString(e.parts()).contains(field), "parts " + Arrays.toString(e.parts()) + " name " + field);
    }

    @Test
    void zeroSpacingIsRejected() {
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> Body.named("b")
                .shape(Shapes.box(0, 0, 0, 1, 1, 1)).material(Elastic.neoHookean(1e5, 0.3, 1000)).spacing(0)
                .build());
        assertNames(e, FrayMessage.OUT_OF_RANGE, "spacing (m)");
        assertTrue(e.getMessage().contains("> 0"), e.getMessage());
    }

    @Test
    void bodyOutsideTheDomainIsRejected() {
        Body b = Body.named("stray").shape(Shapes.sphere(2, 2, 2, 0.1)).material(Elastic.neoHookean(1e5, 0.3, 1000))
                .build();
        InvalidInputException e = assertThrows(InvalidInputException.class,
                () -> Scene.builder().domain(0, 0, 0, 1, 1, 1).add(b).build());
        assertNames(e, FrayMessage.BODY_OUTSIDE_DOMAIN, "stray");
    }

    @Test
    void badCellSizeAndCflAreRejected() {
        assertNames(assertThrows(InvalidInputException.class, () -> Scene.builder().cellSize(-1).build()),
                FrayMessage.OUT_OF_RANGE, "cellSize (m)");
        assertNames(assertThrows(InvalidInputException.class, () -> Scene.builder().cfl(1.5).build()),
                FrayMessage.OUT_OF_RANGE, "cfl");
        assertNames(assertThrows(InvalidInputException.class, () -> Scene.builder().threads(0).build()),
                FrayMessage.OUT_OF_RANGE, "threads");
    }

    @Test
    void bodyTooSmallForItsSpacingIsReported() {
        Scene s = Scene.builder().add(Body.named("speck").shape(Shapes.sphere(0.5, 0.5, 0.5, 1e-4))
                .material(Elastic.neoHookean(1e5, 0.3, 1000)).spacing(0.01).jitter(0.5).build()).build();
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> new Simulation(s).close());
        assertNames(e, FrayMessage.BODY_EMPTY, "speck");
    }
}

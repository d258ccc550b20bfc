package dev.fray.core.parallel;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.grid.BlockLayout;
import dev.fray.core.kernel.Kernel;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.core.testing.GridFixture;
import org.junit.jupiter.api.Test;

import java.util.concurrent.atomic.AtomicInteger;

/**
 * The colour loop runs every particle block once, and all blocks of one colour finish before the next colour starts,
 * so that blocks running at the same time never share a node (DESIGN.md section 3; common practice, no source).
 */
class BlockScheduleTest extends FrayTestBase {
    @Test
    void runsEveryBlockOnceColourByColour() {
        try (GridFixture fx = new GridFixture(GridFixture.randomParticles(rand, 2000, 0, 1.5), Kernel.QUADRATIC,
                new double[3], 0.05, 3)) {
            BlockLayout layout = fx.layout;
            int nb = layout.blockCount();
            int[] order = new int[nb];
            int[] runs = new int[nb];
            AtomicInteger clock = new AtomicInteger();
            BlockSchedule.byColour(fx.workers, layout, (w, r) -> {
                order[r] = clock.getAndIncrement();
                runs[r]++;
            });
            int[] first = new int[8];
            int[] last = new int[8];
            java.util.Arrays.fill(first, Integer.MAX_VALUE);
            java.util.Arrays.fill(last, -1);
            for (int r = 0; r < nb; r++) {
                assertEquals(1, runs[r], "block " + r + " runs once");
                int c = BlockLayout.colour(layout.key(r));
                first[c] = Math.min(first[c], order[r]);
                last[c] = Math.max(last[c], order[r]);
            }
            for (int c = 0, prev = -1; c < 8; c++) {
                if (last[c] >= 0) {
                    assertTrue(first[c] > prev, "colour " + c + " starts after the previous colour ends");
                    prev = last[c];
                }
            }
        }
    }
}

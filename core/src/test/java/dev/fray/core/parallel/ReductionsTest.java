package dev.fray.core.parallel;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.grid.SparseGrid;
import dev.fray.core.testing.FrayTestBase;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

/**
 * Fixed-order reductions: the node partition does not depend on the thread count and partial sums are added in
 * task order, so a sum has the same bits for any thread count (DESIGN.md section 3; floating-point addition is not
 * associative, common practice, no source).
 */
class ReductionsTest extends FrayTestBase {
    /**
     * Partials 1e16, 1, -1e16, 1 add to 1 left to right ((1e16 + 1) rounds to 1e16) and to 0 right to left, so
     * the result shows the order.
     */
    @Test
    void sumsAddPartialsInTaskOrder() {
        double[] partials = {1e16, 1.0, -1e16, 1.0};
        assertEquals(1.0, Reductions.sum(partials, 4), "left to right");
        double reversed = 0;
        for (int t = 3; t >= 0; t--) {
            reversed += partials[t];
        }
        assertNotEquals(1.0, reversed, "the example depends on the order");
        assertEquals(1e16, Reductions.sum(partials, 2), "only the first tasks");
        double[] interleaved = {9, 1e16, 9, 1.0, 9, -1e16, 9, 1.0};
        assertEquals(1.0, Reductions.sum(interleaved, 4, 2, 1), "component 1 of stride 2");
        assertEquals(36.0, Reductions.sum(interleaved, 4, 2, 0), "component 0 of stride 2");
    }

    /** overNodes covers every node of the active blocks exactly once in the same ranges for 1, 2 and 3 threads. */
    @Test
    void nodePartitionIsFixed() {
        int blocks = 53;
        List<String> reference = null;
        for (int threads = 1; threads <= 3; threads++) {
            int[] hits = new int[blocks * SparseGrid.NODES_PER_BLOCK];
            List<String> ranges = Collections.synchronizedList(new ArrayList<>());
            try (Workers workers = new Workers(threads)) {
                Reductions.overNodes(workers, blocks, (w, t, from, to) -> {
                    ranges.add(t + ":" + from + "-" + to);
                    for (int i = from; i < to; i++) {
                        hits[i]++;
                    }
                });
            }
            for (int i = 0; i < hits.length; i++) {
                assertEquals(1, hits[i], "node " + i + " with " + threads + " threads");
            }
            assertEquals(Reductions.gridTasks(blocks), ranges.size());
            Collections.sort(ranges);
            if (reference == null) {
                reference = ranges;
            }
            assertEquals(reference, ranges, "ranges with " + threads + " threads");
        }
    }

    /** A dot product over the fixed partition has the same bits for 1, 2 and 3 threads. */
    @Test
    void dotProductIsBitwiseTheSameForAnyThreadCount() {
        int blocks = 70;
        int n = blocks * SparseGrid.NODES_PER_BLOCK;
        double[] a = new double[n];
        double[] b = new double[n];
        for (int i = 0; i < n; i++) {
            a[i] = rand.nextGaussian() * Math.exp(20 * rand.nextDouble());
            b[i] = rand.nextGaussian();
        }
        long reference = 0;
        for (int threads = 1; threads <= 3; threads++) {
            int tasks = Reductions.gridTasks(blocks);
            double[] partial = new double[tasks];
            try (Workers workers = new Workers(threads)) {
                Reductions.overNodes(workers, blocks, (w, t, from, to) -> {
                    double s = 0;
                    for (int i = from; i < to; i++) {
                        s += a[i] * b[i];
                    }
                    partial[t] = s;
                });
            }
            long bits = Double.doubleToLongBits(Reductions.sum(partial, tasks));
            if (threads == 1) {
                reference = bits;
                assertTrue(tasks > 3, "enough tasks for the threads to share them");
            }
            assertEquals(reference, bits, "dot product with " + threads + " threads");
        }
    }
}

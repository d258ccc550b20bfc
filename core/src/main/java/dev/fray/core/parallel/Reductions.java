package dev.fray.core.parallel;

import dev.fray.core.grid.SparseGrid;

/**
 * Fixed partitions of grid work and sums combined in a fixed order, so that every reduction gives the same bits
 * for any thread count: each task forms its partial over a range that does not depend on the threads, and the
 * partials are added in task order.
 */
public final class Reductions {
    /** Grid blocks per task of node-wise loops. */
    public static final int GRID_TASK_BLOCKS = 16;
    /** Nodes per task of node-wise loops. */
    public static final int NODES_PER_TASK = GRID_TASK_BLOCKS * SparseGrid.NODES_PER_BLOCK;

    private Reductions() {
    }

    /** Work on a range of grid nodes. */
    @FunctionalInterface
    public interface NodeRange {
        /**
         * @param worker the worker, 0 to threads - 1
         * @param task   the task index
         * @param from   first node
         * @param to     end node, exclusive
         */
        void run(int worker, int task, int from, int to);
    }

    /** @return tasks covering this many grid blocks */
    public static int gridTasks(int gridBlocks) {
        return (gridBlocks + GRID_TASK_BLOCKS - 1) / GRID_TASK_BLOCKS;
    }

    /**
     * Runs a node-wise task over the nodes of the first {@code gridBlocks} grid blocks in the fixed partition.
     *
     * @param workers    the workers
     * @param gridBlocks active grid blocks
     * @param body       the work per range
     */
    public static void overNodes(Workers workers, int gridBlocks, NodeRange body) {
        int nodes = gridBlocks * SparseGrid.NODES_PER_BLOCK;
        workers.forEach(gridTasks(gridBlocks), (w, t) -> body.run(w, t, t * NODES_PER_TASK,
                Math.min(nodes, (t + 1) * NODES_PER_TASK)));
    }

    /**
     * @param partials per-task partial sums
     * @param tasks    number of tasks
     * @return their sum, added in task order
     */
    public static double sum(double[] partials, int tasks) {
        double s = 0;
        for (int t = 0; t < tasks; t++) {
            s += partials[t];
        }
        return s;
    }

    /**
     * Sums interleaved partials: component k of task t sits at {@code stride * t + k}.
     *
     * @param partials the partials
     * @param tasks    number of tasks
     * @param stride   values per task
     * @param k        the component
     * @return the sum of component k in task order
     */
    public static double sum(double[] partials, int tasks, int stride, int k) {
        double s = 0;
        for (int t = 0; t < tasks; t++) {
            s += partials[stride * t + k];
        }
        return s;
    }
}

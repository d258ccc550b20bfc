package dev.fray.core.parallel;

import dev.fray.core.grid.BlockLayout;

/**
 * The colour loop: runs a task on every particle block in 8 phases by block-coordinate parity. Blocks of one colour
 * are 8 nodes apart, and a block's buffer reaches at most 8 nodes, so blocks running together write disjoint nodes;
 * within a block the particles go in their sorted order, so every node sum is formed in the same order for any
 * thread count.
 */
public final class BlockSchedule {
    /** Work on one particle block. */
    @FunctionalInterface
    public interface BlockTask {
        /**
         * @param worker the worker running it, 0 to threads - 1
         * @param block  the particle block
         */
        void run(int worker, int block);
    }

    private BlockSchedule() {
    }

    /**
     * Runs a task on every particle block, colour by colour.
     *
     * @param workers the workers
     * @param layout  the block layout
     * @param task    the work on one block
     */
    public static void byColour(Workers workers, BlockLayout layout, BlockTask task) {
        int[] blocks = layout.colourBlocks();
        for (int c = 0; c < 8; c++) {
            final int from = layout.colourStart(c);
            workers.forEach(layout.colourStart(c + 1) - from, (w, t) -> task.run(w, blocks[from + t]));
        }
    }
}

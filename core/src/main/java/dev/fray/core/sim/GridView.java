package dev.fray.core.sim;

/**
 * A read-only view of the background grid after the last step: the active nodes with their positions, and per
 * velocity field the node mass and velocity. Nodes are numbered 0 to {@link #nodeCount()} - 1 in the grid's block
 * order; nodes of an active block that no particle reached have mass 0. Valid until the next step.
 */
public interface GridView {
    /** @return cell size, m */
    double cellSize();

    /** @return number of nodes in the active blocks */
    int nodeCount();

    /** @return number of velocity fields per node (1, or 2 where cracks separate) */
    int fieldCount();

    /**
     * @param node the node
     * @param out  (output) its position x, y, z, m
     */
    void position(int node, double[] out);

    /**
     * @param field the field
     * @param node  the node
     * @return the field's mass at the node, kg
     */
    double mass(int field, int node);

    /**
     * @param field the field
     * @param node  the node
     * @param out   (output) the field's velocity at the node after the grid update, m/s (0 where the mass is 0)
     */
    void velocity(int field, int node, double[] out);
}

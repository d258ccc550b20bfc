package dev.fray.core.transfer;

/**
 * Which of a node's velocity fields a particle feeds (scatter) and reads (gather). With one field every particle
 * feeds field 0 and the transfers take their fast block-local path; with several, each particle's contribution at
 * each stencil node goes to the field this routing names. The routing is rebuilt each step by {@link #partition()}
 * before the scatter and must not change until the gather has run.
 */
public interface FieldRouting {
    /** One field per node: the ordinary solver. */
    FieldRouting SINGLE = new FieldRouting() {
        @Override
        public int fieldCount() {
            return 1;
        }

        @Override
        public void partition() {
        }

        @Override
        public int field(int p, int node) {
            return 0;
        }
    };

    /** @return number of velocity fields per node, &gt;= 1 */
    int fieldCount();

    /** Builds this step's routing from the particles' current state, before the scatter. */
    void partition();

    /**
     * @param p    particle index in current storage order
     * @param node grid node
     * @return the field, 0 to {@link #fieldCount()} - 1, that particle p feeds at the node
     */
    int field(int p, int node);

    /** Grows the routing's node arrays to the grid's active nodes, before they are zeroed. Default: none. */
    default void ensureNodes() {
    }

    /** Zeroes the routing's node data of grid blocks [from, to) (called per task). Default: none. */
    default void zeroNodes(int from, int to) {
    }

    /**
     * @return per node, the direction from field 0 towards field 1 where the fields meet (3 per node, any length,
     *         read with {@link #normalLengths2()}), or null with one field (live array)
     */
    default double[] normals() {
        return null;
    }

    /** @return per node, the squared length of {@link #normals()}, 0 where the node has one field (live array) */
    default double[] normalLengths2() {
        return null;
    }

    /** @return bytes held by the routing's arrays */
    default long memoryBytes() {
        return 0;
    }
}

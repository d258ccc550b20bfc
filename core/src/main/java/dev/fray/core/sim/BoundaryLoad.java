package dev.fray.core.sim;

/**
 * What one grip or obstacle did to the material: the force it exerted in the last step (its impulse on the grid
 * nodes and particles it acted on, divided by the step) and the work it has done since the start.
 *
 * @param kind   "grip" or "obstacle"
 * @param name   the grip's or obstacle's name
 * @param forceX force on the material x, N
 * @param forceY force on the material y, N
 * @param forceZ force on the material z, N
 * @param work   work done on the material since the start, J
 */
public record BoundaryLoad(String kind, String name, double forceX, double forceY, double forceZ, double work) {
    /**
     * @return the column prefix of this load in tabular output: kind, underscore, the name with every character
     *         other than letters, digits, '-' and '_' replaced by '_'
     */
    public String columnPrefix() {
        return kind + "_" + name.replaceAll("[^A-Za-z0-9_-]", "_");
    }
}

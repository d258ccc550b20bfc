package dev.fray.core.sim;

/** A velocity as a function of position, for initial conditions set by a host. */
@FunctionalInterface
public interface VelocityField {
    /**
     * @param x   position x, m
     * @param y   position y, m
     * @param z   position z, m
     * @param out (output) velocity at out[0..2], m/s
     */
    void velocity(double x, double y, double z, double[] out);
}

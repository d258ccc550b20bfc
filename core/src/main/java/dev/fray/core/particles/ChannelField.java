package dev.fray.core.particles;

/**
 * Initial values of a channel as a function of a particle's initial position, for fiber directions, material
 * regions and other per-particle parameters set up by a host or a scene file.
 */
@FunctionalInterface
public interface ChannelField {
    /**
     * @param x   initial position x, m
     * @param y   initial position y, m
     * @param z   initial position z, m
     * @param out (output) the channel's components at out[0 .. width-1]; preset to the channel's initial value
     */
    void value(double x, double y, double z, double[] out);
}

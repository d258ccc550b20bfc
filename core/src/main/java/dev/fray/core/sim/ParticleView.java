package dev.fray.core.sim;

import dev.fray.core.particles.ChannelSpec;

import java.util.List;

/**
 * Read-only view of the particles. Particle indices are the current storage order, which changes between steps
 * (particles are sorted by grid block); {@link #id(int)} is stable over a run. Valid until the next step.
 */
public interface ParticleView {
    /** @return number of particles */
    int size();

    /**
     * @param p particle index
     * @return stable id, in [0, size())
     */
    int id(int p);

    /**
     * @param p particle index
     * @return index of its body in the scene's body list
     */
    int body(int p);

    /** @return channel names in declaration order (built-in first) */
    List<String> channelNames();

    /**
     * @param name channel name
     * @return its declaration
     * @throws IllegalArgumentException for unknown names
     */
    ChannelSpec spec(String name);

    /**
     * @param name      channel name
     * @param p         particle index
     * @param component component, in [0, width)
     * @return the value
     */
    double get(String name, int p, int component);

    /**
     * Copies a whole channel, in stable-id order (particle with id i at dst[off + width*i]).
     *
     * @param name channel name
     * @param dst  (output) destination, at least width*size() values from off
     * @param off  offset into dst
     */
    void copyById(String name, double[] dst, int off);
}

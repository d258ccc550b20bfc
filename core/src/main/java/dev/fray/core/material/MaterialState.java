package dev.fray.core.material;

/**
 * What a material law sees of the particles of one body during one batch call: the deformation gradients and the
 * channels it declared. Indices are particle indices in the store; arrays are the live backing arrays, so a law
 * must write only to its own channels and only at indices in the range it was given.
 */
public interface MaterialState {
    /**
     * @return deformation gradients F, 9 per particle, row-major: F[9p + 3r + c] = F_rc (dimensionless)
     */
    double[] deformation();

    /**
     * @param name a channel this law declared
     * @return its backing array, {@code width} values per particle
     * @throws IllegalArgumentException if no such channel exists
     */
    double[] channel(String name);
}

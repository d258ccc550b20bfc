package dev.fray.damage.fiber;

import dev.fray.core.error.Checks;
import dev.fray.core.particles.ChannelSpec;

/**
 * Channel convention for fiber families, shared by the fiber-reinforced laws, the anisotropic damage models and
 * the fiber fields: family k (1 to 3) stores its unit direction in the reference configuration in the channel
 * "fiber-k" (width 3, dimensionless) and its current direction F a0 / |F a0| in "fiber-k-current". A zero
 * reference vector (the initial value) means the particle has no fiber of that family.
 */
public final class FiberChannels {
    /** Largest number of fiber families per particle. */
    public static final int MAX_FAMILIES = 3;

    private FiberChannels() {
    }

    /**
     * @param family family number, 1 to 3
     * @return name of the reference-direction channel, "fiber-k"
     */
    public static String reference(int family) {
        Checks.inRange("fiber family", family, 1, MAX_FAMILIES);
        return "fiber-" + family;
    }

    /**
     * @param family family number, 1 to 3
     * @return name of the current-direction channel, "fiber-k-current"
     */
    public static String current(int family) {
        return reference(family) + "-current";
    }

    /**
     * @param family family number, 1 to 3
     * @return declaration of the reference-direction channel (initially zero: no fiber)
     */
    public static ChannelSpec referenceSpec(int family) {
        return new ChannelSpec(reference(family), 3, 0, "1",
                "unit fiber direction of family " + family + " in the reference configuration");
    }

    /**
     * @param family family number, 1 to 3
     * @return declaration of the current-direction channel
     */
    public static ChannelSpec currentSpec(int family) {
        return new ChannelSpec(current(family), 3, 0, "1",
                "unit fiber direction of family " + family + " in the current configuration, F a0 / |F a0|");
    }
}

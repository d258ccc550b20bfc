package dev.fray.core.particles;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;

/**
 * Declaration of a per-particle channel: a named block of {@code width} doubles per particle, stored interleaved
 * (particle p's components at {@code p*width .. p*width+width-1}). Plugins declare the channels they need;
 * writers export channels by name, so a plugin's state reaches every output.
 *
 * @param name        unique name, lower case with dashes, e.g. "damage", "fiber-1"
 * @param width       components per particle, 1 to 9
 * @param initial     value every component starts with
 * @param unit        SI unit of the components, "1" for dimensionless
 * @param description one line for humans
 */
public record ChannelSpec(String name, int width, double initial, String unit, String description) {
    /** Validates the declaration. */
    public ChannelSpec {
        Checks.notNull("channel name", name);
        if (!name.matches("[a-z][a-z0-9-]*")) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "channel name", name,
                    "lower-case letters, digits and dashes, starting with a letter");
        }
        Checks.inRange("channel width of \"" + name + "\"", width, 1, 9);
        Checks.finite("initial value of channel \"" + name + "\"", initial);
        Checks.notNull("unit of channel \"" + name + "\"", unit);
        description = description == null ? "" : description;
    }

    /**
     * @param name  channel name
     * @param width components per particle
     * @param unit  SI unit
     * @return a channel starting at zero with no description
     */
    public static ChannelSpec of(String name, int width, String unit) {
        return new ChannelSpec(name, width, 0.0, unit, "");
    }
}

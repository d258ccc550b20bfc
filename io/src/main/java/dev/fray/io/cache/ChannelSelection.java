package dev.fray.io.cache;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ParticleStore;
import dev.fray.core.sim.ParticleView;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Which particle channels a cache writer exports besides the ones it always writes: either every channel a plugin
 * declared, or an explicit list. Shared by the PLY and VTP writers; immutable.
 */
final class ChannelSelection {
    /** Built-in channels of every simulation; the default export leaves them out. */
    private static final Set<String> BUILT_IN = Set.of(ParticleStore.POSITION, ParticleStore.VELOCITY,
            ParticleStore.AFFINE, ParticleStore.DEFORMATION, ParticleStore.MASS, ParticleStore.VOLUME);
    /** Channels that every writer writes in its own form, so they cannot be chosen again. */
    private static final Set<String> FIXED = Set.of(ParticleStore.POSITION, ParticleStore.VELOCITY);

    private final List<String> channels;
    private final boolean pluginChannels;
    private final String format;
    private final Set<String> reserved;

    private ChannelSelection(List<String> channels, boolean pluginChannels, String format, Set<String> reserved) {
        this.channels = channels;
        this.pluginChannels = pluginChannels;
        this.format = format;
        this.reserved = reserved;
    }

    /**
     * @param format   file format for messages, e.g. "PLY"
     * @param reserved output names the writer uses itself, which a plugin channel must not take
     * @return every channel declared by a plugin (all but the built-in affine, deformation, mass and volume)
     */
    static ChannelSelection plugins(String format, Set<String> reserved) {
        return new ChannelSelection(List.of(), true, format, reserved);
    }

    /**
     * @param format       file format for messages, e.g. "PLY"
     * @param reserved     output names the writer uses itself
     * @param channels     the chosen channel names
     * @param alwaysWritten how the writer writes the fixed channels, for the message that rejects them
     * @return exactly the given channels
     * @throws InvalidInputException MISSING for a null list or name, INCONSISTENT for a duplicate, a fixed or a
     *                               reserved name
     */
    static ChannelSelection of(String format, Set<String> reserved, List<String> channels, String alwaysWritten) {
        if (channels == null) {
            throw new InvalidInputException(FrayMessage.MISSING, format + " channel list");
        }
        Set<String> seen = new HashSet<>();
        for (String c : channels) {
            if (c == null) {
                throw new InvalidInputException(FrayMessage.MISSING, format + " channel name");
            }
            if (FIXED.contains(c) || reserved.contains(c)) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, format + " channel \"" + c + "\"",
                        alwaysWritten);
            }
            if (!seen.add(c)) {
                throw new InvalidInputException(FrayMessage.INCONSISTENT, format + " channel \"" + c + "\"",
                        "listed twice");
            }
        }
        return new ChannelSelection(List.copyOf(channels), false, format, reserved);
    }

    /**
     * @param view particles of a simulation
     * @return the channels to export for them, in order
     * @throws InvalidInputException UNKNOWN_NAME if a chosen channel does not exist, INCONSISTENT if a plugin
     *         channel takes a reserved name
     */
    List<String> resolve(ParticleView view) {
        if (!pluginChannels) {
            for (String c : channels) {
                view.spec(c); // throws, naming the channel and the known ones
            }
            return channels;
        }
        List<String> out = new ArrayList<>();
        for (String c : view.channelNames()) {
            if (!BUILT_IN.contains(c)) {
                if (reserved.contains(c)) {
                    throw new InvalidInputException(FrayMessage.INCONSISTENT, "channel \"" + c + "\"",
                            "clashes with the " + format + " array of the same name; choose the channels explicitly");
                }
                out.add(c);
            }
        }
        return out;
    }

    @Override
    public String toString() {
        return pluginChannels ? "plugin channels" : channels.toString();
    }
}

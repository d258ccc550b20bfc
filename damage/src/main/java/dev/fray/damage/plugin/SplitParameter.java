package dev.fray.damage.plugin;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.plugin.Parameters;
import dev.fray.core.plugin.Suggest;

import java.util.List;
import java.util.Locale;

/**
 * The optional damage-model parameter {@value #NAME}: which tension-compression split the model asks of the
 * material law, by name. Shared by the damage-model providers; stateless.
 */
final class SplitParameter {
    /** Parameter name. */
    static final String NAME = "split";
    /** Allowed values, {@link TensionSplit#key()} in declaration order; the first is the default. */
    static final List<String> VALUES = java.util.Arrays.stream(TensionSplit.values()).map(TensionSplit::key).toList();
    /** Description of the parameter for provider descriptions. */
    static final String DESCRIPTION = "split (" + String.join(", ", VALUES) + "; default " + VALUES.get(0) + ")";

    private SplitParameter() {
    }

    /**
     * Reads the parameter (case-insensitively), marking it used.
     *
     * @param params the provider's parameters (input)
     * @return the split; {@link TensionSplit#LAW_DEFAULT} when absent
     * @throws InvalidInputException with key UNKNOWN_NAME naming the parameter and listing the allowed values, with
     *                               a did-you-mean suggestion when one is close, or OUT_OF_RANGE if not a string
     */
    static TensionSplit read(Parameters params) {
        String value = params.string(NAME, VALUES.get(0));
        int i = VALUES.indexOf(value.toLowerCase(Locale.ROOT));
        if (i < 0) {
            String best = Suggest.closest(value, VALUES);
            throw new InvalidInputException(FrayMessage.UNKNOWN_NAME, NAME + " in " + params.where(), value,
                    best == null ? VALUES : "did you mean \"" + best + "\"? all: " + VALUES);
        }
        return TensionSplit.values()[i];
    }
}

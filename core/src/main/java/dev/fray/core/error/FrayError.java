package dev.fray.core.error;

/** Common face of every exception Fray throws on purpose: a catalogue key and the values it was formatted with. */
public interface FrayError {
    /** @return the catalogue entry of this error */
    FrayMessage key();

    /** @return a copy of the values formatted into the message */
    Object[] parts();
}

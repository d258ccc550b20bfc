package dev.fray.core.error;

/**
 * Bad input from a user or host: a parameter out of range, a malformed file, an unknown name.
 * The message names the field (and the file where there is one) and what is allowed.
 */
public class InvalidInputException extends IllegalArgumentException implements FrayError {
    private static final long serialVersionUID = 1L;
    private final FrayMessage key;
    private final Object[] parts;

    /**
     * @param key   catalogue entry
     * @param parts values for its placeholders
     */
    public InvalidInputException(FrayMessage key, Object... parts) {
        super(key.format(parts));
        this.key = key;
        this.parts = parts.clone();
    }

    /**
     * @param key   catalogue entry
     * @param cause underlying failure
     * @param parts values for its placeholders
     */
    public InvalidInputException(FrayMessage key, Throwable cause, Object... parts) {
        super(key.format(parts), cause);
        this.key = key;
        this.parts = parts.clone();
    }

    @Override
    public FrayMessage key() {
        return key;
    }

    @Override
    public Object[] parts() {
        return parts.clone();
    }
}

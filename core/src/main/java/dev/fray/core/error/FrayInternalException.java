package dev.fray.core.error;

/** A bug inside Fray, not the user's fault. */
public class FrayInternalException extends IllegalStateException implements FrayError {
    private static final long serialVersionUID = 1L;
    private final Object[] parts;

    /**
     * @param explanation what invariant broke
     * @param cause       underlying failure, may be null
     */
    public FrayInternalException(String explanation, Throwable cause) {
        super(FrayMessage.INTERNAL.format(explanation), cause);
        this.parts = new Object[] {explanation};
    }

    /**
     * Wraps an unexpected failure.
     *
     * @param cause the unexpected exception
     * @return the wrapped internal error
     */
    public static FrayInternalException internal(Throwable cause) {
        return new FrayInternalException(String.valueOf(cause), cause);
    }

    @Override
    public FrayMessage key() {
        return FrayMessage.INTERNAL;
    }

    @Override
    public Object[] parts() {
        return parts.clone();
    }
}

package dev.circa.converter.normalize;

/** A circuit that cannot be renormalised exactly; the message gives the reason and the node. */
public final class NotNormalizableException extends Exception {
    private static final long serialVersionUID = 1L;

    public NotNormalizableException(String message) {
        super(message);
    }
}

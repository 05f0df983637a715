package dev.circa.validator.compare;

/** Two circuits that cannot be compared: different variables (by name and type) or outputs that do not correspond. */
public final class IncompatibleCircuitsException extends Exception {
    private static final long serialVersionUID = 1L;

    public IncompatibleCircuitsException(String message) {
        super(message);
    }
}

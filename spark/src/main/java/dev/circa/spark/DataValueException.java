package dev.circa.spark;

/**
 * A cell that is not a value of its variable (an unknown label, a state index out of range, a number
 * that is not finite), met while a job runs: the message names the column, the value and the row.
 */
public final class DataValueException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** An error with its whole message. */
    public DataValueException(String message) {
        super(message);
    }
}

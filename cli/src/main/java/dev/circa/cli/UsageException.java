package dev.circa.cli;

/** A bad option value or combination found after parsing; reported like a picocli usage error (status 2). */
public final class UsageException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public UsageException(String message) {
        super(message);
    }
}

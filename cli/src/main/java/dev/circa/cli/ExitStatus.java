package dev.circa.cli;

/** Exit statuses of every subcommand (CLI.md). */
public final class ExitStatus {
    /** Done; the model is valid or the check passed. */
    public static final int OK = 0;
    /** The model has an error, or the numbers disagree beyond tolerance. */
    public static final int FAILED = 1;
    /** No model could be built or the command could not run. */
    public static final int UNUSABLE = 2;

    private ExitStatus() {
    }
}

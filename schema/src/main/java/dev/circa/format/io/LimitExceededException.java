package dev.circa.format.io;

/** A named read limit was hit; the message names the limit's option and how to raise it. */
public final class LimitExceededException extends FormatException {
    private static final long serialVersionUID = 1L;

    private final String option;

    /**
     * @param problem the whole problem sentence, naming {@code option}
     * @param option the command-line option that sets the limit, e.g. {@code --max-nodes}
     */
    public LimitExceededException(String file, int line, int column, String pointer, String problem, String option) {
        super(file, line, column, pointer, problem);
        this.option = option;
    }

    /** "WHAT exceeds the limit of LIMIT set by OPTION (raise it with OPTION)". */
    public static LimitExceededException of(String file, int line, int column, String pointer, String what,
            String option, long limit) {
        return new LimitExceededException(file, line, column, pointer,
                what + " exceeds the limit of " + limit + " set by " + option + " (raise it with " + option + ")",
                option);
    }

    @Override
    public LimitExceededException relocated(int newLine, int newColumn) {
        LimitExceededException f = new LimitExceededException(file(), newLine, newColumn, pointer(), problem(), option);
        f.setStackTrace(getStackTrace());
        return f;
    }

    /** The command-line option that sets the limit, e.g. {@code --max-nodes}. */
    public String option() {
        return option;
    }
}

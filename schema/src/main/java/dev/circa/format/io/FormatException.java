package dev.circa.format.io;

import java.io.IOException;
import java.util.Locale;

/**
 * An input from which no model can be built: unreadable, not JSON, a wrong type, a missing member,
 * a named limit hit. The message names the file, line, column and what was expected.
 */
public class FormatException extends IOException {
    private static final long serialVersionUID = 1L;

    private final String file;
    private final int line;
    private final int column;
    private final String pointer;
    private final String problem;

    /**
     * @param file the file (as given by the user), or {@code null}
     * @param line 1-based line, or 0 when unknown
     * @param column 1-based column, or 0 when unknown
     * @param pointer JSON pointer of the member concerned, or {@code null}
     * @param problem what was seen and what was expected
     */
    public FormatException(String file, int line, int column, String pointer, String problem) {
        super(render(file, line, column, pointer, problem));
        this.file = file;
        this.line = line;
        this.column = column;
        this.pointer = pointer;
        this.problem = problem;
    }

    private static String render(String file, int line, int column, String pointer, String problem) {
        StringBuilder sb = new StringBuilder();
        sb.append(file == null ? "<input>" : file);
        if (line > 0) {
            sb.append(String.format(Locale.ROOT, ":%d:%d", line, column));
        }
        sb.append(": ").append(problem);
        if (pointer != null && !pointer.isEmpty()) {
            sb.append(" (at ").append(pointer).append(')');
        }
        return sb.toString();
    }

    /** The same problem at another position (used when the position is known only to the caller). */
    public FormatException relocated(int newLine, int newColumn) {
        FormatException f = new FormatException(file, newLine, newColumn, pointer, problem);
        f.setStackTrace(getStackTrace());
        return f;
    }

    /** The file as given by the user, or {@code null}. */
    public String file() {
        return file;
    }

    /** 1-based line, or 0 when unknown. */
    public int line() {
        return line;
    }

    /** 1-based column, or 0 when unknown. */
    public int column() {
        return column;
    }

    /** JSON pointer of the member concerned, or {@code null}. */
    public String pointer() {
        return pointer;
    }

    /** The problem alone, without file and position. */
    public String problem() {
        return problem;
    }
}

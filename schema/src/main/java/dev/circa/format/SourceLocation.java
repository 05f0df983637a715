package dev.circa.format;

/**
 * Where something is in an input: a JSON pointer always, line and column (1-based) when known.
 *
 * @param pointer JSON pointer, e.g. {@code /nodes/7}
 * @param line 1-based line, or 0 when unknown
 * @param column 1-based column, or 0 when unknown
 */
public record SourceLocation(String pointer, int line, int column) {
    /** A location known only by its pointer. */
    public static SourceLocation of(String pointer) {
        return new SourceLocation(pointer, 0, 0);
    }

    /** Whether line and column are known. */
    public boolean hasLineColumn() {
        return line > 0;
    }

    /** {@code /nodes/7 (line 12, column 9)}, or just the pointer. */
    @Override
    public String toString() {
        return hasLineColumn() ? pointer + " (line " + line + ", column " + column + ")" : pointer;
    }
}

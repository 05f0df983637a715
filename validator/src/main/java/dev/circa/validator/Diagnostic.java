package dev.circa.validator;

/**
 * One finding of the validator, immutable.
 *
 * @param code the rule's stable id, e.g. {@code ProductScopesOverlap} (also the key for {@code --rule})
 * @param severity how serious it is
 * @param message what was seen, what was expected and which option sets the bound
 * @param pointer JSON pointer of the member concerned, e.g. {@code /nodes/7}; {@code ""} for the document
 * @param node id of the node concerned, or {@code null}
 * @param line 1-based line, or 0 when unknown
 * @param column 1-based column, or 0 when unknown
 */
public record Diagnostic(String code, Severity severity, String message, String pointer, Integer node,
        int line, int column) {

    /** This diagnostic with another severity. */
    public Diagnostic withSeverity(Severity s) {
        return new Diagnostic(code, s, message, pointer, node, line, column);
    }

    /** Whether line and column are known. */
    public boolean hasLineColumn() {
        return line > 0;
    }

    /**
     * {@code [Code] message at /nodes/7 (line 12, column 9)}; an unknown line and column read
     * {@code (line and column unknown)}.
     */
    public String render() {
        String at = pointer == null || pointer.isEmpty() ? "(document root)" : pointer;
        String lc = hasLineColumn() ? "(line " + line + ", column " + column + ")" : "(line and column unknown)";
        return "[" + code + "] " + message + " at " + at + " " + lc;
    }

    @Override
    public String toString() {
        return render();
    }
}

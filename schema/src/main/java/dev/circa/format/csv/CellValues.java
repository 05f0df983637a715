package dev.circa.format.csv;

import dev.circa.format.Variable;
import dev.circa.format.io.DecimalToDouble;
import tools.jackson.core.io.NumberInput;

/**
 * Turns CSV cells into values and back (FORMAT.md section 5): an empty cell is missing (NaN), a
 * categorical or binary cell equal to a state label is that state, else a decimal state index; a
 * count is a non-negative integer; a real is a finite decimal number.
 */
public final class CellValues {
    /** The largest count read or written: every whole number up to 2^53 is exactly a double. */
    public static final long MAX_COUNT = 1L << 53;
    /** Longest cell decoded by the fast parser; longer ones (rare) go to {@link Double#parseDouble}. */
    private static final int FAST_LENGTH = 40;

    private CellValues() {
    }

    /**
     * The value of {@code cell} for {@code v}, NaN when empty.
     *
     * @return the value
     * @throws IllegalArgumentException with a sentence saying what was expected, when the cell is not a value of {@code v}
     */
    public static double parse(Variable v, String cell) {
        if (v.type().isDiscrete() && !v.states().isEmpty()) {
            // a label is matched exactly as written first: " a" and "a" may be two states
            int exact = v.stateIndex(cell);
            if (exact >= 0) {
                return exact;
            }
        }
        String s = cell.strip();
        if (s.isEmpty()) {
            return Double.NaN;
        }
        switch (v.type()) {
            case REAL -> {
                double d = number(s, v);
                if (!Double.isFinite(d)) {
                    throw new IllegalArgumentException("\"" + cell + "\" is not a finite number (variable " + v.name() + " is real)");
                }
                return d;
            }
            case COUNT -> {
                long n = integer(s, v, "a count (0, 1, 2, ...)");
                if (n < 0) {
                    throw new IllegalArgumentException("\"" + cell + "\" is negative; variable " + v.name() + " is a count (0, 1, 2, ...)");
                }
                if (n > MAX_COUNT) {
                    throw new IllegalArgumentException("\"" + cell + "\" is beyond the counts a double holds exactly; variable "
                            + v.name() + " is a count from 0 to " + MAX_COUNT);
                }
                return n;
            }
            default -> {
                int k = v.stateIndex(s);
                if (k >= 0) {
                    return k;
                }
                int states = v.stateCount();
                String expected = v.states().isEmpty() ? "a state index from 0 to " + (states - 1)
                        : "one of " + String.join(", ", v.states()) + " or a state index from 0 to " + (states - 1);
                long n;
                try {
                    n = integer(s, v, expected);
                } catch (IllegalArgumentException e) {
                    throw new IllegalArgumentException("\"" + cell + "\" is not a value of " + v.name() + "; expected " + expected);
                }
                if (n < 0 || n >= states) {
                    throw new IllegalArgumentException("\"" + cell + "\" is not a value of " + v.name() + "; expected " + expected);
                }
                return n;
            }
        }
    }

    /** The CSV text of {@code value} for {@code v}: a label when the variable has labels, empty when NaN. */
    public static String format(Variable v, double value) {
        if (Double.isNaN(value)) {
            return "";
        }
        if (v.type().isDiscrete()) {
            int k = (int) value;
            if (!v.states().isEmpty() && k >= 0 && k < v.states().size()) {
                return v.states().get(k);
            }
            return Long.toString((long) value);
        }
        return Double.toString(value);
    }

    /** A log-density as written in CSV: {@code -inf} for negative infinity. */
    public static String formatLogDensity(double value) {
        if (value == Double.NEGATIVE_INFINITY) {
            return "-inf";
        }
        if (Double.isNaN(value)) {
            return "nan";
        }
        return Double.toString(value);
    }

    /** Parses a log-density cell: a decimal number or {@code -inf}. */
    public static double parseLogDensity(String cell) {
        String s = cell.strip();
        if (s.equalsIgnoreCase("-inf") || s.equalsIgnoreCase("-infinity")) {
            return Double.NEGATIVE_INFINITY;
        }
        if (!isDecimal(s)) {
            throw new IllegalArgumentException("\"" + cell + "\" is not a log-density; expected a decimal number or -inf");
        }
        double d = decimal(s);
        if (!Double.isFinite(d)) {
            throw new IllegalArgumentException("\"" + cell + "\" is out of double range");
        }
        return d;
    }

    private static double number(String s, Variable v) {
        if (!isDecimal(s)) {
            throw new IllegalArgumentException("\"" + s + "\" is not a number (variable " + v.name() + " is real)");
        }
        return decimal(s);
    }

    /**
     * The double nearest to a cell that {@link #isDecimal} accepted, the double {@link Double#parseDouble}
     * gives (round to nearest; tested bit for bit): most cells from their digits by {@link DecimalToDouble},
     * the rest by Jackson's fast decimal parser (the JDK's parser takes its big-integer path for most
     * 17-digit cells: 1.3-2.4 s against 0.24-0.37 s for 8.3 million such cells).
     */
    private static double decimal(String s) {
        // most cells (up to 18 significant digits, powers of ten within 27) from their digits, without a parser
        int n = s.length();
        int i = 0;
        boolean negative = s.charAt(0) == '-';
        if (negative || s.charAt(0) == '+') {
            i++;
        }
        long w = 0;
        int significant = 0;
        int q = 0;
        boolean fraction = false;
        for (; i < n; i++) {
            char c = s.charAt(i);
            if (c == '.') {
                fraction = true;
                continue;
            }
            if (!isDigit(c)) {
                break;
            }
            w = w * 10 + (c - '0');
            if (w != 0) {
                significant++;
            }
            if (fraction) {
                q--;
            }
        }
        if (i < n) {
            // the exponent (isDecimal checked its form): kept bounded, far beyond any double's range either way
            i++;
            boolean minus = s.charAt(i) == '-';
            if (minus || s.charAt(i) == '+') {
                i++;
            }
            int power = 0;
            for (; i < n; i++) {
                power = Math.min(power * 10 + (s.charAt(i) - '0'), 100_000);
            }
            q += minus ? -power : power;
        }
        double v = significant <= 18 ? DecimalToDouble.toDouble(negative, w, q) : Double.NaN;
        if (!Double.isNaN(v)) {
            return v;
        }
        return s.length() <= FAST_LENGTH ? NumberInput.parseDouble(s, true) : Double.parseDouble(s);
    }

    /**
     * Whether {@code s} is a decimal number: an optional sign, digits with an optional point (at
     * least one digit in all), an optional exponent. One left-to-right scan, so the time is linear in
     * the length of the cell (a backtracking pattern took minutes on a cell of 100,000 digits).
     */
    static boolean isDecimal(String s) {
        int n = s.length();
        int i = 0;
        if (i < n && (s.charAt(i) == '+' || s.charAt(i) == '-')) {
            i++;
        }
        int digits = 0;
        while (i < n && isDigit(s.charAt(i))) {
            i++;
            digits++;
        }
        if (i < n && s.charAt(i) == '.') {
            i++;
            while (i < n && isDigit(s.charAt(i))) {
                i++;
                digits++;
            }
        }
        if (digits == 0) {
            return false;
        }
        if (i < n && (s.charAt(i) == 'e' || s.charAt(i) == 'E')) {
            i++;
            if (i < n && (s.charAt(i) == '+' || s.charAt(i) == '-')) {
                i++;
            }
            int exponent = 0;
            while (i < n && isDigit(s.charAt(i))) {
                i++;
                exponent++;
            }
            if (exponent == 0) {
                return false;
            }
        }
        return i == n;
    }

    private static boolean isDigit(char c) {
        return c >= '0' && c <= '9';
    }

    /** An optional sign and 1 to 18 digits (so it fits a long), else the message that {@code expected} completes. */
    private static long integer(String s, Variable v, String expected) {
        int n = s.length();
        int i = n > 0 && (s.charAt(0) == '+' || s.charAt(0) == '-') ? 1 : 0;
        boolean digits = n - i >= 1 && n - i <= 18;
        for (int k = i; k < n && digits; k++) {
            digits = isDigit(s.charAt(k));
        }
        if (!digits) {
            throw new IllegalArgumentException("\"" + s + "\" is not a value of " + v.name() + "; expected " + expected);
        }
        return Long.parseLong(s);
    }

    /**
     * Quotes a field for CSV output when it needs it, so that {@link CsvReader} (and any RFC 4180 reader)
     * reads back exactly {@code s}: a comma, quote or line break inside; white space at either end (a
     * reader may trim unquoted fields; quoting is the common practice that keeps them); a {@code #}
     * first (as the first field, an unquoted one would start a comment line).
     */
    public static String quote(String s) {
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.indexOf('\n') < 0 && s.indexOf('\r') < 0
                && !s.startsWith("#") && (s.isEmpty() || !Character.isWhitespace(s.charAt(0))
                && !Character.isWhitespace(s.charAt(s.length() - 1)))) {
            return s;
        }
        return '"' + s.replace("\"", "\"\"") + '"';
    }
}

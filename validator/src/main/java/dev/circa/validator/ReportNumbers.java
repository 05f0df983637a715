package dev.circa.validator;

import java.util.Locale;

/** Numbers in the text form of the check and comparison reports. */
public final class ReportNumbers {
    private ReportNumbers() {
    }

    /** Three significant digits; {@code n/a} for NaN, {@code inf} and {@code -inf}. */
    public static String g(double d) {
        if (Double.isNaN(d)) {
            return "n/a";
        }
        if (Double.isInfinite(d)) {
            return d > 0 ? "inf" : "-inf";
        }
        return String.format(Locale.ROOT, "%.3g", d);
    }

    /** A log-density in full: {@code -inf}, {@code NaN} or every digit. */
    public static String ld(double d) {
        return d == Double.NEGATIVE_INFINITY ? "-inf" : Double.isNaN(d) ? "NaN" : Double.toString(d);
    }
}

package dev.circa.validator.analysis;

import java.util.Locale;

/**
 * Numbers in messages: shortest round-trip digits or a given number of significant digits,
 * {@code 1e-9} rather than {@code 1.0E-9}, Locale.ROOT. Not for application code.
 */
public final class Numbers {
    private Numbers() {
    }

    /** {@code x} as message text, e.g. {@code 0.93}, {@code 1e-9}, {@code -inf}. */
    public static String text(double x) {
        if (Double.isInfinite(x)) {
            return x > 0 ? "inf" : "-inf";
        }
        if (Double.isNaN(x)) {
            return "NaN";
        }
        String s = Double.toString(x).toLowerCase(Locale.ROOT);
        int e = s.indexOf('e');
        String mantissa = e < 0 ? s : s.substring(0, e);
        String exp = e < 0 ? "" : s.substring(e);
        if (mantissa.endsWith(".0")) {
            mantissa = mantissa.substring(0, mantissa.length() - 2);
        }
        return mantissa + exp;
    }

    /** {@code v} to {@code digits} significant digits, trailing zeros dropped ({@code 1e-09}, {@code 0.95}). */
    public static String format(double v, int digits) {
        if (v == Double.NEGATIVE_INFINITY) {
            return "-inf";
        }
        if (v == Double.POSITIVE_INFINITY) {
            return "inf";
        }
        if (Double.isNaN(v)) {
            return "NaN";
        }
        String s = String.format(Locale.ROOT, "%." + digits + "g", v);
        int e = s.indexOf('e');
        String mantissa = e < 0 ? s : s.substring(0, e);
        String exponent = e < 0 ? "" : s.substring(e);
        if (mantissa.indexOf('.') >= 0) {
            int end = mantissa.length();
            while (mantissa.charAt(end - 1) == '0') {
                end--;
            }
            if (mantissa.charAt(end - 1) == '.') {
                end--;
            }
            mantissa = mantissa.substring(0, end);
        }
        return mantissa + exponent;
    }
}

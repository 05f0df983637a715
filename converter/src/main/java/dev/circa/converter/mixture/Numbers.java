package dev.circa.converter.mixture;

import java.util.Locale;

/** Short, locale-independent renderings of numbers for messages. Not for application code. */
final class Numbers {
    private Numbers() {
    }

    /** {@code v} to {@code digits} significant digits, trailing zeros dropped ({@code 1e-09}, {@code 0.95}). */
    static String format(double v, int digits) {
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

package dev.circa.format;

import java.util.Locale;

/** A number with its noun in the right form for messages: "1 error", "2 errors", "1 entry", "3 entries". */
public final class Counts {
    private Counts() {
    }

    /** {@code n} and {@code singular}, with an "s" added unless {@code n} is 1. */
    public static String of(long n, String singular) {
        return of(n, singular, singular + "s");
    }

    /** {@code n} with thousands separators and {@code singular}, with an "s" unless {@code n} is 1: "1,000 rows". */
    public static String grouped(long n, String singular) {
        return String.format(Locale.ROOT, "%,d %s", n, n == 1 ? singular : singular + "s");
    }

    /** {@code n} and {@code singular} or {@code plural}. */
    public static String of(long n, String singular, String plural) {
        return String.format(Locale.ROOT, "%d %s", n, n == 1 ? singular : plural);
    }
}

package dev.circa.converter.mixture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.Test;

/**
 * Valid mixtures with numbers at the ends of double range (issue 16) convert with their verification
 * passing, or are refused with a located message (exit 2 at the command line); never an internal failure
 * (another exception, or a verification that fails because the source evaluation gave NaN).
 */
class ExtremeNumbersConversionTest {
    /** The ends of double range and a few ordinary numbers (the seeds of the mutation loop below). */
    private static final String[] EXTREMES = {"1.7976931348623157e308", "1.7e308", "1e300", "2.2250738585072014e-308",
        "4.9e-324", "1e-300", "0", "1", "0.5", "1e15", "9007199254740992", "-1.7976931348623157e308", "-4.9e-324"};

    @Test
    void convert_extremeNumbersDocument_verifiedAndValid() throws Exception {
        byte[] text = ExtremeNumbersConversionTest.class.getResourceAsStream("extreme-numbers.yaml").readAllBytes();
        MixtureDocument doc = MixtureReader.readString(new String(text, StandardCharsets.UTF_8), "extreme-numbers.yaml",
                ReadLimits.DEFAULT);
        // the conversion is proved against the source's own densities at 2 x 1000 points; every family's log-density
        // at these parameters is checked against commons-math3 (where it is finite) in ReferenceDensitiesTest
        MixtureConverter.Result r = MixtureConverter.convert(doc, MixtureOptions.DEFAULT);
        assertTrue(r.verification().passed(), r.summary());
        assertEquals(2000, r.verification().points());
    }

    /** Every family, each parameter set to each extreme in turn, in a two-component mixture with a weight near 0. */
    @Test
    void convert_everyFamilyAtEveryExtreme_convertsOrLocatedRefusal() throws Exception {
        String[][] families = {
            {"real", "normal", "mean", "sd"}, {"real", "lognormal", "mu", "sigma"}, {"real", "exponential", "rate"},
            {"real", "gamma", "shape", "rate"}, {"real", "beta", "alpha", "beta"}, {"real", "uniform", "low", "high"},
            {"count", "poisson", "rate"}, {"count", "binomial", "trials", "p"}, {"binary", "bernoulli", "p"}};
        int converted = 0;
        int refused = 0;
        List<String> failures = new ArrayList<>();
        for (String[] f : families) {
            for (String first : EXTREMES) {
                for (String second : f.length > 3 ? EXTREMES : new String[] {"1"}) {
                    String params = f[2] + ": " + first + (f.length > 3 ? ", " + f[3] + ": " + second : "");
                    String yaml = String.format(Locale.ROOT, "format: circa.mixture%nversion: \"1.0\"%nvariables:%n"
                            + "  - {name: x, type: %s}%nmodel:%n  mixture:%n"
                            + "    - {weight: 4.9e-324, product: [{var: x, %s: {%s}}]}%n"
                            + "    - {weight: 1, product: [{var: x, %s}]}%n",
                            f[0], f[1], params, f[0].equals("real") ? "normal: {mean: 0, sd: 1}"
                                    : f[0].equals("count") ? "poisson: {rate: 2}" : "bernoulli: {p: 0.5}");
                    try {
                        MixtureDocument doc = MixtureReader.readString(yaml, "extreme.yaml", ReadLimits.DEFAULT);
                        MixtureConverter.Result r = MixtureConverter.convert(doc, MixtureOptions.DEFAULT.withVerifyPoints(50));
                        if (r.verification().passed()) {
                            converted++;
                        } else {
                            failures.add(f[1] + " {" + params + "}: " + r.summary());
                        }
                    } catch (FormatException e) {
                        // a refusal names the file and the line of the offending input (the second document line is 2)
                        assertEquals("extreme.yaml", e.file(), e.getMessage());
                        assertTrue(e.line() >= 1, e.getMessage());
                        refused++;
                    }
                }
            }
        }
        assertTrue(failures.isEmpty(), failures.size() + " internal failures, first: " + (failures.isEmpty() ? "" : failures.get(0)));
        assertTrue(converted > 300 && refused > 100, converted + " converted, " + refused + " refused");
    }
}

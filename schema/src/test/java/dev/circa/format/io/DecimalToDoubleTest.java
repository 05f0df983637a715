package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.math.BigDecimal;
import java.math.MathContext;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The decimal decoder against the JDK's own {@link Double#parseDouble} (outside this project; it
 * rounds to nearest, ties to even, as the Java Language Specification requires): bit for bit on
 * every decimal it accepts, including exact midpoints between neighbouring doubles, and NaN (decode
 * the general way) outside its range. Then the circuit reader, which uses it, on weights written with
 * 17 digits and at midpoints.
 */
class DecimalToDoubleTest {
    private static int checked;

    private static void same(boolean negative, long w, int q) {
        double expected = Double.parseDouble((negative ? "-" : "") + w + "e" + q);
        double got = DecimalToDouble.toDouble(negative, w, q);
        assertEquals(Double.doubleToRawLongBits(expected), Double.doubleToRawLongBits(got),
                () -> (negative ? "-" : "") + w + "e" + q + ": " + got + " instead of " + expected);
        checked++;
    }

    /** Shortest decimals of random doubles (as writers print them), where they are in range. */
    @Test
    void shortestDecimalsOfRandomDoubles() {
        SplittableRandom r = new SplittableRandom(11);
        checked = 0;
        for (int i = 0; i < 400_000; i++) {
            // magnitudes 1e-10 .. 1e20, the range of weights, means and scales
            double d = (1 + r.nextDouble()) * Math.pow(10, r.nextInt(-10, 20));
            BigDecimal u = new BigDecimal(Double.toString(d)).stripTrailingZeros();
            same(r.nextBoolean(), u.unscaledValue().longValueExact(), -u.scale());
        }
        assertEquals(400_000, checked);
    }

    /** Decimals of 15 to 18 digits near random doubles: most are not any double's shortest form. */
    @Test
    void longDecimals() {
        SplittableRandom r = new SplittableRandom(12);
        for (int i = 0; i < 300_000; i++) {
            double d = r.nextDouble() * Math.pow(10, r.nextInt(-9, 27));
            BigDecimal u = new BigDecimal(d).round(new MathContext(r.nextInt(15, 19))).stripTrailingZeros();
            if (u.signum() != 0 && u.scale() <= DecimalToDouble.MAX_EXPONENT && u.scale() >= -DecimalToDouble.MAX_EXPONENT) {
                same(false, u.unscaledValue().longValueExact(), -u.scale());
            }
        }
    }

    /**
     * Exact midpoints between neighbouring doubles and their decimal neighbours: an odd 54-bit integer
     * times a power of two (ties go to the even significand), also written with a power of ten
     * (5 * O * 10^-1 = O / 2).
     */
    @Test
    void midpointsRoundToEven() {
        SplittableRandom r = new SplittableRandom(13);
        for (int i = 0; i < 200_000; i++) {
            long odd = (1L << 53) + 2 * r.nextLong(0, 1L << 52) + 1;
            int shift = r.nextInt(0, 6);
            for (long d = -1; d <= 1; d++) {
                same(false, (odd << shift) + d, 0);
                same(false, odd * 5 + d, -1);
                same(false, odd * 25 + d, -2);
            }
        }
        // 2^53 + 1 lies halfway between 2^53 and 2^53 + 2: the even one
        assertEquals(9007199254740992.0, DecimalToDouble.toDouble(false, (1L << 53) + 1, 0));
        assertEquals(9007199254740996.0, DecimalToDouble.toDouble(false, (1L << 53) + 3, 0));
    }

    /** Random significands below 2^60 over the whole exponent range, and near powers of two. */
    @Test
    void wholeRange() {
        SplittableRandom r = new SplittableRandom(14);
        for (int i = 0; i < 300_000; i++) {
            long w = r.nextInt(3) == 0 ? (1L << r.nextInt(1, 60)) + r.nextInt(-2, 3) : r.nextLong(1, DecimalToDouble.MAX_SIGNIFICAND);
            same(r.nextBoolean(), Math.max(1, w), r.nextInt(-DecimalToDouble.MAX_EXPONENT, DecimalToDouble.MAX_EXPONENT + 1));
        }
        for (int q = -DecimalToDouble.MAX_EXPONENT; q <= DecimalToDouble.MAX_EXPONENT; q++) {
            same(false, 1, q);
            same(false, DecimalToDouble.MAX_SIGNIFICAND - 1, q);
        }
    }

    @Test
    void outsideTheRangeIsLeftToTheGeneralDecoder() {
        assertTrue(Double.isNaN(DecimalToDouble.toDouble(false, 1, DecimalToDouble.MAX_EXPONENT + 1)));
        assertTrue(Double.isNaN(DecimalToDouble.toDouble(false, 1, -DecimalToDouble.MAX_EXPONENT - 1)));
        assertTrue(Double.isNaN(DecimalToDouble.toDouble(true, DecimalToDouble.MAX_SIGNIFICAND, 0)));
        assertEquals(Double.doubleToRawLongBits(-0.0), Double.doubleToRawLongBits(DecimalToDouble.toDouble(true, 0, -5)));
        assertEquals(Double.doubleToRawLongBits(0.0), Double.doubleToRawLongBits(DecimalToDouble.toDouble(false, 0, 400)));
    }

    /**
     * The reader decodes weights as the JDK's parser does: 17-digit weights, exact midpoints, 19 and
     * more digits, leading zeros, exponents in and out of range, negative zero.
     */
    @Test
    void readerDecodesAsTheJdkParser(@TempDir Path dir) throws Exception {
        SplittableRandom r = new SplittableRandom(15);
        int n = 3000;
        String[] texts = new String[n];
        for (int i = 0; i < n; i++) {
            texts[i] = switch (i % 8) {
                case 0 -> Double.toString(r.nextDouble() * 1e-3);
                case 1 -> new BigDecimal(r.nextDouble()).round(new MathContext(17)).toPlainString();
                case 2 -> ((1L << 53) + 2 * r.nextLong(0, 1L << 52) + 1) + "e0";
                case 3 -> new BigDecimal(r.nextDouble()).round(new MathContext(25)).toPlainString();
                case 4 -> "0.000" + r.nextLong(1, 1L << 50) + "E-" + r.nextInt(0, 40);
                case 5 -> r.nextLong(1, 1L << 59) + "0000e" + r.nextInt(0, 280);
                case 6 -> "-0.0";
                default -> "1." + r.nextInt(0, 1000) + "e+" + r.nextInt(0, 30);
            };
        }
        StringBuilder json = new StringBuilder("{\"format\":\"circa.circuit\",\"version\":\"1.0\",")
                .append("\"variables\":[{\"name\":\"flow\",\"type\":\"real\"}],\"nodes\":[\n")
                .append("{\"id\":0,\"input\":\"normal\",\"var\":0,\"mean\":0,\"sd\":1}\n");
        for (int i = 0; i < n; i++) {
            json.append(",{\"id\":").append(i + 1).append(",\"input\":\"normal\",\"var\":0,\"mean\":")
                    .append(texts[i]).append(",\"sd\":1}\n");
        }
        json.append(",{\"id\":").append(n + 1).append(",\"sum\":[");
        for (int i = 0; i <= n; i++) {
            json.append(i == 0 ? "" : ",").append(i);
        }
        json.append("],\"weights\":[");
        for (int i = 0; i <= n; i++) {
            json.append(i == 0 ? "" : ",").append(i == 0 ? "1e-300" : texts[i - 1].replace("-0.0", "0.0"));
        }
        json.append("]}\n],\"outputs\":[{\"name\":\"joint\",\"node\":").append(n + 1).append("}]}\n");
        Path file = dir.resolve("pump-weights.json");
        Files.writeString(file, json, StandardCharsets.UTF_8);
        var table = new CircuitReader().read(file).nodeTable();
        for (int i = 0; i < n; i++) {
            int node = i + 1;
            double expected = Double.parseDouble(texts[i]);
            String text = texts[i];
            assertEquals(Double.doubleToRawLongBits(expected), Double.doubleToRawLongBits(table.value(table.valueStart(node))),
                    () -> "mean " + text);
            double weight = Double.parseDouble(text.replace("-0.0", "0.0"));
            assertEquals(Double.doubleToRawLongBits(weight), Double.doubleToRawLongBits(table.value(table.valueStart(n + 1) + node)),
                    () -> "weight " + text);
        }
    }
}

package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.NodeTable;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The weights of a large sum, decoded on the second thread ({@link DeferredNumbers}), against the
 * JDK's own decoding of the same text ({@link Double#parseDouble}, correctly rounded by its
 * specification); and a bad number or bad syntax after the decoder has started, which must end the
 * read with the same located message as anywhere else and leave no decoder thread behind.
 */
class DeferredNumbersTest {
    /** Enough weights for several batches, so that the decoder thread runs. */
    private static final int MANY = 3 * DeferredNumbers.BATCH + 123;
    /** Line of the first weight in {@link #document}. */
    private static final int FIRST_WEIGHT_LINE = 5;

    /** A circuit whose sum (node index 1) has one weight per line from line {@value #FIRST_WEIGHT_LINE}. */
    private static String document(List<String> weights) {
        StringBuilder sb = new StringBuilder();
        sb.append("{\"format\": \"circa.circuit\", \"version\": \"1.0\",\n");
        sb.append("\"variables\": [{\"name\": \"inlet_pressure\", \"type\": \"real\"}],\n");
        sb.append("\"nodes\": [{\"id\": 0, \"input\": \"normal\", \"var\": 0, \"mean\": 1, \"sd\": 2},\n");
        sb.append("{\"id\": 1, \"sum\": [");
        for (int k = 0; k < weights.size(); k++) {
            sb.append(k == 0 ? "0" : ", 0");
        }
        sb.append("], \"weights\": [\n");
        for (int k = 0; k < weights.size(); k++) {
            sb.append(weights.get(k)).append(k + 1 < weights.size() ? ",\n" : "\n");
        }
        sb.append("]}],\n\"outputs\": [{\"name\": \"joint\", \"node\": 1}]}\n");
        return sb.toString();
    }

    /** Number texts of every form the decoder must agree on: short and long, with and without exponent. */
    private static List<String> texts(int n) {
        String[] fixed = {"0.1", "-0.5", "1e-320", "4.9e-324", "2.5E-3", "1.0E10", "2.5E+3", "7e2", "-0.0", "0.000001",
            "12345678901234567890", "123456789012345678901234567890.5", "1e-400", "0", "1", "-3",
            "0." + "3".repeat(250), "9".repeat(280) + ".5", "1.7976931348623157E308", "2.2250738585072014E-308"};
        SplittableRandom rnd = new SplittableRandom(7);
        List<String> out = new ArrayList<>(n);
        for (int k = 0; k < n; k++) {
            if (k % 97 < fixed.length) {
                out.add(fixed[k % 97]);
            } else {
                double scale = Math.pow(10, rnd.nextInt(-30, 30));
                out.add(Double.toString((rnd.nextDouble() - 0.3) * scale));
            }
        }
        return out;
    }

    private static NodeTable read(String doc) throws FormatException {
        return new CircuitReader().read(new ByteArrayInputStream(doc.getBytes(StandardCharsets.UTF_8)), "case.json")
                .nodeTable();
    }

    private static boolean decoderAlive() {
        for (Thread t : Thread.getAllStackTraces().keySet()) {
            if (t.getName().equals("circa-number-decoder") && t.isAlive()) {
                return true;
            }
        }
        return false;
    }

    @Test
    void read_manyWeightsOfEveryForm_sameBitsAsTheJdk() throws FormatException {
        List<String> w = texts(MANY);
        NodeTable t = read(document(w));
        int at = t.valueStart(1);
        assertEquals(MANY, t.valueEnd(1) - at);
        for (int k = 0; k < MANY; k++) {
            // reference: java.lang.Double.parseDouble of the same text
            long expected = Double.doubleToRawLongBits(Double.parseDouble(w.get(k)));
            assertEquals(expected, Double.doubleToRawLongBits(t.value(at + k)), "weight " + k + " = " + w.get(k));
        }
        assertEquals(1.0, t.value(t.valueStart(0)));
        assertEquals(2.0, t.value(t.valueStart(0) + 1));
        assertFalse(decoderAlive());
    }

    @Test
    void read_fewWeights_sameBitsAsTheJdkWithoutAThread() throws FormatException {
        List<String> w = texts(200);
        NodeTable t = read(document(w));
        for (int k = 0; k < w.size(); k++) {
            // reference: java.lang.Double.parseDouble of the same text
            assertEquals(Double.doubleToRawLongBits(Double.parseDouble(w.get(k))),
                    Double.doubleToRawLongBits(t.value(t.valueStart(1) + k)));
        }
    }

    @Test
    void read_outOfRangeAfterTheDecoderStarted_locatedAndNoThreadLeft() {
        for (int bad : new int[] {150, MANY - 10}) {
            List<String> w = texts(MANY);
            w.set(bad, "1e400");
            FormatException e = assertThrows(FormatException.class, () -> read(document(w)));
            assertEquals(FIRST_WEIGHT_LINE + bad, e.line());
            assertEquals(1, e.column());
            assertEquals("/nodes/1/weights/" + bad, e.pointer());
            assertEquals("the number 1e400 is out of double range; expected a finite number", e.problem());
            assertFalse(decoderAlive());
        }
    }

    @Test
    void read_syntaxErrorAfterTheDecoderStarted_locatedAndNoThreadLeft() {
        List<String> w = texts(MANY);
        int bad = MANY - 50;
        w.set(bad, "0.5 0.25");
        FormatException e = assertThrows(FormatException.class, () -> read(document(w)));
        assertEquals(FIRST_WEIGHT_LINE + bad, e.line());
        assertTrue(e.column() > 1, "column " + e.column());
        assertFalse(decoderAlive());
    }
}

package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;

/**
 * {@link JsonInput#isIntIn(int, int)} decodes integer tokens itself: it must say yes exactly when the
 * parser's own decoding (Jackson, the reference here) finds an int in the range, with the same value.
 */
class JsonInputIntegerTest {
    @Test
    void everyLengthAndBoundary_sameAsTheParsersDecoding() throws Exception {
        List<String> literals = new ArrayList<>(List.of("0", "-0", "7", "-7", "10", "99", "2147483647", "2147483648",
                "-2147483648", "-2147483649", "9999999999", "10000000000", "12345678901234567890", "-1", "1.0", "2e3",
                "4294967296", "-9999999999"));
        Random rnd = new Random(3);
        for (int i = 0; i < 2000; i++) {
            long v = rnd.nextLong() >> rnd.nextInt(64);
            literals.add(Long.toString(v));
        }
        int[][] ranges = {{0, Integer.MAX_VALUE}, {Integer.MIN_VALUE, Integer.MAX_VALUE}, {-5, 100}, {3, 3}};
        String json = "[" + String.join(", ", literals) + "]";
        for (int[] r : ranges) {
            try (JsonInput in = JsonInput.fromStream(new ByteArrayInputStream(json.getBytes(StandardCharsets.UTF_8)), "ints.json",
                    ReadLimits.DEFAULT);
                    JsonParser reference = JsonInput.mapperFor(ReadLimits.DEFAULT).createParser(json)) {
                in.next();
                reference.nextToken();
                int k = 0;
                while (in.nextElement()) {
                    reference.nextToken();
                    boolean want = reference.currentToken() == JsonToken.VALUE_NUMBER_INT
                            && reference.getNumberType() == JsonParser.NumberType.INT
                            && reference.getIntValue() >= r[0] && reference.getIntValue() <= r[1];
                    String what = literals.get(k) + " in [" + r[0] + ", " + r[1] + "]";
                    assertEquals(want, in.isIntIn(r[0], r[1]), what);
                    if (want) {
                        assertEquals(reference.getIntValue(), in.intValue(), what);
                    }
                    k++;
                }
                assertEquals(literals.size(), k);
            }
        }
    }
}

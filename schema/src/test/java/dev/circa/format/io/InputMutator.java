package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;

import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;

/**
 * Seeded mutations of a corpus of seed files, for the mutation loops of the reader tests: byte
 * flips, random bytes, insertions of bytes or of tokens that readers treat specially, deletions,
 * truncations, duplicated ranges and splices of two seeds. The same seed gives the same inputs.
 */
public final class InputMutator {
    /** Tokens the readers treat specially (JSON, YAML and CSV syntax, hard numbers, bad UTF-8). */
    private static final List<byte[]> TOKENS = tokens("{", "}", "[", "]", "\"", ",", ":", "null", "true", "false",
            "-", "0", "-0", "1e999999", "-1e999999", "1e-999999", "NaN", "Infinity", "-Infinity", ".inf", ".nan",
            "9223372036854775808", "2147483648", "1.5", "\\u0000", "\\", "\n", "\r\n", "\r", "\t", "#", "\"\"", "''",
            "- ", "&a ", "*a", "!!binary ", "---\n", "...", "\"id\": ", "\"nodes\": ", "\"format\": ", "\"version\": \"2.0\"",
            "\"$schema\": \"http://127.0.0.1:9/x\"", "-inf", "1e308", "\uFEFF", "\u00e9", "\ud83d\ude00",
            // extreme but valid numbers: the ends of double range, subnormals, integers past 2^53 and 2^63,
            // YAML 1.2 core-schema spellings, and a lone surrogate escape
            "1.7976931348623157e308", "-1.7976931348623157e308", "4.9e-324", "2.2250738585072014e-308", "1e19",
            "-1e300", "9007199254740993", ".5", "-.5", "+1", "0x1F", "0o17", "\\ud800", " a");
    private static final byte[][] BAD_UTF8 = {{(byte) 0xC3, 0x28}, {(byte) 0xFF}, {(byte) 0xED, (byte) 0xA0, (byte) 0x80},
        {(byte) 0xF0, (byte) 0x9F}, {0}};

    private final Random random;
    private final List<byte[]> corpus;
    private final StringBuilder last = new StringBuilder();

    /** Mutates the files of {@code corpus} (not empty) with a generator seeded by {@code seed}. */
    public InputMutator(long seed, List<byte[]> corpus) {
        if (corpus.isEmpty()) {
            throw new IllegalArgumentException("empty corpus");
        }
        this.random = new Random(seed);
        this.corpus = List.copyOf(corpus);
    }

    /** The next input: one seed with one to four mutations applied. */
    public byte[] next() {
        last.setLength(0);
        int s = random.nextInt(corpus.size());
        last.append("seed ").append(s);
        byte[] b = corpus.get(s).clone();
        int rounds = 1 + random.nextInt(4);
        for (int r = 0; r < rounds; r++) {
            b = mutate(b);
        }
        return b;
    }

    /** A property of one input: whether it was read whole (it throws an AssertionError when it fails). */
    @FunctionalInterface
    public interface Property {
        boolean holds(byte[] input) throws Exception;
    }

    /**
     * Checks {@code property} on the next {@code count} inputs under a 60-second hang guard (only a guard:
     * tests never assert on time), naming the mutation of a failure.
     *
     * @return how many inputs were read whole ([0]) and how many refused ([1])
     */
    public int[] run(int count, Property property) {
        int[] outcome = new int[2];
        assertTimeoutPreemptively(Duration.ofSeconds(60), () -> {
            for (int i = 0; i < count; i++) {
                byte[] input = next();
                try {
                    outcome[property.holds(input) ? 0 : 1]++;
                } catch (AssertionError e) {
                    throw new AssertionError("mutation " + i + " (" + lastMutations() + "): " + e.getMessage(), e);
                }
            }
        });
        return outcome;
    }

    /** What the last call of {@link #next()} did, for failure messages. */
    public String lastMutations() {
        return last.toString();
    }

    private byte[] mutate(byte[] b) {
        int kind = random.nextInt(9);
        int n = b.length;
        switch (kind) {
            case 0 -> {
                if (n > 0) {
                    int at = random.nextInt(n);
                    b[at] ^= (byte) (1 << random.nextInt(8));
                    last.append(", flip at ").append(at);
                }
                return b;
            }
            case 1 -> {
                if (n > 0) {
                    int at = random.nextInt(n);
                    b[at] = (byte) random.nextInt(256);
                    last.append(", random byte at ").append(at);
                }
                return b;
            }
            case 2 -> {
                int at = random.nextInt(n + 1);
                last.append(", token at ").append(at);
                return insert(b, at, TOKENS.get(random.nextInt(TOKENS.size())));
            }
            case 3 -> {
                int at = random.nextInt(n + 1);
                last.append(", bad UTF-8 at ").append(at);
                return insert(b, at, BAD_UTF8[random.nextInt(BAD_UTF8.length)]);
            }
            case 4 -> {
                if (n == 0) {
                    return b;
                }
                int at = random.nextInt(n);
                int len = 1 + random.nextInt(Math.min(n - at, 16));
                last.append(", delete ").append(len).append(" at ").append(at);
                byte[] c = new byte[n - len];
                System.arraycopy(b, 0, c, 0, at);
                System.arraycopy(b, at + len, c, at, n - at - len);
                return c;
            }
            case 5 -> {
                int at = random.nextInt(n + 1);
                last.append(", truncate at ").append(at);
                return Arrays.copyOf(b, at);
            }
            case 6 -> {
                if (n == 0) {
                    return b;
                }
                int from = random.nextInt(n);
                int len = 1 + random.nextInt(Math.min(n - from, 64));
                int at = random.nextInt(n + 1);
                last.append(", duplicate ").append(len).append(" from ").append(from).append(" to ").append(at);
                return insert(b, at, Arrays.copyOfRange(b, from, from + len));
            }
            case 7 -> {
                byte[] other = corpus.get(random.nextInt(corpus.size()));
                int cut = random.nextInt(n + 1);
                int from = random.nextInt(other.length + 1);
                last.append(", splice at ").append(cut).append(" with another seed from ").append(from);
                byte[] c = Arrays.copyOf(b, cut + other.length - from);
                System.arraycopy(other, from, c, cut, other.length - from);
                return c;
            }
            default -> {
                int at = random.nextInt(n + 1);
                int len = 1 + random.nextInt(8);
                byte[] r = new byte[len];
                random.nextBytes(r);
                last.append(", ").append(len).append(" random bytes at ").append(at);
                return insert(b, at, r);
            }
        }
    }

    private static byte[] insert(byte[] b, int at, byte[] what) {
        byte[] c = new byte[b.length + what.length];
        System.arraycopy(b, 0, c, 0, at);
        System.arraycopy(what, 0, c, at, what.length);
        System.arraycopy(b, at, c, at + what.length, b.length - at);
        return c;
    }

    private static List<byte[]> tokens(String... s) {
        List<byte[]> l = new ArrayList<>();
        for (String t : s) {
            l.add(t.getBytes(StandardCharsets.UTF_8));
        }
        return l;
    }
}

package dev.circa.format.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.CircuitDocument;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.zip.GZIPOutputStream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Gzip files are nothing but gzip members (RFC 1952, section 2.2: "a gzip file consists of a series of
 * members"): concatenated members read as one text; anything else after the last member is an error
 * naming its byte offset. The compressed bytes come from java.util.zip.GZIPOutputStream.
 */
class GzipMembersInputStreamTest {
    private static final String CIRCUIT = """
            {"format": "circa.circuit", "version": "1.0", "variables": [{"name": "x", "type": "real"}],
             "nodes": [{"id": 0, "input": "normal", "var": 0, "mean": 0, "sd": 1}],
             "outputs": [{"name": "joint", "node": 0}]}
            """;

    @TempDir
    Path tmp;

    @Test
    void open_oneAndTwoMembers_wholeText() throws IOException {
        byte[] text = CIRCUIT.getBytes(StandardCharsets.UTF_8);
        byte[] one = gzip(text);
        assertArrayEquals(text, readAll(write("one.json.gz", one)));
        int half = text.length / 2;
        byte[] two = concat(gzip(Arrays.copyOf(text, half)), gzip(Arrays.copyOfRange(text, half, text.length)));
        assertArrayEquals(text, readAll(write("two.json.gz", two)));
        CircuitDocument doc = new CircuitReader().read(write("two-read.json.gz", two));
        assertTrue(doc.nodes().size() == 1);
    }

    @Test
    void read_garbageOrNulBytesAfterTheLastMember_errorWithOffset() throws IOException {
        byte[] gz = gzip(CIRCUIT.getBytes(StandardCharsets.UTF_8));
        for (byte[] tail : new byte[][] {{0}, {0, 0, 0, 0}, "garbage".getBytes(StandardCharsets.US_ASCII), {0x1f}}) {
            Path p = write("tail.json.gz", concat(gz, tail));
            FormatException e = assertThrows(FormatException.class, () -> new CircuitReader().read(p));
            assertTrue(e.getMessage().startsWith(p.toString()), e.getMessage());
            assertTrue(e.getMessage().contains("unexpected bytes after the end of the gzip data at byte " + gz.length),
                    e.getMessage());
        }
    }

    @Test
    void read_truncatedOrDamaged_errorNamesTheFile() throws IOException {
        byte[] gz = gzip(CIRCUIT.getBytes(StandardCharsets.UTF_8));
        Path cut = write("cut.json.gz", Arrays.copyOf(gz, gz.length - 6));
        FormatException c = assertThrows(FormatException.class, () -> new CircuitReader().read(cut));
        assertTrue(c.getMessage().contains("truncated"), c.getMessage());
        byte[] damaged = gz.clone();
        damaged[gz.length - 8] ^= 0x01; // the CRC-32 of the trailer
        Path d = write("crc.json.gz", damaged);
        FormatException e = assertThrows(FormatException.class, () -> new CircuitReader().read(d));
        assertTrue(e.getMessage().contains("CRC-32"), e.getMessage());
        Path plain = write("plain.json.gz", CIRCUIT.getBytes(StandardCharsets.UTF_8));
        FormatException f = assertThrows(FormatException.class, () -> new CircuitReader().read(plain));
        assertTrue(f.getMessage().contains("not gzip-compressed"), f.getMessage());
    }

    private Path write(String name, byte[] bytes) throws IOException {
        Path p = tmp.resolve(name);
        Files.write(p, bytes);
        return p;
    }

    private static byte[] readAll(Path p) throws IOException {
        try (InputStream in = InputFiles.open(p, 1 << 20)) {
            return in.readAllBytes();
        }
    }

    private static byte[] gzip(byte[] text) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (GZIPOutputStream g = new GZIPOutputStream(out)) {
            g.write(text);
        }
        return out.toByteArray();
    }

    private static byte[] concat(byte[] a, byte[] b) {
        byte[] c = Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, c, a.length, b.length);
        return c;
    }
}

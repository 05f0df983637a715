package dev.circa.format.csv;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.FormatException;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Every CSV file is read as the JSON reader reads text: UTF-8, UTF-16 or UTF-32 in either byte order,
 * with or without a byte-order mark (RFC 8259 section 8.1; the marks are those of The Unicode Standard,
 * section 23.8). The bytes are made by the JDK's encoders.
 */
class CsvEncodingTest {
    private static final String TEXT = "inlet_pressure,valve\n3.0,\" open \"\n2.1,Ünïcødé\n";
    private static final List<List<String>> RECORDS = List.of(List.of("inlet_pressure", "valve"),
            List.of("3.0", " open "), List.of("2.1", "Ünïcødé"));

    @TempDir
    Path tmp;

    @Test
    void open_everyUnicodeEncodingWithAndWithoutMark_sameRecords() throws IOException {
        String[] names = {"UTF-8", "UTF-16BE", "UTF-16LE", "UTF-32BE", "UTF-32LE"};
        for (String name : names) {
            Charset cs = Charset.forName(name);
            for (boolean mark : new boolean[] {true, false}) {
                ByteArrayOutputStream b = new ByteArrayOutputStream();
                b.write(((mark ? "\uFEFF" : "") + TEXT).getBytes(cs));
                Path p = tmp.resolve(name + (mark ? "-bom" : "") + ".csv");
                Files.write(p, b.toByteArray());
                assertEquals(RECORDS, read(p), name + (mark ? " with" : " without") + " a byte-order mark");
            }
        }
    }

    @Test
    void open_malformedBytes_locatedError() throws IOException {
        Path p = tmp.resolve("latin1.csv");
        Files.write(p, "a,b\n1,\u00e9\n".getBytes(StandardCharsets.ISO_8859_1));
        FormatException e = assertThrows(FormatException.class, () -> read(p));
        assertTrue(e.getMessage().startsWith(p + ":"), e.getMessage());
        assertTrue(e.getMessage().contains("expected UTF-8, UTF-16 or UTF-32"), e.getMessage());
    }

    @Test
    void open_malformedBytesBeyondTheFirstBuffer_locatedAtTheirOwnLineAndColumn() throws IOException {
        // 20,000 lines of 12 bytes (240 KB, several reads of the reader's 64 Ki-character buffer); on line
        // 15,000 the second cell is "2.", then 0xE9 (a Latin-1 byte, not UTF-8: RFC 3629 section 4, a
        // lead byte must be followed by continuation bytes 0x80-0xBF), then "5"
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.write("inlet,valve\n".getBytes(StandardCharsets.US_ASCII));
        for (int line = 2; line <= 20_000; line++) {
            b.write((line == 15_000 ? "1.25,2." : "1.25,2.50\n").getBytes(StandardCharsets.US_ASCII));
            if (line == 15_000) {
                b.write(0xE9);
                b.write("5\n".getBytes(StandardCharsets.US_ASCII));
            }
        }
        for (String name : new String[] {"middle.csv", "middle.csv.gz"}) {
            Path p = tmp.resolve(name);
            byte[] bytes = b.toByteArray();
            if (name.endsWith(".gz")) {
                ByteArrayOutputStream z = new ByteArrayOutputStream();
                try (java.util.zip.GZIPOutputStream g = new java.util.zip.GZIPOutputStream(z)) {
                    g.write(bytes);
                }
                bytes = z.toByteArray();
            }
            Files.write(p, bytes);
            FormatException e = assertThrows(FormatException.class, () -> read(p));
            assertTrue(e.getMessage().startsWith(p + ":15000:8: not valid text: byte 0xE9 is not UTF-8 text"),
                    e.getMessage());
        }
    }

    @Test
    void reader_malformedUtf16_locatedAfterTheCharactersBeforeIt() throws IOException {
        // a lone low surrogate 0xDC00 in UTF-16BE (The Unicode Standard, section 3.9: D91) on line 3,
        // column 3, after a 70,000-character first line
        String head = "x".repeat(70_000) + "\nab\ncd";
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        b.write(head.getBytes(StandardCharsets.UTF_16BE));
        b.write(new byte[] {(byte) 0xDC, 0x00, 0, 'e', 0, '\n'});
        Path p = tmp.resolve("utf16.csv");
        Files.write(p, b.toByteArray());
        FormatException e = assertThrows(FormatException.class, () -> read(p));
        assertTrue(e.getMessage().startsWith(p + ":3:3: not valid text: bytes 0xDC 0x00 are not UTF-16BE text"),
                e.getMessage());
    }

    private static List<List<String>> read(Path p) throws FormatException {
        return CsvRecords.of(p);
    }
}

package dev.circa.format.csv;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
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

    private static List<List<String>> read(Path p) throws FormatException {
        List<List<String>> out = new ArrayList<>();
        try (CsvReader r = CsvReader.open(p, ReadLimits.DEFAULT)) {
            List<String> rec;
            while ((rec = r.next()) != null) {
                out.add(List.copyOf(rec));
            }
        }
        return out;
    }
}

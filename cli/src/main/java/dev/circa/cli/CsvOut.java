package dev.circa.cli;

import dev.circa.format.csv.CellValues;
import java.io.IOException;
import java.io.Writer;

/** Writes CSV records, quoting fields that need it. */
final class CsvOut {
    private final Writer w;

    CsvOut(Writer w) {
        this.w = w;
    }

    void record(String... fields) throws IOException {
        for (int i = 0; i < fields.length; i++) {
            if (i > 0) {
                w.write(',');
            }
            w.write(CellValues.quote(fields[i]));
        }
        w.write('\n');
    }

    void flush() throws IOException {
        w.flush();
    }
}

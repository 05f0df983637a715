package dev.circa.cli;

import dev.circa.format.csv.CellValues;
import java.io.IOException;
import java.io.Writer;

/** Writes CSV records, quoting fields that need it. */
final class CsvOut {
    private final Writer w;
    private final Progress progress;
    private final long total;
    private long records;

    /** A writer whose data rows are counted in {@code progress} ({@code total} of them, or -1 when unknown). */
    CsvOut(Writer w, Progress progress, long total) {
        this.w = w;
        this.progress = progress;
        this.total = total;
    }

    void record(String... fields) throws IOException {
        for (int i = 0; i < fields.length; i++) {
            if (i > 0) {
                w.write(',');
            }
            w.write(CellValues.quote(fields[i]));
        }
        w.write('\n');
        if ((++records & 1023) == 0) {
            progress.count(records - 1, total, "row");
        }
    }

    /** The records written so far (the header included). */
    long records() {
        return records;
    }

    /** Pushes out what is buffered, ignoring a failure (used on the way out of an error). */
    void flushQuietly() {
        try {
            w.flush();
        } catch (IOException ignored) {
            // the error being reported matters more than a failed flush
        }
    }

    void flush() throws IOException {
        w.flush();
    }
}

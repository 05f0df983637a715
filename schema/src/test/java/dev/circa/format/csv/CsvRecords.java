package dev.circa.format.csv;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.ReadLimits;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/** Every record of a CSV file as {@link CsvReader} reads it, for tests of this and other modules. */
public final class CsvRecords {
    private CsvRecords() {
    }

    /** The records of {@code p} (the header first), under the default limits. */
    public static List<List<String>> of(Path p) throws FormatException {
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

package dev.circa.converter.mixture;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/** The open datasets copied into fixtures/data (sources in fixtures/data/SOURCES.md), as plain tables. */
final class Datasets {
    static final Path DATA = Path.of("..", "fixtures", "data");

    private Datasets() {
    }

    /** The cells of a CSV file written by R's write.csv: header first, quotes removed. */
    static List<String[]> csv(String name) {
        try {
            List<String[]> rows = new ArrayList<>();
            for (String line : Files.readAllLines(DATA.resolve(name))) {
                if (line.isBlank()) {
                    continue;
                }
                String[] cells = line.split(",", -1);
                for (int i = 0; i < cells.length; i++) {
                    cells[i] = cells[i].replace("\"", "");
                }
                rows.add(cells);
            }
            return rows;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The numeric columns {@code columns} of every data row. */
    static double[][] numbers(String name, int... columns) {
        List<String[]> rows = csv(name);
        double[][] out = new double[rows.size() - 1][columns.length];
        for (int r = 1; r < rows.size(); r++) {
            for (int c = 0; c < columns.length; c++) {
                out[r - 1][c] = Double.parseDouble(rows.get(r)[columns[c]]);
            }
        }
        return out;
    }
}

package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SampleCommandTest {
    @TempDir
    Path tmp;

    @Test
    void chunkRows_boundedByCountAndCellBudget() {
        assertEquals(3, SampleCommand.chunkRows(3, 200_000));
        assertEquals(5, SampleCommand.chunkRows(5000, 200_000));
        assertEquals(4096, SampleCommand.chunkRows(1_000_000, 2));
        assertEquals(1, SampleCommand.chunkRows(10, 5_000_000));
        assertEquals(1, SampleCommand.chunkRows(0, 10));
    }

    /** Was out of memory under the suite's 2 GiB heap: a 4096-row buffer of 200,000 cells each (6.5 GB). */
    @Test
    void sample_threeRowsOf200000Variables_fitsTheHeap() throws Exception {
        int nv = 200_000;
        Path circuit = tmp.resolve("wide.json");
        try (BufferedWriter w = Files.newBufferedWriter(circuit)) {
            w.write("{\"format\": \"circa.circuit\", \"version\": \"1.0\", \"variables\": [");
            for (int v = 0; v < nv; v++) {
                w.write((v == 0 ? "" : ",") + "{\"name\": \"x" + v + "\", \"type\": \"real\"}");
            }
            w.write("], \"nodes\": [");
            for (int v = 0; v < nv; v++) {
                w.write("{\"id\": " + v + ", \"input\": \"normal\", \"var\": " + v + ", \"mean\": 0, \"sd\": 1},");
            }
            w.write("{\"id\": " + nv + ", \"product\": [");
            for (int v = 0; v < nv; v++) {
                w.write((v == 0 ? "" : ",") + v);
            }
            w.write("]}], \"outputs\": [{\"name\": \"joint\", \"node\": " + nv + "}]}");
        }
        Path out = tmp.resolve("s.csv");
        CliRunner r = CliRunner.run("sample", circuit.toString(), "-n", "3", "--seed", "1", "-o", out.toString());
        assertEquals(0, r.status, r.err);
        List<String> lines = Files.readAllLines(out);
        assertEquals(4, lines.size());
        for (String line : lines.subList(1, 4)) {
            String[] cells = line.split(",", -1);
            assertEquals(nv, cells.length);
            for (String c : cells) {
                // a standard normal draw: finite, and beyond 10 sd with probability ~1e-23 (common practice)
                assertTrue(Math.abs(Double.parseDouble(c)) < 10, c);
            }
        }
    }
}

package dev.circa.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.concurrent.atomic.AtomicLong;
import org.junit.jupiter.api.Test;

/** The progress line: when it is drawn, what it says, and that it is cleared; with an injected clock and terminal flag. */
class ProgressTest {
    private static final long SECOND = 1_000_000_000L;

    @Test
    void terminal_nothingBeforeTwoSeconds_thenCarriageReturnLine_clearedAtClose() {
        AtomicLong now = new AtomicLong(5 * SECOND);
        StringWriter sink = new StringWriter();
        Progress p = new Progress(new PrintWriter(sink), true, now::get, "circa sample: drawing");
        p.count(1_000, 100_000, "row");
        now.addAndGet(SECOND);
        p.tick();
        assertEquals("", sink.toString(), "short work shows nothing");
        now.addAndGet(SECOND);
        p.tick();
        assertEquals("\rcirca sample: drawing, 1,000 of 100,000 rows (1%), 2 s", sink.toString());
        p.count(12_000, 100_000, "row");
        now.addAndGet(3 * SECOND);
        p.tick();
        assertTrue(sink.toString().endsWith("\rcirca sample: drawing, 12,000 of 100,000 rows (12%), 5 s"), sink.toString());
        p.phase("circa sample: writing");
        p.tick();
        // a shorter line overwrites the longer one with spaces
        String last = sink.toString().substring(sink.toString().lastIndexOf('\r'));
        int longest = "circa sample: drawing, 12,000 of 100,000 rows (12%), 5 s".length();
        assertEquals("\rcirca sample: writing, 5 s" + " ".repeat(longest - "circa sample: writing, 5 s".length()), last);
        p.close();
        assertTrue(sink.toString().endsWith("\r" + " ".repeat("circa sample: writing, 5 s".length()) + "\r"), "the line is erased: " + sink);
    }

    @Test
    void notATerminal_neverWritten() {
        AtomicLong now = new AtomicLong(0);
        StringWriter sink = new StringWriter();
        Progress p = new Progress(new PrintWriter(sink), false, now::get, "circa eval: scoring d.csv");
        p.count(5, -1, "row");
        now.addAndGet(60 * SECOND);
        p.tick();
        p.clear();
        p.close();
        assertEquals("", sink.toString());
    }

    @Test
    void start_onAWriterThatIsNotTheProcessTerminal_isSilent() {
        StringWriter sink = new StringWriter();
        try (Progress p = Progress.start(new PrintWriter(sink), "circa check: checking r.csv")) {
            p.tick();
        }
        assertEquals("", sink.toString());
    }

    @Test
    void line_unknownTotal_countOnly_singular() {
        assertEquals("circa eval: scoring d.csv, 1 row, 3 s", Progress.line("circa eval: scoring d.csv", 1, -1, "row", 3 * SECOND));
        assertEquals("circa eval: scoring d.csv, 2,048 rows, 3 s", Progress.line("circa eval: scoring d.csv", 2048, -1, "row",
                3 * SECOND + 999_999_999L));
        assertEquals("circa validate: validating a.json, 7 s", Progress.line("circa validate: validating a.json", -1, -1, null,
                7 * SECOND));
    }

    @Test
    void csvOut_countsDataRowsIntoTheLine() throws Exception {
        AtomicLong now = new AtomicLong(0);
        StringWriter sink = new StringWriter();
        Progress p = new Progress(new PrintWriter(sink), true, now::get, "circa sample: writing s.csv");
        CsvOut out = new CsvOut(new StringWriter(), p, 5000);
        out.record("x", "y");
        for (int r = 0; r < 2047; r++) {
            out.record("1", "2");
        }
        now.addAndGet(3 * SECOND);
        p.tick();
        // the header is not a data row: 2,048 records written, 2,047 of them rows
        assertEquals("\rcirca sample: writing s.csv, 2,047 of 5,000 rows (40%), 3 s", sink.toString());
    }
}

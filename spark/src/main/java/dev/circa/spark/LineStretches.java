package dev.circa.spark;

import java.io.Reader;
import java.util.Iterator;
import org.apache.spark.sql.Row;

/**
 * The lines of a partition of a text file (rows of {@code value} and {@code start}, the offset of the
 * file split they come from) cut into stretches of one split each, each read as one text through a
 * {@link Reader}, lines joined by a newline. Streams: a stretch holds one line at a time.
 */
final class LineStretches {
    private final Iterator<Row> rows;
    private Row peeked;

    LineStretches(Iterator<Row> rows) {
        this.rows = rows;
        this.peeked = rows.hasNext() ? rows.next() : null;
    }

    /** Whether another stretch follows. */
    boolean hasNext() {
        return peeked != null;
    }

    /** The split offset of the next stretch. */
    long start() {
        return peeked.getLong(1);
    }

    /**
     * The next stretch, preceded by {@code prefix} (a header line, or empty); the reader counts the
     * stretch's lines in {@link Stretch#lines()}.
     */
    Stretch next(String prefix) {
        return new Stretch(start(), prefix);
    }

    /** One split's lines as text. */
    final class Stretch extends Reader {
        private final long start;
        private String current;
        private int pos;
        private long lines;
        private boolean readWhole;
        private boolean done;

        private Stretch(long start, String prefix) {
            this.start = start;
            this.current = prefix;
        }

        /** Lines of the file read so far (not counting the prefix). */
        long lines() {
            return lines;
        }

        /**
         * Whether the file must be read whole, from its bytes, by circa's own reader: a line read so far
         * has an odd number of {@code "} (a quoted cell goes on past its end, so records may span the
         * stretches' boundaries; see {@link DataFiles}), or a character the line reader makes of bytes
         * that are not UTF-8 text (U+FFFD in place of malformed bytes, U+0000 from UTF-16 or UTF-32 text),
         * which circa's reader decodes or reports at their own line and column.
         */
        boolean readWhole() {
            return readWhole;
        }

        /** Reads to the end of the stretch. */
        void drain() {
            while (advance()) {
                current = "";
            }
        }

        private boolean advance() {
            if (done || peeked == null || peeked.getLong(1) != start) {
                done = true;
                return false;
            }
            current = (peeked.isNullAt(0) ? "" : peeked.getString(0)) + "\n";
            int quotes = 0;
            for (int i = current.indexOf('"'); i >= 0; i = current.indexOf('"', i + 1)) {
                quotes++;
            }
            readWhole |= (quotes & 1) == 1 || current.indexOf('\uFFFD') >= 0 || current.indexOf('\u0000') >= 0;
            pos = 0;
            lines++;
            peeked = rows.hasNext() ? rows.next() : null;
            return true;
        }

        @Override
        public int read(char[] buf, int off, int len) {
            while (pos >= current.length()) {
                if (!advance()) {
                    return -1;
                }
            }
            int n = Math.min(len, current.length() - pos);
            current.getChars(pos, pos + n, buf, off);
            pos += n;
            return n;
        }

        @Override
        public void close() {
            drain();
        }
    }
}

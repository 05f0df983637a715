package dev.circa.format.csv;

import dev.circa.format.io.FormatException;
import dev.circa.format.io.InputFiles;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.io.TextDecoding;
import java.io.IOException;
import java.io.InputStream;
import java.io.Reader;
import java.nio.charset.CharacterCodingException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Streams the records of a CSV file (RFC 4180: quoted fields, doubled quotes, CRLF or LF), skipping
 * blank lines and lines that start with {@code #}. Every record carries the line it starts on, and
 * {@link #column(int)} gives the column of each field, for messages. Not thread-safe.
 */
public final class CsvReader implements AutoCloseable {
    private final Reader in;
    private final String file;
    private final int maxField;
    private final ReadLimits limits;
    private final char[] buf = new char[1 << 16];
    private int pos;
    private int len;
    private boolean eof;
    private int line = 1;
    private int col = 1;
    private int recordLine;
    private final List<String> fields = new ArrayList<>();
    private int[] columns = new int[16];
    private final StringBuilder field = new StringBuilder();

    /** Reads from {@code reader}; {@code file} names it in messages. */
    public CsvReader(Reader reader, String file, ReadLimits limits) {
        this(reader, file, limits, 1);
    }

    /**
     * Reads from {@code reader}, a stretch of a larger file that starts on line {@code firstLine} of
     * it, so that records and messages carry the lines of the whole file (distributed readers).
     */
    public CsvReader(Reader reader, String file, ReadLimits limits, int firstLine) {
        this.in = reader;
        this.file = file;
        this.maxField = limits.maxString();
        this.limits = limits;
        this.line = firstLine;
    }

    /**
     * Opens {@code path} ({@code .gz} decompressed, {@code -} for standard input) as UTF-8, UTF-16 or
     * UTF-32 with or without a byte-order mark, detected as the JSON reader does ({@link TextDecoding}).
     */
    public static CsvReader open(Path path, ReadLimits limits) throws FormatException {
        InputStream s = InputFiles.open(path, limits.maxBytes());
        String name = InputFiles.displayName(path);
        return new CsvReader(TextDecoding.reader(s, name), name, limits);
    }

    /** The file name used in messages. */
    public String file() {
        return file;
    }

    /** The limits this reader was opened with (callers apply {@code --max-number} to numeric cells). */
    public ReadLimits limits() {
        return limits;
    }

    /** Line on which the current record starts (1-based). */
    public int line() {
        return recordLine;
    }

    /** Column (1-based) where field {@code i} of the current record starts. */
    public int column(int i) {
        return i < fields.size() ? columns[i] : 1;
    }

    /** A located error in field {@code i} of the current record. */
    public FormatException error(int i, String problem) {
        return new FormatException(file, recordLine, column(i), null, problem);
    }

    /**
     * Reads the next record.
     *
     * @return the fields (a list reused by the next call), or {@code null} at the end of the file
     */
    public List<String> next() throws FormatException {
        while (true) {
            int c = peek();
            if (c < 0) {
                return null;
            }
            if (c == '\n' || c == '\r') {
                consumeNewline();
                continue;
            }
            if (c == '#' && col == 1) {
                while ((c = peek()) >= 0 && c != '\n' && c != '\r') {
                    take();
                }
                continue;
            }
            break;
        }
        fields.clear();
        recordLine = line;
        while (true) {
            int start = col;
            boolean quoted = false;
            field.setLength(0);
            int c = peek();
            if (c == '"') {
                quoted = true;
                take();
                while (true) {
                    c = take();
                    if (c < 0) {
                        throw new FormatException(file, recordLine, start, null,
                                "the file ends inside a quoted field; expected a closing '\"'");
                    }
                    if (c == '"') {
                        if (peek() == '"') {
                            take();
                            append('"', start);
                        } else {
                            break;
                        }
                    } else {
                        if (c == '\n') {
                            line++;
                            col = 1;
                        }
                        append((char) c, start);
                    }
                }
                c = peek();
                if (c >= 0 && c != ',' && c != '\n' && c != '\r') {
                    throw new FormatException(file, line, col, null,
                            "unexpected character after a quoted field; expected ',' or the end of the line");
                }
            } else {
                while ((c = peek()) >= 0 && c != ',' && c != '\n' && c != '\r') {
                    take();
                    if (c == '"') {
                        throw new FormatException(file, line, col - 1, null,
                                "a '\"' inside an unquoted field; quote the whole field and double the quote");
                    }
                    append((char) c, start);
                }
            }
            addField(field.toString(), start);
            c = peek();
            if (c == ',') {
                take();
                continue;
            }
            if (c == '\n' || c == '\r') {
                consumeNewline();
            }
            if (!quoted && fields.size() == 1 && fields.get(0).isEmpty()) {
                // a line holding nothing is blank, not a record with one empty field
                continue;
            }
            return fields;
        }
    }

    private void append(char c, int start) throws LimitExceededException {
        if (field.length() >= maxField) {
            throw LimitExceededException.of(file, recordLine, start, null, "the length of a field",
                    ReadLimits.MAX_STRING, maxField);
        }
        field.append(c);
    }

    private void addField(String s, int start) {
        if (fields.size() == columns.length) {
            columns = java.util.Arrays.copyOf(columns, columns.length * 2);
        }
        columns[fields.size()] = start;
        fields.add(s);
    }

    private void consumeNewline() throws FormatException {
        int c = take();
        if (c == '\r' && peek() == '\n') {
            take();
        }
        line++;
        col = 1;
    }

    private int peek() throws FormatException {
        if (pos >= len) {
            if (eof) {
                return -1;
            }
            fill();
            if (len <= 0) {
                eof = true;
                len = 0;
                pos = 0;
                return -1;
            }
        }
        return buf[pos];
    }

    private int take() throws FormatException {
        int c = peek();
        if (c >= 0) {
            pos++;
            col++;
        }
        return c;
    }

    private void fill() throws FormatException {
        try {
            len = in.read(buf, 0, buf.length);
            pos = 0;
        } catch (TextDecoding.MalformedTextException e) {
            throw new FormatException(file, line, col, null, "not valid text: " + e.getMessage()
                    + "; expected UTF-8, UTF-16 or UTF-32");
        } catch (CharacterCodingException e) {
            throw new FormatException(file, line, col, null, "not valid text: expected UTF-8, UTF-16 or UTF-32");
        } catch (FormatException e) {
            throw e;
        } catch (IOException e) {
            if (e.getCause() instanceof FormatException fe) {
                throw fe;
            }
            throw new FormatException(file, line, col, null, "cannot be read: " + dev.circa.format.io.IoMessages.of(e));
        }
    }

    @Override
    public void close() throws FormatException {
        try {
            in.close();
        } catch (IOException e) {
            throw new FormatException(file, 0, 0, null, "cannot be closed: " + dev.circa.format.io.IoMessages.of(e));
        }
    }
}

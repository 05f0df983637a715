package dev.circa.format.io;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.SequenceInputStream;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;
import java.util.Locale;
import tools.jackson.core.JsonToken;

/**
 * A JSON parser over a circuit file that starts inside its {@code nodes} array, at an element's first
 * byte or at the array's <code>]</code>, standing where a parser that had read the file from its start
 * would stand: its input is one line of its own, the document's members read before {@code nodes}
 * (so that a duplicate after the array is found) and <code>"nodes": [</code>, then the file from that
 * byte on. Its lines, columns and byte offsets are the file's. What it reads from that byte on is the
 * same tokens in the same context as for a parser of the whole file, so the same document, findings
 * and errors. Stateless.
 */
final class ResumedInput {
    private ResumedInput() {
    }

    /**
     * Opens {@code file} at byte {@code offset} (at {@code line}, {@code column}), positioned on the
     * nodes array's start: the next token is the element (or the <code>]</code>) at that byte.
     *
     * @param membersBefore the document's members before {@code nodes}, in order
     * @param name the file's name in messages
     * @throws IOException when the file cannot be opened again
     */
    static JsonInput open(Path file, long offset, int line, int column, List<String> membersBefore, ReadLimits limits,
            String name) throws IOException {
        byte[] prefix = prefix(membersBefore);
        FileChannel channel = FileChannel.open(file, StandardOpenOption.READ);
        channel.position(offset);
        InputStream stream = new LimitedInputStream(new SequenceInputStream(new ByteArrayInputStream(prefix),
                Channels.newInputStream(channel)), limits.maxBytes() - offset + prefix.length, name);
        return open(stream, prefix, offset, line, column, limits, name);
    }

    /**
     * The same for an input read in order: {@code rest} (its bytes from {@code offset} on that were
     * read but not taken), then {@code stream} (or {@code failure}, the error the stream gave, again).
     */
    static JsonInput open(byte[] rest, InputStream stream, IOException failure, long offset, int line, int column,
            List<String> membersBefore, ReadLimits limits, String name) throws FormatException {
        byte[] prefix = prefix(membersBefore);
        InputStream then = failure == null ? stream : new InputStream() {
            @Override
            public int read() throws IOException {
                throw failure;
            }
        };
        InputStream in = new SequenceInputStream(java.util.Collections.enumeration(List.of(
                new ByteArrayInputStream(prefix), new ByteArrayInputStream(rest), then)));
        return open(in, prefix, offset, line, column, limits, name);
    }

    private static JsonInput open(InputStream stream, byte[] prefix, long offset, int line, int column, ReadLimits limits,
            String name) throws FormatException {
        JsonInput input;
        try {
            input = JsonInput.fromStream(stream, name, limits);
        } catch (FormatException e) {
            try {
                stream.close();
            } catch (IOException closing) {
                e.addSuppressed(closing);
            }
            throw e;
        }
        input.moveTo(line, column);
        input.shiftBytes(offset - prefix.length);
        // the first line: the members (values stand in for the document's), then the array's start
        input.startDocument("a circuit document");
        String m;
        do {
            m = input.nextProperty();
        } while (m != null && !m.equals("nodes"));
        if (input.token() != JsonToken.START_ARRAY) {
            input.close();
            throw new IllegalStateException("the first line of a resumed input did not open the nodes array");
        }
        return input;
    }

    /** The first line: the document's members so far, then the opening of the nodes array. */
    static byte[] prefix(List<String> membersBefore) {
        StringBuilder sb = new StringBuilder("{");
        for (String m : membersBefore) {
            sb.append('"');
            for (int i = 0; i < m.length(); i++) {
                char c = m.charAt(i);
                if (c == '"' || c == '\\' || c < 0x20 || c >= 0x7f) {
                    // escaped, so that the name is the same whatever it holds (lone surrogates included)
                    sb.append(String.format(Locale.ROOT, "\\u%04x", (int) c));
                } else {
                    sb.append(c);
                }
            }
            sb.append("\":0,");
        }
        sb.append("\"nodes\":[\n");
        return sb.toString().getBytes(StandardCharsets.US_ASCII);
    }
}

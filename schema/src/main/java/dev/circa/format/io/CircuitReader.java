package dev.circa.format.io;

import dev.circa.format.CheckCase;
import dev.circa.format.Checks;
import dev.circa.format.CircuitDocument;
import dev.circa.format.DocumentLocations;
import dev.circa.format.NodeLocations;
import dev.circa.format.NodeTable;
import dev.circa.format.Output;
import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import dev.circa.format.certificate.CertificateWriter;
import java.io.IOException;
import java.io.InputStream;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Consumer;
import tools.jackson.core.JsonToken;
import tools.jackson.databind.JsonNode;

/**
 * Reads a circuit document (FORMAT.md section 2) in one streaming pass, in any member order.
 *
 * <p>Structure is checked while reading: JSON syntax, member types, required members, exactly one
 * kind per node, the {@code format} and major {@code version}, finite numbers, duplicate keys and
 * the {@link ReadLimits}. Any of these ends the read with a located {@link FormatException}.
 * Values are not judged here (ranges, references, order, scopes): that is the validator's work.
 * Unknown properties outside {@code extensions} are kept as {@link ReadFinding}s.
 *
 * <p>The JSON parser is the authority on all of this. For a stored file, plain nodes are read straight
 * from the bytes ({@link NodeScanner}), the second half of a large file's nodes on a second thread
 * ({@link NodeArrayTail}), and the parser takes over ({@link ResumedInput}) at the first node that needs
 * it: the document, its locations, findings and errors are the same as the parser's alone.
 *
 * <p>Instances hold only their limits and are safe to share between threads.
 */
public final class CircuitReader extends JsonDocumentReader<CircuitDocument> {
    /** The newest minor version of format 1 this reader knows. */
    public static final int SUPPORTED_MINOR = 0;

    /** Stored files from this size on have their nodes read straight from their bytes. */
    static final long SCAN_AT_LEAST = 64 << 10;
    private final long scanAtLeast;
    private final long splitAtLeast;
    private final Consumer<Boolean> tailEvents;
    private final Consumer<Boolean> headEvents;

    public CircuitReader() {
        this(ReadLimits.DEFAULT);
    }

    public CircuitReader(ReadLimits limits) {
        this(limits, SCAN_AT_LEAST, NodeArrayTail.MIN_BYTES, taken -> { });
    }

    /**
     * A reader that reads the nodes of stored files of at least {@code scanAtLeast} bytes straight from
     * their bytes ({@link NodeScanner}), and those of at least {@code splitAtLeast} bytes in two halves on
     * two threads ({@link NodeArrayTail}), and those of every stream (standard input, gzip, a caller's
     * stream) in order with one scanner, unless {@code scanAtLeast} is {@link Long#MAX_VALUE} (the parser
     * reads everything); {@code tailEvents} hears, for each read that started a second
     * thread, whether its half was taken ({@code true}) or dropped ({@code false}). The document read is
     * the same either way.
     */
    CircuitReader(ReadLimits limits, long scanAtLeast, long splitAtLeast, Consumer<Boolean> tailEvents) {
        this(limits, scanAtLeast, splitAtLeast, tailEvents, taken -> { });
    }

    /** The same; {@code headEvents} hears, for each read that started a first half's reader, whether it was taken. */
    CircuitReader(ReadLimits limits, long scanAtLeast, long splitAtLeast, Consumer<Boolean> tailEvents,
            Consumer<Boolean> headEvents) {
        super(limits);
        this.scanAtLeast = scanAtLeast;
        this.splitAtLeast = splitAtLeast;
        this.tailEvents = tailEvents;
        this.headEvents = headEvents;
    }

    /**
     * Reads {@code path}. For a large stored file, both halves of the nodes start to be read on two threads
     * ({@link NodeArrayHead}, {@link NodeArrayTail}) before the parser is even set up; the parser, reading
     * the members before the nodes meanwhile, then takes what they read when it finds the nodes array where
     * they guessed it.
     */
    @Override
    public CircuitDocument read(Path path) throws FormatException {
        NodeArrayTail tail = null;
        NodeArrayHead head = null;
        if (JsonInput.isStored(path) && limits().maxDepth() >= 4) {
            try (FileChannel ch = FileChannel.open(path, StandardOpenOption.READ)) {
                long size = ch.size();
                if (size >= splitAtLeast && scannable(ch, size, scanAtLeast, limits())) {
                    // from the middle of the whole file: the nodes are most of a large circuit
                    tail = NodeArrayTail.start(path, size, 0, limits());
                    head = NodeArrayHead.start(path, size, tail == null ? Long.MAX_VALUE : tail.nodeOffset(), limits());
                }
            } catch (IOException e) {
                // the read itself reports a file it cannot read
            }
        }
        try (JsonInput in = JsonInput.openJson(path, limits())) {
            CircuitDocument doc = read(in, null, tail, head);
            if (head != null) {
                headEvents.accept(head.taken());
            }
            return doc;
        } finally {
            // when the read never started, or failed, nothing is left running (closing twice is harmless)
            if (tail != null) {
                tail.close();
            }
            if (head != null) {
                head.close();
            }
        }
    }

    @Override
    protected CircuitDocument read(JsonInput in) throws FormatException {
        return read(in, null, null, null);
    }

    private CircuitDocument read(JsonInput in, Path sameFile, NodeArrayTail tail, NodeArrayHead head) throws FormatException {
        try (Pass pass = new Pass(in, limits(), scanAtLeast, splitAtLeast, tailEvents); DeferredNumbers numbers = pass.numbers) {
            pass.sameFile = sameFile;
            pass.tail = tail;
            pass.head = head;
            return pass.run();
        }
    }

    /** Whether the nodes of a stored file of {@code size} bytes, open as {@code ch}, are read by a scanner. */
    private static boolean scannable(FileChannel ch, long size, long scanAtLeast, ReadLimits limits) throws IOException {
        return size >= scanAtLeast && size <= limits.maxBytes() && NodeScanner.startsAsUtf8(ch);
    }

    /**
     * Reads {@code stream}, which gives the bytes of the regular file {@code sameFile} as stored, from its
     * start and in order (through a digest, for example, which then sees every byte once). Like
     * {@link #read(InputStream, String)}, except that for a large file a second thread reads the second
     * half of the nodes straight from the file; its nodes are taken only when the stream's bytes of that
     * half have the same SHA-256 digest as the bytes it read, and the read fails, saying so, when they differ
     * (the file changed while it was read). The stream is not closed.
     *
     * @param name the file's name in messages
     */
    public CircuitDocument readAlongside(InputStream stream, String name, Path sameFile) throws FormatException {
        JsonInput in = JsonInput.fromStream(stream, name, limits());
        return read(in, sameFile, null, null);
    }

    /** The state of one read. */
    private static final class Pass implements AutoCloseable {
        /** The input: the file's, then a parser resumed after the nodes read straight from the file. */
        private JsonInput in;
        /** The input the read started with (its caller closes it). */
        private final JsonInput first;
        private final long scanAtLeast;
        private final ReadLimits limits;
        private final long splitAtLeast;
        /** The document's members before {@code nodes}, in order. */
        private final List<String> membersBefore = new ArrayList<>();
        private NodeArrayTail tail;
        /** The first half's reader, started with the tail when the file was opened (or {@code null}). */
        private NodeArrayHead head;
        /** The regular file a stream input reads in order, when the caller says so ({@link #readAlongside}). */
        Path sameFile;
        private final Consumer<Boolean> tailEvents;
        private final String file;
        private final List<ReadFinding> unknown = new ArrayList<>();
        private final DocumentLocations.Recorder locations = new DocumentLocations.Recorder();
        private final NodeLocations.Recorder nodeLocations = new NodeLocations.Recorder();
        private final NodeTable.Builder table = new NodeTable.Builder();
        /** Decodes the weights on a second thread while the read goes on. */
        final DeferredNumbers numbers = new DeferredNumbers(table);

        Pass(JsonInput in, ReadLimits limits, long scanAtLeast, long splitAtLeast, Consumer<Boolean> tailEvents) {
            this.in = in;
            this.first = in;
            this.scanAtLeast = scanAtLeast;
            this.limits = limits;
            this.splitAtLeast = splitAtLeast;
            this.tailEvents = tailEvents;
            this.file = in.file();
        }

        CircuitDocument run() throws FormatException {
            in.startDocument("a circuit document");
            // A missing member is reported at the start of the object that lacks it.
            int rootLine = in.line();
            int rootColumn = in.column();
            CircuitDocument.Builder b = CircuitDocument.builder().source(file);
            String format = null;
            String version = null;
            int formatLine = rootLine;
            int formatColumn = rootColumn;
            boolean sawNodes = false;
            boolean sawOutputs = false;
            boolean sawVariables = false;
            String member;
            while ((member = in.nextProperty()) != null) {
                String ptr = "/" + member;
                if (!sawNodes && !member.equals("nodes")) {
                    membersBefore.add(member);
                }
                locations.put(ptr, in.line(), in.column());
                switch (member) {
                    case "format" -> {
                        formatLine = in.line();
                        formatColumn = in.column();
                        format = in.readString(ptr);
                        if (!CircuitDocument.FORMAT.equals(format)) {
                            throw in.error(ptr, "unknown format \"" + format + "\"; expected \""
                                    + CircuitDocument.FORMAT + "\"");
                        }
                    }
                    case "version" -> {
                        version = in.readString(ptr);
                        DocumentHeader.checkVersion(in, version, ptr);
                        b.version(version);
                    }
                    case "name" -> b.name(in.readString(ptr));
                    case "description" -> b.description(in.readString(ptr));
                    case "provenance" -> b.provenance(DocumentHeader.readProvenance(in, ptr, unknown));
                    case "variables" -> {
                        b.variables(VariableListReader.read(in, ptr, unknown));
                        sawVariables = true;
                    }
                    case "nodes" -> {
                        readNodes(ptr);
                        sawNodes = true;
                    }
                    case "outputs" -> {
                        b.outputs(readOutputs(ptr));
                        sawOutputs = true;
                    }
                    case "checks" -> b.checks(readChecks(ptr));
                    case "extensions" -> {
                        in.expect(JsonToken.START_OBJECT, ptr, "an object");
                        JsonNode ext = in.readTree();
                        b.extensions(ext);
                    }
                    default -> {
                        unknown(ptr, "unknown property \"" + member + "\" in a circuit document");
                        in.skipValue();
                    }
                }
            }
            in.endDocument();
            if (format == null) {
                throw new FormatException(file, rootLine, rootColumn, "/format",
                        "missing \"format\"; expected \"format\": \"" + CircuitDocument.FORMAT + "\"");
            }
            if (version == null) {
                throw new FormatException(file, formatLine, formatColumn, "/version",
                        "missing \"version\"; expected \"version\": \"1.0\"");
            }
            if (!sawVariables) {
                throw new FormatException(file, rootLine, rootColumn, "/variables", "missing \"variables\"; expected an array of variables");
            }
            if (!sawNodes) {
                throw new FormatException(file, rootLine, rootColumn, "/nodes", "missing \"nodes\"; expected an array of nodes");
            }
            if (!sawOutputs) {
                throw new FormatException(file, rootLine, rootColumn, "/outputs", "missing \"outputs\"; expected an array of outputs");
            }
            boolean newerMinor = DocumentHeader.minor(version) > SUPPORTED_MINOR;
            List<ReadFinding> findings = new ArrayList<>(unknown.size());
            for (ReadFinding f : unknown) {
                findings.add(newerMinor
                        ? new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY_NEWER_MINOR,
                                f.message() + " (ignored: the document is version " + version + ")", f.location())
                        : f);
            }
            numbers.finish();
            return b.nodeTable(table.build()).nodeLocations(nodeLocations.build()).locations(locations.build())
                    .findings(findings).build();
        }

        private void unknown(String ptr, String message) {
            unknown.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY, message,
                    new SourceLocation(ptr, in.line(), in.column())));
        }

        private List<Output> readOutputs(String ptr) throws FormatException {
            in.expect(JsonToken.START_ARRAY, ptr, "an array of outputs");
            List<Output> outs = new ArrayList<>();
            while (in.nextElement()) {
                String p = ptr + "/" + outs.size();
                locations.put(p, in.line(), in.column());
                in.expect(JsonToken.START_OBJECT, p, "an output object {\"name\": ..., \"node\": ...}");
                String name = null;
                Integer node = null;
                String m;
                while ((m = in.nextProperty()) != null) {
                    switch (m) {
                        case "name" -> name = in.readString(p + "/name");
                        case "node" -> node = in.readInt(p + "/node", 0, Integer.MAX_VALUE);
                        default -> {
                            unknown(p + "/" + m, "unknown property \"" + m + "\" in an output");
                            in.skipValue();
                        }
                    }
                }
                SourceLocation at = locations.build().get(p);
                if (name == null || node == null) {
                    throw new FormatException(file, at.line(), at.column(), p,
                            "an output needs \"name\" and \"node\"; missing " + (name == null ? "\"name\"" : "\"node\""));
                }
                outs.add(new Output(name, node));
            }
            return outs;
        }

        private Checks readChecks(String ptr) throws FormatException {
            in.expect(JsonToken.START_OBJECT, ptr, "an object");
            double atol = Checks.DEFAULT_TOLERANCE;
            double rtol = Checks.DEFAULT_TOLERANCE;
            List<CheckCase> cases = new ArrayList<>();
            String m;
            while ((m = in.nextProperty()) != null) {
                String p = ptr + "/" + m;
                switch (m) {
                    case "atol" -> atol = in.readDouble(p);
                    case "rtol" -> rtol = in.readDouble(p);
                    case "cases" -> {
                        in.expect(JsonToken.START_ARRAY, p, "an array of cases");
                        while (in.nextElement()) {
                            cases.add(readCase(p + "/" + cases.size()));
                        }
                    }
                    default -> {
                        unknown(p, "unknown property \"" + m + "\" in checks");
                        in.skipValue();
                    }
                }
            }
            return new Checks(atol, rtol, cases);
        }

        private CheckCase readCase(String p) throws FormatException {
            locations.put(p, in.line(), in.column());
            int line = in.line();
            int col = in.column();
            in.expect(JsonToken.START_OBJECT, p, "a case object");
            String output = null;
            Map<String, Object> values = null;
            Double logDensity = null;
            boolean sawDensity = false;
            String m;
            while ((m = in.nextProperty()) != null) {
                String q = p + "/" + m;
                switch (m) {
                    case "output" -> output = in.readString(q);
                    case "values" -> {
                        in.expect(JsonToken.START_OBJECT, q, "an object of values keyed by variable name");
                        values = new LinkedHashMap<>();
                        String v;
                        while ((v = in.nextProperty()) != null) {
                            String r = q + "/" + v;
                            if (in.token() == JsonToken.VALUE_STRING) {
                                values.put(v, in.readString(r));
                            } else {
                                values.put(v, in.readDouble(r));
                            }
                        }
                    }
                    case "logDensity" -> {
                        sawDensity = true;
                        logDensity = in.token() == JsonToken.VALUE_NULL ? Double.NEGATIVE_INFINITY : in.readDouble(q);
                    }
                    default -> {
                        unknown(q, "unknown property \"" + m + "\" in a check case");
                        in.skipValue();
                    }
                }
            }
            if (!sawDensity) {
                throw new FormatException(file, line, col, p, "a check case needs \"logDensity\" (a number, or null for -inf)");
            }
            return new CheckCase(output, values == null ? Map.of() : values, logDensity);
        }

        private void readNodes(String ptr) throws FormatException {
            in.expect(JsonToken.START_ARRAY, ptr, "an array of nodes");
            int scanned = scanNodes();
            if (scanned < 0) {
                return;
            }
            NodeArrayReader nodes = new NodeArrayReader(in, limits, table, nodeLocations, numbers, unknown);
            nodes.skipCount(scanned);
            long meet = tail == null ? Long.MAX_VALUE : tail.nodeOffset();
            while (in.nextElement()) {
                if (meet != Long.MAX_VALUE && in.byteOffset() >= meet) {
                    meet = Long.MAX_VALUE;
                    if (in.byteOffset() == tail.nodeOffset() && takeTail(nodes.count(), in.line(), in.column())) {
                        return;
                    }
                    closeTail();
                }
                nodes.readNext(ptr);
            }
            closeTail();
        }

        /**
         * Reads what it can of the nodes array with {@link NodeScanner}s straight from the file (a second
         * one on a second thread for the second half of a large file), then leaves {@link #in} where the
         * parser takes over: on the array's end, or before the first node left to it.
         *
         * @return the nodes read, or -1 when the whole array was read (and {@link #in} stands after it)
         */
        private int scanNodes() throws FormatException {
            Path file = in.storedFile();
            long at = in.byteOffset();
            if (at < 0 || limits.maxDepth() < 4) {
                return 0;
            }
            int line = in.line();
            int column = in.column();
            if (file == null) {
                // a stream's length is not known: any stream is scanned, unless this reader never scans
                return scanAtLeast == Long.MAX_VALUE ? 0 : scanStream(at, line, column);
            }
            try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
                long size = ch.size();
                if (!scannable(ch, size, scanAtLeast, limits)) {
                    return 0;
                }
                if (tail != null && tail.nodeOffset() <= at) {
                    // started early, at a node the reader cannot meet: before the nodes array
                    tail.close();
                    tail = null;
                }
                if (size >= splitAtLeast && tail == null) {
                    tail = NodeArrayTail.start(file, size, at, limits);
                }
                if (head != null && head.bracketOffset() != at) {
                    // it guessed another array: dropped unheard
                    head.close();
                    head = null;
                }
                if (head != null) {
                    head.meet(tail == null ? Long.MAX_VALUE : tail.nodeOffset());
                    return takeHead(ch, size, line, column);
                }
                NodeScanner scanner = new NodeScanner(ch, at + 1, line, column + 1, limits, table, nodeLocations, size);
                NodeScanner.End end = scanner.scan(tail == null ? Long.MAX_VALUE : tail.nodeOffset(), true);
                return readOn(ch, size, end, scanner.count(), scanner.offset(), scanner.line(), scanner.column());
            } catch (FormatException e) {
                throw e;
            } catch (IOException e) {
                throw new FormatException(file.toString(), 0, 0, null, "cannot be read: " + IoMessages.of(e));
            }
        }

        /**
         * Takes the nodes the head read from the array's <code>[</code>, at {@code line}, {@code column}, and reads
         * on from where it stopped as from this thread's own scanner ({@link #readOn}).
         *
         * @return as {@link #scanNodes}
         */
        private int takeHead(FileChannel ch, long size, int line, int column) throws IOException, FormatException {
            NodeScanner.End end = head.await();
            int count = head.count();
            long offset = head.offset();
            int atLine = head.stopLine(line);
            int atColumn = head.stopColumn(column);
            table.appendAll(head.table());
            nodeLocations.appendAll(head.locations(), line, column);
            head.take();
            head.close();
            head = null;
            return readOn(ch, size, end, count, offset, atLine, atColumn);
        }

        /**
         * Reads on from where the first half's scan stopped, as {@code end} says, after {@code count} nodes, at
         * {@code offset}, {@code line}, {@code column}: at the tail's node the tail's nodes are taken when the
         * tail holds, else a scanner reads on from that node; then the parser reads on from where the scan stopped.
         *
         * @return as {@link #scanNodes}
         */
        private int readOn(FileChannel ch, long size, NodeScanner.End end, int count, long offset, int line, int column)
                throws IOException, FormatException {
            if (end == NodeScanner.End.MET) {
                if (takeTail(count, line, column)) {
                    return -1;
                }
                closeTail();
                NodeScanner scanner = new NodeScanner(ch, offset, line, column, limits, table, nodeLocations, size);
                scanner.countFrom(count);
                scanner.scan(Long.MAX_VALUE, false);
                resume(scanner.offset(), scanner.line(), scanner.column());
                return scanner.count();
            }
            if (tail != null && offset > tail.nodeOffset()) {
                closeTail();
            }
            resume(offset, line, column);
            return count;
        }

        /**
         * The same for an input read in order (standard input, a gzip file, a stream given by the caller):
         * one {@link NodeScanner} takes the bytes the parser had read past the array's <code>[</code>, then the
         * stream, and a parser reads on from where it stopped ({@link ResumedInput}) with the bytes it had read
         * and not taken. Every byte is read from the stream once, in order (so a stream that is hashed as it is
         * read, as for a certified load, is hashed whole). Inputs the parser reads as characters are left to it.
         */
        private int scanStream(long at, int line, int column) throws FormatException {
            InputStream source = in.source();
            byte[] ahead = source == null ? null : in.releaseBuffered();
            if (ahead == null) {
                return 0;
            }
            NodeScanner scanner = new NodeScanner(source, ahead, at + 1, line, column + 1, limits, table, nodeLocations);
            long size = sizeOfSameFile();
            if (size >= splitAtLeast && size <= limits.maxBytes()) {
                tail = NodeArrayTail.start(sameFile, size, at, limits, true);
            }
            NodeScanner.End end = scanner.scan(tail == null ? Long.MAX_VALUE : tail.nodeOffset(), true);
            if (end == NodeScanner.End.MET) {
                if (takeHashedTail(scanner, source)) {
                    return -1;
                }
                scanner.scan(Long.MAX_VALUE, false);
            }
            closeTail();
            goOn(ResumedInput.open(scanner.rest(), source, scanner.failure(), scanner.offset(), scanner.line(),
                    scanner.column(), membersBefore, limits, file));
            return scanner.count();
        }

        /** The size of {@link #sameFile} when it is a regular file, else -1. */
        private long sizeOfSameFile() {
            try {
                return sameFile != null && Files.isRegularFile(sameFile) ? Files.size(sameFile) : -1;
            } catch (IOException e) {
                return -1;
            }
        }

        /**
         * At the node where a hashed tail started: when the tail holds, passes over the stream's bytes of its
         * nodes (hashing them), checks them against the tail's digest, takes the tail's nodes and goes on after
         * the array with a parser over the rest of the stream. False when the tail does not hold (the scanner
         * reads on by itself).
         */
        private boolean takeHashedTail(NodeScanner scanner, InputStream source) throws FormatException {
            int line = scanner.line();
            int column = scanner.column();
            if (!tail.handOver(line, column, scanner.count(), limits.maxNodes())) {
                return false;
            }
            java.security.MessageDigest passed = CertificateWriter.newSha256();
            boolean same;
            try {
                same = scanner.passTo(tail.endOffset(), passed) && java.security.MessageDigest.isEqual(passed.digest(),
                        tail.digest());
            } catch (FormatException e) {
                throw e;
            } catch (IOException e) {
                throw new FormatException(file, 0, 0, null, "cannot be read: " + IoMessages.of(e));
            }
            if (!same) {
                throw new FormatException(file, 0, 0, null, "changed while it was read: the second half of its nodes"
                        + " differs between two reads of the file; read it again once it is written");
            }
            adoptTail(line, column, ResumedInput.open(scanner.rest(), source, scanner.failure(), tail.endOffset(),
                    tail.endLine(), tail.endColumn(), membersBefore, limits, file));
            return true;
        }

        /** Goes on with a parser that starts at {@code offset} in the nodes array ({@link ResumedInput}). */
        private void resume(long offset, int line, int column) throws IOException {
            goOn(ResumedInput.open(first.storedFile(), offset, line, column, membersBefore, limits, file));
        }

        /** Reads on with {@code next}, closing a resumed input this read opened before (the caller closes the first). */
        private void goOn(JsonInput next) throws FormatException {
            if (in != first) {
                in.close();
            }
            in = next;
        }

        /**
         * Takes a tail that holds: its nodes (from the node met at {@code line}, {@code column}), then reads on
         * with {@code after}, a parser standing on the array's <code>]</code> where the tail ended.
         */
        private void adoptTail(int line, int column, JsonInput after) throws FormatException {
            table.appendAll(tail.table());
            nodeLocations.appendAll(tail.locations(), line, column);
            tailEvents.accept(Boolean.TRUE);
            goOn(after);
            in.nextElement();
            tail.close();
            tail = null;
        }

        /**
         * At the node where the tail started: takes its nodes and goes on after the array when it holds
         * ({@link NodeArrayTail}), else leaves the read as it was.
         */
        private boolean takeTail(int nodesBefore, int line, int column) throws FormatException {
            if (!tail.handOver(line, column, nodesBefore, limits.maxNodes())) {
                return false;
            }
            JsonInput after;
            try {
                after = ResumedInput.open(first.storedFile(), tail.endOffset(), tail.endLine(), tail.endColumn(),
                        membersBefore, limits, file);
            } catch (FormatException e) {
                throw e;
            } catch (IOException e) {
                throw new FormatException(file, 0, 0, null, "cannot be read: " + IoMessages.of(e));
            }
            adoptTail(line, column, after);
            return true;
        }

        /** Drops a tail that does not hold (the read goes on as if there were none). */
        private void closeTail() {
            if (tail != null) {
                tail.close();
                tail = null;
                tailEvents.accept(Boolean.FALSE);
            }
        }

        /** Stops a tail still running; closes a resumed input (the caller closes the first). */
        @Override
        public void close() throws FormatException {
            if (tail != null) {
                tail.close();
                tail = null;
            }
            if (head != null) {
                head.close();
                head = null;
            }
            if (in != first) {
                in.close();
            }
        }
    }
}

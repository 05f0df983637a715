package dev.circa.format.io;

import dev.circa.format.Family;
import dev.circa.format.NodeLocations;
import dev.circa.format.NodeTable;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.util.Arrays;
import java.util.List;
import tools.jackson.core.io.NumberInput;

/**
 * Reads the nodes of a circuit's {@code nodes} array straight from the bytes of the file, for the
 * plain form machine-written files take: ASCII text, the members FORMAT.md lists, numbers
 * and integer ids. It reads a node only when the node is beyond doubt: well-formed JSON, no duplicate
 * or unknown member, exactly the members its kind needs, numbers finite and within the limits. At the
 * first node that is not (anything else: an escape in a string, another character set, a multivariate
 * input, a syntax error, a node too long for the buffer), it stops before that
 * node and says where it is, and the JSON parser reads on from there ({@link ResumedInput}): what is
 * reported about the file, and where, is the parser's. What it reads goes to the table as the parser's
 * reader would put it: same order, same numbers (both decode each number to the nearest double).
 *
 * <p>Lines and columns are counted as the parser counts them (a line feed, a carriage return or both
 * end a line; a column is a byte position in its line, from 1). Not thread-safe; one instance reads one run of nodes.
 */
final class NodeScanner {
    /** How a scan ended. */
    enum End {
        /** At the <code>]</code> that closes the nodes array ({@link #offset()} is its position). */
        ARRAY_END,
        /** At the start of the node at the offset the scan was asked to stop at. */
        MET,
        /** At the start of a node (or the array's end) left to the parser. */
        LEFT
    }

    private static final int MAX_BUFFER = 64 << 20;
    private static final String[] KEYS = {"id", "label", "input", "product", "sum", "weights", "logWeights", "var",
        "p", "probs", "logProbs", "value", "mean", "sd", "mu", "sigma", "rate", "shape", "alpha", "beta", "low", "high",
        "trials"};
    private static final int ID = 0;
    private static final int LABEL = 1;
    private static final int INPUT = 2;
    private static final int PRODUCT = 3;
    private static final int SUM = 4;
    private static final int WEIGHTS = 5;
    private static final int LOG_WEIGHTS = 6;
    private static final int VAR = 7;
    private static final int PROBS = 9;
    private static final int LOG_PROBS = 10;
    /** For each family, its parameters' keys (indices in {@link #KEYS}, in the family's order) and their bits. */
    private static final int[][] FAMILY_KEYS = new int[Family.values().length][];
    private static final long[] FAMILY_PARAMS = new long[Family.values().length];

    static {
        for (Family f : Family.values()) {
            int[] keys = new int[f.parameters().size()];
            long bits = 0;
            for (int k = 0; k < keys.length; k++) {
                keys[k] = List.of(KEYS).indexOf(f.parameters().get(k));
                bits |= 1L << keys[k];
            }
            FAMILY_KEYS[f.ordinal()] = keys;
            FAMILY_PARAMS[f.ordinal()] = bits;
        }
    }

    /** The file read at positions, or {@code null} when the bytes come from {@link #stream} in order. */
    private final FileChannel channel;
    /** The input read in order (its bytes the parser had read ahead first, from {@link #ahead}), or {@code null}. */
    private final InputStream stream;
    private byte[] ahead;
    private int aheadPos;
    /** The stream's failure, kept so that the parser meets it again where it reads on ({@link #rest()}). */
    private IOException failure;
    private final ReadLimits limits;
    /** When set, every byte the scan takes, in order ({@link #hashTaken}). */
    private java.security.MessageDigest taken;
    private final NodeTable.Builder table;
    private final NodeLocations.Recorder locations;
    private byte[] buf;
    /** File offset of {@code buf[0]}. */
    private long bufStart;
    private int pos;
    private int lim;
    /** Where the node being read starts in {@code buf}: kept when the buffer is refilled. */
    private int mark;
    /** The line of the mark, and the file offset where that line starts. */
    private int markLine;
    private long markLineStart;
    private boolean eof;
    private int line;
    /** File offset of the first byte of the current line. */
    private long lineStart;
    private int count;
    private volatile boolean stopped;
    /** The end: where it is, its line and column. */
    private long endOffset;
    private int endLine;
    private int endColumn;

    // the node being read
    private final double[] scalars = new double[KEYS.length];
    private int[] children = new int[64];
    private int childCount;
    private double[] numbers = new double[64];
    private int numberCount;
    private char[] chars = new char[64];
    private int intValue;
    private double doubleValue;
    private String stringValue;

    /**
     * @param offset the file offset to read from: just after the nodes array's <code>[</code>, or a node's
     *     <code>{</code>
     * @param line the line of that offset
     * @param column its column
     */
    NodeScanner(FileChannel channel, long offset, int line, int column, ReadLimits limits, NodeTable.Builder table,
            NodeLocations.Recorder locations, long fileSize) {
        this(channel, null, null, offset, line, column, limits, table, locations,
                (int) Math.max(64, Math.min(1 << 20, fileSize - offset + 1)));
    }

    /**
     * A scanner of an input read in order: {@code ahead} (what the parser had read past the array's
     * <code>[</code>), then {@code stream}; {@code offset} is the input's byte offset of {@code ahead}'s first byte.
     */
    NodeScanner(InputStream stream, byte[] ahead, long offset, int line, int column, ReadLimits limits,
            NodeTable.Builder table, NodeLocations.Recorder locations) {
        this(null, stream, ahead, offset, line, column, limits, table, locations, STREAM_BUFFER);
    }

    private NodeScanner(FileChannel channel, InputStream stream, byte[] ahead, long offset, int line, int column,
            ReadLimits limits, NodeTable.Builder table, NodeLocations.Recorder locations, int buffer) {
        this.channel = channel;
        this.stream = stream;
        this.ahead = ahead;
        this.limits = limits;
        this.table = table;
        this.locations = locations;
        this.buf = new byte[buffer];
        this.bufStart = offset;
        this.line = line;
        this.lineStart = offset - (column - 1);
    }

    /** The first buffer of a scanner of a stream (it grows when a node needs more). */
    private static final int STREAM_BUFFER = 1 << 16;

    /**
     * After a scan of a stream: the bytes read from it and not taken, from the end of the scan on (the
     * parser reads them, then the rest of the stream).
     */
    byte[] rest() {
        int from = (int) (endOffset - bufStart);
        int left = ahead == null ? 0 : ahead.length - aheadPos;
        byte[] r = Arrays.copyOfRange(buf, from, lim + left);
        if (left > 0) {
            System.arraycopy(ahead, aheadPos, r, lim - from, left);
        }
        return r;
    }

    /** Makes the scan feed {@code d} every byte it takes, from its start to where it ends ({@link #takenDigest()}). */
    void hashTaken(java.security.MessageDigest d) {
        taken = d;
    }

    /** After a scan: the digest of the bytes from its start to its end (exclusive), or null without {@link #hashTaken}. */
    byte[] takenDigest() {
        if (taken == null) {
            return null;
        }
        taken.update(buf, 0, (int) (endOffset - bufStart));
        return taken.digest();
    }

    /**
     * Passes over the input from where the scan stopped to {@code target} (a later byte offset) without
     * reading nodes, feeding the bytes to {@code d}; the scan then stands at {@code target} (its line and
     * column are the caller's to know). False when the input ends first.
     */
    boolean passTo(long target, java.security.MessageDigest d) throws IOException {
        pos = (int) (endOffset - bufStart);
        while (bufStart + lim < target) {
            d.update(buf, pos, lim - pos);
            pos = lim;
            mark = lim;
            if (!fill()) {
                return false;
            }
        }
        int to = (int) (target - bufStart);
        d.update(buf, pos, to - pos);
        pos = to;
        mark = to;
        endOffset = target;
        return true;
    }

    /** The stream's failure that ended the scan, or {@code null}. */
    IOException failure() {
        return failure;
    }

    /** Whether the file starts as UTF-8 JSON text would without a byte order mark (no zero, nothing past ASCII). */
    static boolean startsAsUtf8(FileChannel ch) throws IOException {
        ByteBuffer b = ByteBuffer.allocate(4);
        ch.read(b, 0);
        for (int i = 0; i < b.position(); i++) {
            int c = b.get(i) & 0xff;
            if (c == 0 || c >= 0x80) {
                return false;
            }
        }
        return true;
    }

    /** The nodes read so far. */
    int count() {
        return count;
    }

    /** The file offset where the last scan ended. */
    long offset() {
        return endOffset;
    }

    /** The line where the last scan ended. */
    int line() {
        return endLine;
    }

    /** The column where the last scan ended. */
    int column() {
        return endColumn;
    }

    /**
     * Reads nodes until the array ends, a node starts at file offset {@code meet}, or a node is left to
     * the parser. May be called again after {@link End#MET} to go on.
     *
     * @param first whether no element of the array has been read yet (the scan starts after its <code>[</code>)
     */
    End scan(long meet, boolean first) {
        meetAt = meet;
        return scan(first);
    }

    /** The same, stopping at the node last given to {@link #meet} (set before the scan starts; moved while it runs). */
    End scan(boolean first) {
        try {
            return scanNodes(first);
        } catch (IOException e) {
            // the parser reads on from the node being read, and reports the failure where it meets it
            return back();
        }
    }

    /** Makes a scan in progress (on another thread) stop at its next node. */
    void stop() {
        stopped = true;
    }

    /** The offset of the node a scan stops at ({@link End#MET}); another thread may move it ({@link #meet}). */
    private volatile long meetAt = Long.MAX_VALUE;

    /**
     * Makes a scan in progress (on another thread) stop at the node that starts at {@code offset} instead;
     * a scan already past it reads on to the end of what it can read.
     */
    void meet(long offset) {
        meetAt = offset;
    }

    /** Counts the nodes of this scan on from {@code nodesBefore} (read by others before it), for the node limit. */
    void countFrom(int nodesBefore) {
        count = nodesBefore;
    }

    private End scanNodes(boolean first) throws IOException {
        boolean atStart = first;
        while (true) {
            setMark();
            if (stopped) {
                return stop(End.LEFT);
            }
            if (lim - pos < buf.length >> 2) {
                // a quarter of the buffer ahead of every node: the node's own loops then almost never refill,
                // so the compiled code that first sees them never meets a refill it has not seen (which would
                // send it back to the interpreter to be compiled again, on each thread)
                fill();
            }
            if (!skipSpace()) {
                // the parser reads on from where this scan stood (and finds what ends the input there)
                return back();
            }
            setMark();
            if (atStart && buf[pos] == ']') {
                return stop(End.ARRAY_END);
            }
            atStart = false;
            long at = bufStart + pos;
            if (at == meetAt) {
                return stop(End.MET);
            }
            if (buf[pos] != '{' || count >= limits.maxNodes()) {
                return stop(End.LEFT);
            }
            int nodeLine = line;
            int nodeColumn = (int) (at - lineStart + 1);
            int kind = node();
            // a node counts only when what follows it is a comma and the next node, or the end of the array
            boolean more = false;
            boolean fine = kind >= 0 && skipSpace();
            if (fine) {
                if (buf[pos] == ',') {
                    pos++;
                    fine = skipSpace() && buf[pos] == '{';
                    more = true;
                } else {
                    fine = buf[pos] == ']';
                }
            }
            if (!fine) {
                return back();
            }
            commit(kind);
            locations.add(nodeLine, nodeColumn);
            count++;
            if (!more) {
                setMark();
                return stop(End.ARRAY_END);
            }
        }
    }

    /** Remembers the current position, and its line, as where a node (or the array's end) starts. */
    private void setMark() {
        mark = pos;
        markLine = line;
        markLineStart = lineStart;
    }

    /** Goes back to the mark and leaves what follows to the parser. */
    private End back() {
        pos = mark;
        line = markLine;
        lineStart = markLineStart;
        return stop(End.LEFT);
    }

    private End stop(End end) {
        endOffset = bufStart + mark;
        endLine = line;
        endColumn = (int) (endOffset - lineStart + 1);
        return end;
    }

    // -------- one node

    private static final int KIND_INPUT = 0;
    private static final int KIND_PRODUCT = 1;
    private static final int KIND_SUM = 2;

    private long seen;
    private int id;
    private String label;
    private Family family;
    private int var;

    /** Reads the node at {@code pos} (a <code>{</code>); its kind, or -1 when it is left to the parser. */
    private int node() throws IOException {
        pos++;
        seen = 0;
        label = null;
        family = null;
        childCount = 0;
        numberCount = 0;
        if (!skipSpace() || buf[pos] != '"') {
            return -1;
        }
        while (true) {
            int key = key();
            if (key < 0 || (seen & (1L << key)) != 0) {
                return -1;
            }
            seen |= 1L << key;
            if (!skipSpace() || buf[pos] != ':') {
                return -1;
            }
            pos++;
            if (!skipSpace() || !value(key)) {
                return -1;
            }
            if (!skipSpace()) {
                return -1;
            }
            byte c = buf[pos++];
            if (c == '}') {
                break;
            }
            if (c != ',' || !skipSpace() || buf[pos] != '"') {
                return -1;
            }
        }
        return kindOf();
    }

    /** The kind of the node read when it has exactly the members that kind needs, else -1. */
    private int kindOf() {
        if ((seen & (1L << ID)) == 0) {
            return -1;
        }
        long kinds = seen & ((1L << INPUT) | (1L << PRODUCT) | (1L << SUM));
        long rest = seen & ~((1L << ID) | (1L << LABEL) | kinds);
        if (kinds == 1L << PRODUCT) {
            return rest == 0 ? KIND_PRODUCT : -1;
        }
        if (kinds == 1L << SUM) {
            return rest == (1L << WEIGHTS) || rest == (1L << LOG_WEIGHTS) ? KIND_SUM : -1;
        }
        if (kinds != 1L << INPUT || family == null || family == Family.MVNORMAL || (rest & (1L << VAR)) == 0) {
            return -1;
        }
        long params = rest & ~(1L << VAR);
        if (family == Family.CATEGORICAL) {
            return params == (1L << PROBS) || params == (1L << LOG_PROBS) ? KIND_INPUT : -1;
        }
        // scalar parameters only (an array where a number belongs was refused when read)
        return params == FAMILY_PARAMS[family.ordinal()] ? KIND_INPUT : -1;
    }

    private void commit(int kind) {
        for (int k = 0; k < childCount; k++) {
            table.appendChild(children[k]);
        }
        if (kind == KIND_PRODUCT) {
            table.close(NodeTable.PRODUCT, id, label, null, false);
            return;
        }
        if (kind == KIND_SUM) {
            for (int k = 0; k < numberCount; k++) {
                table.appendValue(numbers[k]);
            }
            table.close(NodeTable.SUM, id, label, null, (seen & (1L << LOG_WEIGHTS)) != 0);
            return;
        }
        table.appendVar(var);
        if (family == Family.CATEGORICAL) {
            for (int k = 0; k < numberCount; k++) {
                table.appendValue(numbers[k]);
            }
            table.close(NodeTable.INPUT, id, label, family, (seen & (1L << LOG_PROBS)) != 0);
            return;
        }
        for (int key : FAMILY_KEYS[family.ordinal()]) {
            table.appendValue(scalars[key]);
        }
        table.close(NodeTable.INPUT, id, label, family, false);
    }

    /** Reads the value of member {@code key}; false when the node is left to the parser. */
    private boolean value(int key) throws IOException {
        switch (key) {
            case ID -> {
                if (!uint()) {
                    return false;
                }
                id = intValue;
                return true;
            }
            case VAR -> {
                if (!uint()) {
                    return false;
                }
                var = intValue;
                return true;
            }
            case LABEL -> {
                if (!string()) {
                    return false;
                }
                label = stringValue;
                return true;
            }
            case INPUT -> {
                if (!string()) {
                    return false;
                }
                family = Family.fromJsonName(stringValue);
                return family != null;
            }
            case PRODUCT, SUM -> {
                return array(true);
            }
            case WEIGHTS, LOG_WEIGHTS, PROBS, LOG_PROBS -> {
                return array(false);
            }
            default -> {
                if (!number()) {
                    return false;
                }
                scalars[key] = doubleValue;
                return true;
            }
        }
    }

    /** An array of node ids into {@code children}, or of numbers into {@code numbers}. */
    private boolean array(boolean ids) throws IOException {
        if (buf[pos] != '[') {
            return false;
        }
        pos++;
        if (!skipSpace()) {
            return false;
        }
        if (buf[pos] == ']') {
            pos++;
            return true;
        }
        while (true) {
            if (ids ? !id() : !numberToList()) {
                return false;
            }
            if (!skipSpace()) {
                return false;
            }
            byte c = buf[pos++];
            if (c == ']') {
                return true;
            }
            if (c != ',' || !skipSpace()) {
                return false;
            }
        }
    }

    /** A node id appended to {@code children}. */
    private boolean id() throws IOException {
        if (!uint()) {
            return false;
        }
        if (childCount == children.length) {
            children = Arrays.copyOf(children, childCount * 2);
        }
        children[childCount++] = intValue;
        return true;
    }

    /** A number appended to {@code numbers}. */
    private boolean numberToList() throws IOException {
        if (!number()) {
            return false;
        }
        if (numberCount == numbers.length) {
            numbers = Arrays.copyOf(numbers, numberCount * 2);
        }
        numbers[numberCount++] = doubleValue;
        return true;
    }

    // -------- tokens

    /** Skips spaces, tabs and line feeds; false at the end of the input or when the buffer cannot hold the node. */
    private boolean skipSpace() throws IOException {
        while (true) {
            if (pos == lim && !fill()) {
                return false;
            }
            byte c = buf[pos];
            if (c == ' ' || c == '\t') {
                pos++;
            } else if (c == '\n' || c == '\r') {
                // a line ends at a line feed, a carriage return, or both together, as the parser counts lines
                pos++;
                if (c == '\r' && (pos < lim || fill()) && buf[pos] == '\n') {
                    pos++;
                }
                line++;
                lineStart = bufStart + pos;
            } else {
                return true;
            }
        }
    }

    /** A member name at {@code pos} (a quote): its index in {@link #KEYS}, or -1. */
    private int key() throws IOException {
        int end = stringEnd(pos + 1);
        if (end < 0) {
            return -1;
        }
        // pos still stands on the opening quote (moved with the buffer)
        int start = pos + 1;
        pos = end + 1;
        int len = end - start;
        for (int k = 0; k < KEYS.length; k++) {
            String name = KEYS[k];
            if (name.length() == len && same(name, start)) {
                return k;
            }
        }
        return -1;
    }

    private boolean same(String name, int at) {
        for (int i = 0; i < name.length(); i++) {
            if (buf[at + i] != name.charAt(i)) {
                return false;
            }
        }
        return true;
    }

    /**
     * The position of the quote that ends the string whose text starts at {@code start}, or -1 (not plain
     * ASCII, or no end). The buffer may move while it looks: the caller takes positions from the result.
     */
    private int stringEnd(int start) throws IOException {
        int i = start;
        while (true) {
            if (i == lim) {
                long base = bufStart;
                if (!fill()) {
                    return -1;
                }
                i -= (int) (bufStart - base);
            }
            byte c = buf[i];
            if (c == '"') {
                return i;
            }
            if (c < 0x20 || c == '\\' || c >= 0x7f) {
                return -1;
            }
            i++;
        }
    }

    /** A string value at {@code pos}: {@link #stringValue}; false when not plain ASCII or longer than the limit. */
    private boolean string() throws IOException {
        if (buf[pos] != '"') {
            return false;
        }
        int end = stringEnd(pos + 1);
        int start = pos + 1;
        if (end < 0 || end - start > limits.maxString()) {
            return false;
        }
        stringValue = new String(buf, start, end - start, java.nio.charset.StandardCharsets.US_ASCII);
        pos = end + 1;
        return true;
    }

    /** A non-negative integer id (JSON integer syntax, at most the int maximum): {@link #intValue}. */
    private boolean uint() throws IOException {
        ensure(12);
        int start = pos;
        int i = start;
        long v = 0;
        while (i < lim && i - start <= 10) {
            byte c = buf[i];
            if (c < '0' || c > '9') {
                break;
            }
            v = v * 10 + (c - '0');
            i++;
        }
        int len = i - start;
        if (len == 0 || len > 10 || (len > 1 && buf[start] == '0') || v > Integer.MAX_VALUE || i == lim
                || !delimiter(buf[i])) {
            return false;
        }
        intValue = (int) v;
        pos = i;
        return true;
    }

    /** A finite number (JSON number syntax, within the length limit): {@link #doubleValue}. */
    private boolean number() throws IOException {
        ensure(limits.maxNumber() + 2);
        // JSON syntax, -?(0|[1-9][0-9]*)(.[0-9]+)?([eE][+-]?[0-9]+)?, checked while the end is found
        int start = pos;
        int i = start;
        boolean negative = i < lim && buf[i] == '-';
        if (negative) {
            i++;
        }
        int intStart = i;
        // the digits as a significand w (leading zeros left out; those after the 18th only counted) and a power of ten
        long w = 0;
        int significant = 0;
        while (i < lim && buf[i] >= '0' && buf[i] <= '9') {
            w = w * 10 + (buf[i] - '0');
            if (w != 0) {
                significant++;
            }
            i++;
        }
        int intDigits = i - intStart;
        if (intDigits == 0 || (intDigits > 1 && buf[intStart] == '0')) {
            return false;
        }
        boolean integer = true;
        int q = 0;
        if (i < lim && buf[i] == '.') {
            integer = false;
            int f = ++i;
            while (i < lim && buf[i] >= '0' && buf[i] <= '9') {
                w = w * 10 + (buf[i] - '0');
                if (w != 0) {
                    significant++;
                }
                i++;
            }
            if (i == f) {
                return false;
            }
            q = f - i;
        }
        if (i < lim && (buf[i] == 'e' || buf[i] == 'E')) {
            integer = false;
            i++;
            boolean minus = false;
            if (i < lim && (buf[i] == '+' || buf[i] == '-')) {
                minus = buf[i] == '-';
                i++;
            }
            int e = i;
            int power = 0;
            while (i < lim && buf[i] >= '0' && buf[i] <= '9') {
                // beyond any double's range either way: kept bounded, decoded the general way
                power = Math.min(power * 10 + (buf[i] - '0'), 100_000);
                i++;
            }
            if (i == e) {
                return false;
            }
            q += minus ? -power : power;
        }
        int len = i - start;
        if (i == lim || !delimiter(buf[i]) || len > limits.maxNumber()) {
            return false;
        }
        double v;
        if (integer) {
            // an integer is made a double as the parser makes it: from its integer value (so -0 is 0)
            if (intDigits > 18) {
                return false;
            }
            v = negative ? -w : w;
        } else {
            // most decimals (up to 18 significant digits, powers of ten within 27) without a string
            v = significant <= 18 ? DecimalToDouble.toDouble(negative, w, q) : Double.NaN;
            if (Double.isNaN(v)) {
                if (chars.length < len) {
                    chars = new char[Math.max(len, chars.length * 2)];
                }
                for (int k = 0; k < len; k++) {
                    chars[k] = (char) buf[start + k];
                }
                v = NumberInput.parseDouble(chars, 0, len, true);
            }
            if (!Double.isFinite(v)) {
                return false;
            }
        }
        doubleValue = v;
        pos = i;
        return true;
    }

    /** Reads from {@link #ahead}, then from {@link #stream}; keeps the stream's failure. */
    private int readStream(byte[] b, int off, int len) throws IOException {
        if (ahead != null && aheadPos < ahead.length) {
            int n = Math.min(len, ahead.length - aheadPos);
            System.arraycopy(ahead, aheadPos, b, off, n);
            aheadPos += n;
            return n;
        }
        if (failure != null) {
            throw failure;
        }
        try {
            int n;
            do {
                n = stream.read(b, off, len);
            } while (n == 0);
            return n;
        } catch (IOException e) {
            failure = e;
            throw e;
        }
    }

    /** Whether {@code c} may follow a number: white space, a comma, a bracket or a brace. */
    private static boolean delimiter(byte c) {
        return c == ',' || c == ']' || c == '}' || c == ' ' || c == '\n' || c == '\t' || c == '\r';
    }

    /** Makes at least {@code n} bytes from {@link #pos} available, as far as the file has them. */
    private void ensure(int n) throws IOException {
        while (lim - pos < n && fill()) {
            // reads on
        }
    }

    /**
     * Reads more of the file into the buffer, keeping the node being read (from {@link #mark}); grows the
     * buffer when the node fills it. False at the end of the file or when a node would need more than
     * {@link #MAX_BUFFER} bytes.
     */
    private boolean fill() throws IOException {
        if (eof) {
            return false;
        }
        if (mark > 0) {
            if (taken != null) {
                taken.update(buf, 0, mark);
            }
            System.arraycopy(buf, mark, buf, 0, lim - mark);
            bufStart += mark;
            pos -= mark;
            lim -= mark;
            mark = 0;
        }
        if (lim == buf.length) {
            if (buf.length >= MAX_BUFFER) {
                return false;
            }
            buf = Arrays.copyOf(buf, Math.min(MAX_BUFFER, buf.length * 2));
        }
        int n = channel != null ? channel.read(ByteBuffer.wrap(buf, lim, buf.length - lim), bufStart + lim)
                : readStream(buf, lim, buf.length - lim);
        if (n <= 0) {
            eof = true;
            return false;
        }
        lim += n;
        return true;
    }
}

package dev.circa.format.io;

import dev.circa.format.CheckCase;
import dev.circa.format.Checks;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Counts;
import dev.circa.format.Family;
import dev.circa.format.NodeTable;
import dev.circa.format.Output;
import dev.circa.format.Variable;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import tools.jackson.core.JacksonException;
import tools.jackson.core.JsonGenerator;
import tools.jackson.databind.ObjectMapper;

/**
 * Writes a circuit document in the canonical member order of FORMAT.md (format, version, name,
 * description, provenance, variables, nodes, outputs, checks, extensions), nodes in the order
 * given (children first when the document is valid), one node per line. Every double is written
 * so that it reads back bit for bit (the shortest decimal that does: {@link JsonInput#mapperFor}). Stateless and
 * thread-safe.
 */
public final class CircuitWriter {
    private static final ObjectMapper MAPPER = JsonInput.mapperFor(ReadLimits.DEFAULT);

    /** Writes {@code doc} to {@code target} whole or not at all ({@code .gz} compressed, {@code -} standard output). */
    public void write(CircuitDocument doc, Path target, Path... inputs) throws IOException {
        AtomicOutput.write(target, out -> write(doc, out), inputs);
    }

    /** Writes {@code doc} to {@code out} (not closed). */
    public void write(CircuitDocument doc, OutputStream out) throws IOException {
        try (JsonGenerator g = MAPPER.createGenerator(new NonClosingOutputStream(out))) {
            g.writeStartObject();
            g.writeRaw("\n");
            g.writeName("format");
            g.writeString(CircuitDocument.FORMAT);
            g.writeName("version");
            g.writeString(doc.version() == null ? "1.0" : doc.version());
            if (doc.name() != null) {
                g.writeName("name");
                g.writeString(doc.name());
            }
            if (doc.description() != null) {
                g.writeName("description");
                g.writeString(doc.description());
            }
            if (doc.provenance() != null) {
                DocumentHeader.writeProvenance(g, doc.provenance());
            }
            writeVariables(g, doc.variables());
            g.writeRaw("\n");
            g.writeName("nodes");
            g.writeStartArray();
            NodeTable t = doc.nodeTable();
            for (int i = 0; i < t.size(); i++) {
                g.writeRaw("\n");
                writeNode(g, t, i);
            }
            g.writeRaw("\n");
            g.writeEndArray();
            g.writeRaw("\n");
            g.writeName("outputs");
            g.writeStartArray();
            for (Output o : doc.outputs()) {
                g.writeStartObject();
                g.writeName("name");
                g.writeString(o.name());
                g.writeName("node");
                g.writeNumber(o.node());
                g.writeEndObject();
            }
            g.writeEndArray();
            if (doc.checks() != null) {
                writeChecks(g, doc.checks());
            }
            if (doc.extensions() != null) {
                g.writeRaw("\n");
                g.writeName("extensions");
                g.writeTree(doc.extensions());
            }
            g.writeRaw("\n");
            g.writeEndObject();
            g.writeRaw("\n");
        } catch (JacksonException e) {
            Throwable c = e.getCause();
            if (c instanceof IOException io) {
                throw io;
            }
            throw new IOException(e.getMessage(), e);
        }
    }

    /** Writes a {@code variables} member (shared with the other document writers). */
    public static void writeVariables(JsonGenerator g, List<Variable> variables) {
        g.writeRaw("\n");
        g.writeName("variables");
        g.writeStartArray();
        for (Variable v : variables) {
            g.writeRaw("\n  ");
            g.writeStartObject();
            g.writeName("name");
            g.writeString(v.name());
            g.writeName("type");
            g.writeString(v.type().jsonName());
            if (!v.states().isEmpty()) {
                g.writeName("states");
                g.writeStartArray();
                for (String s : v.states()) {
                    g.writeString(s);
                }
                g.writeEndArray();
            }
            if (v.unit() != null) {
                g.writeName("unit");
                g.writeString(v.unit());
            }
            if (v.description() != null) {
                g.writeName("description");
                g.writeString(v.description());
            }
            g.writeEndObject();
        }
        g.writeRaw("\n");
        g.writeEndArray();
    }

    /** Node {@code i} of {@code t}, read from the columns (no record made). */
    private static void writeNode(JsonGenerator g, NodeTable t, int i) {
        g.writeStartObject();
        g.writeName("id");
        g.writeNumber(t.id(i));
        String label = t.label(i);
        if (label != null) {
            g.writeName("label");
            g.writeString(label);
        }
        byte kind = t.kind(i);
        if (kind == NodeTable.INPUT) {
            writeInput(g, t, i);
        } else {
            g.writeName(kind == NodeTable.PRODUCT ? "product" : "sum");
            g.writeStartArray();
            for (int e = t.childStart(i); e < t.childEnd(i); e++) {
                g.writeNumber(t.childId(e));
            }
            g.writeEndArray();
            if (kind == NodeTable.SUM) {
                g.writeName(t.logForm(i) ? "logWeights" : "weights");
                writeNumbers(g, t, t.valueStart(i), t.valueEnd(i));
            }
        }
        g.writeEndObject();
    }

    private static void writeInput(JsonGenerator g, NodeTable t, int i) {
        Family f = t.family(i);
        g.writeName("input");
        g.writeString(f.jsonName());
        int p = t.valueStart(i);
        int d = t.varEnd(i) - t.varStart(i);
        int need = f == Family.MVNORMAL ? d + d * d : f == Family.CATEGORICAL ? 0 : f.parameters().size();
        if (d < 1 || t.valueEnd(i) - p < need) {
            throw new IllegalArgumentException("input node " + t.id(i) + " (" + f.jsonName() + ") has "
                    + Counts.of(d, "variable") + " and " + Counts.of(t.valueEnd(i) - p, "parameter") + ": too few to write");
        }
        if (f == Family.MVNORMAL) {
            g.writeName("vars");
            g.writeStartArray();
            for (int k = t.varStart(i); k < t.varEnd(i); k++) {
                g.writeNumber(t.var(k));
            }
            g.writeEndArray();
            g.writeName("mean");
            writeNumbers(g, t, p, p + d);
            g.writeName("cov");
            g.writeStartArray();
            for (int r = 0; r < d; r++) {
                writeNumbers(g, t, p + d + r * d, p + d + (r + 1) * d);
            }
            g.writeEndArray();
            return;
        }
        g.writeName("var");
        g.writeNumber(t.var(t.varStart(i)));
        if (f == Family.CATEGORICAL) {
            g.writeName(t.logForm(i) ? "logProbs" : "probs");
            writeNumbers(g, t, p, t.valueEnd(i));
            return;
        }
        List<String> names = f.parameters();
        for (int k = 0; k < names.size(); k++) {
            g.writeName(names.get(k));
            writeNumber(g, t.value(p + k), f == Family.BINOMIAL && k == 0 || f == Family.INDICATOR);
        }
    }

    private static void writeNumber(JsonGenerator g, double v, boolean integral) {
        // -0.0 is integral too, but written as an integer it would read back as +0.0.
        if (integral && v == Math.rint(v) && Math.abs(v) < 9.007199254740992E15
                && Double.doubleToRawLongBits(v) != Double.doubleToRawLongBits(-0.0)) {
            g.writeNumber((long) v);
        } else {
            g.writeNumber(v);
        }
    }

    private static void writeChecks(JsonGenerator g, Checks c) {
        g.writeRaw("\n");
        g.writeName("checks");
        g.writeStartObject();
        g.writeName("atol");
        g.writeNumber(c.atol());
        g.writeName("rtol");
        g.writeNumber(c.rtol());
        g.writeName("cases");
        g.writeStartArray();
        for (CheckCase cc : c.cases()) {
            g.writeRaw("\n  ");
            g.writeStartObject();
            if (cc.output() != null) {
                g.writeName("output");
                g.writeString(cc.output());
            }
            g.writeName("values");
            g.writeStartObject();
            for (Map.Entry<String, Object> e : cc.values().entrySet()) {
                g.writeName(e.getKey());
                if (e.getValue() instanceof Number num) {
                    g.writeNumber(num.doubleValue());
                } else {
                    g.writeString(String.valueOf(e.getValue()));
                }
            }
            g.writeEndObject();
            g.writeName("logDensity");
            if (cc.logDensity() == Double.NEGATIVE_INFINITY) {
                g.writeNull();
            } else {
                g.writeNumber(cc.logDensity());
            }
            g.writeEndObject();
        }
        g.writeEndArray();
        g.writeEndObject();
    }

    /** Numbers {@code from} to {@code to} (exclusive) of {@code t}, as an array. */
    private static void writeNumbers(JsonGenerator g, NodeTable t, int from, int to) {
        g.writeStartArray();
        for (int k = from; k < to; k++) {
            g.writeNumber(t.value(k));
        }
        g.writeEndArray();
    }
}

package dev.circa.format.regions;

import dev.circa.format.io.AtomicOutput;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.DocumentHeader;
import dev.circa.format.io.NonClosingOutputStream;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Path;
import tools.jackson.core.JacksonException;
import tools.jackson.core.JsonGenerator;
import tools.jackson.databind.ObjectMapper;

/**
 * Writes a region graph document in the canonical member order of FORMAT.md (format, version,
 * name, description, provenance, variables, regions, partitions, extensions), one region or
 * partition per line. Stateless and thread-safe.
 */
public final class RegionGraphWriter {
    private static final ObjectMapper MAPPER = JsonInput.mapperFor(ReadLimits.DEFAULT);

    /** Writes {@code graph} to {@code target} whole or not at all ({@code .gz} compressed, {@code -} standard output). */
    public void write(RegionGraph graph, Path target, Path... inputs) throws IOException {
        AtomicOutput.write(target, out -> write(graph, out), inputs);
    }

    /** Writes {@code graph} to {@code out} (not closed). */
    public void write(RegionGraph graph, OutputStream out) throws IOException {
        try (JsonGenerator g = MAPPER.createGenerator(new NonClosingOutputStream(out))) {
            g.writeStartObject();
            g.writeRaw("\n");
            g.writeName("format");
            g.writeString(RegionGraph.FORMAT);
            g.writeName("version");
            g.writeString(graph.version() == null ? "1.0" : graph.version());
            if (graph.name() != null) {
                g.writeName("name");
                g.writeString(graph.name());
            }
            if (graph.description() != null) {
                g.writeName("description");
                g.writeString(graph.description());
            }
            if (graph.provenance() != null) {
                DocumentHeader.writeProvenance(g, graph.provenance());
            }
            CircuitWriter.writeVariables(g, graph.variables());
            g.writeRaw("\n");
            g.writeName("regions");
            g.writeStartArray();
            for (Region r : graph.regions()) {
                g.writeRaw("\n  ");
                g.writeStartObject();
                g.writeName("id");
                g.writeNumber(r.id());
                g.writeName("vars");
                writeInts(g, r.vars());
                g.writeEndObject();
            }
            g.writeRaw("\n");
            g.writeEndArray();
            g.writeRaw("\n");
            g.writeName("partitions");
            g.writeStartArray();
            for (Partition p : graph.partitions()) {
                g.writeRaw("\n  ");
                g.writeStartObject();
                g.writeName("region");
                g.writeNumber(p.region());
                g.writeName("parts");
                writeInts(g, p.parts());
                g.writeEndObject();
            }
            g.writeRaw("\n");
            g.writeEndArray();
            if (graph.extensions() != null) {
                g.writeRaw("\n");
                g.writeName("extensions");
                g.writeTree(graph.extensions());
            }
            g.writeRaw("\n");
            g.writeEndObject();
            g.writeRaw("\n");
        } catch (JacksonException e) {
            if (e.getCause() instanceof IOException io) {
                throw io;
            }
            throw new IOException(e.getMessage(), e);
        }
    }

    private static void writeInts(JsonGenerator g, int[] a) {
        g.writeStartArray();
        for (int v : a) {
            g.writeNumber(v);
        }
        g.writeEndArray();
    }
}

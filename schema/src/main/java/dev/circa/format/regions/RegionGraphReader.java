package dev.circa.format.regions;

import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import dev.circa.format.Variable;
import dev.circa.format.io.DocumentHeader;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.JsonDocumentReader;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.io.VariableListReader;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import tools.jackson.core.JsonToken;

/**
 * Reads a region graph document (FORMAT.md section 3) in one streaming pass, members in any order.
 *
 * <p>Shape is checked while reading (JSON syntax, member types, required members, {@code format}
 * and major {@code version}, duplicate keys, {@link ReadLimits}); any problem ends the read with a
 * located {@link FormatException}. An unknown property outside {@code extensions} is an error in
 * a version-1.0 document and is ignored (kept as a {@link ReadFinding}) in a newer minor version.
 * Whether the graph is a valid region graph (root, coverage, cycles) is not judged here.
 *
 * <p>Instances hold only their limits and are safe to share between threads.
 */
public final class RegionGraphReader extends JsonDocumentReader<RegionGraph> {
    /** The newest minor version of format 1 this reader knows. */
    public static final int SUPPORTED_MINOR = 0;

    public RegionGraphReader() {
        this(ReadLimits.DEFAULT);
    }

    public RegionGraphReader(ReadLimits limits) {
        super(limits);
    }

    @Override
    protected RegionGraph read(JsonInput in) throws FormatException {
        return new Pass(in).run();
    }

    /** The state of one read. */
    private static final class Pass {
        private final JsonInput in;
        private final List<ReadFinding> unknown = new ArrayList<>();
        private final List<Region> regions = new ArrayList<>();
        private final List<Partition> partitions = new ArrayList<>();
        private int[] regionLines = new int[16];
        private int[] regionColumns = new int[16];
        private int[] partitionLines = new int[16];
        private int[] partitionColumns = new int[16];

        Pass(JsonInput in) {
            this.in = in;
        }

        RegionGraph run() throws FormatException {
            in.startDocument("a region graph document");
            int rootLine = in.line();
            int rootColumn = in.column();
            RegionGraph.Builder b = RegionGraph.builder().source(in.file());
            String format = null;
            String version = null;
            boolean sawVariables = false;
            boolean sawRegions = false;
            boolean sawPartitions = false;
            String member;
            while ((member = in.nextProperty()) != null) {
                String ptr = "/" + member;
                switch (member) {
                    case "format" -> {
                        format = in.readString(ptr);
                        if (!RegionGraph.FORMAT.equals(format)) {
                            throw in.error(ptr, "unknown format \"" + format + "\"; expected \"" + RegionGraph.FORMAT + "\"");
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
                        List<ReadFinding> varFindings = new ArrayList<>();
                        b.location(new SourceLocation(ptr, in.line(), in.column()));
                        List<SourceLocation> starts = new ArrayList<>();
                        List<Variable> vars = VariableListReader.read(in, ptr, varFindings, starts);
                        starts.forEach(b::location);
                        unknown.addAll(varFindings);
                        b.variables(vars);
                        sawVariables = true;
                    }
                    case "regions" -> {
                        b.location(new SourceLocation(ptr, in.line(), in.column()));
                        readRegions(ptr);
                        sawRegions = true;
                    }
                    case "partitions" -> {
                        readPartitions(ptr);
                        sawPartitions = true;
                    }
                    case "extensions" -> {
                        in.expect(JsonToken.START_OBJECT, ptr, "an object");
                        b.extensions(in.readTree());
                    }
                    default -> {
                        unknownAt(ptr, "unknown property \"" + member + "\" in a region graph document");
                        in.skipValue();
                    }
                }
            }
            in.endDocument();
            if (format == null) {
                throw new FormatException(in.file(), rootLine, rootColumn, "", "missing \"format\"; expected \"" + RegionGraph.FORMAT + "\"");
            }
            if (version == null) {
                throw new FormatException(in.file(), rootLine, rootColumn, "", "missing \"version\"; expected \"1.0\"");
            }
            if (!sawVariables) {
                throw new FormatException(in.file(), rootLine, rootColumn, "", "missing \"variables\"; expected an array of variables");
            }
            if (!sawRegions) {
                throw new FormatException(in.file(), rootLine, rootColumn, "", "missing \"regions\"; expected an array of regions");
            }
            if (!unknown.isEmpty()) {
                if (DocumentHeader.minor(version) <= SUPPORTED_MINOR) {
                    SourceLocation l = unknown.get(0).location();
                    throw new FormatException(in.file(), l.line(), l.column(), l.pointer(), unknown.get(0).message()
                            + "; a version " + version + " document allows unknown properties only under \"extensions\"");
                }
                List<ReadFinding> ignored = new ArrayList<>();
                for (ReadFinding f : unknown) {
                    ignored.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY_NEWER_MINOR, f.message(), f.location()));
                }
                b.findings(ignored);
            }
            int nr = regions.size();
            int np = partitions.size();
            return b.regions(regions).partitions(sawPartitions ? partitions : List.of())
                    .regionLocations(Arrays.copyOf(regionLines, nr), Arrays.copyOf(regionColumns, nr))
                    .partitionLocations(Arrays.copyOf(partitionLines, np), Arrays.copyOf(partitionColumns, np))
                    .build();
        }

        private void unknownAt(String pointer, String message) {
            unknown.add(new ReadFinding(ReadFinding.Kind.UNKNOWN_PROPERTY, message,
                    new SourceLocation(pointer, in.line(), in.column())));
        }

        private void readRegions(String ptr) throws FormatException {
            in.expect(JsonToken.START_ARRAY, ptr, "an array of regions");
            while (in.nextElement()) {
                int index = regions.size();
                String p = ptr + "/" + index;
                int line = in.line();
                int col = in.column();
                in.expect(JsonToken.START_OBJECT, p, "a region object {\"id\": ..., \"vars\": [...]}");
                int id = -1;
                int[] vars = null;
                String m;
                while ((m = in.nextProperty()) != null) {
                    String q = p + "/" + m;
                    switch (m) {
                        case "id" -> id = in.readInt(q, 0, Integer.MAX_VALUE);
                        case "vars" -> vars = in.readIntArray(q, 0, Integer.MAX_VALUE);
                        default -> {
                            unknownAt(q, "unknown property \"" + m + "\" in a region");
                            in.skipValue();
                        }
                    }
                }
                if (id < 0) {
                    throw new FormatException(in.file(), line, col, p, "a region needs an \"id\" (an integer >= 0)");
                }
                if (vars == null) {
                    throw new FormatException(in.file(), line, col, p, "region " + id
                            + " needs \"vars\" (an array of variable indices)");
                }
                if (index == regionLines.length) {
                    regionLines = Arrays.copyOf(regionLines, index * 2);
                    regionColumns = Arrays.copyOf(regionColumns, index * 2);
                }
                regionLines[index] = line;
                regionColumns[index] = col;
                regions.add(new Region(id, vars));
            }
        }

        private void readPartitions(String ptr) throws FormatException {
            in.expect(JsonToken.START_ARRAY, ptr, "an array of partitions");
            while (in.nextElement()) {
                int index = partitions.size();
                String p = ptr + "/" + index;
                int line = in.line();
                int col = in.column();
                in.expect(JsonToken.START_OBJECT, p, "a partition object {\"region\": ..., \"parts\": [...]}");
                int region = -1;
                int[] parts = null;
                String m;
                while ((m = in.nextProperty()) != null) {
                    String q = p + "/" + m;
                    switch (m) {
                        case "region" -> region = in.readInt(q, 0, Integer.MAX_VALUE);
                        case "parts" -> parts = in.readIntArray(q, 0, Integer.MAX_VALUE);
                        default -> {
                            unknownAt(q, "unknown property \"" + m + "\" in a partition");
                            in.skipValue();
                        }
                    }
                }
                if (region < 0) {
                    throw new FormatException(in.file(), line, col, p, "a partition needs a \"region\" (a region id)");
                }
                if (parts == null) {
                    throw new FormatException(in.file(), line, col, p, "the partition of region " + region
                            + " needs \"parts\" (an array of region ids)");
                }
                if (index == partitionLines.length) {
                    partitionLines = Arrays.copyOf(partitionLines, index * 2);
                    partitionColumns = Arrays.copyOf(partitionColumns, index * 2);
                }
                partitionLines[index] = line;
                partitionColumns[index] = col;
                partitions.add(new Partition(region, parts));
            }
        }
    }
}

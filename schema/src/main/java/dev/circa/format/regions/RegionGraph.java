package dev.circa.format.regions;

import dev.circa.format.Document;
import dev.circa.format.Header;
import dev.circa.format.SourceLocation;
import java.util.Arrays;
import java.util.List;

/**
 * A region graph document (FORMAT.md section 3) as read or generated: variables, regions and
 * partitions in document order, with ids and references kept as written so that a checker can
 * say what is wrong with them. {@link #regionLocation(int)} and {@link #partitionLocation(int)}
 * give where each entry starts in the source.
 *
 * <p>Instances are immutable once built and safe to share between threads.
 */
public final class RegionGraph implements Document {
    /** The value of {@code format} for a region graph. */
    public static final String FORMAT = "circa.regions";

    private final Header header;
    private final List<Region> regions;
    private final List<Partition> partitions;
    private final int[] regionLines;
    private final int[] regionColumns;
    private final int[] partitionLines;
    private final int[] partitionColumns;
    private final java.util.Map<String, SourceLocation> locations;

    private RegionGraph(Builder b) {
        this.header = b.header();
        this.regions = List.copyOf(b.regions);
        this.partitions = List.copyOf(b.partitions);
        this.regionLines = b.regionLines;
        this.regionColumns = b.regionColumns;
        this.partitionLines = b.partitionLines;
        this.partitionColumns = b.partitionColumns;
        this.locations = java.util.Map.copyOf(b.locations);
    }

    /** A builder for graphs made in code (generators, tests) or by the reader. */
    public static Builder builder() {
        return new Builder();
    }

    @Override
    public Header header() {
        return header;
    }

    /** The regions in document order. */
    public List<Region> regions() {
        return regions;
    }

    /** The partitions in document order. */
    public List<Partition> partitions() {
        return partitions;
    }

    /** Where region {@code index} (its position in {@link #regions()}) starts: pointer {@code /regions/INDEX}. */
    public SourceLocation regionLocation(int index) {
        return locate("/regions/" + index, index, regionLines, regionColumns);
    }

    /** Where partition {@code index} starts: pointer {@code /partitions/INDEX}. */
    public SourceLocation partitionLocation(int index) {
        return locate("/partitions/" + index, index, partitionLines, partitionColumns);
    }

    /**
     * Where the member at {@code pointer} starts ({@code /variables}, {@code /variables/INDEX}, {@code /regions}),
     * or a location without line and column when it is not known.
     */
    public SourceLocation location(String pointer) {
        SourceLocation at = locations.get(pointer);
        return at != null ? at : SourceLocation.of(pointer);
    }

    private static SourceLocation locate(String pointer, int index, int[] lines, int[] columns) {
        if (lines == null || index >= lines.length) {
            return SourceLocation.of(pointer);
        }
        return new SourceLocation(pointer, lines[index], columns[index]);
    }

    /** Builds a {@link RegionGraph}. Not thread-safe. */
    public static final class Builder extends Header.Setters<Builder> {
        private List<Region> regions = List.of();
        private List<Partition> partitions = List.of();
        private int[] regionLines;
        private int[] regionColumns;
        private int[] partitionLines;
        private int[] partitionColumns;
        private final java.util.Map<String, SourceLocation> locations = new java.util.HashMap<>();

        private Builder() {
        }

        /** Where a member starts (by its pointer), for messages. */
        public Builder location(SourceLocation at) {
            locations.put(at.pointer(), at);
            return this;
        }

        public Builder regions(List<Region> v) {
            this.regions = v;
            return this;
        }

        public Builder partitions(List<Partition> v) {
            this.partitions = v;
            return this;
        }

        /** Line and column (1-based) where each region starts, by position. */
        public Builder regionLocations(int[] lines, int[] columns) {
            this.regionLines = Arrays.copyOf(lines, lines.length);
            this.regionColumns = Arrays.copyOf(columns, columns.length);
            return this;
        }

        /** Line and column (1-based) where each partition starts, by position. */
        public Builder partitionLocations(int[] lines, int[] columns) {
            this.partitionLines = Arrays.copyOf(lines, lines.length);
            this.partitionColumns = Arrays.copyOf(columns, columns.length);
            return this;
        }

        public RegionGraph build() {
            return new RegionGraph(this);
        }
    }
}

package dev.circa.format;

import java.util.HashMap;
import java.util.Map;

/** Line and column of the members of a document other than nodes, keyed by JSON pointer. */
public final class DocumentLocations {
    /** No locations known. */
    public static final DocumentLocations NONE = new DocumentLocations(Map.of());

    private final Map<String, SourceLocation> byPointer;

    public DocumentLocations(Map<String, SourceLocation> byPointer) {
        this.byPointer = Map.copyOf(byPointer);
    }

    /** The location of {@code pointer}, or the pointer alone when it was not recorded. */
    public SourceLocation get(String pointer) {
        SourceLocation l = byPointer.get(pointer);
        return l != null ? l : SourceLocation.of(pointer);
    }

    /** Collects locations while reading. Not thread-safe. */
    public static final class Recorder {
        private final Map<String, SourceLocation> map = new HashMap<>();

        public void put(String pointer, int line, int column) {
            map.put(pointer, new SourceLocation(pointer, line, column));
        }

        public DocumentLocations build() {
            return new DocumentLocations(map);
        }
    }
}

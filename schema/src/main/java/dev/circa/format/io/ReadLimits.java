package dev.circa.format.io;

/**
 * Named limits on what a reader accepts (CLI.md, "Limits"). Each has a command-line option of the
 * same name; a message that hits one names it.
 *
 * @param maxBytes uncompressed bytes read from one file, gzip included ({@code --max-bytes})
 * @param maxNodes nodes in one circuit ({@code --max-nodes})
 * @param maxDepth JSON/YAML nesting depth ({@code --max-depth})
 * @param maxString characters in one string ({@code --max-string})
 * @param maxNumber characters in one number ({@code --max-number})
 */
public record ReadLimits(long maxBytes, long maxNodes, int maxDepth, int maxString, int maxNumber) {
    public static final String MAX_BYTES = "--max-bytes";
    public static final String MAX_NODES = "--max-nodes";
    public static final String MAX_DEPTH = "--max-depth";
    public static final String MAX_STRING = "--max-string";
    public static final String MAX_NUMBER = "--max-number";

    /** The defaults of CLI.md: 16 GiB, 200,000,000 nodes, depth 64, 1 MiB strings, 1,000-character numbers. */
    public static final ReadLimits DEFAULT = new ReadLimits(16L << 30, 200_000_000L, 64, 1 << 20, 1000);

    public ReadLimits {
        if (maxBytes <= 0 || maxNodes <= 0 || maxDepth <= 0 || maxString <= 0 || maxNumber <= 0) {
            throw new IllegalArgumentException("every read limit must be positive");
        }
    }

    public ReadLimits withMaxBytes(long v) {
        return new ReadLimits(v, maxNodes, maxDepth, maxString, maxNumber);
    }

    public ReadLimits withMaxNodes(long v) {
        return new ReadLimits(maxBytes, v, maxDepth, maxString, maxNumber);
    }

    public ReadLimits withMaxDepth(int v) {
        return new ReadLimits(maxBytes, maxNodes, v, maxString, maxNumber);
    }

    public ReadLimits withMaxString(int v) {
        return new ReadLimits(maxBytes, maxNodes, maxDepth, v, maxNumber);
    }

    public ReadLimits withMaxNumber(int v) {
        return new ReadLimits(maxBytes, maxNodes, maxDepth, maxString, v);
    }
}

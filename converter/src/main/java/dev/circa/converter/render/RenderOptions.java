package dev.circa.converter.render;

/**
 * Settings of a rendering.
 *
 * @param scopes whether each node's label lists its scope (in the summary, scopes are always shown)
 * @param maxNodes above this many nodes, the picture is a summary by scope instead of node by node
 */
public record RenderOptions(boolean scopes, int maxNodes) {
    /** The default limit of {@code --max-render-nodes}. */
    public static final int DEFAULT_MAX_NODES = 500;
    /** Node by node up to 500 nodes, without scopes. */
    public static final RenderOptions DEFAULT = new RenderOptions(false, DEFAULT_MAX_NODES);

    public RenderOptions {
        if (maxNodes < 0) {
            throw new IllegalArgumentException("the node limit must be >= 0");
        }
    }
}

package dev.circa.format.regions;

/**
 * A partition of a region graph: a split of region {@code region} into {@code parts}, by region
 * ids as written.
 *
 * @param region id of the region it splits
 * @param parts ids of the parts (at least two when valid); callers must not modify
 */
public record Partition(int region, int[] parts) {
}

package dev.circa.format.regions;

/**
 * A region of a region graph: a set of variable indices, as written (the converter checks that
 * they are sorted, unique and in range).
 *
 * @param id the region's id, unique in its document (>= 0)
 * @param vars variable indices; callers must not modify
 */
public record Region(int id, int[] vars) {
}

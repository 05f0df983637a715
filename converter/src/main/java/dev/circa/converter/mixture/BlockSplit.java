package dev.circa.converter.mixture;

/**
 * Finds the independent blocks of a covariance matrix from its zero pattern: variables i and j are
 * in one block when they are connected through entries that are not exactly zero (connected
 * components, by union-find). A matrix whose entries outside the blocks are all zero is, after a
 * permutation, block diagonal, and its normal density is the product of the blocks'. Not for
 * application code.
 */
final class BlockSplit {
    private BlockSplit() {
    }

    /**
     * The blocks of the symmetric {@code d x d} matrix {@code cov}: each an array of positions in
     * 0..d-1, increasing, blocks ordered by their first position.
     */
    static int[][] blocks(double[] cov, int d) {
        int[] parent = new int[d];
        for (int i = 0; i < d; i++) {
            parent[i] = i;
        }
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < i; j++) {
                if (cov[i * d + j] != 0 || cov[j * d + i] != 0) {
                    int a = find(parent, i);
                    int b = find(parent, j);
                    if (a != b) {
                        parent[Math.max(a, b)] = Math.min(a, b);
                    }
                }
            }
        }
        int[] blockOf = new int[d];
        int[] size = new int[d];
        int count = 0;
        int[] idOfRoot = new int[d];
        java.util.Arrays.fill(idOfRoot, -1);
        for (int i = 0; i < d; i++) {
            int r = find(parent, i);
            if (idOfRoot[r] < 0) {
                idOfRoot[r] = count++;
            }
            blockOf[i] = idOfRoot[r];
            size[blockOf[i]]++;
        }
        int[][] out = new int[count][];
        int[] fill = new int[count];
        for (int b = 0; b < count; b++) {
            out[b] = new int[size[b]];
        }
        for (int i = 0; i < d; i++) {
            int b = blockOf[i];
            out[b][fill[b]++] = i;
        }
        return out;
    }

    private static int find(int[] parent, int i) {
        while (parent[i] != i) {
            parent[i] = parent[parent[i]];
            i = parent[i];
        }
        return i;
    }
}

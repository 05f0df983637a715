package dev.circa.format;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * Appending a blocked column by moving the appended entries within their own blocks gives the entries
 * a plain append gives (each entry read back at its place), for every fill of the receiving column's
 * last block (empty, one entry, all but one) and appended columns ending anywhere in a block.
 */
class BlockAdoptionTest {
    private static int[][] column(int size, int per, int firstValue) {
        int[][] blocks = new int[(size + per - 1) / per + 1][];
        for (int k = 0; k < size; k++) {
            if (blocks[k / per] == null) {
                blocks[k / per] = new int[per];
            }
            blocks[k / per][k % per] = firstValue + k;
        }
        return blocks;
    }

    @Test
    void appendedEntriesFollowInOrderForEveryFill() {
        for (int per : new int[] {1, 2, 7, 8}) {
            for (int size = per; size <= 4 * per; size++) {
                for (int srcSize = per; srcSize <= 5 * per + 1; srcSize++) {
                    int[][] blocks = column(size, per, 0);
                    int[][] src = column(srcSize, per, size);
                    assertTrue(BlockAdoption.applies(size, srcSize, per));
                    int[][] out = BlockAdoption.append(blocks, size, src, srcSize, per);
                    for (int k = 0; k < size + srcSize; k++) {
                        int at = k;
                        int p = per;
                        assertEquals(k, out[k / per][k % per], () -> "entry " + at + " with " + p + " per block");
                    }
                    for (int[] b : src) {
                        assertEquals(null, b, "the appended column keeps no block");
                    }
                }
            }
        }
    }

    @Test
    void anEmptyColumnTakesTheAppendedBlocksAsTheyAre() {
        for (int srcSize = 0; srcSize <= 20; srcSize++) {
            int[][] blocks = {new int[2]};
            int[][] src = column(srcSize, 8, 0);
            int[] firstBlock = src[0];
            assertTrue(BlockAdoption.applies(0, srcSize, 8));
            int[][] out = BlockAdoption.append(blocks, 0, src, srcSize, 8);
            for (int k = 0; k < srcSize; k++) {
                assertEquals(k, out[k / 8][k % 8]);
            }
            if (srcSize > 0) {
                assertTrue(out[0] == firstBlock, "the blocks are taken, not copied");
            }
        }
    }

    @Test
    void smallColumnsAreLeftToThePlainAppend() {
        assertFalse(BlockAdoption.applies(7, 100, 8));
        assertFalse(BlockAdoption.applies(100, 7, 8));
        assertTrue(BlockAdoption.applies(8, 8, 8));
    }
}

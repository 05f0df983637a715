package dev.circa.format;

import java.util.Arrays;

/**
 * Appends one blocked column to another without new blocks: the entries of the appended column move
 * within its own blocks, which then become the receiving column's. A column of {@code size} entries
 * keeps entry {@code k} at {@code blocks[k / per][k % per]}, every block but the last full. When the
 * receiving column's last block holds {@code r} entries, the first {@code per - r} appended entries
 * fill it, and each appended block then takes its own last {@code r} entries to its front and the next
 * block's first {@code per - r} behind them. Every entry is copied once, as a plain append copies it,
 * but no fresh memory is touched (large reads append half a document this way).
 */
final class BlockAdoption {
    private BlockAdoption() {
    }

    /**
     * Whether {@link #append} applies: the receiving column is empty (it then takes the appended blocks
     * as they are), or both hold at least one full block (so their blocks all have {@code per} entries of room).
     */
    static boolean applies(int size, int srcSize, int per) {
        return size == 0 || (size >= per && srcSize >= per);
    }

    /**
     * The blocks of the column {@code blocks} of {@code size} entries followed by the {@code srcSize}
     * entries of {@code src} (whose blocks are reused and must not be used by their owner afterwards).
     * May return {@code blocks} itself, or a longer copy of it.
     */
    static <T> T[] append(T[] blocks, int size, T[] src, int srcSize, int per) {
        int total = size + srcSize;
        int needed = (int) (((long) total + per - 1) / per);
        T[] out = blocks.length >= needed ? blocks : Arrays.copyOf(blocks, Math.max(needed, 2 * blocks.length));
        int full = size / per;
        int r = size - full * per;
        int srcBlocks = (int) (((long) srcSize + per - 1) / per);
        if (r == 0) {
            System.arraycopy(src, 0, out, full, srcBlocks);
            Arrays.fill(src, null);
            return out;
        }
        int room = per - r;
        // the receiving column's last block first
        System.arraycopy(src[0], 0, out[full], r, Math.min(room, srcSize));
        for (int t = 0; room + (long) t * per < srcSize; t++) {
            T block = src[t];
            int from = room + t * per;
            int move = Math.min(r, srcSize - from);
            System.arraycopy(block, room, block, 0, move);
            int next = (t + 1) * per;
            if (next < srcSize) {
                System.arraycopy(src[t + 1], 0, block, r, Math.min(room, srcSize - next));
            }
            out[full + 1 + t] = block;
        }
        Arrays.fill(src, null);
        return out;
    }
}

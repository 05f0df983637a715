package dev.circa.engine.internal;

import dev.circa.engine.family.Families;
import dev.circa.engine.family.SpecialFunctions;

/**
 * The univariate input log-densities of {@link DenseKernel} over a chunk of several rows, read from the
 * chunk's data turned variable-major once per chunk: {@code cell[v][r]} is variable v at row r, and
 * {@code nanRow[nanStart[v] .. nanStart[v+1]-1]} lists the rows where v is missing. A normal input is
 * computed over every row into a 0-based row array, the listed rows set to the input's missing value, and
 * the array added to the fused product's sum; the sum goes to the product's value slot once, by
 * {@link System#arraycopy}. Every loop reads and writes its arrays at the same index from 0, so the JIT
 * turns it into vector instructions: a loop reading the data at {@code v * rows + r} and writing the values at
 * {@code base + r} (two arrays at two offsets) stayed scalar, at 1.2 ns a density against 0.3 to 0.45 here.
 * Row-major data read a row at a time is a strided gather per input that the JIT cannot vectorise either.
 *
 * <p>Every row gets exactly the doubles of the row-at-a-time loop: the same formula on the same operands
 * ({@code z = (x - mean) / sd}, {@code -0.5 z z - log sd - log(2 pi) / 2}, log sd taken once per circuit),
 * {@link Families#logDensity} for other families, the input's log total mass at a missing or hidden cell,
 * and a fused product's children added in child order, the first child first. A row's values do not depend
 * on the other rows of the chunk. One per workspace; the arrays grow on first use to the chunk's data size,
 * at most {@value #MAX_CELLS} cells: a chunk of more (very wide data) is not taken, and the kernel reads it
 * row by row as before.
 */
public final class InputColumns {
    /** Most cells (rows x variables) of a chunk taken: 32 MiB of doubles. */
    public static final int MAX_CELLS = 1 << 22;
    private static final double HALF_LOG_2PI = SpecialFunctions.HALF_LOG_2PI;

    /** The sum being built: a fused product's inputs added so far, or one input, at rows 0 .. rows-1. */
    private final double[] acc;
    /** One input's log-densities at every row, before they are added to {@link #acc}. */
    private final double[] term;
    /** Per variable, its cells at the chunk's rows; each array grown to the largest chunk seen. */
    private double[][] cell = new double[0][];
    /** Per variable, its cells with 0 at the missing ones, and 1 at its observed rows and 0 elsewhere, and the reverse. */
    private double[][] clean = new double[0][];
    private double[][] seen = new double[0][];
    private double[][] unseen = new double[0][];
    private int[] nanStart = new int[1];
    private int[] nanRow = new int[0];
    private int rows;
    private boolean loaded;

    /** Columns for chunks of up to {@code maxRows} rows. */
    public InputColumns(int maxRows) {
        this.acc = new double[maxRows];
        this.term = new double[maxRows];
    }

    /** Whether a chunk of {@code rows} rows of {@code nv} variables is taken by {@link #load}. */
    public static boolean fits(int rows, int nv) {
        return (long) rows * nv <= MAX_CELLS;
    }

    /** Whether the last {@link #load} took its chunk: then {@link #fused} and {@link #input} may be called. */
    public boolean loaded() {
        return loaded;
    }

    /**
     * Takes rows {@code row0 .. row0+rows-1} of row-major {@code data} ({@code nv} variables a row) as the
     * chunk that later calls evaluate, if it {@link #fits}.
     */
    public void load(double[] data, int row0, int rows, int nv) {
        this.rows = rows;
        this.loaded = fits(rows, nv);
        if (!loaded) {
            return;
        }
        if (cell.length < nv) {
            cell = java.util.Arrays.copyOf(cell, nv);
            clean = java.util.Arrays.copyOf(clean, nv);
            seen = java.util.Arrays.copyOf(seen, nv);
            unseen = java.util.Arrays.copyOf(unseen, nv);
            nanStart = new int[nv + 1];
        }
        if (nanRow.length < rows * nv) {
            nanRow = new int[rows * nv];
        }
        final double[][] t = cell;
        for (int v = 0; v < nv; v++) {
            if (t[v] == null || t[v].length < rows) {
                t[v] = new double[rows];
            }
        }
        for (int r = 0; r < rows; r++) {
            int at = (row0 + r) * nv;
            for (int v = 0; v < nv; v++) {
                t[v][r] = data[at + v];
            }
        }
        int n = 0;
        for (int v = 0; v < nv; v++) {
            nanStart[v] = n;
            final double[] x = t[v];
            for (int r = 0; r < rows; r++) {
                if (x[r] != x[r]) {
                    nanRow[n++] = r;
                }
            }
            if (n > nanStart[v]) {
                if (clean[v] == null || clean[v].length < rows) {
                    clean[v] = new double[rows];
                    seen[v] = new double[rows];
                    unseen[v] = new double[rows];
                }
                final double[] xc = clean[v];
                final double[] w = seen[v];
                final double[] u = unseen[v];
                for (int r = 0; r < rows; r++) {
                    boolean observed = x[r] == x[r];
                    xc[r] = observed ? x[r] : 0;
                    w[r] = observed ? 1 : 0;
                    u[r] = observed ? 0 : 1;
                }
            }
        }
        nanStart[nv] = n;
    }

    /**
     * A {@link DenseBlocks#FUSED} product {@code i} at every row of the chunk, into {@code value[base + r]}:
     * the sum of its inputs' log-densities in child order (variables in {@code hide} count as missing).
     */
    public void fused(CircuitData c, DenseBlocks d, int i, boolean[] hide, double[] value, int base) {
        final int s = c.childStart[i];
        for (int e = s; e < c.childStart[i + 1]; e++) {
            input(c, d, c.inputSlot[c.childIndex[e]], hide, e > s);
        }
        System.arraycopy(acc, 0, value, base, rows);
    }

    /** Univariate input {@code slot} at every row of the chunk, into {@code value[base + r]}. */
    public void input(CircuitData c, DenseBlocks d, int slot, boolean[] hide, double[] value, int base) {
        input(c, d, slot, hide, false);
        System.arraycopy(acc, 0, value, base, rows);
    }

    /**
     * Input {@code slot} at every row, stored at {@code acc[r]} or added to it when {@code add}. Its
     * parameters are read in the circuit's own arrays, in node order, as the inputs come (not in
     * {@link DenseBlocks}' fused tables, laid out for one row). A normal's formula goes over every row into
     * {@link #term} (or straight into {@code acc} when it is stored), each missing row then set to the input's
     * missing value, and {@code term} added to {@code acc}: every loop indexes its arrays alike, so the JIT
     * turns it into vector instructions (a loop reading one array at {@code at + r} and writing another at
     * {@code base + r} stayed scalar, 4 to 5 times slower).
     */
    private void input(CircuitData c, DenseBlocks d, int slot, boolean[] hide, boolean add) {
        final int n = rows;
        final double[] a = acc;
        final double missing = d.inputMissing[slot];
        final int v = c.varIndex[c.varStart[slot]];
        if (hide != null && hide[v]) {
            for (int r = 0; r < n; r++) {
                a[r] = add ? a[r] + missing : missing;
            }
            return;
        }
        final double[] x = cell[v];
        final int code = c.family[slot];
        final int off = c.paramStart[slot];
        final int k0 = nanStart[v];
        final int k1 = nanStart[v + 1];
        if (code == Families.NORMAL) {
            final double mean = c.params[off];
            final double sd = c.params[off + 1];
            final double logSd = d.inputLogSd[slot];
            if (k0 == k1) {
                if (add) {
                    for (int r = 0; r < n; r++) {
                        double z = (x[r] - mean) / sd;
                        a[r] += -0.5 * z * z - logSd - HALF_LOG_2PI;
                    }
                } else {
                    for (int r = 0; r < n; r++) {
                        double z = (x[r] - mean) / sd;
                        a[r] = -0.5 * z * z - logSd - HALF_LOG_2PI;
                    }
                }
                return;
            }
            final double z0 = (0.0 - mean) / sd;
            final double f0 = -0.5 * z0 * z0 - logSd - HALF_LOG_2PI;
            if (Double.isFinite(f0) && Double.isFinite(missing)
                    && Double.doubleToRawLongBits(missing) != Double.doubleToRawLongBits(-0.0)) {
                masked(v, mean, sd, logSd, missing, add);
                return;
            }
            final double[] g = add ? term : a;
            for (int r = 0; r < n; r++) {
                double z = (x[r] - mean) / sd;
                g[r] = -0.5 * z * z - logSd - HALF_LOG_2PI;
            }
            for (int k = k0; k < k1; k++) {
                g[nanRow[k]] = missing;
            }
            if (add) {
                for (int r = 0; r < n; r++) {
                    a[r] += g[r];
                }
            }
            return;
        }
        final int len = c.paramStart[slot + 1] - off;
        for (int r = 0; r < n; r++) {
            double xr = x[r];
            double f = xr != xr ? missing : Families.logDensity(code, c.params, off, len, xr);
            a[r] = add ? a[r] + f : f;
        }
    }

    /**
     * A normal input over a variable with missing rows, in one loop over every row: the formula at the
     * variable's cells with 0 at the missing ones (where it is finite: checked by the caller), times 1 at an
     * observed row and 0 at a missing one, plus the input's missing value times the reverse. At an observed
     * row that is the formula plus a zero, at a missing one a zero plus the missing value: the same doubles as
     * the formula stored and the missing rows overwritten (the formula is never -0, and the caller checks that
     * the missing value is finite and not -0), without a pass over the missing rows and another over the sum.
     */
    private void masked(int v, double mean, double sd, double logSd, double missing, boolean add) {
        final int n = rows;
        final double[] a = acc;
        final double[] xc = clean[v];
        final double[] w = seen[v];
        final double[] u = unseen[v];
        if (add && Double.doubleToRawLongBits(missing) == 0) {
            // missing is +0 (a normal's total mass is 1), so missing * u is +0 at every row: the same doubles
            // without reading u (on the verification rows of a 9 * 10^6-edge region graph this loop reads
            // its arrays from beyond the cache, one array less)
            for (int r = 0; r < n; r++) {
                double z = (xc[r] - mean) / sd;
                a[r] += (-0.5 * z * z - logSd - HALF_LOG_2PI) * w[r] + missing;
            }
        } else if (add) {
            for (int r = 0; r < n; r++) {
                double z = (xc[r] - mean) / sd;
                a[r] += (-0.5 * z * z - logSd - HALF_LOG_2PI) * w[r] + missing * u[r];
            }
        } else {
            for (int r = 0; r < n; r++) {
                double z = (xc[r] - mean) / sd;
                a[r] = (-0.5 * z * z - logSd - HALF_LOG_2PI) * w[r] + missing * u[r];
            }
        }
    }
}

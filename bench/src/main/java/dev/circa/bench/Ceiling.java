package dev.circa.bench;

/**
 * The machine's practical ceiling for circuit evaluation, as {@link PeerTable} prints it: a plain dense
 * product with a matrix of about {@code entries} doubles (near square), one thread, written the way the JIT
 * vectorises best (a multiply-add over contiguous memory in the innermost loop, every array in it read and
 * written from index 0: Java 17 keeps a loop scalar when two arrays in it start at different offsets):
 * matrix times vector for batch 1 (column by column), matrix times an {@code n x batch} matrix otherwise
 * (row by row).
 */
final class Ceiling {
    private Ceiling() {
    }

    /** Calls per second of the product for {@code batch} right-hand columns. */
    static double measure(long entries, int batch) {
        int n = (int) Math.max(1, Math.round(Math.sqrt(entries)));
        int m = (int) Math.max(1, entries / n);
        double[] a = PeerTable.rows(m, n, 3);
        for (int i = 0; i < a.length; i++) {
            a[i] = Math.abs(a[i]) * 1e-3;
        }
        double[] x = PeerTable.rows(n, batch, 4);
        double scale = (double) m * n / entries;
        Runnable r;
        if (batch == 1) {
            double[][] columns = split(a, n, m);
            double[] y = new double[m];
            r = () -> matVec(columns, x, y);
        } else {
            double[][] ar = split(a, m, n);
            double[][] xr = split(x, n, batch);
            double[][] y = new double[m][batch];
            r = () -> matMat(ar, xr, y);
        }
        return PeerTable.cpuRate(r) * scale;
    }

    /**
     * Wall-clock scaling of the batch-{@code batch} product from one thread to two (rows of A split in two
     * halves, one per thread): what the machine itself gives a second thread on this work, printed beside
     * circa's own scaling so that a shared or hyper-threaded pair of processors is not mistaken for circa's.
     */
    static double twoThreadScaling(long entries, int batch) throws InterruptedException {
        int n = (int) Math.max(1, Math.round(Math.sqrt(entries)));
        int m = (int) Math.max(2, entries / n) & ~1;
        int h = m / 2;
        double[][] top = split(PeerTable.rows(h, n, 3), h, n);
        double[][] bottom = split(PeerTable.rows(h, n, 5), h, n);
        double[][] x = split(PeerTable.rows(n, batch, 4), n, batch);
        double[][] y0 = new double[h][batch];
        double[][] y1 = new double[h][batch];
        double one = PeerTable.wallRate(() -> {
            matMat(top, x, y0);
            matMat(bottom, x, y1);
        });
        java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newSingleThreadExecutor();
        try {
            double two = PeerTable.wallRate(() -> {
                java.util.concurrent.Future<?> f = pool.submit(() -> matMat(bottom, x, y1));
                matMat(top, x, y0);
                try {
                    f.get();
                } catch (java.util.concurrent.ExecutionException | InterruptedException e) {
                    throw new IllegalStateException(e);
                }
            });
            return two / one;
        } finally {
            pool.shutdownNow();
        }
    }

    /** The {@code rows x cols} row-major {@code flat} as an array of rows. */
    private static double[][] split(double[] flat, int rows, int cols) {
        double[][] r = new double[rows][];
        for (int i = 0; i < rows; i++) {
            r[i] = java.util.Arrays.copyOfRange(flat, i * cols, (i + 1) * cols);
        }
        return r;
    }

    /** y = A x, A given by its columns. */
    static void matVec(double[][] columns, double[] x, double[] y) {
        java.util.Arrays.fill(y, 0);
        for (int j = 0; j < columns.length; j++) {
            double xj = x[j];
            double[] c = columns[j];
            for (int i = 0; i < y.length; i++) {
                y[i] += c[i] * xj;
            }
        }
    }

    /** Y = A X, each given by its rows. */
    static void matMat(double[][] a, double[][] x, double[][] y) {
        for (int i = 0; i < a.length; i++) {
            double[] yi = y[i];
            java.util.Arrays.fill(yi, 0);
            double[] ai = a[i];
            for (int k = 0; k < ai.length; k++) {
                double aik = ai[k];
                double[] xk = x[k];
                for (int j = 0; j < yi.length; j++) {
                    yi[j] += aik * xk[j];
                }
            }
        }
    }
}

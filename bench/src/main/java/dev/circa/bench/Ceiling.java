package dev.circa.bench;

/**
 * The machine's practical ceiling for circuit evaluation, as {@link PeerTable} prints it: a plain dense
 * product with a matrix of about {@code entries} doubles (near square), one thread, written the way the JIT
 * vectorises best (a multiply-add over contiguous memory in the innermost loop): matrix times vector for
 * batch 1 (column by column), matrix times an {@code n x batch} matrix otherwise (row by row).
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
        double[] y = new double[m * batch];
        double scale = (double) m * n / entries;
        Runnable r = batch == 1 ? () -> matVec(a, m, n, x, y) : () -> matMat(a, m, n, x, batch, y);
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
        double[] top = PeerTable.rows(h, n, 3);
        double[] bottom = PeerTable.rows(h, n, 5);
        double[] x = PeerTable.rows(n, batch, 4);
        double[] y0 = new double[h * batch];
        double[] y1 = new double[h * batch];
        double one = PeerTable.wallRate(() -> {
            matMat(top, h, n, x, batch, y0);
            matMat(bottom, h, n, x, batch, y1);
        });
        java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newSingleThreadExecutor();
        try {
            double two = PeerTable.wallRate(() -> {
                java.util.concurrent.Future<?> f = pool.submit(() -> matMat(bottom, h, n, x, batch, y1));
                matMat(top, h, n, x, batch, y0);
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

    /** y = A x, A column-major (m x n). */
    static void matVec(double[] a, int m, int n, double[] x, double[] y) {
        java.util.Arrays.fill(y, 0, m, 0);
        for (int j = 0; j < n; j++) {
            double xj = x[j];
            int base = j * m;
            for (int i = 0; i < m; i++) {
                y[i] += a[base + i] * xj;
            }
        }
    }

    /** Y = A X, A row-major (m x n), X row-major (n x b), Y row-major (m x b); columns in tiles of 256. */
    static void matMat(double[] a, int m, int n, double[] x, int b, double[] y) {
        java.util.Arrays.fill(y, 0, m * b, 0);
        for (int j0 = 0; j0 < b; j0 += 256) {
            int j1 = Math.min(b, j0 + 256);
            for (int i = 0; i < m; i++) {
                int yb = i * b;
                for (int k = 0; k < n; k++) {
                    double aik = a[i * n + k];
                    int xb = k * b;
                    for (int j = j0; j < j1; j++) {
                        y[yb + j] += aik * x[xb + j];
                    }
                }
            }
        }
    }
}

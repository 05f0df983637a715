package dev.circa.model;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.circa.converter.regions.CompileOptions;
import dev.circa.converter.regions.GridRegions;
import dev.circa.converter.regions.RegionCompiler;
import java.lang.management.ManagementFactory;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.Callable;
import java.util.concurrent.CyclicBarrier;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.junit.jupiter.api.Test;

/**
 * One model shared by 16 threads gives, bit for bit, the results of a serial run; calls on a thread's
 * reused row allocate nothing at steady state. Both on the example circuit (generic path) and on a
 * region-graph circuit (dense blocks).
 */
class ConcurrencyTest {
    private static final int THREADS = 16;

    /** Seeded rows by name with about a third of the values missing. */
    private static List<Map<String, Object>> rows(Model m, long seed, int count) {
        Random rnd = new Random(seed);
        List<Map<String, Object>> rows = new ArrayList<>();
        for (int r = 0; r < count; r++) {
            Map<String, Object> row = new HashMap<>();
            for (var v : m.variables()) {
                if (rnd.nextInt(3) == 0) {
                    continue;
                }
                switch (v.type()) {
                    case REAL -> row.put(v.name(), 2.0 + rnd.nextGaussian());
                    case CATEGORICAL -> row.put(v.name(), v.states().get(rnd.nextInt(v.states().size())));
                    default -> row.put(v.name(), rnd.nextInt(2));
                }
            }
            rows.add(row);
        }
        return rows;
    }

    /** Every kind of call on every row, as one array of numbers. */
    private static double[] everything(Model m, List<Map<String, Object>> rows) {
        int nv = m.variableCount();
        double[] result = new double[rows.size() * 6];
        double[] data = new double[rows.size() * nv];
        Row row = m.newRow();
        Row evidence = m.newRow();
        String first = m.variables().get(0).name();
        for (int r = 0; r < rows.size(); r++) {
            Map<String, Object> values = rows.get(r);
            result[6 * r] = m.logDensity(values);
            result[6 * r + 1] = m.logDensity(row.setAll(values));
            m.encode(values, data, r);
            evidence.clear();
            if (!row.isMissing(first)) {
                evidence.set(first, row.get(first));
                row.missing(first);
            }
            result[6 * r + 2] = m.conditional(row, evidence);
            result[6 * r + 3] = m.impute(values).logValue();
        }
        double[] batch = new double[rows.size()];
        m.logDensity(data, rows.size(), 0, batch);
        double[] cond = new double[rows.size() * m.outputCount()];
        m.conditional(data, rows.size(), m.evidenceMask(first), cond);
        for (int r = 0; r < rows.size(); r++) {
            result[6 * r + 4] = batch[r];
            result[6 * r + 5] = cond[r * m.outputCount()];
        }
        return result;
    }

    private static void sharedByThreads_identicalToSerial(Model m, int rowsPerThread) throws Exception {
        List<List<Map<String, Object>>> inputs = new ArrayList<>();
        List<double[]> serial = new ArrayList<>();
        for (int t = 0; t < THREADS; t++) {
            inputs.add(rows(m, t, rowsPerThread));
            serial.add(everything(m, inputs.get(t)));
        }
        double[] serialSample = new double[100 * m.variableCount()];
        m.sample(0, 11, 0, 100, serialSample);
        ExecutorService pool = Executors.newFixedThreadPool(THREADS);
        try {
            CyclicBarrier start = new CyclicBarrier(THREADS);
            List<Future<double[][]>> results = new ArrayList<>();
            for (int t = 0; t < THREADS; t++) {
                List<Map<String, Object>> in = inputs.get(t);
                int part = t;
                Callable<double[][]> task = () -> {
                    start.await();
                    double[] sample = new double[100 * m.variableCount()];
                    double[] again = null;
                    for (int round = 0; round < 2; round++) {
                        again = everything(m, in);
                        m.sample(0, 11 + round, 0, 100, sample);
                    }
                    // rows part*6 .. part*6+5 of seed 11, drawn by this thread alone
                    double[] slice = new double[6 * m.variableCount()];
                    m.sample(0, 11, part * 6L, 6, slice);
                    return new double[][] {again, slice};
                };
                results.add(pool.submit(task));
            }
            for (int t = 0; t < THREADS; t++) {
                double[][] got = results.get(t).get();
                assertArrayEquals(serial.get(t), got[0], "thread " + t);
                double[] expectedSlice = new double[6 * m.variableCount()];
                System.arraycopy(serialSample, t * 6 * m.variableCount(), expectedSlice, 0, expectedSlice.length);
                assertArrayEquals(expectedSlice, got[1], "sample slice of thread " + t);
            }
        } finally {
            pool.shutdownNow();
        }
    }

    @Test
    void exampleCircuit_sharedBy16Threads_identicalToSerial() throws Exception {
        sharedByThreads_identicalToSerial(Model.load(Fixtures.PUMP_STATION), 400);
    }

    /** A 4x4 grid region graph compiled with 8 sums, 8 input bundles and 2 outputs, seed 1: dense blocks. */
    private static Model grid() throws Exception {
        CompileOptions options = new CompileOptions(8, 8, 2, CompileOptions.defaults().families());
        return Model.loader().load(RegionCompiler.compile(GridRegions.generate(4, 4), options, 1L));
    }

    @Test
    void regionGraphCircuit_sharedBy16Threads_identicalToSerial() throws Exception {
        Model m = grid();
        assertTrue(m.circuit().denseBlockSummary().blocks() > 0, "the grid circuit has dense blocks");
        sharedByThreads_identicalToSerial(m, 60);
    }

    @Test
    void steadyState_rowMapConditionalAndBatchCalls_allocateNothing() throws Exception {
        com.sun.management.ThreadMXBean bean = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        long id = Thread.currentThread().getId();
        for (Model m : new Model[] {Model.load(Fixtures.PUMP_STATION), grid()}) {
            Map<String, Object> values = rows(m, 3, 1).get(0);
            String first = m.variables().get(0).name();
            Map<String, Object> query = Map.of(m.variables().get(1).name(), 1.0);
            Map<String, Object> given = Map.of(first, 2.5);
            Row row = m.newRow().setAll(values);
            Row evidence = m.newRow();
            Row other = m.newRow().set(m.variables().get(1).name(), 1.0);
            evidence.set(first, 2.5);
            double[] data = new double[8 * m.variableCount()];
            for (int r = 0; r < 8; r++) {
                m.encode(values, data, r);
            }
            double[] out = new double[8 * m.outputCount()];
            boolean[] mask = m.evidenceMask(first);
            Runnable calls = () -> {
                m.logDensity(row);
                m.logDensity(values);
                m.conditional(other, evidence);
                m.conditional(query, given);
                m.logDensity(data, 8, out);
                m.logDensity(data, 8, m.outputCount() - 1, out);
                m.conditional(data, 8, mask, out);
                m.impute(row, 0, other);
                other.clear().set(m.variables().get(1).name(), 1.0);
            };
            for (int i = 0; i < 3_000; i++) {
                calls.run();
            }
            long before = bean.getThreadAllocatedBytes(id);
            long baseline = bean.getThreadAllocatedBytes(id) - before;
            before = bean.getThreadAllocatedBytes(id);
            for (int i = 0; i < 1_000; i++) {
                calls.run();
            }
            long allocated = bean.getThreadAllocatedBytes(id) - before - baseline;
            // 1,000 rounds of 9 calls: any per-call allocation would show as at least 9,000 * 16 bytes
            assertTrue(allocated < 4096, m.source() + ": " + allocated + " bytes allocated in 9,000 calls");
        }
        assertEquals(THREADS, 16);
    }
}

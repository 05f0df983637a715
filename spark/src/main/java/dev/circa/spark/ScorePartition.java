package dev.circa.spark;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.Variable;
import java.util.Iterator;
import java.util.NoSuchElementException;
import org.apache.spark.api.java.function.MapPartitionsFunction;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;

/**
 * Scores one partition: rows are read into a reused row-major buffer in batches of {@link #BATCH},
 * evaluated together on the engine's fast path, and given back with their log-densities appended.
 */
final class ScorePartition implements MapPartitionsFunction<Row, Row> {
    /** Rows evaluated at once (as {@code circa eval} reads them). */
    static final int BATCH = 1024;
    private static final long serialVersionUID = 1L;

    private final Broadcast<SparkModel> model;
    private final ColumnBinding binding;
    private final boolean[] given;
    private final int[] outputs;

    ScorePartition(Broadcast<SparkModel> model, ColumnBinding binding, boolean[] given, int[] outputs) {
        this.model = model;
        this.binding = binding;
        this.given = given;
        this.outputs = outputs;
    }

    @Override
    public Iterator<Row> call(Iterator<Row> rows) {
        CompiledCircuit c = model.value().compiled();
        return new Batches(rows, c, new Evaluator(c));
    }

    private final class Batches implements Iterator<Row> {
        private final Iterator<Row> in;
        private final Evaluator evaluator;
        private final Variable[] variables;
        private final int nv;
        private final int no;
        private final double[] data;
        private final double[] result;
        private final Row[] pending = new Row[BATCH];
        private int count;
        private int next;

        Batches(Iterator<Row> in, CompiledCircuit c, Evaluator evaluator) {
            this.in = in;
            this.evaluator = evaluator;
            this.variables = c.variables().toArray(new Variable[0]);
            this.nv = c.variableCount();
            this.no = c.outputCount();
            this.data = new double[BATCH * Math.max(1, nv)];
            this.result = new double[BATCH * no];
        }

        @Override
        public boolean hasNext() {
            if (next < count) {
                return true;
            }
            count = 0;
            next = 0;
            while (count < BATCH && in.hasNext()) {
                Row r = in.next();
                binding.fill(r, variables, data, count * nv);
                pending[count++] = r;
            }
            if (count == 0) {
                return false;
            }
            if (given == null) {
                evaluator.logDensity(data, count, result);
            } else {
                evaluator.conditional(data, count, given, result);
            }
            return true;
        }

        @Override
        public Row next() {
            if (!hasNext()) {
                throw new NoSuchElementException();
            }
            Row r = pending[next];
            pending[next] = null;
            int width = r.length();
            Object[] values = new Object[width + outputs.length];
            for (int i = 0; i < width; i++) {
                values[i] = r.get(i);
            }
            for (int k = 0; k < outputs.length; k++) {
                values[width + k] = result[next * no + outputs[k]];
            }
            next++;
            return RowFactory.create(values);
        }
    }
}

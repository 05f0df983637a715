package dev.circa.model;

import dev.circa.engine.CompiledCircuit;
import dev.circa.engine.Evaluator;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Variable;
import dev.circa.validator.Property;
import dev.circa.validator.ValidationReport;
import dev.circa.validator.Verdict;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A circuit proven fit to serve, ready to score rows: its document, the validator's report and the
 * compiled circuit, loaded by a {@link ModelLoader} ({@link #loader()}, or {@link #load(Path)} with the
 * defaults).
 *
 * <p>Rows are given by variable name, as a {@link Map} or a reusable {@link Row}: a real is a number, a
 * count a non-negative integer, a categorical or binary value its state label or state index; an absent
 * or {@code null} value is missing and is marginalised. Log-densities are natural logarithms, -inf where
 * the density is 0. Every call that takes no output index answers for the first output; the
 * {@code int output} overloads choose one ({@link #outputIndex(String)}), the {@code logDensities}
 * methods give every output.
 *
 * <p>Batches for the hot path are flat arrays: {@code data} holds {@code rows x variableCount()} cells,
 * row-major, columns in the order of {@link #variables()}, NaN for a missing value, a state index or
 * count as a double ({@link #encode} and {@link Row#copyTo} fill them by name); results go into arrays
 * the caller supplies and may reuse. Batch cells are not checked, as in the engine's
 * {@link Evaluator}: a value outside a variable's support scores -inf.
 *
 * <p>Thread-safe and immutable: one model may be shared by any number of threads. Each thread gets its
 * own workspace (evaluator and buffers) on its first call and reuses it afterwards, so calls allocate
 * nothing at steady state, except those that return new objects ({@link Imputation}, sampled maps).
 * A row's result depends only on that row: results are identical, bit for bit, whatever the threads.
 */
public final class Model {
    private final String source;
    private final CircuitDocument document;
    private final ValidationReport report;
    private final CompiledCircuit circuit;
    private final Requirement requirement;
    private final VariableCodec codec;
    private final double[] logPartition;
    private final boolean mpeExact;
    private final ThreadLocal<Workspace> workspaces;

    Model(String source, CircuitDocument document, ValidationReport report, CompiledCircuit circuit,
            Requirement requirement) {
        this.source = source;
        this.document = document;
        this.report = report;
        this.circuit = circuit;
        this.requirement = requirement;
        this.codec = new VariableCodec(circuit.variables());
        this.logPartition = new Evaluator(circuit).logPartition();
        this.mpeExact = report.exactQueries().mpe();
        this.workspaces = ThreadLocal.withInitial(() -> new Workspace(this, codec));
    }

    /**
     * A loader with the defaults ({@link dev.circa.format.io.ReadLimits#DEFAULT},
     * {@link Requirement#DEFAULT}), to set other limits, a requirement or a read hook.
     *
     * @return the default loader
     */
    public static ModelLoader loader() {
        return ModelLoader.defaults();
    }

    /**
     * Loads {@code file} with the default limits and requirement.
     *
     * @param file the circuit file ({@code .gz} decompressed)
     * @return the model
     * @throws ModelException when it cannot be read or is not proven fit to serve
     */
    public static Model load(Path file) throws ModelException {
        return loader().load(file);
    }

    /**
     * The name of the file or stream the model was read from, as given.
     *
     * @return the source's name
     */
    public String source() {
        return source;
    }

    /**
     * The document as read.
     *
     * @return the document
     */
    public CircuitDocument document() {
        return document;
    }

    /**
     * The validator's report (properties, log Z, exact queries, warnings).
     *
     * @return the report
     */
    public ValidationReport report() {
        return report;
    }

    /**
     * The compiled circuit, for the engine's low-level entry points.
     *
     * @return the circuit
     */
    public CompiledCircuit circuit() {
        return circuit;
    }

    /**
     * The requirement the model was proven under.
     *
     * @return the requirement
     */
    public Requirement requirement() {
        return requirement;
    }

    /**
     * The variables; a variable's index here is its column in batches.
     *
     * @return an unmodifiable list
     */
    public List<Variable> variables() {
        return circuit.variables();
    }

    /**
     * Number of variables, the cells of one batch row.
     *
     * @return the count
     */
    public int variableCount() {
        return circuit.variableCount();
    }

    /**
     * The index of the variable named {@code name}.
     *
     * @param name a variable's name
     * @return its index in {@link #variables()}
     * @throws IllegalArgumentException when there is no such variable
     */
    public int variableIndex(String name) {
        return codec.indexOf(name);
    }

    /**
     * Number of outputs.
     *
     * @return the count
     */
    public int outputCount() {
        return circuit.outputCount();
    }

    /**
     * The name of output {@code output}.
     *
     * @param output the output's index
     * @return its name
     */
    public String outputName(int output) {
        checkOutput(output);
        return circuit.outputName(output);
    }

    /**
     * The index of the output named {@code name}.
     *
     * @param name an output's name
     * @return its index
     * @throws IllegalArgumentException when there is no such output
     */
    public int outputIndex(String name) {
        int o = circuit.outputIndex(name);
        if (o < 0) {
            throw new IllegalArgumentException("\"" + name + "\" is not an output of this model; expected one of "
                    + String.join(", ", outputNames()));
        }
        return o;
    }

    /**
     * The outputs' names, in order.
     *
     * @return a new list
     */
    public List<String> outputNames() {
        List<String> names = new ArrayList<>();
        for (int o = 0; o < circuit.outputCount(); o++) {
            names.add(circuit.outputName(o));
        }
        return names;
    }

    /**
     * Whether the validator proved every output normalized (log Z = 0 within the tolerance); otherwise
     * log-densities are those of the unnormalised circuit, and conditionals and samples are still exact.
     *
     * @return true when proven normalized
     */
    public boolean normalized() {
        return report.property(Property.NORMALIZED) == Verdict.TRUE;
    }

    /**
     * Whether imputation gives the exact most probable explanation: the circuit was proven smooth,
     * decomposable and deterministic.
     *
     * @return true when MPE is exact
     */
    public boolean mpeExact() {
        return mpeExact;
    }

    /**
     * The log-partition log Z of the first output: its value with every variable missing.
     *
     * @return log Z (0 for a normalized circuit)
     */
    public double logPartition() {
        return logPartition[0];
    }

    /**
     * The log-partition of output {@code output}.
     *
     * @param output the output's index
     * @return log Z
     */
    public double logPartition(int output) {
        checkOutput(output);
        return logPartition[output];
    }

    /**
     * A new row of this model, every variable missing, to fill by name and reuse.
     *
     * @return a new row
     */
    public Row newRow() {
        return new Row(this, codec);
    }

    // ---- log-densities

    /**
     * The log-density of the first output at {@code row}, missing values marginalised.
     *
     * @param row a row of this model
     * @return the log-density
     */
    public double logDensity(Row row) {
        return logDensity(row, 0);
    }

    /**
     * The log-density of output {@code output} at {@code row}, missing values marginalised.
     *
     * @param row a row of this model
     * @param output the output's index
     * @return the log-density
     */
    public double logDensity(Row row, int output) {
        own(row);
        checkOutput(output);
        Workspace ws = workspaces.get();
        ws.evaluator.logDensity(row.cells, 1, ws.out);
        return ws.out[output];
    }

    /**
     * The log-density of every output at {@code row}.
     *
     * @param row a row of this model
     * @param out output: {@code out[o]} for output o, at least {@link #outputCount()} entries
     */
    public void logDensities(Row row, double[] out) {
        own(row);
        workspaces.get().evaluator.logDensity(row.cells, 1, out);
    }

    /**
     * The log-density of the first output at a row given by name, missing values marginalised.
     *
     * @param values values by variable name; an absent or {@code null} value is missing
     * @return the log-density
     * @throws IllegalArgumentException when a name is not a variable or a value not one of its values
     */
    public double logDensity(Map<String, ?> values) {
        return logDensity(values, 0);
    }

    /**
     * The log-density of output {@code output} at a row given by name.
     *
     * @param values values by variable name; an absent or {@code null} value is missing
     * @param output the output's index
     * @return the log-density
     * @throws IllegalArgumentException when a name is not a variable or a value not one of its values
     */
    public double logDensity(Map<String, ?> values, int output) {
        checkOutput(output);
        Workspace ws = workspaces.get();
        ws.evaluator.logDensity(ws.query.setAll(values).cells, 1, ws.out);
        return ws.out[output];
    }

    /**
     * The log-density of every output at a row given by name.
     *
     * @param values values by variable name; an absent or {@code null} value is missing
     * @param out output: {@code out[o]} for output o, at least {@link #outputCount()} entries
     * @throws IllegalArgumentException when a name is not a variable or a value not one of its values
     */
    public void logDensities(Map<String, ?> values, double[] out) {
        Workspace ws = workspaces.get();
        ws.evaluator.logDensity(ws.query.setAll(values).cells, 1, out);
    }

    /**
     * Log-densities of every output for a batch.
     *
     * @param data input: {@code rows x variableCount()} cells (see the class comment)
     * @param rows number of rows
     * @param out output: {@code out[r * outputCount() + o]} for row r and output o
     */
    public void logDensity(double[] data, int rows, double[] out) {
        workspaces.get().evaluator.logDensity(data, rows, out);
    }

    /**
     * Log-densities of output {@code output} for a batch.
     *
     * @param data input: {@code rows x variableCount()} cells (see the class comment)
     * @param rows number of rows
     * @param output the output's index
     * @param out output: {@code out[r]} for row r
     */
    public void logDensity(double[] data, int rows, int output, double[] out) {
        checkOutput(output);
        checkBatch(data, rows, out, rows);
        Workspace ws = workspaces.get();
        int no = circuit.outputCount();
        if (no == 1) {
            ws.evaluator.logDensity(data, rows, out);
            return;
        }
        int nv = circuit.variableCount();
        for (int r0 = 0; r0 < rows; r0 += Workspace.CHUNK) {
            int n = Math.min(Workspace.CHUNK, rows - r0);
            System.arraycopy(data, r0 * nv, ws.cells, 0, n * nv);
            ws.evaluator.logDensity(ws.cells, n, ws.out);
            for (int r = 0; r < n; r++) {
                out[r0 + r] = ws.out[r * no + output];
            }
        }
    }

    /**
     * Writes a row given by name into row {@code row} of a batch.
     *
     * @param values values by variable name; an absent or {@code null} value is missing
     * @param data output: the batch
     * @param row the row's index in the batch
     * @throws IllegalArgumentException when a name is not a variable or a value not one of its values
     */
    public void encode(Map<String, ?> values, double[] data, int row) {
        workspaces.get().query.setAll(values).copyTo(data, row);
    }

    /**
     * The values of row {@code row} of a batch by variable name, as {@link Row#value(String)} gives them.
     *
     * @param data input: the batch
     * @param row the row's index
     * @return a new map in the order of {@link #variables()}
     */
    public Map<String, Object> decode(double[] data, int row) {
        Map<String, Object> m = new LinkedHashMap<>();
        int nv = circuit.variableCount();
        for (int v = 0; v < nv; v++) {
            m.put(circuit.variables().get(v).name(), codec.decode(v, data[row * nv + v]));
        }
        return m;
    }

    // ---- conditionals

    /**
     * The conditional log p(query | evidence) of the first output, computed exactly as
     * log p(query, evidence) - log p(evidence) with every other variable marginalised.
     *
     * @param query the values whose probability is asked; no variable may be observed in both rows
     * @param evidence the values given
     * @return the conditional log-density; NaN when the evidence has probability 0
     * @throws IllegalArgumentException when a variable is observed in both rows
     */
    public double conditional(Row query, Row evidence) {
        return conditional(query, evidence, 0);
    }

    /**
     * The conditional log p(query | evidence) of output {@code output}.
     *
     * @param query the values whose probability is asked
     * @param evidence the values given
     * @param output the output's index
     * @return the conditional log-density; NaN when the evidence has probability 0
     * @throws IllegalArgumentException when a variable is observed in both rows
     */
    public double conditional(Row query, Row evidence, int output) {
        own(query);
        own(evidence);
        checkOutput(output);
        return conditional(workspaces.get(), query, evidence, output);
    }

    /**
     * The conditional log p(query | evidence) of the first output, both given by name.
     *
     * @param query values by variable name whose probability is asked
     * @param evidence values by variable name that are given
     * @return the conditional log-density; NaN when the evidence has probability 0
     * @throws IllegalArgumentException when a name is unknown, a value invalid, or a variable in both maps
     */
    public double conditional(Map<String, ?> query, Map<String, ?> evidence) {
        return conditional(query, evidence, 0);
    }

    /**
     * The conditional log p(query | evidence) of output {@code output}, both given by name.
     *
     * @param query values by variable name whose probability is asked
     * @param evidence values by variable name that are given
     * @param output the output's index
     * @return the conditional log-density; NaN when the evidence has probability 0
     * @throws IllegalArgumentException when a name is unknown, a value invalid, or a variable in both maps
     */
    public double conditional(Map<String, ?> query, Map<String, ?> evidence, int output) {
        checkOutput(output);
        Workspace ws = workspaces.get();
        return conditional(ws, ws.query.setAll(query), ws.evidence.setAll(evidence), output);
    }

    private double conditional(Workspace ws, Row query, Row evidence, int output) {
        int nv = circuit.variableCount();
        for (int v = 0; v < nv; v++) {
            double e = evidence.cells[v];
            boolean given = !Double.isNaN(e);
            if (given && !Double.isNaN(query.cells[v])) {
                throw new IllegalArgumentException("variable " + circuit.variables().get(v).name()
                        + " is both in the query and in the evidence; expected it in one of them");
            }
            ws.given[v] = given;
            ws.cells[v] = given ? e : query.cells[v];
        }
        ws.evaluator.conditional(ws.cells, 1, ws.given, ws.out);
        return ws.out[output];
    }

    /**
     * Conditional log-densities of every output for a batch: log p(observed cells not in the evidence |
     * observed evidence cells) per row.
     *
     * @param data input: {@code rows x variableCount()} cells (see the class comment)
     * @param rows number of rows
     * @param evidence input: per variable, whether its column is evidence ({@link #evidenceMask})
     * @param out output: {@code out[r * outputCount() + o]}; NaN where the evidence has probability 0
     */
    public void conditional(double[] data, int rows, boolean[] evidence, double[] out) {
        workspaces.get().evaluator.conditional(data, rows, evidence, out);
    }

    /**
     * The evidence mask of {@link #conditional(double[], int, boolean[], double[])} for the named variables.
     *
     * @param names the evidence variables
     * @return a new array, one entry per variable
     * @throws IllegalArgumentException when a name is not a variable
     */
    public boolean[] evidenceMask(String... names) {
        boolean[] mask = new boolean[circuit.variableCount()];
        for (String n : names) {
            mask[codec.indexOf(n)] = true;
        }
        return mask;
    }

    // ---- imputation

    /**
     * Fills the missing values of {@code row} with the most probable explanation for output
     * {@code output}, exact when {@link #mpeExact()}.
     *
     * @param row input: the observed values
     * @param output the output's index
     * @param filled output: {@code row} with its missing values filled (may be {@code row} itself);
     *     variables outside the output's scope stay missing
     * @return the max-product log value of the output at the completed row
     */
    public double impute(Row row, int output, Row filled) {
        own(row);
        own(filled);
        checkOutput(output);
        Workspace ws = workspaces.get();
        ws.evaluator.mpe(row.cells, 1, output, ws.filled, ws.logValue);
        System.arraycopy(ws.filled, 0, filled.cells, 0, ws.filled.length);
        return ws.logValue[0];
    }

    /**
     * The most probable explanation of a row given by name, for the first output.
     *
     * @param values values by variable name; an absent or {@code null} value is filled
     * @return the completed row, its log value and whether it is exact
     * @throws IllegalArgumentException when a name is not a variable or a value not one of its values
     */
    public Imputation impute(Map<String, ?> values) {
        return impute(values, 0);
    }

    /**
     * The most probable explanation of a row given by name, for output {@code output}.
     *
     * @param values values by variable name; an absent or {@code null} value is filled
     * @param output the output's index
     * @return the completed row, its log value and whether it is exact
     * @throws IllegalArgumentException when a name is not a variable or a value not one of its values
     */
    public Imputation impute(Map<String, ?> values, int output) {
        checkOutput(output);
        Workspace ws = workspaces.get();
        Row row = ws.query.setAll(values);
        double logValue = impute(row, output, row);
        return new Imputation(row.toMap(), logValue, mpeExact);
    }

    /**
     * The most probable explanation of every row of a batch for output {@code output}.
     *
     * @param data input: {@code rows x variableCount()} cells (see the class comment)
     * @param rows number of rows
     * @param output the output's index
     * @param completed output: {@code rows x variableCount()} cells, {@code data} with missing cells filled
     * @param logValue output: per row, the max-product log value of the output
     */
    public void impute(double[] data, int rows, int output, double[] completed, double[] logValue) {
        checkOutput(output);
        workspaces.get().evaluator.mpe(data, rows, output, completed, logValue);
    }

    // ---- sampling

    /**
     * Draws rows {@code firstRow .. firstRow + n - 1} of the sequence named by {@code seed} from output
     * {@code output} by ancestral sampling. Row k of a seed is the same whichever call or thread draws it,
     * on any machine (the engine's {@link dev.circa.engine.Sampler}: one xoshiro256** stream per row).
     *
     * @param output the output's index
     * @param seed the seed
     * @param firstRow the index of the first row in the seed's sequence
     * @param n number of rows
     * @param out output: {@code n x variableCount()} cells; variables outside the output's scope are NaN
     * @throws IllegalArgumentException when the output's total mass is 0 or not finite
     * @throws dev.circa.engine.DrawOverflowException when a draw is not a value of its variable (an input's
     *     parameters overflow the double or count range when sampled); it names the input node
     */
    public void sample(int output, long seed, long firstRow, int n, double[] out) {
        checkOutput(output);
        workspaces.get().sampler(circuit, seed).sample(output, firstRow, n, out);
    }

    /**
     * Draws the first {@code n} rows of the sequence named by {@code seed} from the first output, by name.
     *
     * @param seed the seed
     * @param n number of rows
     * @return new maps in the order of {@link #variables()}, as {@link Row#value(String)} gives values
     * @throws IllegalArgumentException when the output's total mass is 0 or not finite
     */
    public List<Map<String, Object>> sample(long seed, int n) {
        double[] cells = new double[n * circuit.variableCount()];
        sample(0, seed, 0, n, cells);
        List<Map<String, Object>> rows = new ArrayList<>(n);
        for (int r = 0; r < n; r++) {
            rows.add(decode(cells, r));
        }
        return rows;
    }

    private void own(Row row) {
        if (row.model() != this) {
            throw new IllegalArgumentException("the row belongs to another model; make rows with newRow()");
        }
    }

    private void checkOutput(int output) {
        if (output < 0 || output >= circuit.outputCount()) {
            throw new IllegalArgumentException("no output " + output + "; this model has " + circuit.outputCount()
                    + " (" + String.join(", ", outputNames()) + ")");
        }
    }

    private void checkBatch(double[] data, int rows, double[] out, long outNeeded) {
        if (rows < 0 || data.length < (long) rows * circuit.variableCount() || out.length < outNeeded) {
            throw new IllegalArgumentException("a batch of " + rows + " rows needs " + (long) rows * circuit.variableCount()
                    + " cells and " + outNeeded + " results; given " + data.length + " and " + out.length);
        }
    }
}

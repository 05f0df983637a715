package dev.circa.converter.regions;

import dev.circa.converter.npz.NpzArchive;
import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.io.FormatException;

/**
 * The parameters of a compiled region graph: each sum's weights (or log-weights) and each input's
 * parameters, laid out as FORMAT.md section 3 says, for one {@link RegionStructure} and
 * {@link CompileOptions}. They come from a seed ({@link SeededParameters}), from a NumPy archive
 * ({@link ArchiveParameters}), or from a compiled circuit for export ({@link CircuitParameters}), and
 * go to a circuit ({@link RegionCompiler}) or to an archive ({@link #toArchive()}).
 *
 * <p>Immutable; the arrays it hands out must not be modified.
 */
public final class RegionParameters {
    /** The concentration of the symmetric Dirichlet that seeded weights are drawn from. */
    public static final double DIRICHLET_ALPHA = 1.0;

    private final RegionStructure structure;
    private final CompileOptions options;
    private final Layout layout;
    private final double[][][] weights;
    private final boolean[] logWeights;
    private final double[][][] inputs;

    RegionParameters(RegionStructure structure, CompileOptions options, double[][][] weights,
            boolean[] logWeights, double[][][] inputs) {
        this.structure = structure;
        this.options = options;
        this.layout = new Layout(structure, options);
        this.weights = weights;
        this.logWeights = logWeights;
        this.inputs = inputs;
    }

    /** The structure these parameters belong to. */
    public RegionStructure structure() {
        return structure;
    }

    /** The options these parameters belong to. */
    public CompileOptions options() {
        return options;
    }

    Layout layout() {
        return layout;
    }

    /** Whether region {@code r} has sums (an inner region, or the root). */
    public boolean hasSums(int r) {
        return layout.hasSums(r);
    }

    /** Number of sums of region {@code r}. */
    public int sumCount(int r) {
        return layout.sums(r);
    }

    /** Number of children of each sum of region {@code r}. */
    public int childCount(int r) {
        return layout.children(r);
    }

    /** The weights (log-weights when {@link #logWeights(int)}) of sum {@code k} of region {@code r}. */
    public double[] weights(int r, int k) {
        return weights[r][k];
    }

    /** Whether region {@code r}'s weights are log-weights. */
    public boolean logWeights(int r) {
        return logWeights[r];
    }

    /** The parameters (in {@link Family} layout) of the input for variable position {@code j} of bundle {@code i} of leaf {@code r}. */
    public double[] inputParams(int r, int i, int j) {
        return inputs[r][i * structure.vars(r).length + j];
    }

    /** The family of variable {@code var}. */
    public Family family(int var) {
        return options.family(structure.variables().get(var).type());
    }

    /** Random, valid, normalised parameters drawn from {@code seed} (see {@link SeededParameters}). */
    public static RegionParameters seeded(RegionStructure s, CompileOptions o, long seed) {
        return SeededParameters.of(s, o, seed);
    }

    /**
     * Parameters from a NumPy archive in the layout of FORMAT.md section 3.
     *
     * @throws FormatException when an array is missing, extra, misshapen, given both per variable
     *     and per region, or holds a value outside its parameter's range; the message names the array
     */
    public static RegionParameters fromArchive(RegionStructure s, CompileOptions o, NpzArchive a) throws FormatException {
        return ArchiveParameters.read(s, o, a);
    }

    /**
     * The parameters of a circuit compiled from {@code s}, for export. K, I, C and the families are
     * read off the circuit; every node must be where compiling the graph with them puts it.
     *
     * @throws FormatException located at the first node that does not match the layout
     */
    public static RegionParameters fromCircuit(RegionStructure s, CircuitDocument c) throws FormatException {
        return CircuitParameters.read(s, c);
    }

    /**
     * These parameters as arrays in the layout of FORMAT.md section 3: {@code r<ID>.weights} (or
     * {@code r<ID>.logweights}) for each region with sums, and per-variable arrays
     * {@code r<ID>.v<VAR>.<param>} for each leaf region, regions in document order.
     */
    public NpzArchive toArchive() {
        return ArchiveParameters.toArchive(this);
    }
}

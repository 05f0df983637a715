package dev.circa.converter.regions;

import dev.circa.format.Provenance;
import dev.circa.format.ReadFinding;
import dev.circa.format.SourceLocation;
import dev.circa.format.Variable;
import dev.circa.format.VariableType;
import dev.circa.format.io.FormatException;
import dev.circa.format.io.JsonInput;
import dev.circa.format.io.LimitExceededException;
import dev.circa.format.io.ReadLimits;
import dev.circa.format.io.VariableListReader;
import dev.circa.format.regions.Partition;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import tools.jackson.core.JsonToken;

/**
 * Random region graphs: the variable set split at random to depth D, repeated R times from the root.
 *
 * <p>How a graph is drawn, with one {@link SplitMix64} seeded by the seed: the root (all
 * variables) is region 0. For each repetition in turn, its regions are split breadth first: a
 * region of at least two variables at a depth below D (the root is at depth 0) is split by
 * shuffling its variables (Fisher-Yates, from the last position down, swapping with a uniform
 * position at or before it), then cutting the shuffled list at a point drawn uniformly from
 * [1, n-1]; the two parts (sorted) become new regions, numbered in order of creation, and the
 * split a partition. Every split gives two non-empty parts; each repetition has regions of its
 * own below the shared root; a region not split is a leaf. Same seed, same graph, on any platform.
 *
 * <p>Stateless.
 */
public final class RandomRegions {
    /** One sentence for {@code --help}: how a split is drawn. */
    public static final String SPLIT_RULE = "each split shuffles the region's variables (Fisher-Yates, SplitMix64 seeded"
            + " by --seed) and cuts the shuffled list at a point drawn uniformly from 1 to n-1, giving two non-empty parts";

    /** The option that bounds the variables of a generated graph. */
    public static final String MAX_VARIABLES = "--max-vars";

    /**
     * The default of {@value #MAX_VARIABLES}: the generator holds about 150 bytes of heap per variable
     * (measured: 10^7 variables at depth 1 ran in 1.5 GB, within -Xmx1500m; 10^8 took 6.4 GB), so the
     * default stays within the heap a Java 17 JVM gives itself on a machine of 8 GB (a quarter of it).
     */
    public static final long DEFAULT_MAX_VARIABLES = 10_000_000L;

    private RandomRegions() {
    }

    /** The variables {@code x0} ... {@code x<n-1>}, all real. */
    public static List<Variable> realVariables(int n) {
        if (n < 1) {
            throw new IllegalArgumentException("the number of variables must be at least 1, got " + n);
        }
        List<Variable> vars = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            vars.add(Variable.of("x" + i, VariableType.REAL));
        }
        return vars;
    }

    /**
     * Reads a JSON array of variables as in FORMAT.md section 1 (for {@code regions random --variables FILE.json});
     * an unknown property is an error. Whether names are unique is checked when the graph is checked.
     *
     * @throws FormatException located at what is wrong
     */
    public static List<Variable> readVariables(Path file, ReadLimits limits) throws FormatException {
        try (JsonInput in = JsonInput.openJson(file, limits)) {
            JsonToken t = in.next();
            if (t != JsonToken.START_ARRAY) {
                throw in.error("", "expected a JSON array of variables, found " + JsonInput.describe(t));
            }
            List<ReadFinding> unknown = new ArrayList<>();
            List<Variable> vars = VariableListReader.read(in, "", unknown);
            if (!unknown.isEmpty()) {
                SourceLocation l = unknown.get(0).location();
                throw new FormatException(in.file(), l.line(), l.column(), l.pointer(), unknown.get(0).message());
            }
            in.endDocument();
            if (vars.isEmpty()) {
                throw new FormatException(in.file(), 1, 1, "", "the variable list is empty; expected at least one variable");
            }
            return vars;
        }
    }

    /**
     * Draws a random region graph.
     *
     * @param variables the variables (at least one)
     * @param depth D >= 0: split levels below the root
     * @param repeats R >= 1: independent split trees below the root
     * @param seed the seed
     */
    public static RegionGraph generate(List<Variable> variables, int depth, int repeats, long seed) {
        return generate(variables, depth, repeats, seed, ReadLimits.DEFAULT);
    }

    /**
     * The most variable references a random region graph can hold: the root's n, and per repetition n at
     * each split level (a level below which every region is a single variable holds no more splits).
     */
    public static long maxVariableReferences(long variables, int depth, long repeats) {
        long levels = Math.min(depth, Math.max(0, variables - 1));
        double refs = variables + (double) repeats * variables * levels;
        return refs >= Long.MAX_VALUE ? Long.MAX_VALUE : (long) refs;
    }

    /**
     * Checks, before any work, that a random region graph of {@code variables} variables, depth and
     * repeats stays within {@code --max-nodes}: the number of variables, and the variable references of
     * its regions (the circuit compiled from it has at least one input node for each reference of a leaf
     * region, and the generator holds them all).
     *
     * @throws LimitExceededException naming {@code --max-nodes}
     */
    public static void checkLimits(long variables, int depth, long repeats, ReadLimits limits) throws LimitExceededException {
        checkLimits(variables, depth, repeats, limits, DEFAULT_MAX_VARIABLES);
    }

    /**
     * {@link #checkLimits(long, int, long, ReadLimits)} with at most {@code maxVariables} variables
     * ({@value #MAX_VARIABLES}), checked first.
     *
     * @throws LimitExceededException naming {@value #MAX_VARIABLES} or {@code --max-nodes}
     */
    public static void checkLimits(long variables, int depth, long repeats, ReadLimits limits, long maxVariables)
            throws LimitExceededException {
        if (variables > maxVariables) {
            throw new LimitExceededException(null, 0, 0, null, String.format(java.util.Locale.ROOT,
                    "a random region graph of %d variables is more than the limit of %d set by %s (about 150 bytes"
                            + " of heap per variable; raise it with %s and the heap with CIRCA_JAVA_OPTS=-Xmx...)",
                    variables, maxVariables, MAX_VARIABLES, MAX_VARIABLES), MAX_VARIABLES);
        }
        long refs = maxVariableReferences(variables, depth, repeats);
        if (variables > limits.maxNodes() || refs > limits.maxNodes()) {
            throw new LimitExceededException(null, 0, 0, null, String.format(java.util.Locale.ROOT,
                    "a random region graph of %d variables, depth %d and %d repeats holds up to %d variable references,"
                            + " more than the limit of %d set by %s (raise it with %s, or lower --depth or --repeats)",
                    variables, depth, repeats, refs, limits.maxNodes(), ReadLimits.MAX_NODES, ReadLimits.MAX_NODES),
                    ReadLimits.MAX_NODES);
        }
    }

    /**
     * Draws a random region graph within {@code limits}, checked before any work ({@link #checkLimits}).
     *
     * @throws IllegalArgumentException for an empty variable list, a negative depth, fewer than one
     *     repeat, or a graph beyond {@code --max-nodes} (the message names the limit)
     */
    public static RegionGraph generate(List<Variable> variables, int depth, int repeats, long seed, ReadLimits limits) {
        return generate(variables, depth, repeats, seed, limits, DEFAULT_MAX_VARIABLES);
    }

    /** {@link #generate(List, int, int, long, ReadLimits)} with at most {@code maxVariables} variables ({@value #MAX_VARIABLES}). */
    public static RegionGraph generate(List<Variable> variables, int depth, int repeats, long seed, ReadLimits limits,
            long maxVariables) {
        try {
            checkLimits(variables.size(), depth, repeats, limits, maxVariables);
        } catch (LimitExceededException e) {
            throw new IllegalArgumentException(e.problem(), e);
        }
        if (variables.isEmpty()) {
            throw new IllegalArgumentException("a region graph needs at least one variable");
        }
        if (depth < 0) {
            throw new IllegalArgumentException("depth must be at least 0, got " + depth);
        }
        if (repeats < 1) {
            throw new IllegalArgumentException("repeats must be at least 1, got " + repeats);
        }
        SplitMix64 rng = new SplitMix64(seed);
        int n = variables.size();
        List<Region> regions = new ArrayList<>();
        List<Partition> partitions = new ArrayList<>();
        int[] all = new int[n];
        for (int i = 0; i < n; i++) {
            all[i] = i;
        }
        regions.add(new Region(0, all));
        int[] queue = new int[16];
        int[] queueDepth = new int[16];
        for (int rep = 0; rep < repeats; rep++) {
            int head = 0;
            int tail = 0;
            queue[tail] = 0;
            queueDepth[tail++] = 0;
            while (head < tail) {
                int r = queue[head];
                int d = queueDepth[head++];
                int[] vars = regions.get(r).vars();
                if (d >= depth || vars.length < 2) {
                    continue;
                }
                int[] shuffled = vars.clone();
                for (int i = shuffled.length - 1; i > 0; i--) {
                    int j = rng.nextInt(i + 1);
                    int t = shuffled[i];
                    shuffled[i] = shuffled[j];
                    shuffled[j] = t;
                }
                int cut = 1 + rng.nextInt(shuffled.length - 1);
                int[] left = Arrays.copyOfRange(shuffled, 0, cut);
                int[] right = Arrays.copyOfRange(shuffled, cut, shuffled.length);
                Arrays.sort(left);
                Arrays.sort(right);
                int a = regions.size();
                regions.add(new Region(a, left));
                regions.add(new Region(a + 1, right));
                partitions.add(new Partition(r, new int[] {a, a + 1}));
                if (tail + 2 > queue.length) {
                    queue = Arrays.copyOf(queue, queue.length * 2);
                    queueDepth = Arrays.copyOf(queueDepth, queueDepth.length * 2);
                }
                queue[tail] = a;
                queueDepth[tail++] = d + 1;
                queue[tail] = a + 1;
                queueDepth[tail++] = d + 1;
            }
        }
        return RegionGraph.builder().variables(variables).regions(regions).partitions(partitions)
                .provenance(new Provenance(null, null, "random region graph: depth " + depth + ", repeats " + repeats
                        + ", seed " + seed))
                .build();
    }
}

package dev.circa.converter.regions;

import dev.circa.format.Counts;
import dev.circa.format.SourceLocation;
import dev.circa.format.Variable;
import dev.circa.format.io.FormatException;
import dev.circa.format.regions.Partition;
import dev.circa.format.regions.Region;
import dev.circa.format.regions.RegionGraph;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * A region graph that has been checked (FORMAT.md section 3), with references resolved to
 * positions: regions by their index in the document, partitions in document order.
 *
 * <p>The checks, each failing with a {@link FormatException} located at the offending region or
 * partition: variable names non-empty and unique, a categorical variable with at least two unique
 * states, a binary one with none or two; region ids unique; every region's {@code vars} non-empty, sorted, unique and in range;
 * every partition names an existing region and at least two existing parts that are pairwise
 * disjoint and together equal its region; exactly one root (a region that is the part of no
 * partition) and its {@code vars} are all the variables; no cycles; every region reachable from the root.
 *
 * <p>Immutable; safe to share between threads.
 */
public final class RegionStructure {
    private final RegionGraph graph;
    private final int[] ids;
    private final int[][] vars;
    private final int[] partitionRegion;
    private final int[][] partitionParts;
    private final int[][] partitionsOf;
    private final int root;
    private final int[] order;

    private RegionStructure(RegionGraph graph, int[] ids, int[][] vars, int[] partitionRegion, int[][] partitionParts,
            int[][] partitionsOf, int root, int[] order) {
        this.graph = graph;
        this.ids = ids;
        this.vars = vars;
        this.partitionRegion = partitionRegion;
        this.partitionParts = partitionParts;
        this.partitionsOf = partitionsOf;
        this.root = root;
        this.order = order;
    }

    /**
     * Checks {@code graph} and resolves its references.
     *
     * @throws FormatException naming the file, the line and column of the offending region or
     *     partition and what was expected
     */
    public static RegionStructure of(RegionGraph graph) throws FormatException {
        List<Region> regions = graph.regions();
        List<Partition> partitions = graph.partitions();
        int nv = graph.variables().size();
        int nr = regions.size();
        if (nv == 0) {
            throw fail(graph, graph.location("/variables"), "a region graph needs at least one variable");
        }
        if (nr == 0) {
            throw fail(graph, graph.location("/regions"), "a region graph needs at least one region (the root)");
        }
        checkVariables(graph);
        Map<Integer, Integer> byId = new HashMap<>(nr * 2);
        int[] ids = new int[nr];
        int[][] vars = new int[nr][];
        for (int r = 0; r < nr; r++) {
            Region region = regions.get(r);
            Integer prev = byId.putIfAbsent(region.id(), r);
            if (prev != null) {
                throw fail(graph, graph.regionLocation(r), "region id " + region.id()
                        + " appears twice (first at /regions/" + prev + "); expected unique ids");
            }
            ids[r] = region.id();
            int[] v = region.vars();
            if (v.length == 0) {
                throw fail(graph, graph.regionLocation(r), "region " + region.id()
                        + " has no variables; expected a non-empty set of variable indices");
            }
            for (int i = 0; i < v.length; i++) {
                if (v[i] >= nv) {
                    throw fail(graph, graph.regionLocation(r), "region " + region.id() + " names variable " + v[i]
                            + "; expected indices from 0 to " + (nv - 1));
                }
                if (i > 0 && v[i] <= v[i - 1]) {
                    throw fail(graph, graph.regionLocation(r), "the vars of region " + region.id()
                            + " are not sorted and unique (" + v[i - 1] + " then " + v[i]
                            + "); expected increasing variable indices");
                }
            }
            vars[r] = v.clone();
        }
        int np = partitions.size();
        int[] partitionRegion = new int[np];
        int[][] partitionParts = new int[np][];
        int[] partCount = new int[nr];
        int[] partitionCount = new int[nr];
        int[] stamp = new int[nv];
        int[] member = new int[nv];
        Arrays.fill(stamp, -1);
        Arrays.fill(member, -1);
        for (int p = 0; p < np; p++) {
            Partition part = partitions.get(p);
            SourceLocation at = graph.partitionLocation(p);
            Integer r = byId.get(part.region());
            if (r == null) {
                throw fail(graph, at, "the partition names region " + part.region() + ", which does not exist");
            }
            int[] parts = part.parts();
            if (parts.length < 2) {
                throw fail(graph, at, "the partition of region " + part.region() + " has "
                        + Counts.of(parts.length, "part") + "; expected at least 2");
            }
            int[] resolved = new int[parts.length];
            int covered = 0;
            for (int v : vars[r]) {
                member[v] = p;
            }
            for (int k = 0; k < parts.length; k++) {
                Integer q = byId.get(parts[k]);
                if (q == null) {
                    throw fail(graph, at, "the partition of region " + part.region() + " names part " + parts[k]
                            + ", which does not exist");
                }
                if (q.intValue() == r.intValue()) {
                    throw fail(graph, at, "the partition of region " + part.region() + " has the region itself as a part");
                }
                resolved[k] = q;
                for (int v : vars[q]) {
                    if (stamp[v] == p) {
                        throw fail(graph, at, "the parts of region " + part.region() + " overlap: variable " + v
                                + " (" + graph.variables().get(v).name() + ") is in more than one; expected disjoint parts");
                    }
                    stamp[v] = p;
                    if (member[v] != p) {
                        throw fail(graph, at, "part " + parts[k] + " has variable " + v + " ("
                                + graph.variables().get(v).name() + "), which is not in region " + part.region()
                                + "; expected parts that together equal the region");
                    }
                    covered++;
                }
            }
            if (covered != vars[r].length) {
                throw fail(graph, at, "the parts of region " + part.region() + " cover " + covered + " of its "
                        + Counts.of(vars[r].length, "variable") + "; expected parts that together equal the region");
            }
            partitionRegion[p] = r;
            partitionParts[p] = resolved;
            partitionCount[r]++;
            for (int q : resolved) {
                partCount[q]++;
            }
        }
        int root = -1;
        for (int r = 0; r < nr; r++) {
            if (partCount[r] == 0) {
                if (root >= 0) {
                    throw fail(graph, graph.regionLocation(r), "regions " + ids[root] + " and " + ids[r]
                            + " are both roots (the part of no partition); expected exactly one root");
                }
                root = r;
            }
        }
        if (root < 0) {
            throw fail(graph, graph.location("/regions"),
                    "every region is the part of some partition, so there is no root and the graph has a cycle");
        }
        if (vars[root].length != nv) {
            throw fail(graph, graph.regionLocation(root), "the root region " + ids[root] + " has " + vars[root].length
                    + " of the " + nv + " variables; expected all of them");
        }
        int[][] partitionsOf = new int[nr][];
        for (int r = 0; r < nr; r++) {
            partitionsOf[r] = new int[partitionCount[r]];
        }
        int[] fill = new int[nr];
        for (int p = 0; p < np; p++) {
            int r = partitionRegion[p];
            partitionsOf[r][fill[r]++] = p;
        }
        int[] order = postOrder(graph, ids, partitionsOf, partitionParts, root, nr);
        return new RegionStructure(graph, ids, vars, partitionRegion, partitionParts, partitionsOf, root, order);
    }

    /**
     * Depth-first post-order from the root (parts of partitions in document order), with an explicit
     * stack; a region met again while on the stack is a cycle, one never met is unreachable.
     */
    private static int[] postOrder(RegionGraph graph, int[] ids, int[][] partitionsOf, int[][] parts, int root, int nr)
            throws FormatException {
        final int unseen = 0;
        final int open = 1;
        final int done = 2;
        byte[] state = new byte[nr];
        int[] order = new int[nr];
        int n = 0;
        int[] stackRegion = new int[16];
        int[] stackNext = new int[16];
        int top = 0;
        stackRegion[0] = root;
        stackNext[0] = 0;
        state[root] = open;
        top = 1;
        while (top > 0) {
            int r = stackRegion[top - 1];
            int next = stackNext[top - 1];
            int child = -1;
            int[] ps = partitionsOf[r];
            int seen = 0;
            for (int p : ps) {
                if (next < seen + parts[p].length) {
                    child = parts[p][next - seen];
                    break;
                }
                seen += parts[p].length;
            }
            if (child < 0) {
                state[r] = done;
                order[n++] = r;
                top--;
                continue;
            }
            stackNext[top - 1] = next + 1;
            if (state[child] == open) {
                throw fail(graph, graph.regionLocation(child), "region " + ids[child]
                        + " is a part of a region below it: the graph has a cycle");
            }
            if (state[child] == unseen) {
                state[child] = open;
                if (top == stackRegion.length) {
                    stackRegion = Arrays.copyOf(stackRegion, top * 2);
                    stackNext = Arrays.copyOf(stackNext, top * 2);
                }
                stackRegion[top] = child;
                stackNext[top] = 0;
                top++;
            }
        }
        for (int r = 0; r < nr; r++) {
            if (state[r] != done) {
                throw fail(graph, graph.regionLocation(r), "region " + ids[r]
                        + " cannot be reached from the root region " + ids[root] + "; expected every region reachable");
            }
        }
        return order;
    }

    private static void checkVariables(RegionGraph graph) throws FormatException {
        Map<String, Integer> names = new HashMap<>();
        List<Variable> vars = graph.variables();
        for (int i = 0; i < vars.size(); i++) {
            Variable v = vars.get(i);
            SourceLocation at = graph.location("/variables/" + i);
            if (v.name().isEmpty()) {
                throw fail(graph, at, "variable " + i + " has an empty name; expected a non-empty, unique name");
            }
            Integer prev = names.putIfAbsent(v.name(), i);
            if (prev != null) {
                throw fail(graph, at, "the variable name \"" + v.name() + "\" is used by variables " + prev + " and " + i
                        + "; expected unique names");
            }
            int states = v.states().size();
            boolean unique = new java.util.HashSet<>(v.states()).size() == states;
            if (v.type() == dev.circa.format.VariableType.CATEGORICAL && (states < 2 || !unique)) {
                throw fail(graph, at, "categorical variable \"" + v.name() + "\" has " + states
                        + (unique ? "" : " (not unique)") + (states == 1 ? " state" : " states") + "; expected at least 2 unique state labels");
            }
            if (v.type() == dev.circa.format.VariableType.BINARY && (states != 0 && states != 2 || !unique)) {
                throw fail(graph, at, "binary variable \"" + v.name() + "\" has " + states
                        + " state labels; expected none or 2 unique labels");
            }
        }
    }

    private static FormatException fail(RegionGraph g, SourceLocation at, String problem) {
        return new FormatException(g.source(), at.line(), at.column(), at.pointer(), problem);
    }

    /** The graph this structure was checked from. */
    public RegionGraph graph() {
        return graph;
    }

    /** The variables, by index. */
    public List<Variable> variables() {
        return graph.variables();
    }

    /** Number of regions. */
    public int regionCount() {
        return ids.length;
    }

    /** The id of region {@code r} (its position in the document). */
    public int id(int r) {
        return ids[r];
    }

    /** The sorted variable indices of region {@code r}; callers must not modify. */
    public int[] vars(int r) {
        return vars[r];
    }

    /** The position of the root region. */
    public int root() {
        return root;
    }

    /** Whether region {@code r} is the region of no partition. */
    public boolean isLeaf(int r) {
        return partitionsOf[r].length == 0;
    }

    /** The partitions of region {@code r} in document order; callers must not modify. */
    public int[] partitionsOf(int r) {
        return partitionsOf[r];
    }

    /** Number of partitions. */
    public int partitionCount() {
        return partitionRegion.length;
    }

    /** The region that partition {@code p} splits. */
    public int partitionRegion(int p) {
        return partitionRegion[p];
    }

    /** The parts of partition {@code p} (region positions, in document order); callers must not modify. */
    public int[] parts(int p) {
        return partitionParts[p];
    }

    /** Every region, children before parents (depth-first post-order from the root); callers must not modify. */
    public int[] order() {
        return order;
    }
}

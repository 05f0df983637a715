package dev.circa.validator.rules;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.Node;
import dev.circa.format.NodeTable;
import dev.circa.format.SourceLocation;
import dev.circa.validator.Diagnostic;
import dev.circa.validator.Property;
import dev.circa.validator.RuleSetting;
import dev.circa.validator.SchemaFinding;
import dev.circa.validator.Severity;
import dev.circa.validator.ValidationOptions;
import dev.circa.validator.Verdict;
import dev.circa.validator.analysis.Determinism;
import dev.circa.validator.analysis.Graph;
import dev.circa.validator.analysis.LogPartition;
import dev.circa.validator.analysis.Parameters;
import dev.circa.validator.analysis.Scopes;
import dev.circa.validator.analysis.TreeFinder;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;

/**
 * What the rules see of one validation: the document, the options, the shared analyses (computed
 * once, on first use) and the sink for diagnostics, which applies {@code --rule} settings and keeps
 * at most {@value #MAX_PER_RULE} diagnostics per rule, {@value #MAX_INFO_PER_RULE} of severity info
 * (then one saying how many more there were).
 * Made by {@link dev.circa.validator.Validator}; not for application code.
 */
public final class RuleContext {
    private static final String SCHEMA_RULE = "SchemaMismatch";

    /** Most diagnostics kept per rule. */
    public static final int MAX_PER_RULE = 100;
    /** Most {@link Severity#INFO} diagnostics kept per rule (witnesses of properties not required). */
    public static final int MAX_INFO_PER_RULE = 3;

    private final CircuitDocument doc;
    private final ValidationOptions options;
    private final List<Diagnostic> diagnostics = new ArrayList<>();
    private final Map<String, int[]> counts = new HashMap<>();
    private final Map<String, Rule> lastRule = new HashMap<>();
    private Graph graph;
    private Scopes scopes;
    private boolean scopesDone;
    private Parameters parameters;
    private Determinism determinism;
    private boolean determinismDone;
    private TreeFinder.Result tree;
    private double[] logZ;
    private boolean logZDone;
    private boolean[] reachable;
    private boolean prepared;
    private List<SchemaFinding> schemaFindings = List.of();

    public RuleContext(CircuitDocument doc, ValidationOptions options) {
        this.doc = doc;
        this.options = options;
    }

    public CircuitDocument document() {
        return doc;
    }

    public ValidationOptions options() {
        return options;
    }

    /** Findings of the schema check, set by the validator before the rules run. */
    public void schemaFindings(List<SchemaFinding> findings) {
        this.schemaFindings = List.copyOf(findings);
    }

    /** Findings of the schema check (empty when it did not run). */
    public List<SchemaFinding> schemaFindings() {
        return schemaFindings;
    }

    /** The location of {@code pointer}: the node's line and column inside a node, else the nearest recorded member. */
    public SourceLocation locate(String pointer) {
        if (pointer.startsWith("/nodes/")) {
            int end = pointer.indexOf('/', 7);
            String num = end < 0 ? pointer.substring(7) : pointer.substring(7, end);
            try {
                int i = Integer.parseInt(num);
                if (i >= 0 && i < doc.nodeTable().size()) {
                    SourceLocation l = doc.nodeLocation(i);
                    return new SourceLocation(pointer, l.line(), l.column());
                }
            } catch (NumberFormatException e) {
                // not a node index: fall through to the recorded members
            }
        }
        String p = pointer;
        while (!p.isEmpty()) {
            SourceLocation l = doc.location(p);
            if (l.hasLineColumn()) {
                return new SourceLocation(pointer, l.line(), l.column());
            }
            p = p.substring(0, Math.max(0, p.lastIndexOf('/')));
        }
        return SourceLocation.of(pointer);
    }

    /** The family of node {@code i} when it is an input, else {@code null} (no record made). */
    public Family family(int i) {
        return doc.nodeTable().family(i);
    }

    /**
     * Node {@code i} as a record when it is an input (an {@link dev.circa.format.InputNode}), else {@code null}:
     * products and sums are read from the table without a record.
     */
    public Node input(int i) {
        NodeTable t = doc.nodeTable();
        return t.kind(i) == NodeTable.INPUT ? t.node(i) : null;
    }

    /**
     * Computes the shared analyses now (what the rules would compute on first use, with the same
     * results), so that they can run while something else, such as the schema check, finishes.
     */
    public void prepare() {
        if (prepared) {
            return;
        }
        prepared = true;
        // on two cores: the parameter facts beside the references, then reachability beside the scopes,
        // then the variable tree and log Z beside determinism (each analysis only reads those it depends
        // on, all computed before its task is handed over)
        CompletableFuture<Void> facts = CompletableFuture.runAsync(this::parameters);
        graph();
        CompletableFuture<Void> reach = facts.thenRunAsync(this::reachable);
        scopes();
        join(facts);
        CompletableFuture<Void> treeAndZ = reach.thenRunAsync(() -> {
            tree();
            logPartition();
        });
        determinism();
        join(treeAndZ);
    }

    private static void join(CompletableFuture<Void> f) {
        try {
            f.join();
        } catch (CompletionException e) {
            if (e.getCause() instanceof RuntimeException r) {
                throw r;
            }
            if (e.getCause() instanceof Error r) {
                throw r;
            }
            throw e;
        }
    }

    /** The resolved references. */
    public Graph graph() {
        if (graph == null) {
            graph = Graph.of(doc);
        }
        return graph;
    }

    /** Scopes, or {@code null} when references are broken. */
    public Scopes scopes() {
        if (!scopesDone) {
            scopesDone = true;
            scopes = graph().usable() ? Scopes.of(graph()) : null;
        }
        return scopes;
    }

    /** Parameter problems. */
    public Parameters parameters() {
        if (parameters == null) {
            parameters = Parameters.of(doc, options.tolerance());
        }
        return parameters;
    }

    /** Determinism per sum, or {@code null} when references or parameters are broken. */
    public Determinism determinism() {
        if (!determinismDone) {
            determinismDone = true;
            determinism = scopes() != null && !parameters().anyProblem() && graph().familyTypes.isEmpty()
                    && graph().repeatedVars.isEmpty()
                    ? Determinism.of(graph(), scopes(), parameters(), options.maxEnumeration()) : null;
        }
        return determinism;
    }

    /** The variable tree search, or {@code null} when references are broken. */
    public TreeFinder.Result tree() {
        if (tree == null && scopes() != null) {
            tree = TreeFinder.find(graph(), scopes());
        }
        return tree;
    }

    /** log Z per node when smooth, decomposable and every parameter valid, else {@code null}. */
    public double[] logPartition() {
        if (!logZDone) {
            logZDone = true;
            Scopes s = scopes();
            if (s != null && s.nonSmooth.isEmpty() && s.overlapping.isEmpty() && !parameters().anyProblem()
                    && graph().familyTypes.isEmpty() && graph().repeatedVars.isEmpty()) {
                logZ = LogPartition.of(graph());
            }
        }
        return logZ;
    }

    /** log Z of output {@code o}, or NaN when not computed. */
    public double outputLogPartition(int o) {
        double[] z = logPartition();
        return z == null ? Double.NaN : z[graph().outputNode(o)];
    }

    /** Whether every output's |log Z| is within the tolerance (false when unknown). */
    public boolean outputsNormalized() {
        if (logPartition() == null) {
            return false;
        }
        for (int o = 0; o < graph().outputCount(); o++) {
            if (!(Math.abs(outputLogPartition(o)) <= options.tolerance())) {
                return false;
            }
        }
        return true;
    }

    /** Nodes reachable from some output (over resolved references). */
    public boolean[] reachable() {
        if (reachable == null) {
            Graph g = graph();
            boolean[] r = new boolean[g.size()];
            for (int o = 0; o < g.outputCount(); o++) {
                if (g.outputNode(o) >= 0) {
                    r[g.outputNode(o)] = true;
                }
            }
            for (int i = g.size() - 1; i >= 0; i--) {
                if (r[i]) {
                    for (int e = g.childStart(i); e < g.childEnd(i); e++) {
                        int c = g.child(e);
                        if (c >= 0 && c < i) {
                            r[c] = true;
                        }
                    }
                }
            }
            reachable = r;
        }
        return reachable;
    }

    /** The verdict on {@code p}. */
    public Verdict verdict(Property p) {
        switch (p) {
            case SMOOTH -> {
                return scopes() == null ? Verdict.UNKNOWN : Verdict.of(scopes().nonSmooth.isEmpty());
            }
            case DECOMPOSABLE -> {
                return scopes() == null ? Verdict.UNKNOWN : Verdict.of(scopes().overlapping.isEmpty());
            }
            case DETERMINISTIC -> {
                Determinism d = determinism();
                if (d == null) {
                    return Verdict.UNKNOWN;
                }
                return !d.falseSums().isEmpty() ? Verdict.FALSE : d.unknownSums() > 0 ? Verdict.UNKNOWN : Verdict.TRUE;
            }
            case STRUCTURED_DECOMPOSABLE -> {
                TreeFinder.Result t = tree();
                return t == null ? Verdict.UNKNOWN : Verdict.of(t.tree() != null);
            }
            case NORMALIZED -> {
                return logPartition() == null ? Verdict.UNKNOWN : Verdict.of(outputsNormalized());
            }
            default -> throw new IllegalStateException(p.name());
        }
    }

    /** {@link Severity#ERROR} when {@code p} is required, else {@link Severity#INFO} (CLI.md, {@code --require}). */
    public Severity propertySeverity(Property p) {
        return options.require().contains(p) ? Severity.ERROR : Severity.INFO;
    }

    /** Reports on node {@code index} (pointer {@code /nodes/INDEX}, or a member of it when {@code member} is given). */
    public void atNode(Rule rule, Severity s, int index, String member, String message) {
        SourceLocation l = doc.nodeLocation(index);
        String ptr = member == null ? l.pointer() : l.pointer() + "/" + member;
        emit(rule, new Diagnostic(rule.id(), s, message, ptr, doc.nodeTable().id(index), l.line(), l.column()));
    }

    /** Reports on the member at {@code pointer} (not a node). */
    public void at(Rule rule, Severity s, String pointer, String message) {
        SourceLocation l = doc.location(pointer);
        if (pointer.isEmpty() && doc.nodeTable().size() > 0 && doc.nodeLocation(0).hasLineColumn()) {
            // the document itself starts at the top of the text
            l = new SourceLocation("", 1, 1);
        }
        emit(rule, new Diagnostic(rule.id(), s, message, pointer, null, l.line(), l.column()));
    }

    /** Reports at a known location. */
    public void at(Rule rule, Severity s, SourceLocation l, String message) {
        emit(rule, new Diagnostic(rule.id(), s, message, l.pointer(), null, l.line(), l.column()));
    }

    /**
     * Whether a diagnostic of {@code rule} with severity {@code s} would be dropped (rule off, or
     * {@value #MAX_PER_RULE} already kept); a dropped one is still counted. Rules call it before
     * building a message, so that a million findings cost a million counts, not a million messages.
     */
    public boolean skip(Rule rule, Severity s) {
        RuleSetting setting = options.ruleSettings().get(rule.id());
        if (setting == RuleSetting.OFF) {
            return true;
        }
        int[] c = counts.get(rule.id());
        Severity eff = effective(setting, s);
        if (c == null || c[0] < cap(eff)) {
            return false;
        }
        countDropped(c, eff, 1);
        return true;
    }

    /**
     * Counts {@code more} diagnostics of {@code rule} with severity {@code s} as dropped, as that many
     * further calls of {@link #skip} would once it has returned true (it then returns true for the rest of
     * the rule's findings): a rule with many findings counts the ones after the first dropped at once.
     */
    public void skipAlso(Rule rule, Severity s, int more) {
        RuleSetting setting = options.ruleSettings().get(rule.id());
        int[] c = counts.get(rule.id());
        if (setting == RuleSetting.OFF || more <= 0 || c == null) {
            return;
        }
        countDropped(c, effective(setting, s), more);
    }

    /** The severity a finding of severity {@code s} is reported with under the rule's {@code --rule} setting. */
    private static Severity effective(RuleSetting setting, Severity s) {
        return setting == RuleSetting.WARN ? Severity.WARNING : setting == RuleSetting.ERROR ? Severity.ERROR : s;
    }

    /** Counts {@code n} dropped diagnostics of severity {@code eff} in a rule's counts. */
    private static void countDropped(int[] c, Severity eff, int n) {
        c[0] += n;
        c[1] = Math.min(c[1], eff.ordinal() + 1);
        c[2] = 1;
    }

    private void emit(Rule rule, Diagnostic d) {
        RuleSetting setting = options.ruleSettings().get(rule.id());
        if (setting == RuleSetting.OFF) {
            return;
        }
        Severity eff = effective(setting, d.severity());
        if (eff != d.severity()) {
            d = d.withSeverity(eff);
        }
        int[] c = counts.computeIfAbsent(rule.id(), k -> new int[3]);
        c[0]++;
        if (c[0] <= cap(d.severity())) {
            diagnostics.add(d);
        } else {
            c[2] = 1;
        }
        int worst = c[1] == 0 ? d.severity().ordinal() + 1 : Math.min(c[1], d.severity().ordinal() + 1);
        c[1] = worst;
        lastRule.put(rule.id(), rule);
    }

    private static int cap(Severity s) {
        return s == Severity.INFO ? MAX_INFO_PER_RULE : MAX_PER_RULE;
    }

    /** Every diagnostic kept, with one summary per rule that had more than it kept. */
    public List<Diagnostic> diagnostics() {
        // a schema finding at a pointer where a more specific rule has spoken adds nothing
        java.util.Set<String> specific = new java.util.HashSet<>();
        for (Diagnostic d : diagnostics) {
            if (!d.code().equals(SCHEMA_RULE)) {
                specific.add(d.pointer());
            }
        }
        List<Diagnostic> all = new ArrayList<>(diagnostics.size());
        for (Diagnostic d : diagnostics) {
            if (!d.code().equals(SCHEMA_RULE) || !specific.contains(d.pointer())) {
                all.add(d);
            }
        }
        for (Map.Entry<String, int[]> e : counts.entrySet()) {
            int[] c = e.getValue();
            if (c[2] != 0 || c[0] > MAX_PER_RULE) {
                int kept = 0;
                for (Diagnostic d : diagnostics) {
                    kept += d.code().equals(e.getKey()) ? 1 : 0;
                }
                all.add(new Diagnostic(e.getKey(), Severity.values()[c[1] - 1], String.format(Locale.ROOT,
                        "%d more diagnostics of this rule not shown (%d in all)", c[0] - kept, c[0]),
                        "", null, 0, 0));
            }
        }
        return all;
    }

    /** Short text naming node index {@code i} by its id, e.g. {@code node 7}. */
    public String name(int i) {
        return "node " + doc.nodeTable().id(i);
    }
}

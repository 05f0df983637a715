package dev.circa.validator;

import dev.circa.format.CircuitDocument;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import dev.circa.format.io.CircuitWriter;
import dev.circa.format.io.FormatException;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.stream.Stream;

/**
 * A fixed corpus of circuit texts and the full account the validator (with the bundled schema check)
 * gives of each, as one line per fact: verdict, properties, log Z, statistics and every diagnostic
 * with its code, severity, pointer, node, line, column and message. The corpus: every circuit
 * document under {@code fixtures/}, and seeded random circuits ({@link RandomCircuits}) each written
 * to text after one seeded defect (a negative or unnormalised weight, a missing, later or dropped
 * child, a duplicate id, an out-of-range parameter or variable, a missing output, a shared variable
 * in a product). {@code validator/src/test/resources/dev/circa/validator/findings-golden.txt} holds
 * this account as written by the validator before the circuit's nodes moved into flat columns
 * (commit f4e4ced, by {@link #main}), each
 * validated from a file as {@code circa validate --schema-check always} does; {@code FindingsGoldenTest} requires the same account today.
 * Uses only API that both versions have.
 */
final class FindingsCorpus {
    /** Random circuits in the corpus. */
    static final int RANDOM = 120;

    private FindingsCorpus() {
    }

    /** Writes the account of the corpus under the fixtures directory {@code args[0]} to {@code args[1]}. */
    public static void main(String[] args) throws IOException {
        Files.writeString(Path.of(args[1]), account(Path.of(args[0]), Files.createTempDirectory("findings")),
                StandardCharsets.UTF_8);
    }

    /** The account of the whole corpus, each document validated from a file in {@code scratch}. */
    static String account(Path fixtures, Path scratch) throws IOException {
        Validator v = new Validator(ValidationOptions.defaults(), SchemaCheck.BUNDLED);
        StringBuilder out = new StringBuilder();
        FindingsCorpus.scratch = scratch;
        List<Path> files;
        try (Stream<Path> s = Files.walk(fixtures)) {
            files = s.filter(p -> p.toString().endsWith(".json")).sorted().toList();
        }
        for (Path f : files) {
            String text = Files.readString(f, StandardCharsets.UTF_8);
            if (!text.contains("\"circa.circuit\"")) {
                continue;
            }
            describe(v, fixtures.relativize(f).toString().replace('\\', '/'), text, out);
        }
        for (int c = 0; c < RANDOM; c++) {
            Random rnd = new Random(9000 + c);
            CircuitDocument doc = new RandomCircuits(9000 + c).generate(3 + c % 6, 2 + c % 3);
            List<Node> nodes = new ArrayList<>(doc.nodes());
            List<Output> outputs = doc.outputs();
            String defect = defect(c % 10, nodes, rnd);
            if (defect.equals("missing output")) {
                outputs = List.of(new Output("joint", Integer.MAX_VALUE - 1));
            }
            CircuitDocument broken = CircuitDocument.builder().variables(doc.variables()).nodes(nodes).outputs(outputs).build();
            ByteArrayOutputStream bytes = new ByteArrayOutputStream();
            new CircuitWriter().write(broken, bytes);
            describe(v, "random-" + c + " (" + defect + ")", bytes.toString(StandardCharsets.UTF_8), out);
        }
        return out.toString();
    }

    private static Path scratch;

    private static void describe(Validator v, String name, String text, StringBuilder out) throws IOException {
        out.append("== ").append(name).append('\n');
        Path file = scratch.resolve("circuit.json");
        Files.writeString(file, text, StandardCharsets.UTF_8);
        ValidationReport r;
        try {
            r = v.validate(file);
        } catch (FormatException e) {
            out.append("unreadable: ").append(e.getMessage().replace(file.toString(), "circuit.json")).append('\n');
            return;
        }
        out.append("valid ").append(r.valid()).append(' ').append(r.stats()).append('\n');
        out.append("properties ").append(r.properties()).append('\n');
        if (r.logPartition() != null) {
            for (Map.Entry<String, Double> e : r.logPartition().entrySet()) {
                out.append("logZ ").append(e.getKey()).append(' ').append(e.getValue()).append('\n');
            }
        }
        for (Diagnostic d : r.diagnostics()) {
            out.append(d.code()).append(" | ").append(d.severity()).append(" | ").append(d.pointer()).append(" | ")
                    .append(d.node()).append(" | ").append(d.line()).append(':').append(d.column()).append(" | ")
                    .append(d.message()).append('\n');
        }
    }

    /** Applies defect {@code kind} to a random node of {@code nodes}; returns its name. */
    private static String defect(int kind, List<Node> nodes, Random rnd) {
        List<Integer> sums = new ArrayList<>();
        List<Integer> products = new ArrayList<>();
        List<Integer> inputs = new ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            Node n = nodes.get(i);
            (n instanceof SumNode ? sums : n instanceof ProductNode ? products : inputs).add(i);
        }
        switch (kind) {
            case 0 -> {
                return "none";
            }
            case 1 -> {
                if (sums.isEmpty()) {
                    return "none";
                }
                int i = sums.get(rnd.nextInt(sums.size()));
                SumNode s = (SumNode) nodes.get(i);
                double[] w = s.weights().clone();
                w[0] = s.logWeights() ? w[0] + 0.5 : -w[0];
                nodes.set(i, new SumNode(s.id(), s.label(), s.children(), w, s.logWeights()));
                return s.logWeights() ? "log-weights not normalized" : "negative weight";
            }
            case 2 -> {
                int i = (sums.isEmpty() ? products : sums).get(0);
                Node n = nodes.get(i);
                int[] ch = n.children().clone();
                ch[ch.length - 1] = Integer.MAX_VALUE - 3;
                nodes.set(i, n instanceof SumNode s ? new SumNode(s.id(), s.label(), ch, s.weights(), s.logWeights())
                        : new ProductNode(n.id(), n.label(), ch));
                return "missing child";
            }
            case 3 -> {
                int last = nodes.size() - 1;
                Node n = nodes.remove(last - 1);
                nodes.add(n);
                return "later child";
            }
            case 4 -> {
                int i = rnd.nextInt(nodes.size() - 1) + 1;
                Node n = nodes.get(i);
                int id = nodes.get(0).id();
                nodes.set(i, n instanceof SumNode s ? new SumNode(id, s.label(), s.children(), s.weights(), s.logWeights())
                        : n instanceof ProductNode p ? new ProductNode(id, p.label(), p.children())
                        : new InputNode(id, n.label(), ((InputNode) n).family(), ((InputNode) n).vars(),
                                ((InputNode) n).params(), ((InputNode) n).logForm()));
                return "duplicate id";
            }
            case 5 -> {
                if (sums.isEmpty()) {
                    return "none";
                }
                int i = sums.get(rnd.nextInt(sums.size()));
                SumNode s = (SumNode) nodes.get(i);
                int[] ch = java.util.Arrays.copyOf(s.children(), s.children().length + 1);
                ch[ch.length - 1] = nodes.get(0).id();
                nodes.set(i, new SumNode(s.id(), s.label(), ch, s.weights(), s.logWeights()));
                return "extra child, no weight";
            }
            case 6 -> {
                int i = inputs.get(rnd.nextInt(inputs.size()));
                InputNode in = (InputNode) nodes.get(i);
                double[] p = in.params().clone();
                p[p.length - 1] = -2.5;
                nodes.set(i, new InputNode(in.id(), in.label(), in.family(), in.vars(), p, in.logForm()));
                return "parameter -2.5";
            }
            case 7 -> {
                int i = inputs.get(rnd.nextInt(inputs.size()));
                InputNode in = (InputNode) nodes.get(i);
                int[] vars = in.vars().clone();
                vars[0] = 99;
                nodes.set(i, new InputNode(in.id(), in.label(), in.family(), vars, in.params(), in.logForm()));
                return "variable out of range";
            }
            case 8 -> {
                return "missing output";
            }
            default -> {
                if (products.isEmpty()) {
                    return "none";
                }
                int i = products.get(rnd.nextInt(products.size()));
                ProductNode p = (ProductNode) nodes.get(i);
                int[] ch = java.util.Arrays.copyOf(p.children(), p.children().length + 1);
                ch[ch.length - 1] = ch[0];
                nodes.set(i, new ProductNode(p.id(), p.label(), ch));
                return "product child twice";
            }
        }
    }
}

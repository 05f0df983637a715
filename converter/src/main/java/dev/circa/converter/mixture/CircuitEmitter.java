package dev.circa.converter.mixture;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Family;
import dev.circa.format.InputNode;
import dev.circa.format.Node;
import dev.circa.format.Output;
import dev.circa.format.ProductNode;
import dev.circa.format.Provenance;
import dev.circa.format.SumNode;
import dev.circa.format.mixture.Expression;
import dev.circa.format.mixture.GaussianMixtureExpr;
import dev.circa.format.mixture.InputExpr;
import dev.circa.format.mixture.MixtureDocument;
import dev.circa.format.mixture.MixtureExpr;
import dev.circa.format.mixture.ProductExpr;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Writes the circuit of a checked mixture document: one node (or a few, for a split Gaussian) per
 * item, children first, ids 0..n-1; a definition's item is emitted once and shared by every use.
 * Not for application code.
 */
final class CircuitEmitter {
    /** The producer written in the provenance of converted circuits. */
    static final String PRODUCER = "circa 0.1.0";

    private final List<Node> nodes = new ArrayList<>();

    private CircuitEmitter() {
    }

    static CircuitDocument emit(CheckedModel model) {
        return new CircuitEmitter().run(model);
    }

    private CircuitDocument run(CheckedModel model) {
        ModelGraph g = model.graph();
        MixtureDocument doc = g.document();
        int[] nodeOf = new int[g.size()];
        for (int i = 0; i < g.size(); i++) {
            Expression e = g.items().get(i);
            String label = e.label() != null ? e.label() : g.definitionName(e);
            int[] kids = g.children(i);
            int[] childNodes = new int[kids.length];
            for (int j = 0; j < kids.length; j++) {
                childNodes[j] = nodeOf[kids[j]];
            }
            if (e instanceof InputExpr in) {
                if (in.family() == Family.MVNORMAL) {
                    int d = in.vars().length;
                    double[] mean = java.util.Arrays.copyOfRange(in.params(), 0, d);
                    double[] cov = java.util.Arrays.copyOfRange(in.params(), d, d + d * d);
                    nodeOf[i] = gaussian(label, in.vars(), mean, cov);
                } else {
                    nodeOf[i] = add(new InputNode(nodes.size(), label, in.family(), in.vars().clone(),
                            in.params().clone(), false));
                }
            } else if (e instanceof GaussianMixtureExpr gm) {
                int[] comps = new int[gm.components()];
                for (int c = 0; c < comps.length; c++) {
                    comps[c] = gaussian(null, gm.vars(), gm.means()[c], gm.covariances()[c]);
                }
                nodeOf[i] = add(new SumNode(nodes.size(), label, comps, model.weights(i).clone(), false));
            } else if (e instanceof ProductExpr) {
                nodeOf[i] = add(new ProductNode(nodes.size(), label, childNodes));
            } else if (e instanceof MixtureExpr) {
                nodeOf[i] = add(new SumNode(nodes.size(), label, childNodes, model.weights(i).clone(), false));
            } else {
                throw new IllegalStateException("unexpected item " + e);
            }
        }
        String source = doc.source() == null ? "a mixture document"
                : "converted from the mixture document " + fileName(doc.source());
        return CircuitDocument.builder()
                .name(doc.name())
                .description(doc.description())
                .provenance(new Provenance(PRODUCER, null, source))
                .variables(doc.variables())
                .nodes(nodes)
                .outputs(List.of(new Output("joint", nodeOf[g.root()])))
                .build();
    }

    /** How many covariances of {@code model} (mvnormal inputs and Gaussian-mixture components) split into blocks. */
    static int splitCount(CheckedModel model) {
        int count = 0;
        for (Expression e : model.graph().items()) {
            if (e instanceof InputExpr in && in.family() == Family.MVNORMAL) {
                int d = in.vars().length;
                if (BlockSplit.blocks(java.util.Arrays.copyOfRange(in.params(), d, d + d * d), d).length > 1) {
                    count++;
                }
            } else if (e instanceof GaussianMixtureExpr gm) {
                for (double[] cov : gm.covariances()) {
                    if (gm.dimension() > 1 && BlockSplit.blocks(cov, gm.dimension()).length > 1) {
                        count++;
                    }
                }
            }
        }
        return count;
    }

    /** How many definitions of {@code model} are in the circuit (each as one shared node). */
    static int definitionCount(CheckedModel model) {
        int count = 0;
        for (Expression e : model.graph().items()) {
            if (model.graph().definitionName(e) != null) {
                count++;
            }
        }
        return count;
    }

    /** A normal vector as one input, or as a product of one input per independent block. */
    private int gaussian(String label, int[] vars, double[] mean, double[] cov) {
        int d = vars.length;
        int[][] blocks = BlockSplit.blocks(cov, d);
        if (blocks.length == 1) {
            return block(label, vars, mean, cov, blocks[0]);
        }
        int[] parts = new int[blocks.length];
        for (int b = 0; b < blocks.length; b++) {
            parts[b] = block(null, vars, mean, cov, blocks[b]);
        }
        return add(new ProductNode(nodes.size(), label, parts));
    }

    private int block(String label, int[] vars, double[] mean, double[] cov, int[] idx) {
        int d = vars.length;
        int k = idx.length;
        if (k == 1) {
            int i = idx[0];
            return add(new InputNode(nodes.size(), label, Family.NORMAL, new int[] {vars[i]},
                    new double[] {mean[i], Math.sqrt(cov[i * d + i])}, false));
        }
        int[] v = new int[k];
        double[] p = new double[k + k * k];
        for (int a = 0; a < k; a++) {
            v[a] = vars[idx[a]];
            p[a] = mean[idx[a]];
            for (int b = 0; b < k; b++) {
                p[k + a * k + b] = cov[idx[a] * d + idx[b]];
            }
        }
        return add(new InputNode(nodes.size(), label, Family.MVNORMAL, v, p, false));
    }

    private int add(Node n) {
        nodes.add(n);
        return n.id();
    }

    private static String fileName(String source) {
        try {
            Path p = Path.of(source);
            return p.getFileName() == null ? source : p.getFileName().toString();
        } catch (java.nio.file.InvalidPathException e) {
            return source;
        }
    }
}

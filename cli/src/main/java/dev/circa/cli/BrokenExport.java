package dev.circa.cli;

import dev.circa.format.CircuitDocument;
import dev.circa.format.Node;
import dev.circa.format.ProductNode;
import dev.circa.format.SumNode;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/** The deliberately broken export of {@code circa demo}: two defects the validator must catch. */
final class BrokenExport {
    private BrokenExport() {
    }

    /** A copy of {@code circuit} with one product's first child repeated and one sum's weights scaled by 1.25. */
    static CircuitDocument of(CircuitDocument circuit) {
        List<Node> nodes = new ArrayList<>(circuit.nodes());
        boolean productBroken = false;
        boolean sumBroken = false;
        for (int i = 0; i < nodes.size(); i++) {
            Node n = nodes.get(i);
            if (!productBroken && n instanceof ProductNode p && p.children().length >= 2) {
                int[] c = Arrays.copyOf(p.children(), p.children().length + 1);
                c[c.length - 1] = c[0];
                nodes.set(i, new ProductNode(p.id(), p.label(), c));
                productBroken = true;
            } else if (!sumBroken && n instanceof SumNode s && !s.logWeights()) {
                double[] w = s.weights().clone();
                for (int j = 0; j < w.length; j++) {
                    w[j] *= 1.25;
                }
                nodes.set(i, new SumNode(s.id(), s.label(), s.children(), w, false));
                sumBroken = true;
            }
        }
        return CircuitDocument.builder().name("pump-station-regimes (broken export)")
                .provenance(circuit.provenance()).variables(circuit.variables()).nodes(nodes)
                .outputs(circuit.outputs()).build();
    }
}

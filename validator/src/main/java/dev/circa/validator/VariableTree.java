package dev.circa.validator;

import java.util.ArrayDeque;
import java.util.Arrays;
import java.util.Deque;

/**
 * A variable tree (FORMAT.md, structured decomposability): leaves are variable indices, every inner
 * node has at least two children. Shown as nested arrays, e.g. {@code [[0, 1], 2]}; a tree of a
 * single variable is that variable's index.
 */
public final class VariableTree {
    private final int[][] children;
    private final int[] leafVariable;
    private final int root;

    /**
     * @param children per tree node, its child tree nodes (empty for a leaf); not copied, callers must not modify
     * @param leafVariable per tree node, the variable of a leaf, -1 for an inner node
     * @param root the root tree node
     */
    public VariableTree(int[][] children, int[] leafVariable, int root) {
        this.children = children;
        this.leafVariable = leafVariable;
        this.root = root;
    }

    /** The root tree node. */
    public int root() {
        return root;
    }

    /** Number of tree nodes, leaves included. */
    public int size() {
        return children.length;
    }

    /** Child tree nodes of {@code node}; empty for a leaf. */
    public int[] children(int node) {
        return Arrays.copyOf(children[node], children[node].length);
    }

    /** The variable of leaf {@code node}, or -1 for an inner node. */
    public int variable(int node) {
        return leafVariable[node];
    }

    /** Visits the tree in the order of its nested-array form, without recursion. */
    public void write(Visitor v) {
        Deque<int[]> stack = new ArrayDeque<>();
        stack.push(new int[] {root, -1});
        while (!stack.isEmpty()) {
            int[] top = stack.peek();
            int node = top[0];
            if (top[1] < 0) {
                if (leafVariable[node] >= 0) {
                    v.leaf(leafVariable[node]);
                    stack.pop();
                    continue;
                }
                v.startInner();
                top[1] = 0;
            }
            if (top[1] < children[node].length) {
                int child = children[node][top[1]++];
                stack.push(new int[] {child, -1});
            } else {
                v.endInner();
                stack.pop();
            }
        }
    }

    /** Receives a tree in nested-array order. */
    public interface Visitor {
        void startInner();

        void leaf(int variable);

        void endInner();
    }

    /** The nested-array form, e.g. {@code [[0, 1], 2]}. */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder();
        boolean[] first = {true};
        write(new Visitor() {
            @Override
            public void startInner() {
                sep();
                sb.append('[');
                first[0] = true;
            }

            @Override
            public void leaf(int variable) {
                sep();
                sb.append(variable);
                first[0] = false;
            }

            @Override
            public void endInner() {
                sb.append(']');
                first[0] = false;
            }

            private void sep() {
                if (!first[0]) {
                    sb.append(", ");
                }
            }
        });
        return sb.toString();
    }
}

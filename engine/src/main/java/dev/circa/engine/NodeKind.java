package dev.circa.engine;

/** The kind of a compiled node. */
public enum NodeKind {
    /** A distribution over one or more variables. */
    INPUT,
    /** The product of its children. */
    PRODUCT,
    /** The weighted sum of its children. */
    SUM
}

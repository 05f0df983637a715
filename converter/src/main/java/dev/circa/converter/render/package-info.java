/**
 * Pictures of circuits: Graphviz DOT of the structure, node by node or, for large circuits, a
 * summary by scope. Used by {@code circa render}.
 */
package dev.circa.converter.render;

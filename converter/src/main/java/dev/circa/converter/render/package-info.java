/**
 * Pictures of circuits: Graphviz DOT of the structure, node by node or, for large circuits, a
 * summary by scope ({@code InternedScopes}: each node's scope, equal scopes shared). Used by {@code circa render}.
 */
package dev.circa.converter.render;

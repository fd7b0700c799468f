package dev.termgate.engine;

import java.util.List;

/** A path: {@code nodes.size() == rels.size() + 1}, in traversal order. */
public record PathValue(List<NodeValue> nodes, List<RelValue> rels) {
    public PathValue {
        nodes = List.copyOf(nodes);
        rels = List.copyOf(rels);
    }
}

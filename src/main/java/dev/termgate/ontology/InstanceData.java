package dev.termgate.ontology;

import dev.termgate.diag.Diagnostic;

import java.util.List;

/**
 * RDF instance data mapped through a schema. Nodes are sorted by id and edges by (from, type, to), so the same
 * data always gives the same result; {@code problems} report every statement that was not imported, by term.
 */
public record InstanceData(List<DataNode> nodes, List<DataEdge> edges, List<Diagnostic> problems) {
    public InstanceData {
        nodes = List.copyOf(nodes);
        edges = List.copyOf(edges);
        problems = List.copyOf(problems);
    }
}

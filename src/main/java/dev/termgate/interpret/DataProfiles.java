package dev.termgate.interpret;

import dev.termgate.ontology.DataEdge;
import dev.termgate.ontology.DataNode;
import dev.termgate.ontology.InstanceData;
import dev.termgate.schema.GraphSchema;

import java.util.Collection;
import java.util.List;
import java.util.Map;
import java.util.function.Function;

/** Ways to read a {@link DataProfile}: from RDF instance data, or by asking the graph itself two read queries. */
public final class DataProfiles {

    /** Every node with its labels and properties. */
    public static final String NODES_QUERY = "MATCH (n) RETURN labels(n) AS labels, properties(n) AS props";
    /** Every relationship with its type and the ids of its ends. */
    public static final String RELATIONSHIPS_QUERY = "MATCH (a)-[r]->(b) RETURN type(r) AS type, id(a) AS source, id(b) AS target";

    private DataProfiles() {}

    public static DataProfile of(InstanceData data, GraphSchema schema) {
        DataProfile.Builder b = DataProfile.builder(schema);
        for (DataNode n : data.nodes()) {
            if (!n.labels().isEmpty()) b.node(n.labels(), n.properties());
        }
        for (DataEdge e : data.edges()) b.rel(e.type(), e.from(), e.to());
        return b.build();
    }

    /**
     * Reads the profile through a query runner (embedded or remote alike): {@link #NODES_QUERY} and
     * {@link #RELATIONSHIPS_QUERY}, rows as plain values (lists and maps).
     */
    public static DataProfile byQueries(Function<String, List<List<Object>>> run, GraphSchema schema) {
        DataProfile.Builder b = DataProfile.builder(schema);
        for (List<Object> row : run.apply(NODES_QUERY)) {
            if (row.size() < 2 || !(row.get(0) instanceof Collection<?> labels) || labels.isEmpty()) continue;
            @SuppressWarnings("unchecked")
            Map<String, Object> props = row.get(1) instanceof Map<?, ?> m ? (Map<String, Object>) m : Map.of();
            b.node(labels.stream().map(String::valueOf).toList(), props);
        }
        for (List<Object> row : run.apply(RELATIONSHIPS_QUERY)) {
            if (row.size() < 3 || row.get(0) == null) continue;
            b.rel(String.valueOf(row.get(0)), row.get(1), row.get(2));
        }
        return b.build();
    }
}

package dev.termgate.ontology;

import java.util.Map;
import java.util.Set;

/**
 * One resource of RDF instance data as a graph node.
 *
 * @param id         the IRI, or {@code _:label} for a blank node
 * @param labels     graph names of its classes as the data states them (superclasses are not added; the schema
 *                   knows them); empty for a resource that is only the target of a relationship
 * @param properties property key → value: {@code String}, {@code Long}, {@code Double}, {@code Boolean},
 *                   {@code java.time.LocalDate}, {@code OffsetDateTime}, {@code LocalDateTime}, {@code LocalTime},
 *                   {@code OffsetTime}, or a {@code List} of those when the data gives several values
 */
public record DataNode(String id, Set<String> labels, Map<String, Object> properties) {
    public DataNode {
        labels = Set.copyOf(labels);
        properties = Map.copyOf(properties);
    }
}

package dev.termgate.ontology;

/** One object-property statement as a relationship: {@code (from)-[:type]->(to)}, ids as in {@link DataNode}. */
public record DataEdge(String from, String type, String to) {}

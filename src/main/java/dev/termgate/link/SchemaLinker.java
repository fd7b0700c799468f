package dev.termgate.link;

import dev.termgate.schema.GraphSchema;

/** Finds the ontology terms a question needs. Implementations are thread-safe once built. */
public interface SchemaLinker {
    Linking link(String question, GraphSchema schema);
}

package dev.termgate.translate;

import dev.termgate.schema.GraphSchema;

import java.nio.file.Path;
import java.util.Optional;

/**
 * What a pipeline is built from.
 *
 * @param schema     the schema derived from the ontology ({@link GraphSchema#empty()} in schema-free mode)
 * @param schemaFree true when no ontology is used: every term is accepted
 * @param graph      a graph file to load; empty for the demo graph (when {@code remote} is empty too)
 * @param remote     a Gremlin Server URL
 * @param cardBudget token budget of a pruned card
 */
public record PipelineSpec(GraphSchema schema, boolean schemaFree, Optional<Path> graph, Optional<String> remote,
                           int cardBudget) {
    public static final int DEFAULT_BUDGET = 1_500;
}

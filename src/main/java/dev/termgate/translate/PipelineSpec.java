package dev.termgate.translate;

import java.nio.file.Path;
import java.util.List;
import java.util.Optional;

/**
 * What a pipeline is built from.
 *
 * @param ontologies ontology files; empty for the bundled demo ontology
 * @param schemaFree no ontology at all (every term accepted)
 * @param graph      a graph file to load; empty for the demo graph (when {@code remote} is empty too)
 * @param remote     a Gremlin Server URL
 * @param cardBudget token budget of a pruned card
 */
public record PipelineSpec(List<Path> ontologies, boolean schemaFree, Optional<Path> graph, Optional<String> remote,
                           int cardBudget) {
    public static final int DEFAULT_BUDGET = 1_500;

    public PipelineSpec {
        ontologies = List.copyOf(ontologies);
    }
}

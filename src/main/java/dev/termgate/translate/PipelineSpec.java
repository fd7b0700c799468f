package dev.termgate.translate;

import dev.termgate.diag.Diagnostic;
import dev.termgate.schema.GraphSchema;

import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.function.Consumer;

/**
 * What a pipeline is built from.
 *
 * @param schema          the schema derived from the ontology ({@link GraphSchema#empty()} in schema-free mode)
 * @param schemaFree      true when no ontology is used: every term is accepted
 * @param importSchema    the schema that maps RDF data to the graph when a graph is loaded (in schema-free mode
 *                        still the ontology's, so that the demo's RDF data gets its labels)
 * @param graphs          graph files to load; empty for the demo graph (when {@code remote} is empty too)
 * @param remote          a Gremlin Server URL
 * @param traversalSource the server's traversal source
 * @param cardBudget      token budget of a pruned card
 * @param loadProblems    told about what loading the graph reported (unknown terms, bad values)
 * @param cardsAhead      questions whose cards the pipeline starts building at once, while the graph loads
 */
public record PipelineSpec(GraphSchema schema, boolean schemaFree, GraphSchema importSchema, List<Path> graphs,
                           Optional<String> remote, String traversalSource, int cardBudget,
                           Consumer<Diagnostic> loadProblems, Optional<CardsAhead> cardsAhead) {
    public static final int DEFAULT_BUDGET = 1_500;
    public static final String DEFAULT_TRAVERSAL_SOURCE = "g";

    public PipelineSpec {
        graphs = List.copyOf(graphs);
    }

    /**
     * The questions a batch will ask, in order, and how many of their cards may wait built: the pipeline's card
     * source then builds them ahead (see {@link CardPrefetch}).
     */
    public record CardsAhead(List<String> questions, int window) {
        public CardsAhead {
            questions = List.copyOf(questions);
            if (window < 1) throw new IllegalArgumentException("window must be at least 1");
        }
    }

    public PipelineSpec withCardsAhead(CardsAhead ahead) {
        return new PipelineSpec(schema, schemaFree, importSchema, graphs, remote, traversalSource, cardBudget, loadProblems,
                Optional.of(ahead));
    }

    /** The demo graph (or the graph files given) checked against {@code schema}, with the default card budget. */
    public static PipelineSpec local(GraphSchema schema, List<Path> graphs) {
        return new PipelineSpec(schema, false, schema, graphs, Optional.empty(), DEFAULT_TRAVERSAL_SOURCE,
                DEFAULT_BUDGET, d -> {}, Optional.empty());
    }
}

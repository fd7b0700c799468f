package dev.termgate.cli;

import dev.termgate.translate.Pipeline;
import dev.termgate.translate.PipelineSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.util.Optional;

/**
 * What the commands that ask questions (ask, shell, batch, eval) share: the model, ontology, graph and card-budget
 * options, and the pipeline they open. The pipeline factory is replaceable for tests.
 */
abstract class QuestionCommand {

    @Mixin ModelOptions model;
    @Mixin OntologyOptions ontology;
    @Mixin GraphOptions graph;
    @Mixin BudgetOption budget;

    @Spec picocli.CommandLine.Model.CommandSpec spec;

    private final Pipeline.Factory factory;

    QuestionCommand(Pipeline.Factory factory) {
        this.factory = factory;
    }

    /** Opens the pipeline the options name; problems loading the graph are told on {@code err}. */
    Pipeline openPipeline(PrintWriter err) {
        return openPipeline(err, Optional.empty());
    }

    /** As {@link #openPipeline(PrintWriter)}, with the cards of the questions to come built ahead. */
    Pipeline openPipeline(PrintWriter err, Optional<PipelineSpec.CardsAhead> ahead) {
        PipelineSpec spec = graph.spec(ontology, budget.tokens(), err);
        return AskWiring.open(factory, ahead.map(spec::withCardsAhead).orElse(spec));
    }
}

package dev.termgate.translate;

import dev.termgate.card.Card;
import dev.termgate.card.CardTerm;
import dev.termgate.card.Cards;
import dev.termgate.card.TokenEncoding;
import dev.termgate.engine.Engine;
import dev.termgate.engine.EngineException;
import dev.termgate.engine.Engines;
import dev.termgate.engine.GraphFiles;
import dev.termgate.graph.ImportException;
import dev.termgate.schema.GraphSchema;

import java.time.Duration;
import java.util.List;
import java.util.function.Supplier;

/** The pipeline of the shipped commands: the ontology's schema, its card, the parser + analyzer + repair gate, the engine. */
public final class StandardPipeline implements Pipeline.Factory {

    @Override
    public Pipeline open(PipelineSpec spec) throws Pipeline.PipelineException {
        GraphSchema schema = spec.schema();
        QueryGate gate = StandardGate.forSchema(schema, spec.schemaFree());
        Engine engine = engine(spec);
        return new Pipeline(schema, wholeCard(schema), gate, new EngineRunner(engine, schema), engine::close);
    }

    private static Engine engine(PipelineSpec spec) throws Pipeline.PipelineException {
        try {
            if (spec.remote().isPresent()) return Engines.remote(spec.remote().get(), "g", Duration.ofSeconds(10));
            GraphFiles.Loaded loaded = spec.graph().isEmpty() ? GraphFiles.demo(spec.schema())
                    : GraphFiles.open(List.of(spec.graph().get()), spec.schema());
            return loaded.engine();
        } catch (EngineException e) {
            throw new Pipeline.PipelineException(e.getMessage(), !e.isServiceFailure(), e.isServiceFailure());
        } catch (ImportException e) {
            throw new Pipeline.PipelineException(e.getMessage(), true, false);
        }
    }

    /** Until schema linking is merged every question gets the whole card, made once. */
    static CardSource wholeCard(GraphSchema schema) {
        Supplier<CardSource.Card> once = memo(() -> of(Cards.whole(schema, TokenEncoding.DEFAULT)));
        return question -> once.get();
    }

    static CardSource.Card of(Card c) {
        return new CardSource.Card(c.text(), c.tokens(), c.terms().stream().map(CardTerm::name).toList());
    }

    private static <T> Supplier<T> memo(Supplier<T> s) {
        return new Supplier<>() {
            private T value;

            @Override
            public synchronized T get() {
                if (value == null) value = s.get();
                return value;
            }
        };
    }
}

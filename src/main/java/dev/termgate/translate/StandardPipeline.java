package dev.termgate.translate;

import dev.termgate.card.Card;
import dev.termgate.card.CardTerm;
import dev.termgate.card.Cards;
import dev.termgate.card.TokenEncoding;
import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Span;
import dev.termgate.schema.GraphSchema;

import java.util.List;
import java.util.function.Supplier;

/** The pipeline of the shipped commands: the ontology's schema, its card, the parser + analyzer + repair gate, the engine. */
public final class StandardPipeline implements Pipeline.Factory {

    @Override
    public Pipeline open(PipelineSpec spec) throws Pipeline.PipelineException {
        GraphSchema schema = spec.schema();
        QueryGate gate = StandardGate.forSchema(schema, spec.schemaFree());
        QueryRunner runner = (checked, limits) -> new RunResult(List.of(), List.of(), false, "",
                List.of(Diagnostic.at(Code.RUNTIME_ERROR, Span.NONE, "the engine is not part of this build yet")));
        return new Pipeline(schema, wholeCard(schema), gate, runner, () -> {});
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

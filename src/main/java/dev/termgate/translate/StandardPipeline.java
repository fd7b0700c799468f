package dev.termgate.translate;

import dev.termgate.card.BudgetTooSmallException;
import dev.termgate.card.Card;
import dev.termgate.card.CardTerm;
import dev.termgate.card.Cards;
import dev.termgate.card.TokenEncoding;
import dev.termgate.engine.Engine;
import dev.termgate.engine.EngineException;
import dev.termgate.graph.ImportException;
import dev.termgate.link.LinkOptions;
import dev.termgate.link.Linkers;
import dev.termgate.link.SchemaLinker;
import dev.termgate.query.Printer;
import dev.termgate.schema.GraphSchema;

import java.util.List;
import java.util.function.Supplier;

/** The pipeline of the shipped commands: the ontology's schema, its card, the parser + analyzer + repair gate, the engine. */
public final class StandardPipeline implements Pipeline.Factory {

    @Override
    public Pipeline open(PipelineSpec spec) throws Pipeline.PipelineException {
        GraphSchema schema = spec.schema();
        QueryGate gate = StandardGate.forSchema(schema, spec.schemaFree());
        primeInBackground(gate);
        CardSource cards = questionCards(schema, spec.cardBudget());
        // Cards asked for ahead start now, on their own thread: the tokenizer and the linker load while this thread
        // loads the graph, and the first questions find their cards ready. The embedding model loads on a third
        // thread: left to the card builder, it came only after the whole card and the linker, and the first cards
        // after the graph. (When the whole card fits the budget it loads in vain: about half a second of a core.)
        if (spec.cardsAhead().isPresent()) Linkers.loadModelInBackground();
        CardPrefetch ahead = spec.cardsAhead().map(a -> new CardPrefetch(cards, a.questions(), a.window())).orElse(null);
        Engine engine;
        try {
            engine = engine(spec);
        } catch (Pipeline.PipelineException | RuntimeException e) {
            if (ahead != null) ahead.close();
            throw e;
        }
        EngineRunner runner = new EngineRunner(engine, schema);
        if (ahead != null && spec.remote().isEmpty()) primeEngineInBackground(schema, gate, runner);
        AutoCloseable close = ahead == null ? engine::close : () -> {
            ahead.close();
            engine.close();
        };
        return new Pipeline(schema, ahead == null ? cards : ahead, gate, runner, close);
    }

    /**
     * Checks two small queries on a background thread while the graph loads. The first check of a process builds
     * the parser's tables and the analyzer's schema index, about a second of work under a lock; without this,
     * the first replies of a batch all waited for it.
     */
    private static void primeInBackground(QueryGate gate) {
        onSpareThread("termgate-prime", () -> {
            gate.check("MATCH (n) WHERE n.x = 1 RETURN n.y AS y ORDER BY y LIMIT 1");
            gate.check("MATCH (n RETURN n"); // the error path: the full lexer and the messages
        });
    }

    /**
     * Runs three small read queries on the embedded graph, on a spare thread, while a batch waits for its
     * first replies: the first runs of a process load and compile the engine's code (about 100 ms each, against
     * 3-7 ms later; BatchThroughputBench), and without this they fell on the first answers. The grouped query
     * reads every node of one label; the others a few nodes.
     */
    private static void primeEngineInBackground(GraphSchema schema, QueryGate gate, QueryRunner runner) {
        List<String> queries = primingQueries(schema);
        onSpareThread("termgate-prime-engine", () -> {
            for (String q : queries) {
                Checked c = gate.check(q);
                if (!c.valid()) continue;
                try {
                    runner.run(c, RunLimits.DEFAULT);
                } catch (InterruptedException e) {
                    return;
                } catch (RuntimeException e) {
                    // a rehearsal only: the questions' own runs report their problems
                }
            }
        });
    }

    /** Starts work that nothing waits for on a daemon thread of its own, so it never holds the process open. */
    private static void onSpareThread(String name, Runnable work) {
        Thread t = new Thread(work, name);
        t.setDaemon(true);
        t.start();
    }

    /**
     * The engine's rehearsal queries for a schema: a property declared on a label, read plainly, grouped and
     * through a relationship; none when the schema declares no property on a label.
     */
    static List<String> primingQueries(GraphSchema schema) {
        for (var p : schema.properties().values()) {
            for (String d : p.domains()) {
                if (!schema.labels().containsKey(d)) continue;
                String n = "(n:" + Printer.schemaName(d) + ")";
                String v = "n." + Printer.schemaName(p.name());
                return List.of(
                        "MATCH " + n + " RETURN " + v + " AS v LIMIT 1",
                        "MATCH " + n + " RETURN " + v + " AS v, count(*) AS c ORDER BY c DESC LIMIT 1",
                        "MATCH " + n + " WITH n LIMIT 5 MATCH (n)-[r]-(m) RETURN type(r) AS t, count(DISTINCT m) AS c "
                                + "ORDER BY c DESC LIMIT 1");
            }
        }
        return List.of();
    }

    private static Engine engine(PipelineSpec spec) throws Pipeline.PipelineException {
        try {
            return GraphSource.open(spec);
        } catch (EngineException e) {
            throw new Pipeline.PipelineException(e.getMessage(), !e.isServiceFailure(), e.isServiceFailure());
        } catch (ImportException e) {
            throw new Pipeline.PipelineException(e.getMessage(), true, false);
        }
    }

    /**
     * The card each question gets: the whole card when it already fits the budget (nothing to gain by
     * pruning), otherwise the card pruned for the question by schema linking. The linker, with its embedding
     * model, is built only when a question first needs it.
     */
    static CardSource questionCards(GraphSchema schema, int budget) {
        Supplier<CardSource.Card> whole = Memo.of(() -> of(Cards.whole(schema, TokenEncoding.DEFAULT)));
        Supplier<SchemaLinker> linker = Memo.of(() -> Linkers.standard(schema, LinkOptions.defaults()));
        return question -> {
            CardSource.Card all = whole.get();
            if (all.tokens() <= budget) return all;
            try {
                return of(Cards.forQuestion(schema, linker.get().link(question, schema), budget,
                        TokenEncoding.DEFAULT));
            } catch (BudgetTooSmallException e) {
                return all;
            }
        };
    }

    static CardSource.Card of(Card c) {
        return new CardSource.Card(c.text(), c.tokens(), c.terms().stream().map(CardTerm::name).toList());
    }
}

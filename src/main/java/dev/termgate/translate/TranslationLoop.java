package dev.termgate.translate;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Render;
import dev.termgate.query.Span;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;

/**
 * The loop for one question: card → ask → take the query out of the reply → gate (parse, analyze, certain
 * repairs) → when errors remain, ask again with the exact diagnostics, up to a number of attempts. It never
 * makes up a query: a question that yields no valid query ends with the last diagnostics.
 *
 * <p>Thread-safe when its parts are; the batch command shares one loop between workers.
 */
public final class TranslationLoop {

    public static final int DEFAULT_ATTEMPTS = 3;

    private final Translator translator;
    private final QueryGate gate;
    private final CardSource cards;
    private final int maxAttempts;

    public TranslationLoop(Translator translator, QueryGate gate, CardSource cards, int maxAttempts) {
        if (maxAttempts < 1) throw new IllegalArgumentException("attempts must be at least 1");
        this.translator = translator;
        this.gate = gate;
        this.cards = cards;
        this.maxAttempts = maxAttempts;
    }

    public Translator translator() {
        return translator;
    }

    public QueryGate gate() {
        return gate;
    }

    public CardSource cards() {
        return cards;
    }

    /**
     * @throws ServiceFailure when the model service failed beyond its retries
     */
    public Outcome translate(String question) {
        long t0 = System.nanoTime();
        CardSource.Card card = translator.readsCard() ? cards.card(question) : CardSource.Card.NONE;
        long t1 = System.nanoTime();
        List<Outcome.Attempt> attempts = new ArrayList<>();
        Tokens tokens = new Tokens();
        Optional<TranslationRequest.PreviousAttempt> previous = Optional.empty();
        List<Diagnostic> last = List.of();
        String lastReport = "";
        for (int n = 1; n <= maxAttempts; n++) {
            Reply reply = translator.translate(new TranslationRequest(question, card.text(), n, previous));
            tokens.add(reply);
            if (reply.declined().isPresent()) {
                // The interpreter is deterministic: asking it again would give the same answer.
                last = List.of(Diagnostic.at(Code.NOT_UNDERSTOOD, Span.NONE, reply.declined().get()));
                lastReport = Render.all(null, last);
                attempts.add(new Outcome.Attempt(n, "", Optional.empty(), last));
                break;
            }
            List<String> candidates = QueryExtractor.candidates(reply.text());
            if (candidates.isEmpty()) {
                last = List.of(Diagnostic.at(Code.NO_QUERY_IN_REPLY, Span.NONE));
                lastReport = Render.all(null, last);
                attempts.add(new Outcome.Attempt(n, reply.text(), Optional.empty(), last));
                previous = Optional.of(new TranslationRequest.PreviousAttempt(reply.text(), Optional.empty(), last, lastReport));
                continue;
            }
            Checked chosen = choose(candidates);
            attempts.add(new Outcome.Attempt(n, reply.text(), Optional.of(chosen), chosen.diagnostics()));
            if (chosen.valid()) {
                long t2 = System.nanoTime();
                return new Outcome(question, translator.name(), card, attempts, Optional.of(chosen), chosen.diagnostics(),
                        chosen.report(), tokens.prompt(), tokens.completion(), Duration.ofNanos(t1 - t0), Duration.ofNanos(t2 - t1));
            }
            last = chosen.diagnostics();
            lastReport = chosen.report();
            previous = Optional.of(new TranslationRequest.PreviousAttempt(reply.text(), Optional.of(chosen.source()),
                    chosen.diagnostics(), chosen.report()));
        }
        List<Diagnostic> finalDiagnostics = new ArrayList<>(last);
        Diagnostic stop = Diagnostic.at(Code.ATTEMPTS_EXHAUSTED, Span.NONE, attempts.size());
        finalDiagnostics.add(stop);
        long t2 = System.nanoTime();
        return new Outcome(question, translator.name(), card, attempts, Optional.empty(), finalDiagnostics,
                lastReport + Render.one(null, stop), tokens.prompt(), tokens.completion(),
                Duration.ofNanos(t1 - t0), Duration.ofNanos(t2 - t1));
    }

    /** The first candidate that passes the gate; else the first that parses; else the first. */
    private Checked choose(List<String> candidates) {
        Checked firstParsed = null;
        Checked first = null;
        for (String c : candidates) {
            Checked checked = gate.check(c);
            if (checked.valid()) return checked;
            if (first == null) first = checked;
            if (firstParsed == null && checked.parsed()) firstParsed = checked;
        }
        return firstParsed != null ? firstParsed : first;
    }

    /** Sums of the token counts the provider reported; absent when it reported none. */
    private static final class Tokens {
        private Integer prompt;
        private Integer completion;

        void add(Reply r) {
            if (r.promptTokens().isPresent()) prompt = (prompt == null ? 0 : prompt) + r.promptTokens().getAsInt();
            if (r.completionTokens().isPresent()) completion = (completion == null ? 0 : completion) + r.completionTokens().getAsInt();
        }

        OptionalInt prompt() {
            return prompt == null ? OptionalInt.empty() : OptionalInt.of(prompt);
        }

        OptionalInt completion() {
            return completion == null ? OptionalInt.empty() : OptionalInt.of(completion);
        }
    }
}

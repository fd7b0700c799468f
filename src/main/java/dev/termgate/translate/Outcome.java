package dev.termgate.translate;

import dev.termgate.diag.Diagnostic;

import java.time.Duration;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;

/**
 * How one question went through the translation loop.
 *
 * @param attempts    every ask, in order
 * @param accepted    the verdict of the query that passed the gate; empty when none did
 * @param diagnostics when nothing was accepted: the last attempt's diagnostics and why the loop stopped;
 *                    otherwise the accepted query's warnings
 * @param report      {@code diagnostics} rendered with carets under the last query text
 */
public record Outcome(String question, String model, CardSource.Card card, List<Attempt> attempts,
                      Optional<Checked> accepted, List<Diagnostic> diagnostics, String report,
                      OptionalInt promptTokens, OptionalInt completionTokens, Duration cardTime, Duration translateTime) {

    public Outcome {
        attempts = List.copyOf(attempts);
        diagnostics = List.copyOf(diagnostics);
    }

    public boolean valid() {
        return accepted.isPresent();
    }

    /** The last query text tried, valid or not; empty when no reply held a query. */
    public Optional<String> lastQuery() {
        for (int i = attempts.size() - 1; i >= 0; i--) {
            if (attempts.get(i).checked().isPresent()) return Optional.of(attempts.get(i).checked().get().source());
        }
        return Optional.empty();
    }

    /**
     * One ask.
     *
     * @param reply   what the translator answered
     * @param checked the verdict on the chosen candidate; empty when the reply held no query
     */
    public record Attempt(int number, String reply, Optional<Checked> checked, List<Diagnostic> diagnostics) {
        public Attempt {
            diagnostics = List.copyOf(diagnostics);
        }
    }
}

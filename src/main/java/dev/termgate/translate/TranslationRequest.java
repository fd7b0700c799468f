package dev.termgate.translate;

import dev.termgate.diag.Diagnostic;

import java.util.List;
import java.util.Optional;

/**
 * What a translator is asked.
 *
 * @param question the user's question, as typed
 * @param card     the schema card text the translator may use
 * @param attempt  1 for the first ask, 2 and more for a re-ask
 * @param previous the last attempt, when this is a re-ask: what came back and what was wrong with it
 */
public record TranslationRequest(String question, String card, int attempt, Optional<PreviousAttempt> previous) {

    public static TranslationRequest first(String question, String card) {
        return new TranslationRequest(question, card, 1, Optional.empty());
    }

    /**
     * @param reply       the whole reply text of the last attempt
     * @param query       the query taken from it, empty when none could be found
     * @param diagnostics every diagnostic of that query, each with its ranked suggestions
     * @param rendered    the diagnostics rendered with carets under the query text
     */
    public record PreviousAttempt(String reply, Optional<String> query, List<Diagnostic> diagnostics, String rendered) {
        public PreviousAttempt {
            diagnostics = List.copyOf(diagnostics);
        }
    }
}

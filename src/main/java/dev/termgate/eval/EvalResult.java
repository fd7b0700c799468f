package dev.termgate.eval;

import dev.termgate.translate.Checked;

import java.util.List;
import java.util.Optional;

/**
 * How one question fared.
 *
 * @param status           see {@link Status}
 * @param validAsWritten   the first attempt's query was valid with no repair
 * @param validAfterRepair the first attempt's query was valid once the certain repairs were made
 * @param validFinal       a valid query came out of the loop (after repair and re-asks)
 * @param repairs          the kinds of the repairs made to the accepted query (e.g. {@code label}, {@code direction})
 * @param promptTokens     null when the translator reports none (the offline interpreter)
 * @param query            the accepted query, else the last one tried, else empty
 * @param detail           why it is not correct: the diagnostic, or the row counts compared
 */
public record EvalResult(String id, String question, String shape, Optional<String> split, Status status,
                         boolean validAsWritten, boolean validAfterRepair, boolean validFinal, int attempts,
                         List<String> repairs, Integer promptTokens, Integer completionTokens, long translateMillis,
                         long totalMillis, Optional<String> query, String gold, String detail, List<Checked.TermUse> terms) {

    public EvalResult {
        repairs = List.copyOf(repairs);
        terms = List.copyOf(terms);
    }

    /** The outcome of one question. */
    public enum Status {
        /** the candidate returned the gold rows */
        CORRECT,
        /** a valid candidate returned other rows */
        WRONG,
        /** no valid query came out of the loop */
        INVALID,
        /** the offline interpreter said it did not understand */
        NOT_UNDERSTOOD,
        /** the valid candidate failed when run (time limit, run-time error) */
        RUN_FAILED,
        /** the model service failed */
        SERVICE_FAILED,
        /** the gold query itself is invalid or fails: the question is not counted against the translator */
        BAD_GOLD;

        public String word() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }

    /** Whether the question counts in execution accuracy (its gold query is usable). */
    public boolean counted() {
        return status != Status.BAD_GOLD;
    }
}

package dev.termgate.translate;

import java.util.Optional;
import java.util.OptionalInt;

/**
 * What a translator answered.
 *
 * @param text             the reply text (a query, or prose with a query in it)
 * @param declined         a reason when the translator chose not to answer (the offline interpreter did not
 *                         understand the question); then {@code text} is ignored
 * @param promptTokens     input tokens, when the provider reports them
 * @param completionTokens output tokens, when the provider reports them
 */
public record Reply(String text, Optional<String> declined, OptionalInt promptTokens, OptionalInt completionTokens) {

    public static Reply of(String text) {
        return new Reply(text, Optional.empty(), OptionalInt.empty(), OptionalInt.empty());
    }

    public static Reply declined(String reason) {
        return new Reply("", Optional.of(reason), OptionalInt.empty(), OptionalInt.empty());
    }
}

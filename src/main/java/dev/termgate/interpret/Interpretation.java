package dev.termgate.interpret;

import java.util.List;
import java.util.Optional;

/**
 * What the interpreter made of a question.
 *
 * @param query         the openCypher query, empty when the question was not understood
 * @param shape         the kind of answer chosen: list, count, filter, superlative, group, compare, exists
 * @param confidence    0..1: how much of the question the evidence explains and how compact the tree is
 * @param notUnderstood why no query was written, when {@code query} is empty
 * @param evidence      the readings used, for {@code --why}-style explanations and tests
 */
public record Interpretation(Optional<String> query, String shape, double confidence, Optional<String> notUnderstood,
                             List<String> evidence) {
    public Interpretation {
        evidence = List.copyOf(evidence);
    }

    static Interpretation declined(String reason, double confidence, List<String> evidence) {
        return new Interpretation(Optional.empty(), "none", confidence, Optional.of(reason), evidence);
    }

    public boolean understood() {
        return query.isPresent();
    }
}

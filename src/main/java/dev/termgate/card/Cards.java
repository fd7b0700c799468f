package dev.termgate.card;

import dev.termgate.link.Linking;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;
import java.util.OptionalInt;

/**
 * Makes schema cards. The public entry of the package:
 * <ul>
 *   <li>{@link #whole} — every term of the ontology;</li>
 *   <li>{@link #forQuestion} — the terms a linker ranked for a question, best first, within a token budget.</li>
 * </ul>
 */
public final class Cards {

    /** The budget used when none is given (issue 7). */
    public static final int DEFAULT_BUDGET = 1500;

    private Cards() {}

    /** The whole-ontology card, measured with the given encoding. */
    public static Card whole(GraphSchema schema, TokenEncoding encoding) {
        CardScope scope = CardScope.whole(schema);
        List<String> lines = new ArrayList<>();
        lines.add(CardText.wholeHeader(schema));
        lines.add(CardText.LEGEND);
        lines.addAll(CardText.body(schema, scope));
        String text = CardText.join(lines);
        int tokens = TokenCounter.of(encoding).count(text);
        return new Card(text, tokens, OptionalInt.empty(), encoding, allTerms(schema), 0, false, List.of(), scope);
    }

    /**
     * The card for one question: the linker's terms in ranked order, each with what keeps the card a valid
     * sub-schema (a relationship type's endpoints, a label holding a key), while the card stays within
     * {@code budget} tokens; budget left over is spent on the own keys of the labels shown. A term that does not
     * fit is left out and counted, and the next one is tried.
     *
     * @throws BudgetTooSmallException when not even the best-ranked term fits
     */
    public static Card forQuestion(GraphSchema schema, Linking linking, int budget, TokenEncoding encoding) {
        return new QuestionCard(schema, linking, budget, TokenCounter.of(encoding)).build();
    }

    /** A shown term with no linking behind it. */
    static CardTerm plainTerm(TermInfo info, List<String> evidence) {
        return new CardTerm(info.kind(), info.name(), info.iri(), OptionalDouble.empty(), evidence);
    }

    private static List<CardTerm> allTerms(GraphSchema schema) {
        List<CardTerm> out = new ArrayList<>();
        for (TermKind kind : TermKind.values()) {
            schema.terms(kind).stream()
                    .sorted(java.util.Comparator.comparing(TermInfo::name))
                    .forEach(t -> out.add(plainTerm(t, List.of())));
        }
        return out;
    }
}

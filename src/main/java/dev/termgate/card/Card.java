package dev.termgate.card;

import java.util.List;
import java.util.OptionalInt;

/**
 * A schema card: the text given to a model, with what was measured and chosen to make it.
 *
 * @param text     the card, lines ending in {@code \n}
 * @param tokens   tokens of {@code text} under {@code encoding}
 * @param budget   the token budget it was made for; empty for the whole-ontology card
 * @param terms    the terms shown, in the order they were chosen (ranked order for a question card, kind then
 *                 name for the whole card)
 * @param leftOut  terms the linker ranked that the card does not show (over budget)
 * @param fallback the linker recognised no term of the question and ranked the most central ones instead
 * @param notices  things to tell the user (fallback, budget, the linker's notices)
 * @param scope    the shown sub-schema, by graph name, for the JSON and DOT renderings
 */
public record Card(String text, int tokens, OptionalInt budget, TokenEncoding encoding, List<CardTerm> terms,
                   int leftOut, boolean fallback, List<String> notices, CardScope scope) {
    public Card {
        terms = List.copyOf(terms);
        notices = List.copyOf(notices);
    }
}

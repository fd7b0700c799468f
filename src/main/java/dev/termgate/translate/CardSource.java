package dev.termgate.translate;

import java.util.List;

/** Gives the schema card a translator sees for a question: pruned for it when schema linking is there. */
public interface CardSource {

    Card card(String question);

    /**
     * @param text   the card as the prompt shows it
     * @param tokens its size in tokens (the tokenizer the card issue chose)
     * @param terms  the graph names of the terms it holds
     */
    record Card(String text, int tokens, List<String> terms) {
        /** What a translator that reads no card is given. */
        public static final Card NONE = new Card("", 0, List.of());

        public Card {
            terms = List.copyOf(terms);
        }
    }
}

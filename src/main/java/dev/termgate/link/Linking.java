package dev.termgate.link;

import java.util.List;

/**
 * The result of linking a question to a schema.
 *
 * @param ranked   terms best first; a connector term (added so the selected classes form one connected
 *                 sub-schema) is placed right after the terms it connects, so taking a prefix keeps the card
 *                 connected as far as possible
 * @param fallback true when no term of the question was recognised and the most central part of the
 *                 ontology was used instead
 * @param notices  things the user should be told (fallback, question truncated for embedding, …)
 */
public record Linking(List<LinkedTerm> ranked, boolean fallback, List<String> notices) {
    public Linking {
        ranked = List.copyOf(ranked);
        notices = List.copyOf(notices);
    }
}

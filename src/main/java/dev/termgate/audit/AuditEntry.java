package dev.termgate.audit;

import dev.termgate.translate.Checked;

import java.util.List;
import java.util.Optional;

/**
 * One audited query.
 *
 * @param cardTerms the graph names of the card the model was given, when the batch line records them
 * @param terms     the ontology terms the (valid) query uses, as the analyzer's term audit gave them
 */
public record AuditEntry(String id, int line, Optional<String> question, Optional<String> query, boolean valid,
                         Optional<String> model, Optional<List<String>> cardTerms, List<Checked.TermUse> terms) {
    public AuditEntry {
        terms = List.copyOf(terms);
        cardTerms = cardTerms.map(List::copyOf);
    }
}

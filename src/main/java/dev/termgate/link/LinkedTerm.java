package dev.termgate.link;

import dev.termgate.schema.TermKind;

import java.util.List;

/**
 * One ontology term that schema linking found relevant to a question.
 *
 * @param name     the graph name (label, relationship type or property key)
 * @param score    higher is more relevant; comparable only within one {@link Linking}
 * @param evidence short human-readable reasons, e.g. {@code label "vessel" ~ "ships" (lexical 0.92)} or
 *                 {@code connects Shipment to Port}
 */
public record LinkedTerm(TermKind kind, String name, double score, List<String> evidence) {
    public LinkedTerm {
        evidence = List.copyOf(evidence);
    }
}

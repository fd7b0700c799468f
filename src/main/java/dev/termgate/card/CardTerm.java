package dev.termgate.card;

import dev.termgate.schema.TermKind;

import java.util.List;
import java.util.OptionalDouble;

/**
 * One term a card shows.
 *
 * @param score    the linking score, when schema linking ranked the term; empty on the whole-ontology card and
 *                 for terms the card added itself (endpoints, holders of keys, keys added with budget to spare)
 * @param evidence why the term is on the card: the linker's reasons, then the card's own
 */
public record CardTerm(TermKind kind, String name, String iri, OptionalDouble score, List<String> evidence) {
    public CardTerm {
        evidence = List.copyOf(evidence);
    }
}

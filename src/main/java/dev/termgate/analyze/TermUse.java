package dev.termgate.analyze;

import dev.termgate.query.Span;
import dev.termgate.schema.TermKind;

import java.util.List;

/**
 * One ontology term a query uses (the term audit).
 *
 * @param kind  label (class), relationship (object property) or property (datatype property)
 * @param name  the graph name as written
 * @param iri   the ontology IRI behind it
 * @param spans every place it is written, in source order
 * @param via   how the ontology allows this use: directly, or only through a superclass, a super- or
 *              sub-property, an inverse or symmetry
 */
public record TermUse(TermKind kind, String name, String iri, List<Span> spans, Via via) {

    public enum Via {
        DIRECT, SUPERCLASS, SUPERPROPERTY, SUBPROPERTY, INVERSE, SYMMETRIC;

        public String word() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }

    public TermUse {
        spans = List.copyOf(spans);
    }
}

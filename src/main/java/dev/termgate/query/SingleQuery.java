package dev.termgate.query;

import java.util.List;

/** A sequence of clauses, ending (for a read query) in RETURN. */
public record SingleQuery(List<Clause> clauses, Span span) implements Node {
    public SingleQuery {
        clauses = List.copyOf(clauses);
    }
}

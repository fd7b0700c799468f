package dev.termgate.translate;

import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Query;

import java.util.List;
import java.util.Optional;


/**
 * The verdict of a {@link QueryGate} on one query text.
 *
 * @param source      the text that was checked
 * @param parsed      true when the text is a query at all (it may still be invalid)
 * @param valid       true when the query (after repair) has no error and may be run
 * @param query       the text to show and run: the repaired text when a repair was made, else {@code source}
 * @param tree        the tree to run; present only when {@code valid}
 * @param diagnostics every remaining diagnostic (errors and warnings), with ranked suggestions
 * @param edits       the certain repairs that were applied
 * @param terms       the ontology terms the final query uses
 * @param report      the diagnostics rendered with carets under the source text
 */
public record Checked(String source, boolean parsed, boolean valid, String query, Optional<Query> tree,
                      List<Diagnostic> diagnostics, List<Edit> edits, List<TermUse> terms, String report) {

    public Checked {
        diagnostics = List.copyOf(diagnostics);
        edits = List.copyOf(edits);
        terms = List.copyOf(terms);
        if (valid && tree.isEmpty()) throw new IllegalArgumentException("a valid query needs its tree");
        if (valid && diagnostics.stream().anyMatch(Diagnostic::isError)) {
            throw new IllegalArgumentException("a query with errors cannot be valid");
        }
    }

    public List<Diagnostic> errors() {
        return diagnostics.stream().filter(Diagnostic::isError).toList();
    }

    /**
     * One repair made to the query.
     *
     * @param what  e.g. {@code label 'Vesel' → 'Vessel'}
     * @param where {@code line L:C} of the original text, or empty
     * @param why   the reason, e.g. the diagnostic it fixed
     */
    public record Edit(String what, String where, String why) {
        @Override
        public String toString() {
            return (where.isEmpty() ? "" : where + ": ") + what + (why.isEmpty() ? "" : " (" + why + ")");
        }
    }

    /**
     * One ontology term a query uses.
     *
     * @param kind  {@code label}, {@code relationship} or {@code property}
     * @param name  the graph name
     * @param iri   the ontology IRI behind it
     * @param via   how it was reached: {@code direct}, or e.g. {@code superclass of Tanker}
     */
    public record TermUse(String kind, String name, String iri, String via) {}
}

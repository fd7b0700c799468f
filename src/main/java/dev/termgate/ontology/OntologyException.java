package dev.termgate.ontology;

import dev.termgate.diag.Diagnostic;

import java.util.List;

/**
 * The ontology could not be loaded. The diagnostics say why (file, line and column for syntax errors);
 * {@link #serviceFailure()} tells an unreachable or failing SPARQL endpoint apart from invalid input.
 */
public final class OntologyException extends RuntimeException {
    private final transient List<Diagnostic> problems;
    private final boolean serviceFailure;

    OntologyException(List<Diagnostic> problems, boolean serviceFailure) {
        super(summary(problems), null, false, false);
        this.problems = List.copyOf(problems);
        this.serviceFailure = serviceFailure;
    }

    static OntologyException of(Diagnostic d) {
        return new OntologyException(List.of(d), false);
    }

    static OntologyException service(Diagnostic d) {
        return new OntologyException(List.of(d), true);
    }

    public List<Diagnostic> problems() {
        return problems;
    }

    /** True when an outside service (a SPARQL endpoint, a remote URL) failed, not the ontology itself. */
    public boolean serviceFailure() {
        return serviceFailure;
    }

    private static String summary(List<Diagnostic> problems) {
        StringBuilder sb = new StringBuilder();
        for (Diagnostic d : problems) {
            if (sb.length() > 0) sb.append('\n');
            sb.append(d.code().id()).append(": ").append(d.fullMessage());
        }
        return sb.toString();
    }
}

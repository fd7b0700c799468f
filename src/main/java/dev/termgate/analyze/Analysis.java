package dev.termgate.analyze;

import dev.termgate.diag.Diagnostic;

import java.util.List;

/**
 * What the analyzer found in one query: every diagnostic in source order, the fixes it can propose, and the
 * ontology terms the query uses.
 */
public record Analysis(List<Diagnostic> diagnostics, List<Fix> fixes, List<TermUse> terms) {

    public Analysis {
        diagnostics = List.copyOf(diagnostics);
        fixes = List.copyOf(fixes);
        terms = List.copyOf(terms);
    }

    public boolean hasErrors() {
        return diagnostics.stream().anyMatch(Diagnostic::isError);
    }

    public long errorCount() {
        return diagnostics.stream().filter(Diagnostic::isError).count();
    }
}

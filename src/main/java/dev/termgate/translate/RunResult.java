package dev.termgate.translate;

import dev.termgate.diag.Diagnostic;

import java.util.List;

/**
 * The rows of one run, as plain values (String, Number, Boolean, null, List, Map) so every output format can
 * show them without knowing the engine.
 *
 * @param plan        the plan that ran, for {@code explain}; empty when the runner has none
 * @param diagnostics run-time findings (time-out, truncation, errors); an error means no rows
 */
public record RunResult(List<String> columns, List<List<Object>> rows, boolean truncated, String plan,
                        List<Diagnostic> diagnostics) {
    public RunResult {
        columns = List.copyOf(columns);
        rows = rows.stream().map(r -> java.util.Collections.unmodifiableList(new java.util.ArrayList<>(r))).toList();
        diagnostics = List.copyOf(diagnostics);
    }

    public boolean failed() {
        return diagnostics.stream().anyMatch(Diagnostic::isError);
    }
}

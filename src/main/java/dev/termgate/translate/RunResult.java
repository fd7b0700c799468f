package dev.termgate.translate;

import dev.termgate.diag.Diagnostic;

import java.util.List;
import java.util.function.Supplier;

/**
 * The rows of one run, as plain values (String, Number, Boolean, null, List, Map) so every output format can
 * show them without knowing the engine.
 *
 * @param planText    the plan that ran, for {@code explain}, written out only when asked for (most runs never show
 *                    it, and writing it means planning the query again); empty when the runner has none
 * @param diagnostics run-time findings (time-out, truncation, errors); an error means no rows
 */
public record RunResult(List<String> columns, List<List<Object>> rows, boolean truncated, Supplier<String> planText,
                        List<Diagnostic> diagnostics) {
    public RunResult {
        columns = List.copyOf(columns);
        rows = rows.stream().map(r -> java.util.Collections.unmodifiableList(new java.util.ArrayList<>(r))).toList();
        diagnostics = List.copyOf(diagnostics);
        planText = Memo.of(planText);
    }

    public RunResult(List<String> columns, List<List<Object>> rows, boolean truncated, String plan, List<Diagnostic> diagnostics) {
        this(columns, rows, truncated, () -> plan, diagnostics);
    }

    /** The plan that ran, or empty. */
    public String plan() {
        return planText.get();
    }

    public boolean failed() {
        return diagnostics.stream().anyMatch(Diagnostic::isError);
    }
}

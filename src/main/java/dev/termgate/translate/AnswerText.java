package dev.termgate.translate;

import dev.termgate.diag.Diagnostic;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Collectors;

/** An answer as a person reads it in a terminal: query, attempts, edits, terms, rows (or why there is no query). */
public final class AnswerText {

    private AnswerText() {}

    public static String render(Answer a, int maxAttempts, String rowFormat) {
        Outcome o = a.outcome();
        StringBuilder sb = new StringBuilder();
        if (o.accepted().isEmpty()) {
            sb.append("No valid query for this question (").append(o.attempts().size()).append(" attempt")
                    .append(o.attempts().size() == 1 ? "" : "s").append(", model ").append(o.model()).append(").\n");
            o.lastQuery().ifPresent(q -> sb.append("Last query tried (rejected, not run):\n").append(indent(q)).append('\n'));
            sb.append(o.report().isBlank() ? diagnostics(o.diagnostics()) : o.report());
            return sb.toString();
        }
        Checked c = o.accepted().get();
        sb.append("query:\n").append(indent(c.query())).append('\n');
        sb.append("attempts: ").append(o.attempts().size()).append(" of ").append(maxAttempts)
                .append(" (model ").append(o.model()).append(")\n");
        if (!c.edits().isEmpty()) {
            sb.append("edits:\n");
            c.edits().forEach(e -> sb.append("  ").append(e).append('\n'));
        }
        sb.append(terms(c.terms()));
        List<Diagnostic> warnings = c.diagnostics();
        if (!warnings.isEmpty()) sb.append(diagnostics(warnings));
        a.run().ifPresent(r -> sb.append(rows(r, rowFormat)));
        return sb.toString();
    }

    public static String terms(List<Checked.TermUse> terms) {
        if (terms.isEmpty()) return "terms: (none)\n";
        Map<String, List<String>> byKind = terms.stream().collect(Collectors.groupingBy(Checked.TermUse::kind,
                java.util.LinkedHashMap::new, Collectors.mapping(t -> t.name() + (t.via().isEmpty() || t.via().equals("direct")
                        ? "" : " (" + t.via() + ")"), Collectors.toList())));
        StringBuilder sb = new StringBuilder("terms:\n");
        byKind.forEach((k, names) -> sb.append("  ").append(k).append(": ").append(String.join(", ", names)).append('\n'));
        return sb.toString();
    }

    /** The plan that ran, for {@code --explain}. */
    public static String plan(RunResult r) {
        return r.plan().isBlank() ? "plan: (none recorded)\n" : "plan:\n" + indent(r.plan().stripTrailing()) + "\n";
    }

    public static String rows(RunResult r, String format) {
        StringBuilder sb = new StringBuilder();
        if (r.failed()) {
            return diagnostics(r.diagnostics());
        }
        sb.append(switch (format) {
            case "csv" -> Tables.csv(r.columns(), r.rows());
            case "json" -> AnswerJson.pretty(rowsJson(r)) + "\n";
            default -> Tables.text(r.columns(), r.rows());
        });
        sb.append('(').append(r.rows().size()).append(r.rows().size() == 1 ? " row" : " rows")
                .append(r.truncated() ? ", truncated" : "").append(")\n");
        r.diagnostics().forEach(d -> sb.append(d).append('\n'));
        return sb.toString();
    }

    private static com.google.gson.JsonObject rowsJson(RunResult r) {
        var o = new com.google.gson.JsonObject();
        var cols = new com.google.gson.JsonArray();
        r.columns().forEach(cols::add);
        o.add("columns", cols);
        var rows = new com.google.gson.JsonArray();
        r.rows().forEach(row -> rows.add(AnswerJson.value(new ArrayList<>(row))));
        o.add("rows", rows);
        o.addProperty("truncated", r.truncated());
        return o;
    }

    public static String diagnostics(List<Diagnostic> ds) {
        StringBuilder sb = new StringBuilder();
        ds.forEach(d -> sb.append(d).append('\n'));
        return sb.toString();
    }

    static String indent(String text) {
        return text.lines().map(l -> "  " + l).collect(Collectors.joining("\n"));
    }
}

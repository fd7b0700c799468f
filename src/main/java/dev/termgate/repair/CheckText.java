package dev.termgate.repair;

import dev.termgate.analyze.TermUse;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Render;

import java.util.List;
import java.util.Locale;

/**
 * The text form of a {@link CheckResult} ({@code termgate check}): the diagnostics with carets; then the
 * canonical query when it is valid as written, or the edits and the repaired query when a certain repair made it
 * valid; then the ontology terms used. Lines other than the query start with {@code //}, so the output of a
 * valid query can be run as it is.
 */
public final class CheckText {
    private CheckText() {}

    public static String of(CheckResult r) {
        StringBuilder sb = new StringBuilder(Render.all(r.source(), r.diagnostics()));
        if (r.wasRepaired()) {
            sb.append("// repaired").append(r.valid() ? "" : " in part (errors remain)").append(":\n");
            r.edits().forEach(e -> sb.append("//   ").append(e).append('\n'));
            if (r.valid()) {
                sb.append(r.repaired().orElse("")).append('\n');
            } else {
                List<Diagnostic> left = r.errors();
                left.forEach(d -> sb.append("//   still: ").append(d).append('\n'));
            }
        } else if (r.valid()) {
            sb.append(r.canonical().orElse(r.source())).append('\n');
        }
        if (r.valid() && !r.terms().isEmpty()) {
            sb.append("// terms used:\n");
            for (TermUse t : r.terms()) {
                sb.append("//   ").append(t.kind().name().toLowerCase(Locale.ROOT)).append(' ').append(t.name())
                        .append(" <").append(t.iri()).append('>')
                        .append(t.via() == TermUse.Via.DIRECT ? "" : " (via " + t.via().word() + ")").append('\n');
            }
        }
        return sb.toString();
    }
}

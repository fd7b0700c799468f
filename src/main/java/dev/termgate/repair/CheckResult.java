package dev.termgate.repair;

import dev.termgate.analyze.Fix;
import dev.termgate.analyze.TermUse;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Query;

import java.util.List;
import java.util.Optional;

/**
 * Everything {@link QueryCheck} found out about one query text.
 *
 * @param source       the text checked
 * @param tree         the parsed tree; empty when the text has syntax errors
 * @param diagnostics  every diagnostic of the text as written (syntax, or analysis), in source order
 * @param canonical    the parsed tree printed canonically; empty when it did not parse
 * @param repairedTree the tree after the certain repairs; empty when nothing was repaired
 * @param repaired     {@code repairedTree} printed canonically
 * @param edits        what the repair changed, where and why
 * @param remaining    the diagnostics left after repair (equal to {@code diagnostics} when nothing was repaired)
 * @param unresolved   errors that had candidates but no certain one: ranked suggestions for a person or model
 * @param terms        the ontology terms the final query uses (the repaired one if repaired)
 * @param valid        true when the query, as written or after certain repair, has no error
 */
public record CheckResult(String source, Optional<Query> tree, List<Diagnostic> diagnostics, Optional<String> canonical,
                          Optional<Query> repairedTree, Optional<String> repaired, List<Edit> edits,
                          List<Diagnostic> remaining, List<Fix> unresolved, List<TermUse> terms, boolean valid) {

    public CheckResult {
        diagnostics = List.copyOf(diagnostics);
        edits = List.copyOf(edits);
        remaining = List.copyOf(remaining);
        unresolved = List.copyOf(unresolved);
        terms = List.copyOf(terms);
    }

    public boolean parsed() {
        return tree.isPresent();
    }

    public boolean wasRepaired() {
        return repairedTree.isPresent();
    }

    /** The tree to run: the repaired one, else the parsed one; empty unless {@link #valid}. */
    public Optional<Query> runnableTree() {
        if (!valid) return Optional.empty();
        return repairedTree.isPresent() ? repairedTree : tree;
    }

    /** The text to show and run: the repaired text, else the canonical text, else the source. */
    public String finalText() {
        return repaired.or(() -> canonical).orElse(source);
    }

    public List<Diagnostic> errors() {
        return remaining.stream().filter(Diagnostic::isError).toList();
    }

    /** For a person: see {@link CheckText}. */
    public String report() {
        return CheckText.of(this);
    }
}

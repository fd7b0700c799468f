package dev.termgate.parser;

import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Render;
import dev.termgate.query.Query;

import java.util.List;
import java.util.Optional;

/**
 * What {@link CypherParser#parse} returns: the tree, or the syntax diagnostics (never both).
 *
 * @param source      the text that was parsed (for rendering diagnostics with carets)
 * @param query       the tree when the text is a well-formed query
 * @param diagnostics syntax errors, empty when the text parsed
 */
public record ParseResult(String source, Optional<Query> query, List<Diagnostic> diagnostics) {

    public ParseResult {
        diagnostics = List.copyOf(diagnostics);
        if (query.isPresent() == !diagnostics.isEmpty()) {
            // a tree with errors, or neither: a bug in the parser, not in the input
            throw new IllegalArgumentException("a parse result holds either a tree or diagnostics");
        }
    }

    static ParseResult success(String source, Query query) {
        return new ParseResult(source, Optional.of(query), List.of());
    }

    static ParseResult failure(String source, List<Diagnostic> diagnostics) {
        return new ParseResult(source, Optional.empty(), diagnostics);
    }

    public boolean isValid() {
        return query.isPresent();
    }

    /** The tree; call only when {@link #isValid()}. */
    public Query tree() {
        return query.orElseThrow(() -> new IllegalStateException("the query did not parse:\n" + render()));
    }

    /** The diagnostics rendered for a person: {@code line L:C:}, the source line and carets. */
    public String render() {
        return Render.all(source, diagnostics);
    }
}

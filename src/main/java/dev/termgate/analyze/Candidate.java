package dev.termgate.analyze;

import dev.termgate.query.Node;

import java.util.function.UnaryOperator;

/**
 * One possible fix of a diagnostic: replace the node at {@code target} (found again by its class and span) with
 * what {@code change} makes of it.
 *
 * @param score  how close the fix is (1 = same name up to case and separators); ranks candidates of one fix
 * @param before the text it replaces, for the edit list
 * @param after  the text it writes
 * @param reason why, in words (the edit list shows it)
 */
public record Candidate(FixKind kind, Node target, UnaryOperator<Node> change, String before, String after,
                        String reason, double score) {

    /** Whether {@code n} is the node this candidate changes (same kind of node at the same place). */
    public boolean targets(Node n) {
        return n.getClass() == target.getClass() && n.span().equals(target.span());
    }
}

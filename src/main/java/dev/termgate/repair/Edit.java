package dev.termgate.repair;

import dev.termgate.analyze.FixKind;
import dev.termgate.query.Span;

/**
 * One change a repair made: what kind, where in the original text, the text before and after, and why.
 */
public record Edit(FixKind kind, Span span, String before, String after, String reason) {

    @Override
    public String toString() {
        String where = span.isNone() ? "" : "line " + span.startLine() + ":" + span.startColumn() + ": ";
        return where + kind.word() + " '" + before + "' → '" + after + "' (" + reason + ")";
    }
}

package dev.termgate.diag;

import dev.termgate.query.Node;
import dev.termgate.query.Span;

import java.util.List;

/**
 * One finding about a query or an input file. Made only through {@link #of} / {@link #at}, so the message
 * always comes from the code's template and the position from the offending node.
 *
 * @param suggestions ranked replacements ("did you mean"), best first; empty when there is none
 */
public record Diagnostic(Code code, Severity severity, Span span, String message, List<String> suggestions) {

    public Diagnostic {
        suggestions = List.copyOf(suggestions);
    }

    public static Diagnostic of(Code code, Node node, Object... args) {
        return at(code, node.span(), args);
    }

    public static Diagnostic at(Code code, Span span, Object... args) {
        return new Diagnostic(code, code.severity(), span, code.format(args), List.of());
    }

    public Diagnostic withSuggestions(List<String> ranked) {
        return new Diagnostic(code, severity, span, message, ranked);
    }

    public Diagnostic withSeverity(Severity newSeverity) {
        return new Diagnostic(code, newSeverity, span, message, suggestions);
    }

    public boolean isError() {
        return severity == Severity.ERROR;
    }

    /** The message with its "did you mean" part, when there are suggestions. */
    public String fullMessage() {
        if (suggestions.isEmpty()) return message;
        return message + "; " + Code.DID_YOU_MEAN.format(Quote.orList(suggestions));
    }

    /** {@code line L:C: error TG3001: message}, without the source excerpt. */
    @Override
    public String toString() {
        String where = span.isNone() ? "" : "line " + span.startLine() + ":" + span.startColumn() + ": ";
        return where + severity.word() + " " + code.id() + ": " + fullMessage();
    }
}

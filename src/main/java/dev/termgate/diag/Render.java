package dev.termgate.diag;

import dev.termgate.query.Span;

import java.util.List;

/** Renders diagnostics for a person: {@code line L:C:}, the source line, and carets under the span. */
public final class Render {
    private Render() {}

    public static String all(String source, List<Diagnostic> diagnostics) {
        StringBuilder sb = new StringBuilder();
        for (Diagnostic d : diagnostics) {
            sb.append(one(source, d));
        }
        return sb.toString();
    }

    public static String one(String source, Diagnostic d) {
        StringBuilder sb = new StringBuilder(d.toString()).append('\n');
        Span s = d.span();
        if (s.isNone() || source == null) return sb.toString();
        String line = lineAt(source, s.startLine());
        if (line == null) return sb.toString();
        String shown = line.length() > 200 ? line.substring(0, 200) + "…" : line;
        sb.append("  ").append(shown.replace('\t', ' ')).append('\n');
        int from = Math.max(1, s.startColumn());
        int to = s.endLine() == s.startLine() ? Math.max(from + 1, s.endColumn()) : line.length() + 1;
        to = Math.min(to, Math.min(shown.length(), line.length()) + 2);
        sb.append("  ").append(" ".repeat(from - 1)).append("^".repeat(Math.max(1, to - from))).append('\n');
        return sb.toString();
    }

    private static String lineAt(String source, int lineNumber) {
        int start = 0;
        for (int n = 1; n < lineNumber; n++) {
            int nl = source.indexOf('\n', start);
            if (nl < 0) return null;
            start = nl + 1;
        }
        int end = source.indexOf('\n', start);
        String line = end < 0 ? source.substring(start) : source.substring(start, end);
        return line.endsWith("\r") ? line.substring(0, line.length() - 1) : line;
    }
}

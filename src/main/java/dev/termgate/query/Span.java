package dev.termgate.query;

/**
 * Where a node stands in the source text. Lines and columns are 1-based; columns count UTF-16 units; the end
 * column is the one just after the last character;
 * offsets are 0-based, end exclusive. Equality of trees ignores spans (see {@link Trees#equalIgnoringSpans}).
 */
public record Span(int startOffset, int endOffset, int startLine, int startColumn, int endLine, int endColumn) {

    /** A span for nodes made by a tool rather than read from text (repairs, the interpreter). */
    public static final Span NONE = new Span(0, 0, 0, 0, 0, 0);

    public Span {
        if (endOffset < startOffset) {
            throw new IllegalArgumentException("span ends before it starts: " + startOffset + ".." + endOffset);
        }
    }

    public boolean isNone() {
        return startLine == 0;
    }

    public int length() {
        return endOffset - startOffset;
    }

    /** The smallest span covering both. */
    public Span to(Span other) {
        if (isNone()) return other;
        if (other.isNone()) return this;
        Span first = startOffset <= other.startOffset ? this : other;
        Span last = endOffset >= other.endOffset ? this : other;
        return new Span(first.startOffset, last.endOffset, first.startLine, first.startColumn, last.endLine, last.endColumn);
    }

    @Override
    public String toString() {
        return isNone() ? "-" : startLine + ":" + startColumn + "-" + endLine + ":" + endColumn;
    }
}

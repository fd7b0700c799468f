package dev.termgate.parser;

import dev.termgate.query.Span;

import java.util.Arrays;

/**
 * Turns ANTLR's code-point indexes into the tree's positions: UTF-16 offsets, 1-based lines and columns.
 * Built once per parse; the code-point table exists only when the text holds characters outside the BMP.
 */
final class SourceMap {
    private final String text;
    private final int[] lineStarts;
    private final int lineCount;
    /** code-point index → UTF-16 offset, or null when they are the same. */
    private final int[] utf16;

    SourceMap(String text) {
        this.text = text;
        int[] starts = new int[16];
        int n = 0;
        starts[n++] = 0;
        boolean supplementary = false;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c == '\n') {
                if (n == starts.length) starts = Arrays.copyOf(starts, n * 2);
                starts[n++] = i + 1;
            } else if (Character.isHighSurrogate(c)) {
                supplementary = true;
            }
        }
        this.lineStarts = starts;
        this.lineCount = n;
        this.utf16 = supplementary ? codePointOffsets(text) : null;
    }

    private static int[] codePointOffsets(String text) {
        int[] map = new int[text.codePointCount(0, text.length()) + 1];
        int cp = 0;
        for (int i = 0; i < text.length(); ) {
            map[cp++] = i;
            i += Character.charCount(text.codePointAt(i));
        }
        map[cp] = text.length();
        return map;
    }

    /** UTF-16 offset of a code-point index. */
    int offset(int codePointIndex) {
        if (utf16 == null) return Math.min(codePointIndex, text.length());
        return utf16[Math.max(0, Math.min(codePointIndex, utf16.length - 1))];
    }

    /** 1-based line of a UTF-16 offset. */
    int line(int offset) {
        int i = Arrays.binarySearch(lineStarts, 0, lineCount, offset);
        return i >= 0 ? i + 1 : -i - 1;
    }

    /** 1-based column (UTF-16 units) of a UTF-16 offset. */
    int column(int offset) {
        return offset - lineStarts[line(offset) - 1] + 1;
    }

    /** The span between two UTF-16 offsets (end exclusive). */
    Span span(int start, int end) {
        if (end < start) end = start;
        if (lineCount == 1) return new Span(start, end, 1, start + 1, 1, end + 1); // the usual one-line query
        int l1 = line(start), l2 = line(end);
        return new Span(start, end, l1, start - lineStarts[l1 - 1] + 1, l2, end - lineStarts[l2 - 1] + 1);
    }

    /** The span of code points {@code [startCp, endCpExclusive)}. */
    Span spanOfCodePoints(int startCp, int endCpExclusive) {
        return span(offset(startCp), offset(endCpExclusive));
    }

    String text() {
        return text;
    }
}

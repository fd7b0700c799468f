package dev.termgate.parser;

import java.util.ArrayList;
import java.util.List;

/**
 * Splits a text holding many queries into the queries, which are separated by blank lines. A blank line inside a
 * string literal, a backtick name or a block comment does not split. Chunks holding only comments are skipped.
 * Shared by {@code check --file} and {@code run --file}.
 */
public final class QueryFile {

    /**
     * One query of the file.
     *
     * @param index  0-based position among the queries
     * @param line   1-based line of the file where the query starts
     * @param text   the query text, without the surrounding blank lines
     */
    public record Entry(int index, int line, String text) {}

    private QueryFile() {}

    public static List<Entry> split(String text) {
        List<Entry> out = new ArrayList<>();
        int n = text.length();
        int chunkStart = 0;
        int line = 1;
        int chunkLine = 1;
        int i = 0;
        char quote = 0;
        boolean blockComment = false;
        boolean lineComment = false;
        boolean lineHasContent = false;
        int lineStart = 0;
        while (i < n) {
            char c = text.charAt(i);
            if (c == '\n') {
                lineComment = false;
                if (quote == 0 && !blockComment && !lineHasContent && isBlank(text, lineStart, i)) {
                    add(out, text, chunkStart, lineStart, chunkLine);
                    chunkStart = i + 1;
                    chunkLine = line + 1;
                }
                line++;
                lineStart = i + 1;
                lineHasContent = false;
                i++;
                continue;
            }
            if (quote != 0 || blockComment || lineComment) lineHasContent = true;
            if (quote != 0) {
                if (c == '\\' && quote != '`') {
                    i += (i + 1 < n && text.charAt(i + 1) != '\n') ? 2 : 1;
                    continue;
                }
                if (c == quote) quote = 0;
            } else if (blockComment) {
                if (c == '*' && i + 1 < n && text.charAt(i + 1) == '/') {
                    blockComment = false;
                    i += 2;
                    continue;
                }
            } else if (!lineComment) {
                if (c == '\'' || c == '"' || c == '`') {
                    quote = c;
                } else if (c == '/' && i + 1 < n && text.charAt(i + 1) == '*') {
                    blockComment = true;
                    lineHasContent = true;
                    i += 2;
                    continue;
                } else if (c == '/' && i + 1 < n && text.charAt(i + 1) == '/') {
                    lineComment = true;
                }
            }
            i++;
        }
        add(out, text, chunkStart, n, chunkLine);
        return out;
    }

    private static boolean isBlank(String text, int from, int to) {
        for (int i = from; i < to; i++) {
            if (!Character.isWhitespace(text.charAt(i))) return false;
        }
        return true;
    }

    /** Adds {@code text[from, to)} when it holds more than blanks and comments; trims leading blank lines. */
    private static void add(List<Entry> out, String text, int from, int to, int line) {
        String chunk = text.substring(from, to);
        int lead = 0;
        while (true) {
            int nl = chunk.indexOf('\n', lead);
            if (nl < 0 || !chunk.substring(lead, nl).isBlank()) break;
            lead = nl + 1;
            line++;
        }
        chunk = chunk.substring(lead).stripTrailing();
        if (chunk.isEmpty() || onlyComments(chunk)) return;
        out.add(new Entry(out.size(), line, chunk));
    }

    private static boolean onlyComments(String chunk) {
        int i = 0;
        int n = chunk.length();
        while (i < n) {
            char c = chunk.charAt(i);
            if (Character.isWhitespace(c)) {
                i++;
            } else if (c == '/' && i + 1 < n && chunk.charAt(i + 1) == '/') {
                int nl = chunk.indexOf('\n', i);
                i = nl < 0 ? n : nl;
            } else if (c == '/' && i + 1 < n && chunk.charAt(i + 1) == '*') {
                int end = chunk.indexOf("*/", i + 2);
                if (end < 0) return false;
                i = end + 2;
            } else {
                return false;
            }
        }
        return true;
    }
}

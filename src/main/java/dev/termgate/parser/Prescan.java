package dev.termgate.parser;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * A linear pass over the raw text before ANTLR sees it. It refuses what would make the recursive-descent parser
 * crash or give a poor message: nesting deeper than the limit (ANTLR recurses per bracket), unterminated strings,
 * names and comments (ANTLR would report a confusing error far from the cause), NUL characters, and text that
 * holds nothing but blanks and comments.
 */
final class Prescan {
    private Prescan() {}

    static List<Diagnostic> check(SourceMap map, int maxDepth) {
        String t = map.text();
        List<Diagnostic> out = new ArrayList<>();
        int depth = 0;
        boolean content = false;
        int i = 0;
        int n = t.length();
        while (i < n) {
            char c = t.charAt(i);
            if (c == '\0') {
                out.add(Diagnostic.at(Code.INVALID_CHARACTER, map.span(i, i + 1), describe(c)));
                i++;
                continue;
            }
            if (c == '/' && i + 1 < n && t.charAt(i + 1) == '/') {
                while (i < n && t.charAt(i) != '\n') i++;
                continue;
            }
            if (c == '/' && i + 1 < n && t.charAt(i + 1) == '*') {
                int end = t.indexOf("*/", i + 2);
                if (end < 0) {
                    out.add(Diagnostic.at(Code.UNTERMINATED_COMMENT, map.span(i, i + 2)));
                    return out;
                }
                i = end + 2;
                continue;
            }
            if (Character.isWhitespace(c) || Character.isSpaceChar(c) || c == '\uFEFF') {
                i++;
                continue;
            }
            content = true;
            if (c == '\'' || c == '"' || c == '`') {
                int j = i + 1;
                boolean closed = false;
                while (j < n) {
                    char d = t.charAt(j);
                    if (d == '\0') {
                        out.add(Diagnostic.at(Code.INVALID_CHARACTER, map.span(j, j + 1), describe(d)));
                    }
                    if (c != '`' && d == '\\') {
                        j += 2;
                        continue;
                    }
                    if (d == c) {
                        if (c == '`' && j + 1 < n && t.charAt(j + 1) == '`') {
                            j += 2;
                            continue;
                        }
                        closed = true;
                        break;
                    }
                    j++;
                }
                if (!closed) {
                    int lineEnd = t.indexOf('\n', i);
                    int end = lineEnd < 0 ? n : lineEnd;
                    out.add(Diagnostic.at(c == '`' ? Code.UNTERMINATED_NAME : Code.UNTERMINATED_STRING,
                            map.span(i, Math.max(i + 1, end))));
                    return out;
                }
                i = j + 1;
                continue;
            }
            if (c == '(' || c == '[' || c == '{') {
                depth++;
                if (depth > maxDepth) {
                    out.add(Diagnostic.at(Code.TOO_DEEP, map.span(i, i + 1), maxDepth));
                    return out;
                }
            } else if (c == ')' || c == ']' || c == '}') {
                depth = Math.max(0, depth - 1);
            }
            i++;
        }
        if (!content && out.isEmpty()) {
            out.add(Diagnostic.at(Code.EMPTY_QUERY, map.span(0, 0)));
        }
        return out;
    }

    /** {@code '—' (U+2014)}; control characters by code only. */
    static String describe(int codePoint) {
        String code = String.format(Locale.ROOT, "U+%04X", codePoint);
        if (Character.isISOControl(codePoint) || !Character.isDefined(codePoint)) return code;
        return "'" + new String(Character.toChars(codePoint)) + "' (" + code + ")";
    }
}

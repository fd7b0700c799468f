package dev.termgate.cli.shell;

import dev.termgate.translate.QueryExtractor;
import org.jline.reader.Candidate;
import org.jline.reader.Completer;
import org.jline.reader.EOFError;
import org.jline.reader.Highlighter;
import org.jline.reader.LineReader;
import org.jline.reader.ParsedLine;
import org.jline.reader.impl.DefaultParser;
import org.jline.utils.AttributedString;
import org.jline.utils.AttributedStringBuilder;
import org.jline.utils.AttributedStyle;

import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** How the shell reads a line: continuation, completion, keyword highlighting. */
final class ShellSyntax {

    static final List<String> KEYWORDS = List.of("MATCH", "OPTIONAL", "WHERE", "RETURN", "WITH", "UNWIND", "ORDER", "BY",
            "SKIP", "LIMIT", "DISTINCT", "AS", "AND", "OR", "NOT", "XOR", "IN", "IS", "NULL", "UNION", "ALL", "ASC",
            "DESC", "ASCENDING", "DESCENDING", "CASE", "WHEN", "THEN", "ELSE", "END", "EXISTS", "STARTS", "ENDS",
            "CONTAINS", "COUNT", "TRUE", "FALSE");
    private static final Pattern WORD = Pattern.compile("\\b[A-Za-z]+\\b");
    private static final Set<String> KEYWORD_SET = Set.copyOf(KEYWORDS);
    /** Our own colours: keywords bold blue, the leading clause word bold magenta. */
    private static final AttributedStyle KEYWORD = AttributedStyle.BOLD.foreground(AttributedStyle.BLUE);

    private ShellSyntax() {}

    /**
     * Any line continues after a trailing backslash. A query continues while a bracket or quote is open, and until
     * it has a RETURN (every read query ends with one) unless it ends with {@code ;} or an empty line.
     */
    static final class Parser extends DefaultParser {
        @Override
        public ParsedLine parse(String line, int cursor, ParseContext context) {
            if (context == ParseContext.ACCEPT_LINE && incomplete(line)) {
                throw new EOFError(-1, -1, "incomplete input", "more");
            }
            return super.parse(line, cursor, context);
        }
    }

    static boolean incomplete(String text) {
        if (text.endsWith("\\")) return true;
        if (!QueryExtractor.startsWithClause(text)) return false;
        int depth = 0;
        char quote = 0;
        boolean returns = false;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (quote != 0) {
                if (c == '\\') i++;
                else if (c == quote) quote = 0;
            } else if (c == '\'' || c == '"' || c == '`') {
                quote = c;
            } else if ((c == 'R' || c == 'r') && text.regionMatches(true, i, "RETURN", 0, 6)
                    && (i == 0 || !Character.isLetterOrDigit(text.charAt(i - 1)))
                    && (i + 6 == text.length() || !Character.isLetterOrDigit(text.charAt(i + 6)))) {
                returns = true;
            } else if (c == '(' || c == '[' || c == '{') {
                depth++;
            } else if (c == ')' || c == ']' || c == '}') {
                depth--;
            }
        }
        if (quote != 0 || depth > 0) return true;
        String t = text.stripTrailing();
        boolean ended = t.endsWith(";") || text.endsWith("\n") || text.endsWith("\n ");
        return !returns && !ended;
    }

    /** Joins the physical lines of one input: a trailing backslash is a line continuation. */
    static String joined(String raw) {
        String t = raw.replace("\\\r\n", "\n").replace("\\\n", "\n").strip();
        while (t.endsWith(";")) t = t.substring(0, t.length() - 1).strip();
        return t;
    }

    static Highlighter highlighter() {
        return new Highlighter() {
            @Override
            public AttributedString highlight(LineReader reader, String buffer) {
                AttributedStringBuilder sb = new AttributedStringBuilder();
                if (!QueryExtractor.startsWithClause(buffer)) return sb.append(buffer).toAttributedString();
                Matcher m = WORD.matcher(buffer);
                int at = 0;
                while (m.find()) {
                    sb.append(buffer.substring(at, m.start()));
                    String w = m.group();
                    boolean kw = KEYWORD_SET.contains(w.toUpperCase(java.util.Locale.ROOT)) && !inName(buffer, m.start());
                    if (kw) sb.styled(KEYWORD, w);
                    else sb.append(w);
                    at = m.end();
                }
                sb.append(buffer.substring(at));
                return sb.toAttributedString();
            }

            @Override
            public void setErrorPattern(Pattern errorPattern) {}

            @Override
            public void setErrorIndex(int errorIndex) {}
        };
    }

    /** A word right after {@code :} or {@code .} is a label, type or property, not a keyword. */
    private static boolean inName(String buffer, int start) {
        return start > 0 && (buffer.charAt(start - 1) == ':' || buffer.charAt(start - 1) == '.');
    }

    /**
     * Completes shell commands at the start of a line, and schema terms (labels, relationship types, property
     * keys) and query keywords anywhere: the term is matched against the identifier being typed, even when it
     * is glued to punctuation as in {@code (v:Ves}.
     */
    static Completer completer(List<String> commands, List<String> labels, List<String> relTypes, List<String> properties) {
        return (reader, line, candidates) -> {
            String word = line.word().substring(0, Math.min(line.wordCursor(), line.word().length()));
            if (line.wordIndex() == 0 && word.startsWith(":")) {
                commands.forEach(c -> candidates.add(new Candidate(c, c, "commands", null, null, null, true)));
                return;
            }
            int i = word.length();
            while (i > 0 && (Character.isLetterOrDigit(word.charAt(i - 1)) || word.charAt(i - 1) == '_')) i--;
            String head = word.substring(0, i);
            List<Candidate> out = new ArrayList<>();
            labels.forEach(t -> out.add(new Candidate(head + t, t, "labels", null, null, null, true)));
            relTypes.forEach(t -> out.add(new Candidate(head + t, t, "relationship types", null, null, null, true)));
            properties.forEach(t -> out.add(new Candidate(head + t, t, "property keys", null, null, null, true)));
            if (head.isEmpty()) KEYWORDS.forEach(k -> out.add(new Candidate(k, k, "keywords", null, null, null, true)));
            candidates.addAll(out);
        };
    }
}

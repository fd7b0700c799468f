package dev.termgate.parser;

import dev.termgate.parser.antlr.CypherLexer;
import org.antlr.v4.runtime.CharStream;
import org.antlr.v4.runtime.CharStreams;
import org.antlr.v4.runtime.CommonToken;
import org.antlr.v4.runtime.CommonTokenFactory;
import org.antlr.v4.runtime.Token;
import org.antlr.v4.runtime.TokenFactory;
import org.antlr.v4.runtime.IntStream;
import org.antlr.v4.runtime.TokenSource;
import org.antlr.v4.runtime.misc.Interval;
import org.antlr.v4.runtime.misc.Pair;

import java.util.HashMap;
import java.util.Map;

/**
 * A hand-written scanner for the plain ASCII queries models write, giving the very tokens the grammar's lexer
 * gives (type, offsets, line, column), several times faster: ANTLR's lexer was a quarter of the parse time.
 * It gives up ({@link #tokenize} returns false) on anything it does not handle exactly like the grammar — a
 * character outside ASCII, a comment, a number other than plain digits or digits '.' digits, a character no
 * token starts with — and the parser then uses ANTLR's lexer. On a syntax error the parser re-lexes with ANTLR's
 * lexer too, so error messages never depend on this class. {@code FastLexerTest} compares the two token by token.
 */
final class FastLexer implements TokenSource {

    /** Keyword text (upper case) → token type, found by asking the grammar's own lexer. */
    private static final Map<String, Integer> KEYWORDS = keywords();

    private CharStream input;
    private Pair<TokenSource, CharStream> source;
    private Token[] tokens = new Token[64];
    private int count;
    private int next;

    /**
     * Scans the whole text. Returns false when the text holds something this scanner leaves to ANTLR's lexer;
     * then no token of it may be used.
     */
    boolean tokenize(String text) {
        count = 0;
        next = 0;
        int n = text.length();
        for (int i = 0; i < n; i++) {
            if (text.charAt(i) >= 128) return false;
        }
        input = new AsciiStream(text);
        source = new Pair<>(this, input);
        int line = 1, lineStart = 0;
        int i = 0;
        while (i < n) {
            char c = text.charAt(i);
            if (c == '\n') {
                line++;
                lineStart = ++i;
                continue;
            }
            if (c == ' ' || c == '\t' || c == '\r' || c == 0x0B || c == 0x0C || c >= 0x1C && c <= 0x1F) {
                i++;
                continue;
            }
            int start = i;
            int type;
            if (isLetter(c) || c == '_') {
                i++;
                while (i < n && isPart(text.charAt(i))) i++;
                type = keyword(text, start, i);
            } else if (c >= '0' && c <= '9') {
                while (i < n && isDigit(text.charAt(i))) i++;
                type = CypherLexer.DecimalInteger;
                if (text.charAt(start) == '0' && i - start > 1) return false;
                if (i < n && text.charAt(i) == '.') {
                    if (i + 1 < n && isDigit(text.charAt(i + 1))) {
                        i++;
                        while (i < n && isDigit(text.charAt(i))) i++;
                        type = CypherLexer.FloatLiteral;
                        if (i < n && (isPart(text.charAt(i)) || text.charAt(i) == '.')) return false;
                    } else if (!(i + 1 < n && text.charAt(i + 1) == '.')) {
                        return false; // '1.' followed by something other than a digit or a second dot
                    }
                } else if (i < n && isPart(text.charAt(i))) {
                    return false; // exponents, hex, octal and invalid numbers
                }
            } else if (c == '\'' || c == '"') {
                i++;
                while (i < n && text.charAt(i) != c) {
                    if (text.charAt(i) == '\\') i++;
                    // a line break inside a literal moves ANTLR's line count on; left to it
                    if (i >= n || text.charAt(i) == '\n') return false;
                    i++;
                }
                if (i >= n) return false;
                i++;
                type = CypherLexer.StringLiteral;
            } else if (c == '`') {
                i++;
                while (true) {
                    if (i >= n) return false;
                    char d = text.charAt(i);
                    if (d == '\n') return false;
                    if (d == '`') {
                        if (i + 1 < n && text.charAt(i + 1) == '`') {
                            i += 2;
                            continue;
                        }
                        break;
                    }
                    i++;
                }
                i++;
                type = CypherLexer.EscapedName;
            } else {
                char d = i + 1 < n ? text.charAt(i + 1) : 0;
                i++;
                switch (c) {
                    case '$' -> type = CypherLexer.DOLLAR;
                    case ',' -> type = CypherLexer.COMMA;
                    case ';' -> type = CypherLexer.SEMI;
                    case ':' -> type = CypherLexer.COLON;
                    case '.' -> {
                        if (d == '.') {
                            i++;
                            type = CypherLexer.DOTDOT;
                        } else if (isDigit(d)) {
                            return false;
                        } else {
                            type = CypherLexer.DOT;
                        }
                    }
                    case '(' -> type = CypherLexer.LPAREN;
                    case ')' -> type = CypherLexer.RPAREN;
                    case '[' -> type = CypherLexer.LBRACKET;
                    case ']' -> type = CypherLexer.RBRACKET;
                    case '{' -> type = CypherLexer.LBRACE;
                    case '}' -> type = CypherLexer.RBRACE;
                    case '+' -> {
                        if (d == '=') {
                            i++;
                            type = CypherLexer.PLUSEQ;
                        } else {
                            type = CypherLexer.PLUS;
                        }
                    }
                    case '=' -> {
                        if (d == '~') {
                            i++;
                            type = CypherLexer.REGEX;
                        } else {
                            type = CypherLexer.EQ;
                        }
                    }
                    case '<' -> {
                        if (d == '>') {
                            i++;
                            type = CypherLexer.NE;
                        } else if (d == '=') {
                            i++;
                            type = CypherLexer.LE;
                        } else {
                            type = CypherLexer.LT;
                        }
                    }
                    case '>' -> {
                        if (d == '=') {
                            i++;
                            type = CypherLexer.GE;
                        } else {
                            type = CypherLexer.GT;
                        }
                    }
                    case '!' -> {
                        if (d == '=') {
                            i++;
                            type = CypherLexer.NE;
                        } else {
                            type = CypherLexer.BANG;
                        }
                    }
                    case '-' -> type = CypherLexer.MINUS;
                    case '*' -> type = CypherLexer.STAR;
                    case '/' -> {
                        if (d == '/' || d == '*') return false;
                        type = CypherLexer.SLASH;
                    }
                    case '%' -> type = CypherLexer.PERCENT;
                    case '^' -> type = CypherLexer.CARET;
                    case '|' -> type = CypherLexer.PIPE;
                    case '&' -> type = CypherLexer.AMP;
                    default -> {
                        return false;
                    }
                }
            }
            add(CommonTokenFactory.DEFAULT.create(source, type, null, Token.DEFAULT_CHANNEL, start, i - 1, line,
                    start - lineStart));
        }
        add(CommonTokenFactory.DEFAULT.create(source, Token.EOF, null, Token.DEFAULT_CHANNEL, n, n - 1, line,
                n - lineStart));
        return true;
    }

    /** The keyword's type, or Identifier. Only words as long as some keyword are looked up. */
    private static int keyword(String text, int start, int end) {
        int len = end - start;
        if (len < MIN_KEYWORD || len > MAX_KEYWORD) return CypherLexer.Identifier;
        char[] up = new char[len];
        for (int k = 0; k < len; k++) {
            char c = text.charAt(start + k);
            up[k] = c >= 'a' && c <= 'z' ? (char) (c - 32) : c;
        }
        Integer kw = KEYWORDS.get(new String(up));
        return kw != null ? kw : CypherLexer.Identifier;
    }

    private static final int MIN_KEYWORD = KEYWORDS.keySet().stream().mapToInt(String::length).min().orElse(0);
    private static final int MAX_KEYWORD = KEYWORDS.keySet().stream().mapToInt(String::length).max().orElse(0);

    /** The text as ANTLR's character stream, for the tokens' text: plain ASCII, so code points are chars. */
    private static final class AsciiStream implements CharStream {
        private final String text;
        private int index;

        AsciiStream(String text) {
            this.text = text;
        }

        @Override
        public String getText(Interval interval) {
            int start = Math.max(0, interval.a);
            int stop = Math.min(interval.b, text.length() - 1);
            return start > stop ? "" : text.substring(start, stop + 1);
        }

        @Override
        public void consume() {
            if (index >= text.length()) throw new IllegalStateException("cannot consume EOF");
            index++;
        }

        @Override
        public int LA(int i) {
            if (i == 0) return 0;
            int at = i > 0 ? index + i - 1 : index + i;
            return at < 0 || at >= text.length() ? IntStream.EOF : text.charAt(at);
        }

        @Override
        public int mark() {
            return -1;
        }

        @Override
        public void release(int marker) {
            // nothing is buffered
        }

        @Override
        public int index() {
            return index;
        }

        @Override
        public void seek(int index) {
            this.index = Math.min(index, text.length());
        }

        @Override
        public int size() {
            return text.length();
        }

        @Override
        public String getSourceName() {
            return IntStream.UNKNOWN_SOURCE_NAME;
        }
    }

    private void add(CommonToken t) {
        if (count == tokens.length) tokens = java.util.Arrays.copyOf(tokens, count * 2);
        tokens[count++] = t;
    }

    private static boolean isLetter(char c) {
        return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z';
    }

    private static boolean isDigit(char c) {
        return c >= '0' && c <= '9';
    }

    /** ASCII characters of {@code IdentifierPart}: ID_Continue ({@code _}, digits, letters) and Sc ({@code $}). */
    private static boolean isPart(char c) {
        return isLetter(c) || isDigit(c) || c == '_' || c == '$';
    }

    private static Map<String, Integer> keywords() {
        Map<String, Integer> out = new HashMap<>();
        CypherLexer lexer = new CypherLexer(CharStreams.fromString(""));
        lexer.removeErrorListeners();
        for (int type = 1; type <= CypherLexer.VOCABULARY.getMaxTokenType(); type++) {
            String name = CypherLexer.VOCABULARY.getSymbolicName(type);
            if (name == null) continue;
            String word = name.endsWith("_") ? name.substring(0, name.length() - 1) : name;
            if (!word.chars().allMatch(ch -> ch >= 'A' && ch <= 'Z')) continue;
            lexer.setInputStream(CharStreams.fromString(word));
            Token t = lexer.nextToken();
            if (t.getType() == type && lexer.nextToken().getType() == Token.EOF) out.put(word, type);
        }
        return Map.copyOf(out);
    }

    // ---- TokenSource ----

    @Override
    public Token nextToken() {
        Token t = tokens[next];
        if (next < count - 1) next++;
        return t;
    }

    @Override
    public int getLine() {
        // also asked by each new token while scanning (then overwritten with the token's own)
        return next < count ? tokens[next].getLine() : 0;
    }

    @Override
    public int getCharPositionInLine() {
        return next < count ? tokens[next].getCharPositionInLine() : 0;
    }

    @Override
    public CharStream getInputStream() {
        return input;
    }

    @Override
    public String getSourceName() {
        return input.getSourceName();
    }

    @Override
    public void setTokenFactory(TokenFactory<?> factory) {
        // tokens are made while scanning, with ANTLR's default factory as its lexer uses
    }

    @Override
    public TokenFactory<?> getTokenFactory() {
        return CommonTokenFactory.DEFAULT;
    }
}

package dev.termgate.parser;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.parser.antlr.CypherLexer;
import dev.termgate.parser.antlr.CypherParser.AnonymousPatternPartContext;
import dev.termgate.parser.antlr.CypherParser.PatternContext;
import dev.termgate.parser.antlr.CypherParser.PatternElementContext;
import dev.termgate.parser.antlr.CypherParser.PatternPartContext;
import org.antlr.v4.runtime.BaseErrorListener;
import org.antlr.v4.runtime.CommonToken;
import org.antlr.v4.runtime.CommonTokenStream;
import org.antlr.v4.runtime.DefaultErrorStrategy;
import org.antlr.v4.runtime.ListTokenSource;
import org.antlr.v4.runtime.Parser;
import org.antlr.v4.runtime.RecognitionException;
import org.antlr.v4.runtime.Recognizer;
import org.antlr.v4.runtime.RuleContext;
import org.antlr.v4.runtime.Token;
import org.antlr.v4.runtime.TokenStream;
import org.antlr.v4.runtime.Vocabulary;
import org.antlr.v4.runtime.atn.ATN;
import org.antlr.v4.runtime.atn.PredictionMode;
import org.antlr.v4.runtime.misc.IntervalSet;
import org.antlr.v4.runtime.misc.ParseCancellationException;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;

/**
 * Turns ANTLR's syntax errors into diagnostics that speak of {@code <expression>}, {@code <pattern>} and
 * {@code <name>} rather than grammar rules and token names. Only the first error is kept: after it, ANTLR's
 * guesses about the rest of the text mislead more than they help.
 */
final class SyntaxErrors {
    private SyntaxErrors() {}

    /** Keywords and symbols for a table of "expected" words; computed once from the grammar. */
    private static final IntervalSet EXPRESSION_START;
    private static final IntervalSet NAME_START;
    private static final IntervalSet CLAUSE_START;
    /** Tokens that continue an expression: binary operators, predicates and postfix selectors. */
    private static final IntervalSet OPERATORS = IntervalSet.of(CypherLexer.AND, CypherLexer.AND);

    static {
        ATN atn = dev.termgate.parser.antlr.CypherParser._ATN;
        EXPRESSION_START = atn.nextTokens(atn.ruleToStartState[dev.termgate.parser.antlr.CypherParser.RULE_expression]);
        NAME_START = atn.nextTokens(atn.ruleToStartState[dev.termgate.parser.antlr.CypherParser.RULE_schemaName]);
        for (int t : new int[] {CypherLexer.OR, CypherLexer.XOR, CypherLexer.NOT, CypherLexer.CONTAINS,
                CypherLexer.ENDS, CypherLexer.STARTS, CypherLexer.IN, CypherLexer.IS, CypherLexer.EQ, CypherLexer.NE,
                CypherLexer.LT, CypherLexer.GT, CypherLexer.LE, CypherLexer.GE, CypherLexer.PLUS, CypherLexer.MINUS,
                CypherLexer.STAR, CypherLexer.SLASH, CypherLexer.PERCENT, CypherLexer.CARET, CypherLexer.REGEX,
                CypherLexer.DOT, CypherLexer.LBRACKET, CypherLexer.COLON}) {
            OPERATORS.add(t);
        }
        CLAUSE_START = atn.nextTokens(atn.ruleToStartState[dev.termgate.parser.antlr.CypherParser.RULE_clause]);
    }

    /** No single-token insertion or deletion: report where the text first goes wrong, then stop. */
    static final class Strategy extends DefaultErrorStrategy {
        @Override
        protected Token singleTokenDeletion(Parser recognizer) {
            return null;
        }

        @Override
        protected boolean singleTokenInsertion(Parser recognizer) {
            return false;
        }

        @Override
        public void reportError(Parser recognizer, RecognitionException e) {
            super.reportError(recognizer, e);
            throw new ParseCancellationException(e);
        }

        @Override
        public void recover(Parser recognizer, RecognitionException e) {
            throw new ParseCancellationException(e);
        }
    }

    /** Collects the first syntax error as a diagnostic. */
    static final class Listener extends BaseErrorListener {
        private final SourceMap map;
        final List<Diagnostic> diagnostics = new ArrayList<>(1);

        Listener(SourceMap map) {
            this.map = map;
        }

        @Override
        public void syntaxError(Recognizer<?, ?> recognizer, Object offendingSymbol, int line, int charPositionInLine,
                                String msg, RecognitionException e) {
            if (!diagnostics.isEmpty()) return;
            Token t = offendingSymbol instanceof Token tok ? tok : null;
            Parser parser = recognizer instanceof Parser p ? p : null;
            diagnostics.add(describe(parser, t, e));
        }

        private Diagnostic describe(Parser parser, Token t, RecognitionException e) {
            if (t == null) {
                return Diagnostic.at(Code.SYNTAX_ERROR, map.span(0, 0), "syntax error");
            }
            int start = t.getType() == Token.EOF ? map.text().length() : map.offset(t.getStartIndex());
            int end = t.getType() == Token.EOF ? start : map.offset(t.getStopIndex() + 1);
            var span = map.span(start, Math.max(start, end));
            if (t.getType() == CypherLexer.UNKNOWN) {
                return Diagnostic.at(Code.INVALID_CHARACTER, span, Prescan.describe(t.getText().codePointAt(0)));
            }
            if (t.getType() == CypherLexer.InvalidNumber && !expects(parser, e, CypherLexer.Identifier)) {
                return Diagnostic.at(Code.INVALID_NUMBER, span, t.getText());
            }
            IntervalSet reported = e != null && e.getExpectedTokens() != null ? e.getExpectedTokens()
                    : parser != null ? parser.getExpectedTokens() : new IntervalSet();
            IntervalSet expected = parser == null ? reported : completeExpected(parser, t, reported);
            RuleContext ctx = e != null && e.getCtx() != null ? e.getCtx() : parser != null ? parser.getContext() : null;
            List<String> words = expectedWords(expected, ctx, parser == null ? null : parser.getVocabulary());
            Diagnostic d = Diagnostic.at(Code.UNEXPECTED_INPUT, span, offending(t), joinOr(words));
            List<String> close = Spelling.closeKeywords(t, expected, parser == null ? null : parser.getVocabulary());
            return close.isEmpty() ? d : d.withSuggestions(close);
        }

        private static boolean expects(Parser parser, RecognitionException e, int type) {
            IntervalSet s = e != null && e.getExpectedTokens() != null ? e.getExpectedTokens()
                    : parser != null ? parser.getExpectedTokens() : null;
            return s != null && s.contains(type);
        }
    }

    /**
     * Tokens that continue something already begun: symbols, the word operators and the words that go on a clause.
     * ANTLR reports the expected tokens of the state where it noticed an error, which misses what could have
     * continued an optional part or a loop it had already left ({@code (n:Port RETURN} lacked {@code ':'} and
     * {@code '|'}; {@code [1, 2} lacked the operators); these are the tokens then worth trying.
     */
    private static final IntervalSet CONTINUATIONS = new IntervalSet();
    /** Tokens (whitespace included) before an error beyond which ANTLR's own expected set is given as it is. */
    private static final int MAX_TRIAL_PREFIX = 256;

    static {
        var vocabulary = dev.termgate.parser.antlr.CypherParser.VOCABULARY;
        for (int type = 1; type <= vocabulary.getMaxTokenType(); type++) {
            String literal = vocabulary.getLiteralName(type);
            if (literal != null && !Character.isLetter(literal.charAt(1))) CONTINUATIONS.add(type);
        }
        for (int type : new int[] {CypherLexer.AND, CypherLexer.OR, CypherLexer.XOR, CypherLexer.NOT, CypherLexer.IN,
                CypherLexer.IS, CypherLexer.CONTAINS, CypherLexer.STARTS, CypherLexer.ENDS, CypherLexer.AS,
                CypherLexer.WHERE, CypherLexer.ORDER, CypherLexer.SKIP_, CypherLexer.LIMIT, CypherLexer.UNION,
                CypherLexer.THEN, CypherLexer.ELSE, CypherLexer.END, CypherLexer.WHEN, Token.EOF}) {
            CONTINUATIONS.add(type);
        }
    }

    /**
     * ANTLR's expected tokens at {@code offending}, completed with the {@link #CONTINUATIONS} that can stand
     * there: each is tried after the text before it and kept when the parse then goes wrong no earlier than the
     * end of input. Errors only: a few dozen parses of the prefix, so not after {@link #MAX_TRIAL_PREFIX} tokens.
     */
    static IntervalSet completeExpected(Parser parser, Token offending, IntervalSet reported) {
        if (offending.getTokenIndex() > MAX_TRIAL_PREFIX) return reported;
        TokenStream in = parser.getInputStream();
        List<Token> prefix = new ArrayList<>();
        for (int i = 0; i < offending.getTokenIndex(); i++) {
            Token x = in.get(i);
            if (x.getChannel() == Token.DEFAULT_CHANNEL) prefix.add(x);
        }
        IntervalSet out = new IntervalSet(reported);
        for (int type : CONTINUATIONS.subtract(reported).toList()) {
            if (continues(prefix, type)) out.add(type);
        }
        return out;
    }

    /** Whether {@code prefix} followed by a token of {@code type} is the start of some statement. */
    private static boolean continues(List<Token> prefix, int type) {
        List<Token> tokens = new ArrayList<>(prefix.size() + 2);
        for (Token x : prefix) tokens.add(new CommonToken(x));
        tokens.add(new CommonToken(type, type == Token.EOF ? "<EOF>" : "x"));
        if (type != Token.EOF) tokens.add(new CommonToken(Token.EOF, "<EOF>"));
        for (int i = 0; i < tokens.size(); i++) ((CommonToken) tokens.get(i)).setTokenIndex(i);
        var trial = new dev.termgate.parser.antlr.CypherParser(
                new CommonTokenStream(new ListTokenSource(tokens)));
        trial.removeErrorListeners();
        TrialStop stop = new TrialStop();
        trial.setErrorHandler(stop);
        trial.getInterpreter().setPredictionMode(PredictionMode.SLL);
        try {
            trial.statement();
            return true;
        } catch (TrialStop.Stopped stopped) {
            return stop.at > prefix.size();
        }
    }

    /**
     * Stops a trial parse at its first error and remembers where, without the stack traces of ANTLR's own
     * exceptions (a trial fails far more often than not).
     */
    private static final class TrialStop extends DefaultErrorStrategy {
        static final class Stopped extends RuntimeException {
            Stopped() {
                super(null, null, false, false);
            }
        }

        private static final Stopped STOPPED = new Stopped();
        int at = -1;

        @Override
        public void recover(Parser recognizer, RecognitionException e) {
            at = e.getOffendingToken() == null ? recognizer.getCurrentToken().getTokenIndex()
                    : e.getOffendingToken().getTokenIndex();
            throw STOPPED;
        }

        @Override
        public Token recoverInline(Parser recognizer) {
            at = recognizer.getCurrentToken().getTokenIndex();
            throw STOPPED;
        }

        @Override
        public void sync(Parser recognizer) {
            // errors are found by the matching itself; sync's look-ahead would only report them earlier
        }

        @Override
        public void reportError(Parser recognizer, RecognitionException e) {
            recover(recognizer, e);
        }
    }

    /** {@code 'RETRUN'} or {@code end of input}. */
    static String offending(Token t) {
        if (t.getType() == Token.EOF) return "end of input";
        String text = t.getText();
        if (text.length() > 40) text = text.substring(0, 37) + "...";
        if (t.getType() == CypherLexer.StringLiteral) return "string " + text;
        return "'" + text + "'";
    }

    static List<String> expectedWords(IntervalSet expected, RuleContext ctx, Vocabulary vocabulary) {
        List<String> words = new ArrayList<>();
        IntervalSet rest = new IntervalSet(expected);
        if (expected.contains(CypherLexer.StringLiteral) && expected.contains(CypherLexer.DecimalInteger)) {
            words.add("<expression>");
            rest = rest.subtract(EXPRESSION_START);
        }
        if (rest.contains(CypherLexer.Identifier)) {
            words.add("<name>");
            rest = rest.subtract(NAME_START);
        }
        if (rest.contains(CypherLexer.LPAREN) && inPattern(ctx)) {
            words.add("<pattern>");
            rest.remove(CypherLexer.LPAREN);
        }
        if (rest.and(CLAUSE_START).size() == CLAUSE_START.size()) {
            words.add("<clause>");
            rest = rest.subtract(CLAUSE_START);
        }
        boolean operator = rest.contains(CypherLexer.AND) && rest.contains(CypherLexer.PLUS)
                && rest.contains(CypherLexer.EQ);
        if (operator) rest = rest.subtract(OPERATORS);
        List<Integer> types = new ArrayList<>(rest.toList());
        types.sort(Comparator.comparing(SyntaxErrors::sortKey));
        for (int type : types) {
            String w = tokenWord(type, vocabulary);
            if (!words.contains(w)) words.add(w);
        }
        if (operator) {
            // after a complete expression every operator could follow; naming them all hides the likely fix
            int eof = words.indexOf("end of input");
            words.add(eof < 0 ? words.size() : eof, "<operator>");
        }
        if (words.size() > 12) {
            List<String> first = new ArrayList<>(words.subList(0, 11));
            first.add("…");
            return first;
        }
        return words;
    }

    /** Keywords first (alphabetical), then symbols, then end of input. */
    private static String sortKey(int type) {
        if (type == Token.EOF) return "2";
        String name = dev.termgate.parser.antlr.CypherParser.VOCABULARY.getLiteralName(type);
        return name == null ? "0" + type(type) : "1" + name;
    }

    private static String type(int type) {
        String s = dev.termgate.parser.antlr.CypherParser.VOCABULARY.getSymbolicName(type);
        return s == null ? "" : s;
    }

    static String tokenWord(int type, Vocabulary vocabulary) {
        if (type == Token.EOF) return "end of input";
        switch (type) {
            case CypherLexer.DecimalInteger, CypherLexer.HexInteger, CypherLexer.OctalInteger:
                return "<integer>";
            case CypherLexer.StringLiteral:
                return "<string>";
            case CypherLexer.FloatLiteral:
                return "<number>";
            case CypherLexer.NE:
                return "'<>'";
            case CypherLexer.SKIP_:
                return "'SKIP'";
            default:
                break;
        }
        Vocabulary v = vocabulary != null ? vocabulary : dev.termgate.parser.antlr.CypherParser.VOCABULARY;
        String literal = v.getLiteralName(type);
        if (literal != null) return literal;
        String symbolic = v.getSymbolicName(type);
        return symbolic == null ? "<" + type + ">" : "'" + symbolic.toUpperCase(Locale.ROOT) + "'";
    }

    /** Only where a path may start: a '(' inside a node pattern or a label expression is just a parenthesis. */
    private static boolean inPattern(RuleContext c) {
        return c instanceof PatternContext || c instanceof PatternPartContext
                || c instanceof AnonymousPatternPartContext || c instanceof PatternElementContext;
    }

    /** {@code a}, {@code a or b}, {@code a, b or c}. Words are already quoted or bracketed. */
    static String joinOr(List<String> words) {
        if (words.isEmpty()) return "something else";
        if (words.size() == 1) return words.get(0);
        return String.join(", ", words.subList(0, words.size() - 1)) + " or " + words.get(words.size() - 1);
    }
}

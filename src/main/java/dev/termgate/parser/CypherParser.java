package dev.termgate.parser;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.parser.antlr.CypherLexer;
import dev.termgate.parser.antlr.CypherParser.StatementContext;
import dev.termgate.query.Query;
import org.antlr.v4.runtime.BailErrorStrategy;
import org.antlr.v4.runtime.CharStreams;
import org.antlr.v4.runtime.CommonTokenStream;
import org.antlr.v4.runtime.atn.PredictionMode;
import org.antlr.v4.runtime.misc.ParseCancellationException;

import java.util.ArrayList;
import java.util.List;

/**
 * The one entry to the openCypher grammar: text in, a syntax tree or syntax diagnostics out. Stateless and
 * thread-safe (each thread reuses its own lexer and parser; ANTLR's prediction cache is shared and synchronized).
 * Never throws on bad input: every fault becomes a {@link Diagnostic} in the TG1xxx band.
 *
 * <pre>{@code
 * ParseResult r = new CypherParser().parse("MATCH (n:Vessel) RETURN n.name");
 * if (r.isValid()) use(r.tree()); else System.err.print(r.render());
 * }</pre>
 */
public final class CypherParser {

    /** Longer input is refused before lexing; model-written queries are a few hundred characters. */
    public static final int MAX_LENGTH = 100_000;
    /** Deeper bracket nesting is refused before parsing, because ANTLR recurses once or more per level. */
    public static final int MAX_DEPTH = 100;

    private final int maxLength;
    private final int maxDepth;

    public CypherParser() {
        this(MAX_LENGTH, MAX_DEPTH);
    }

    /**
     * The length of operator chain the message names: a chain of 1,000 AND parses on a default thread stack
     * (BadInputTest checks it); a few thousand overflow it.
     */
    static final int OPERATOR_CHAIN_HINT = 1_000;

    /** With other limits (for tests and for callers that know their input). */
    public CypherParser(int maxLength, int maxDepth) {
        this.maxLength = maxLength;
        this.maxDepth = maxDepth;
    }

    /** Parses one statement (an optional trailing semicolon is allowed). */
    public ParseResult parse(String text) {
        if (text == null) text = "";
        if (text.length() > maxLength) {
            SourceMap head = new SourceMap(text.substring(0, 1));
            return ParseResult.failure(text, List.of(Diagnostic.at(Code.TOO_LONG, head.span(0, 0), maxLength)));
        }
        SourceMap map = new SourceMap(text);
        List<Diagnostic> early = Prescan.check(map, maxDepth);
        if (!early.isEmpty()) return ParseResult.failure(text, early);
        try {
            return parseChecked(text, map);
        } catch (StackOverflowError e) {
            // A last guard: long operator chains (a AND b AND …, NOT NOT …) recurse without brackets. Not TG1010:
            // such a query may not nest at all, and saying so would send the user looking for brackets.
            return ParseResult.failure(text, List.of(Diagnostic.at(Code.TOO_COMPLEX, map.span(0, 0), OPERATOR_CHAIN_HINT)));
        }
    }

    /**
     * One lexer, token stream and parser per thread, pointed at each new text: constructing them (and their
     * prediction simulators) cost as much as lexing a typical query. ANTLR resets them on a new input.
     */
    private static final ThreadLocal<Machinery> MACHINERY = ThreadLocal.withInitial(Machinery::new);

    private static final class Machinery {
        final CypherLexer lexer = new CypherLexer(CharStreams.fromString(""));
        final CommonTokenStream tokens = new CommonTokenStream(lexer);
        final dev.termgate.parser.antlr.CypherParser parser = new dev.termgate.parser.antlr.CypherParser(tokens);
        final BailErrorStrategy bail = new BailErrorStrategy();
        final FastLexer fast = new FastLexer();
        /** Set while a parse runs: a re-entrant call on the same thread (none today) gets fresh objects. */
        boolean busy;

        Machinery() {
            lexer.removeErrorListeners();
            parser.removeErrorListeners();
        }

        /** Points the parser at the text: through the fast scanner when it takes the text and {@code fastOk}. */
        boolean reset(String text, boolean fastOk) {
            boolean viaFast = fastOk && fast.tokenize(text);
            if (viaFast) {
                tokens.setTokenSource(fast);
            } else {
                lexer.setInputStream(CharStreams.fromString(text));
                tokens.setTokenSource(lexer);
            }
            parser.setInputStream(tokens);
            parser.removeErrorListeners();
            return viaFast;
        }
    }

    private ParseResult parseChecked(String text, SourceMap map) {
        Machinery m = MACHINERY.get();
        if (m.busy) m = new Machinery();
        m.busy = true;
        try {
            return parseWith(m, text, map);
        } finally {
            m.busy = false;
            // a long text's tokens and parse tree are not kept alive until the thread's next parse
            if (text.length() > 10_000) m.reset("", false);
        }
    }

    private ParseResult parseWith(Machinery m, String text, SourceMap map) {
        boolean viaFast = m.reset(text, true);
        CommonTokenStream tokens = m.tokens;
        dev.termgate.parser.antlr.CypherParser parser = m.parser;
        StatementContext tree;
        // Two stages: the fast SLL prediction with bail-out, and full LL only when SLL fails (then either the text
        // is wrong, and LL gives the exact error, or SLL was too weak for it).
        parser.getInterpreter().setPredictionMode(PredictionMode.SLL);
        parser.setErrorHandler(m.bail);
        try {
            tree = parser.statement();
        } catch (ParseCancellationException sllFailed) {
            if (viaFast) {
                // error messages (and LL's second look) always come from the grammar's own lexer
                m.reset(text, false);
            } else {
                tokens.seek(0);
                parser.reset();
            }
            parser.getInterpreter().setPredictionMode(PredictionMode.LL);
            parser.setErrorHandler(new SyntaxErrors.Strategy());
            SyntaxErrors.Listener listener = new SyntaxErrors.Listener(map);
            parser.addErrorListener(listener);
            try {
                tree = parser.statement();
            } catch (ParseCancellationException llFailed) {
                tree = null;
            } finally {
                parser.removeErrorListeners();
            }
            if (!listener.diagnostics.isEmpty()) return ParseResult.failure(text, listener.diagnostics);
            if (tree == null) {
                return ParseResult.failure(text, List.of(Diagnostic.at(Code.SYNTAX_ERROR, map.span(0, 0), "syntax error")));
            }
        }
        TreeBuilder builder = new TreeBuilder(map);
        Query query = builder.statement(tree);
        List<Diagnostic> problems = new ArrayList<>(builder.diagnostics);
        if (builder.patternPredicates > 0) problems.addAll(PatternPlacement.check(query));
        if (!problems.isEmpty()) return ParseResult.failure(text, problems);
        return ParseResult.success(text, query);
    }
}

package dev.termgate.parser;

import dev.termgate.parser.antlr.CypherLexer;
import dev.termgate.tck.TckScenarios;
import org.antlr.v4.runtime.CharStreams;
import org.antlr.v4.runtime.Token;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The hand-written scanner against the grammar's own lexer (the reference): wherever it takes a text, every token
 * (type, offsets, line, column, text) and the end-of-input token must be the same. Texts: every query of the
 * openCypher TCK 1.0.0-M23 (read from the test classpath), and random texts built from query fragments, numbers,
 * strings, names and odd characters (seeded, so a failure repeats).
 */
class FastLexerTest {

    @Test
    void sameTokensAsTheGrammarsLexerOnTheTck() {
        int taken = 0, total = 0;
        for (TckScenarios.Scenario s : TckScenarios.all()) {
            if (s.query().isEmpty()) continue;
            total++;
            if (compare(s.query().get())) taken++;
        }
        System.out.printf("FastLexer: %d of %d TCK queries scanned, every token equal to the grammar's lexer%n", taken, total);
        // most model-written queries are plain ASCII without comments: most of the TCK is too
        assertTrue(taken > total / 2, taken + " of " + total);
    }

    @Test
    void sameTokensAsTheGrammarsLexerOnRandomText() {
        String[] pieces = {"MATCH", "match", "Return", " ", "  ", "\n", "\t", "\r\n", "(", ")", "[", "]", "{", "}", ":",
            "-", "->", "<-", "<", ">", "=", "<>", "!=", "<=", ">=", "=~", "+=", "+", "*", "/", "%", "^", "|", "&", "!", ".",
            "..", ",", ";", "$", "n", "_x", "a$b", "ends", "ENDS", "end", "skip", "SKIP", "in", "Index", "0", "00", "1", "12",
            "1.5", "0.5", ".5", "1.", "1e5", "1.5e-3", "0x1F", "0o17", "12ab", "'s'", "'a\\'b'", "\"q\"", "'", "\"", "`n`",
            "`a``b`", "`", "//c\n", "/*c*/", "#", "~", "?", "@", "\\", "é", "\u0000", "WHERE", "with", "CASE", "count",
            "allShortestPaths", "x1", "9"};
        Random random = new Random(20261202L);
        int taken = 0, total = 20_000;
        for (int k = 0; k < total; k++) {
            StringBuilder sb = new StringBuilder();
            int len = 1 + random.nextInt(12);
            for (int j = 0; j < len; j++) sb.append(pieces[random.nextInt(pieces.length)]);
            if (compare(sb.toString())) taken++;
        }
        System.out.printf("FastLexer: %d of %d random texts scanned, every token equal to the grammar's lexer%n", taken, total);
        assertTrue(taken > total / 10, "the scanner took only " + taken + " random texts");
    }

    /** Whether the scanner took the text; when it did, asserts its tokens equal the grammar lexer's. */
    private static boolean compare(String text) {
        FastLexer fast = new FastLexer();
        if (!fast.tokenize(text)) return false;
        CypherLexer antlr = new CypherLexer(CharStreams.fromString(text));
        antlr.removeErrorListeners();
        List<String> want = new ArrayList<>(), got = new ArrayList<>();
        while (true) {
            Token w = antlr.nextToken();
            want.add(describe(w));
            got.add(describe(fast.nextToken()));
            if (w.getType() == Token.EOF) break;
        }
        got.add(describe(fast.nextToken())); // past the end: still the end-of-input token
        want.add(want.get(want.size() - 1));
        assertEquals(want, got, () -> "tokens of: " + text);
        return true;
    }

    private static String describe(Token t) {
        return t.getType() + " " + t.getStartIndex() + ".." + t.getStopIndex() + " @" + t.getLine() + ":"
                + t.getCharPositionInLine() + " ch" + t.getChannel() + " '" + t.getText() + "'";
    }
}

package dev.termgate.parser;

import dev.termgate.diag.Code;
import dev.termgate.query.Printer;
import dev.termgate.query.Trees;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Input meant to break a parser: each gets a clear diagnostic, never an exception or a stack overflow. */
class BadInputTest {

    private final CypherParser parser = new CypherParser();

    private Code firstCode(String text) {
        ParseResult r = parser.parse(text);
        assertFalse(r.isValid(), "should be refused");
        return r.diagnostics().get(0).code();
    }

    @Test
    void oneMegabyteQueryIsRefusedAsTooLong() {
        String big = "RETURN '" + "x".repeat(1 << 20) + "'";
        ParseResult r = parser.parse(big);
        assertEquals(Code.TOO_LONG, r.diagnostics().get(0).code());
        assertEquals("the query is longer than 100000 characters", r.diagnostics().get(0).message());
    }

    @Test
    void tenThousandNestedParenthesesAreRefusedBeforeParsing() {
        String deep = "RETURN " + "(".repeat(10_000) + "1" + ")".repeat(10_000);
        ParseResult r = parser.parse(deep);
        assertEquals(Code.TOO_DEEP, r.diagnostics().get(0).code());
        assertEquals(1, r.diagnostics().get(0).span().startLine());
        assertEquals(8 + CypherParser.MAX_DEPTH, r.diagnostics().get(0).span().startColumn());
        assertEquals(Code.TOO_DEEP, firstCode("RETURN " + "[".repeat(10_000)));
        assertEquals(Code.TOO_DEEP, firstCode("RETURN " + "{a:".repeat(10_000)));
    }

    @Test
    void nestingUpToTheLimitStillParses() {
        String ok = "RETURN " + "(".repeat(CypherParser.MAX_DEPTH) + "1" + ")".repeat(CypherParser.MAX_DEPTH);
        assertTrue(parser.parse(ok).isValid(), () -> parser.parse(ok).render());
    }

    @Test
    void longPrefixOperatorChainsDoNotOverflowTheStack() {
        // no brackets, so the prescan does not see the depth; the result must still be a diagnostic or a tree
        ParseResult r = parser.parse("RETURN " + "NOT ".repeat(20_000) + "true");
        assertTrue(r.isValid() || r.diagnostics().get(0).code() == Code.TOO_COMPLEX, r.render());
        ParseResult minus = parser.parse("RETURN " + "- ".repeat(40_000) + "1");
        assertTrue(minus.isValid() || minus.diagnostics().get(0).code() == Code.TOO_COMPLEX);
    }

    @Test
    void aFlatChainTooLongToReadIsNotCalledNesting() {
        // 10,000 terms in under 100,000 characters, so that the length limit does not answer first
        ParseResult r = parser.parse("MATCH (n) WHERE n.a" + " AND n.a".repeat(10_000) + " RETURN n");
        assertFalse(r.isValid());
        assertEquals(Code.TOO_COMPLEX, r.diagnostics().get(0).code(), r.render());
        assertFalse(r.render().contains("nests"), r.render());
    }

    @Test
    void aChainAsLongAsTheMessageSaysStillParses() {
        StringBuilder and = new StringBuilder("MATCH (n) WHERE n.a = 0");
        for (int i = 1; i < CypherParser.OPERATOR_CHAIN_HINT; i++) and.append(" AND n.a <> ").append(i);
        ParseResult r = parser.parse(and.append(" RETURN n").toString());
        assertTrue(r.isValid(), r.render());
    }

    @Test
    void longFlatQueriesParse() {
        // width is not depth: 5,000 list elements and 300 AND terms (the tree of a chain is as deep as it is long)
        StringBuilder list = new StringBuilder("RETURN [");
        for (int i = 0; i < 5_000; i++) list.append(i == 0 ? "" : ", ").append(i);
        assertTrue(parser.parse(list.append("] AS xs").toString()).isValid());
        StringBuilder and = new StringBuilder("MATCH (n) WHERE n.a = 0");
        for (int i = 1; i < 300; i++) and.append(" AND n.a <> ").append(i);
        ParseResult r = parser.parse(and.append(" RETURN n").toString());
        assertTrue(r.isValid(), r.render());
        assertTrue(Trees.equalIgnoringSpans(r.tree(), parser.parse(Printer.print(r.tree())).tree()));
    }

    @Test
    void emptyCommentsStringsAndNul() {
        assertEquals(Code.EMPTY_QUERY, firstCode(""));
        assertEquals(Code.EMPTY_QUERY, firstCode("  \t\n "));
        assertEquals(Code.EMPTY_QUERY, firstCode("// nothing\n/* at all */"));
        assertEquals(Code.EMPTY_QUERY, firstCode(null));
        assertEquals(Code.UNTERMINATED_STRING, firstCode("RETURN 'abc"));
        assertEquals(Code.UNTERMINATED_STRING, firstCode("RETURN \"abc\\\""));
        assertEquals(Code.UNTERMINATED_COMMENT, firstCode("RETURN 1 /*"));
        assertEquals(Code.INVALID_CHARACTER, firstCode("RETURN 1\u0000"));
        assertEquals(Code.INVALID_CHARACTER, firstCode("RETURN '\u0000'"));
        assertEquals(Code.INVALID_CHARACTER, firstCode("\u0000"));
    }

    @Test
    void positionsCountUtf16UnitsAfterCharactersOutsideTheBmp() {
        // the emoji is two UTF-16 units; the column of the fault after it must say 17
        ParseResult r = parser.parse("RETURN '\uD83E\uDDD0' AS x y");
        assertEquals(1, r.diagnostics().get(0).span().startLine());
        assertEquals(18, r.diagnostics().get(0).span().startColumn(), r.render());
    }

    @Test
    void parsesConcurrently() throws Exception {
        List<String> queries = List.of("MATCH (a:A)-[:R]->(b) WHERE a.x > 1 RETURN b.y, count(*)",
                "MATCH (a) RETURN a ORDER BY a.name DESC LIMIT 3", "RETURN [x IN range(1, 10) WHERE x % 2 = 0 | x ^ 2]",
                "MATCH (a RETURN a", "UNWIND $xs AS x WITH x WHERE x STARTS WITH 'a' RETURN collect(x)");
        List<ParseResult> expected = queries.stream().map(parser::parse).toList();
        ExecutorService pool = Executors.newFixedThreadPool(4);
        try {
            List<Future<Boolean>> futures = new ArrayList<>();
            for (int t = 0; t < 8; t++) {
                futures.add(pool.submit(() -> {
                    for (int i = 0; i < 300; i++) {
                        int k = i % queries.size();
                        ParseResult r = parser.parse(queries.get(k));
                        ParseResult e = expected.get(k);
                        if (r.isValid() != e.isValid()) return false;
                        if (r.isValid() && !r.tree().equals(e.tree())) return false;
                        if (!r.isValid() && !r.diagnostics().equals(e.diagnostics())) return false;
                    }
                    return true;
                }));
            }
            for (Future<Boolean> f : futures) assertTrue(f.get());
        } finally {
            pool.shutdownNow();
        }
    }
}

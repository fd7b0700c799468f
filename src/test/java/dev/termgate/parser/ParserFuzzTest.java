package dev.termgate.parser;

import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Printer;
import dev.termgate.query.Trees;
import dev.termgate.tck.TckScenarios;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.ShrinkingMode;
import net.jqwik.api.lifecycle.BeforeContainer;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.List;

/**
 * Property-based fuzzing (jqwik): token soups, truncations and single-character mutations of openCypher TCK
 * 1.0.0-M23 queries. The parser must return its own result (a tree, or diagnostics with positions inside the text)
 * and never throw; a tree must survive the printer round trip. 3 × 35,000 = 105,000 inputs. The time check is a
 * hang guard on the thread's CPU time (so that a busy shared machine does not count), not a benchmark.
 */
class ParserFuzzTest {

    private static final CypherParser PARSER = new CypherParser();
    private static final ThreadMXBean THREADS = ManagementFactory.getThreadMXBean();
    /** Hang guard from the issue: no input may take more than 100 ms. */
    private static final long LIMIT_NANOS = 100_000_000L;
    private static List<String> queries;

    @BeforeContainer
    static void warmUp() {
        queries = TckScenarios.all().stream().map(s -> s.query().get()).filter(q -> q.length() <= 400).toList();
        // a warm parser, as in use: ANTLR fills its prediction cache on first sight of each construct
        queries.forEach(PARSER::parse);
    }

    private static final List<String> TOKENS = List.of(
            "MATCH", "OPTIONAL", "WHERE", "WITH", "RETURN", "UNWIND", "AS", "ORDER", "BY", "SKIP", "LIMIT", "DISTINCT",
            "UNION", "ALL", "CREATE", "MERGE", "SET", "DELETE", "DETACH", "REMOVE", "CALL", "YIELD", "EXISTS", "COUNT",
            "CASE", "WHEN", "THEN", "ELSE", "END", "AND", "OR", "XOR", "NOT", "IN", "IS", "NULL", "STARTS", "ENDS",
            "CONTAINS", "true", "false", "any", "none", "single", "reduce", "shortestPath", "FOREACH", "LOAD", "CSV",
            "(", ")", "[", "]", "{", "}", ":", ",", ".", "..", "-", "->", "<-", "--", "<", ">", "=", "<>", "<=", ">=",
            "+", "*", "/", "%", "^", "|", "&", "!", "$", ";", "=~", "+=", "n", "m", "r", "p", "x", "Person", "`a b`",
            "`", "name", "1", "0x1F", "0o17", "1.5", ".5", "1e3", "0x", "12ab", "9223372036854775808", "'s'", "\"d\"",
            "'", "\"", "'\\u00e9'", "'\\uZZ'", "'\\q'", "//c\n", "/*c*/", "/*", "\u0000", "\u2014", "\uD83E\uDDD0",
            "\n", "\t");

    @Provide
    Arbitrary<String> tokenSoups() {
        return Arbitraries.of(TOKENS).list().ofMinSize(0).ofMaxSize(30).map(l -> String.join(" ", l));
    }

    @Provide
    Arbitrary<String> truncations() {
        return Arbitraries.integers().between(0, Integer.MAX_VALUE).map(i -> {
            String q = queries.get(i % queries.size());
            return q.substring(0, (i / queries.size()) % (q.length() + 1));
        });
    }

    @Provide
    Arbitrary<String> mutations() {
        Arbitrary<Character> chars = Arbitraries.oneOf(Arbitraries.of('(', ')', '[', ']', '{', '}', '\'', '"', '`', ':',
                ',', '.', '-', '>', '<', '*', '|', '$', ' ', '\n', '\\', '\u0000', '\u2014'), Arbitraries.chars());
        return Combinators.combine(Arbitraries.of(queries), Arbitraries.integers().between(0, 10_000), chars,
                Arbitraries.integers().between(0, 2)).as((q, at, c, kind) -> {
                    int i = at % (q.length() + 1);
                    return switch (kind) {
                        case 0 -> q.substring(0, i) + c + q.substring(i);
                        case 1 -> i < q.length() ? q.substring(0, i) + c + q.substring(i + 1) : q + c;
                        default -> i < q.length() ? q.substring(0, i) + q.substring(i + 1) : q;
                    };
                });
    }

    @Property(tries = 35_000, shrinking = ShrinkingMode.OFF)
    void tokenSoupsGiveAResult(@ForAll("tokenSoups") String text) {
        check(text);
    }

    @Property(tries = 35_000, shrinking = ShrinkingMode.OFF)
    void truncatedTckQueriesGiveAResult(@ForAll("truncations") String text) {
        check(text);
    }

    @Property(tries = 35_000, shrinking = ShrinkingMode.OFF)
    void mutatedTckQueriesGiveAResult(@ForAll("mutations") String text) {
        check(text);
    }

    private static void check(String text) {
        long t0 = THREADS.getCurrentThreadCpuTime();
        ParseResult r = PARSER.parse(text);
        long took = THREADS.getCurrentThreadCpuTime() - t0;
        if (took > LIMIT_NANOS) {
            throw new AssertionError("took " + took / 1_000_000 + " ms of CPU time: " + text);
        }
        if (r.isValid()) {
            String printed = Printer.print(r.tree());
            ParseResult again = PARSER.parse(printed);
            if (!again.isValid() || !Trees.equalIgnoringSpans(r.tree(), again.tree())) {
                throw new AssertionError("round trip failed for: " + text + "\nprinted: " + printed);
            }
        } else {
            if (r.diagnostics().isEmpty()) throw new AssertionError("no tree and no diagnostic: " + text);
            for (Diagnostic d : r.diagnostics()) {
                if (d.span().endOffset() > text.length()) {
                    throw new AssertionError("diagnostic outside the text: " + d + " for: " + text);
                }
            }
        }
    }
}

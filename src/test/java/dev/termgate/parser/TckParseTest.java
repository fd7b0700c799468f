package dev.termgate.parser;

import dev.termgate.query.Clause;
import dev.termgate.query.Query;
import dev.termgate.query.Trees;
import dev.termgate.tck.TckScenarios;
import dev.termgate.tck.TckScenarios.Scenario;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The parser against the openCypher TCK 1.0.0-M23 (Maven artifact org.opencypher:tck, read from the test
 * classpath by {@link TckScenarios}). Prints the counts and every failure with its reason.
 */
class TckParseTest {

    private final CypherParser parser = new CypherParser();

    @Test
    void readOnlyResultQueriesParse() {
        List<Scenario> scenarios = TckScenarios.readOnlyWithResult();
        List<String> failures = new ArrayList<>();
        for (Scenario s : scenarios) {
            ParseResult r = parser.parse(s.query().get());
            if (!r.isValid()) failures.add(s.id() + "\n" + s.query().get() + "\n" + r.render());
        }
        int parsed = scenarios.size() - failures.size();
        System.out.printf("TCK M23 read-only queries with an expected result: %d of %d parse (%.2f%%)%n", parsed,
                scenarios.size(), 100.0 * parsed / scenarios.size());
        failures.forEach(f -> System.out.println("NOT PARSED " + f));
        // Source: the requirement, ≥ 99% of the 2,888 read-only result queries of TCK M23.
        assertTrue(parsed >= Math.ceil(0.99 * scenarios.size()), parsed + " of " + scenarios.size());
    }

    @Test
    void updateQueriesParseWithTheirWriteClause() {
        List<Scenario> updates = TckScenarios.updates().stream()
                .filter(s -> !s.expectsCompileError()).toList();
        List<String> failures = new ArrayList<>();
        for (Scenario s : updates) {
            ParseResult r = parser.parse(s.query().get());
            if (!r.isValid()) {
                failures.add(s.id() + "\n" + s.query().get() + "\n" + r.render());
            } else if (!hasWriteClause(r.tree())) {
                failures.add(s.id() + " parsed without a write clause\n" + s.query().get());
            }
        }
        System.out.printf("TCK M23 update queries (no compile-time error expected): %d of %d parse with a write clause%n",
                updates.size() - failures.size(), updates.size());
        failures.forEach(f -> System.out.println("UPDATE NOT PARSED " + f));
        assertTrue(failures.isEmpty(), failures.size() + " update queries failed");
    }

    @Test
    void grammarErrorsAreRejected() {
        Map<String, int[]> perDetail = new TreeMap<>();
        List<String> accepted = new ArrayList<>();
        for (Scenario s : TckScenarios.parserErrorScenarios()) {
            ParseResult r = parser.parse(s.query().get());
            int[] c = perDetail.computeIfAbsent(s.expectedError().get().detail(), k -> new int[2]);
            c[1]++;
            if (!r.isValid()) {
                c[0]++;
            } else {
                accepted.add(s.id() + "\n" + s.query().get());
            }
        }
        perDetail.forEach((d, c) -> System.out.printf("TCK M23 %s: %d of %d rejected by the parser%n", d, c[0], c[1]));
        accepted.forEach(a -> System.out.println("WRONGLY ACCEPTED " + a));
        assertTrue(accepted.isEmpty(), accepted.size() + " faulty queries accepted");
    }

    static boolean hasWriteClause(Query q) {
        return !Trees.find(q, Clause.class).stream().filter(Clause::isWrite).toList().isEmpty();
    }
}

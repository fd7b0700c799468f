package dev.termgate.parser;

import dev.termgate.query.Printer;
import dev.termgate.query.Query;
import dev.termgate.query.Trees;
import dev.termgate.tck.TckScenarios;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** parse(print(parse(q))) equals parse(q), spans aside, for every query of the openCypher TCK 1.0.0-M23 that parses. */
class PrinterRoundTripTest {

    private final CypherParser parser = new CypherParser();

    @Test
    void everyParsedTckQueryPrintsToTheSameTree() {
        int parsed = 0;
        List<String> failures = new ArrayList<>();
        List<String> queries = new ArrayList<>();
        TckScenarios.all().forEach(s -> {
            queries.addAll(s.setup());
            s.query().ifPresent(queries::add);
            queries.addAll(s.controlQueries());
        });
        for (String q : queries) {
            ParseResult first = parser.parse(q);
            if (!first.isValid()) continue;
            parsed++;
            String printed = Printer.print(first.tree());
            ParseResult again = parser.parse(printed);
            if (!again.isValid()) {
                failures.add(q + "\n--- printed:\n" + printed + "\n--- does not parse:\n" + again.render());
            } else if (!Trees.equalIgnoringSpans(first.tree(), again.tree())) {
                failures.add(q + "\n--- printed:\n" + printed + "\n--- reads to another tree:\n"
                        + Trees.stripSpans(first.tree()) + "\n" + Trees.stripSpans(again.tree()));
            } else if (!Printer.print(again.tree()).equals(printed)) {
                failures.add(q + "\n--- printing is not stable:\n" + printed);
            }
        }
        System.out.printf("Round trip: %d of %d parsed TCK queries (setup, query and control) print back to the same tree%n",
                parsed - failures.size(), parsed);
        failures.stream().limit(30).forEach(f -> System.out.println("ROUND TRIP FAILED " + f));
        assertTrue(failures.isEmpty(), failures.size() + " round-trip failures");
    }

    @Test
    void canonicalFormIsReadable() {
        Query q = parser.parse("match (a:Vessel)-[:CALLED_AT*1..3]->(p:Port) where a.flag='PA' and p.name starts with 'R' "
                + "return p.name as port, count(distinct a) as vessels order by vessels desc limit 5").tree();
        // common practice: upper-case keywords, one clause per line
        assertEquals("""
                MATCH (a:Vessel)-[:CALLED_AT*1..3]->(p:Port)
                WHERE a.flag = 'PA' AND p.name STARTS WITH 'R'
                RETURN p.name AS port, count(DISTINCT a) AS vessels
                ORDER BY vessels DESC
                LIMIT 5""", Printer.print(q));
    }
}

package dev.termgate.bench;

import dev.termgate.analyze.Analysis;
import dev.termgate.analyze.Analyzer;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Parse + analyze throughput against the schema.org-derived schema (src/test/resources/ontologies/schema.nq),
 * one thread, warm. Target (issue "Ontology-aware analysis"): at least 30,000 queries per second per core.
 * Run: {@code mvn -B -o -Pbench verify -Dtest=AnalyzeBenchTest -Dsurefire.failIfNoSpecifiedTests=false}.
 * Prints the figure; asserts only that the queries are valid (speed is never asserted).
 */
@Tag("bench")
class AnalyzeBenchTest {

    static final List<String> QUERIES = List.of(
            "MATCH (p:Person)-[:WORKS_FOR]->(o:Organization) WHERE o.name STARTS WITH 'A' RETURN o.name, count(p) AS staff ORDER BY staff DESC LIMIT 10",
            "MATCH (m:Movie)-[:DIRECTOR]->(d:Person) WHERE m.datePublished >= '2000-01-01' RETURN d.name, collect(m.name) AS movies",
            "MATCH (e:Event)-[:LOCATION]->(p:Place) WITH p, count(e) AS events WHERE events > 2 RETURN p.name, events",
            "MATCH (b:Book)-[:AUTHOR]->(a:Person), (b)-[:PUBLISHER]->(o:Organization) RETURN a.name, o.name, b.isbn",
            "MATCH (p:Person)-[:MEMBER_OF]->(o:Organization) OPTIONAL MATCH (o)-[:PARENT_ORGANIZATION]->(q:Organization) RETURN p.name, o.name, q.name");

    @Test
    void parseAndAnalyze() {
        GraphSchema schema = OntologyLoader.load(List.of("src/test/resources/ontologies/schema.nq")).schema();
        CypherParser parser = new CypherParser();
        Analyzer analyzer = Analyzer.forSchema(schema);
        for (String q : QUERIES) {
            Analysis a = analyzer.analyze(parser.parse(q).tree());
            System.out.println((a.hasErrors() ? "INVALID " : "valid   ") + q + (a.hasErrors() ? "\n   " + a.diagnostics() : ""));
            assertFalse(a.hasErrors(), q);
        }
        long sink = 0;
        long end = System.nanoTime() + 10_000_000_000L; // warm-up: 10 s (common practice for the JIT to settle)
        while (System.nanoTime() < end) sink += run(parser, analyzer);
        int rounds = 5;
        double best = 0;
        for (int r = 0; r < rounds; r++) {
            long n = 0;
            long t0 = System.nanoTime();
            long stop = t0 + 3_000_000_000L;
            while (System.nanoTime() < stop) {
                sink += run(parser, analyzer);
                n += QUERIES.size();
            }
            double qps = n / ((System.nanoTime() - t0) / 1e9);
            best = Math.max(best, qps);
            System.out.printf("round %d: %.0f queries/s (parse + analyze, one thread)%n", r + 1, qps);
        }
        System.out.printf("best: %.0f queries/s; schema: %d labels, %d relationship types, %d property keys%n", best,
                schema.labels().size(), schema.relTypes().size(), schema.properties().size());
        assertTrue(sink > 0);
    }

    private static long run(CypherParser parser, Analyzer analyzer) {
        long s = 0;
        for (String q : QUERIES) {
            ParseResult r = parser.parse(q);
            s += analyzer.analyze(r.tree()).diagnostics().size() + 1;
        }
        return s;
    }
}

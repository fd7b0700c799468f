package dev.termgate.bench;

import dev.termgate.analyze.Analysis;
import dev.termgate.analyze.Analyzer;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.query.Query;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Parse + analyze throughput against the schema.org-derived schema (src/test/resources/ontologies/schema.nq),
 * one thread, warm. Target (issue "Ontology-aware analysis"): at least 30,000 queries per second per core. A second
 * figure on the small demo ontology, with queries of the same shapes, and the analysis time of each query on
 * both, show that analysis does not grow with the ontology's size.
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

    /**
     * Queries of the same shapes over the demo ontology (examples/maritime, about a hundred terms against
     * schema.org's ~2,500), for the second figure: analysis must not grow with the ontology's size.
     */
    static final List<String> DEMO_QUERIES = List.of(
            "MATCH (v:Vessel)-[:OPERATED_BY]->(c:Carrier) WHERE c.name STARTS WITH 'A' RETURN c.name, count(v) AS fleet ORDER BY fleet DESC LIMIT 10",
            "MATCH (s:Shipment)-[:LOADED_AT]->(p:Port) WHERE s.bookingDate >= '2024-01-01' RETURN p.name, collect(s.shipmentReference) AS shipments",
            "MATCH (pc:PortCall)-[:AT_PORT]->(p:Port) WITH p, count(pc) AS calls WHERE calls > 2 RETURN p.name, calls",
            "MATCH (d:CustomsDeclaration)-[:DECLARES]->(s:Shipment), (d)-[:FILED_BY]->(b:CustomsBroker) RETURN s.shipmentReference, b.name, d.declarationNumber",
            "MATCH (v:Vessel)-[:OPERATED_BY]->(c:Carrier) OPTIONAL MATCH (c)-[:HEADQUARTERED_IN]->(k:Country) RETURN v.name, c.name, k.name");

    @Test
    void parseAndAnalyze() {
        GraphSchema schema = OntologyLoader.load(List.of("src/test/resources/ontologies/schema.nq")).schema();
        double best = measure("schema.org", schema, QUERIES);
        System.out.printf("best: %.0f queries/s; schema: %d labels, %d relationship types, %d property keys%n", best,
                schema.labels().size(), schema.relTypes().size(), schema.properties().size());
    }

    @Test
    void parseAndAnalyzeOnASmallOntology() {
        GraphSchema schema = OntologyLoader.load(List.of(OntologyLoader.DEMO)).schema();
        double best = measure("demo", schema, DEMO_QUERIES);
        System.out.printf("best (demo ontology): %.0f queries/s; schema: %d labels, %d relationship types, %d property keys%n",
                best, schema.labels().size(), schema.relTypes().size(), schema.properties().size());
    }

    /** Warm-up, then the best of five 3-second rounds of parse + analyze; also prints analysis alone per query. */
    private static double measure(String name, GraphSchema schema, List<String> queries) {
        CypherParser parser = new CypherParser();
        Analyzer analyzer = Analyzer.forSchema(schema);
        List<Query> trees = new ArrayList<>();
        for (String q : queries) {
            ParseResult r = parser.parse(q);
            assertTrue(r.isValid(), q);
            Analysis a = analyzer.analyze(r.tree());
            System.out.println((a.hasErrors() ? "INVALID " : "valid   ") + q + (a.hasErrors() ? "\n   " + a.diagnostics() : ""));
            assertFalse(a.hasErrors(), q);
            trees.add(r.tree());
        }
        long sink = 0;
        ThreadMXBean threads = ManagementFactory.getThreadMXBean();
        // Warm-up: 10 s (common practice for the JIT to settle), counted in this thread's CPU time so that a
        // busy machine does not shorten it; at most 60 s of wall clock.
        long cpuEnd = threads.getCurrentThreadCpuTime() + 10_000_000_000L;
        long end = System.nanoTime() + 60_000_000_000L;
        while (threads.getCurrentThreadCpuTime() < cpuEnd && System.nanoTime() < end) sink += run(parser, analyzer, queries);
        int rounds = 5;
        double best = 0, bestCpu = 0;
        for (int r = 0; r < rounds; r++) {
            long n = 0;
            long t0 = System.nanoTime();
            long c0 = threads.getCurrentThreadCpuTime();
            long stop = t0 + 3_000_000_000L;
            while (System.nanoTime() < stop) {
                sink += run(parser, analyzer, queries);
                n += queries.size();
            }
            double qps = n / ((System.nanoTime() - t0) / 1e9);
            // Also per second of this thread's CPU time: on a shared machine the wall clock counts time the
            // thread waited for a core; the CPU figure is the one that stands for "per core".
            double cpuQps = n / ((threads.getCurrentThreadCpuTime() - c0) / 1e9);
            best = Math.max(best, qps);
            bestCpu = Math.max(bestCpu, cpuQps);
            System.out.printf("%s round %d: %.0f queries/s wall, %.0f per CPU-second (parse + analyze, one thread)%n",
                    name, r + 1, qps, cpuQps);
        }
        System.out.printf("%s best per CPU-second: %.0f queries/s%n", name, bestCpu);
        // Analysis alone, per query: the figure to compare between ontologies of different sizes.
        for (int i = 0; i < trees.size(); i++) {
            Query t = trees.get(i);
            double fastest = Double.MAX_VALUE;
            for (int r = 0; r < 5; r++) {
                long t0 = System.nanoTime();
                for (int k = 0; k < 20_000; k++) sink += analyzer.analyze(t).diagnostics().size() + 1;
                fastest = Math.min(fastest, (System.nanoTime() - t0) / 20_000.0 / 1e3);
            }
            System.out.printf("%s analyze only, query %d: %.2f µs%n", name, i + 1, fastest);
        }
        System.out.printf("%s: load average %.2f at the end of the measurement (%d cores)%n", name,
                ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage(),
                Runtime.getRuntime().availableProcessors());
        assertTrue(sink > 0);
        return best;
    }

    private static long run(CypherParser parser, Analyzer analyzer, List<String> queries) {
        long s = 0;
        for (String q : queries) {
            ParseResult r = parser.parse(q);
            s += analyzer.analyze(r.tree()).diagnostics().size() + 1;
        }
        return s;
    }
}

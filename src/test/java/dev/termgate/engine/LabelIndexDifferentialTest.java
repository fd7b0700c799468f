package dev.termgate.engine;

import dev.termgate.graph.GraphBuilder;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.query.Query;
import dev.termgate.schema.GraphSchema;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Differential test of the embedded graph's label index ({@link GraphPort#selectiveVertexIds}): a match that starts
 * from a selective label looks its vertices up by id instead of testing every vertex's label. On seeded graphs
 * with skewed labels (a rare one, a common one, nodes with two labels and with none) and on the demo graph (its
 * gold queries, subclass labels included), every query must give the same rows, or the same error, with the index
 * as with the label scan. The scan is the reference: it is what the openCypher TCK checks (TckEngineTest).
 */
class LabelIndexDifferentialTest {

    @AfterEach
    void restore() {
        Matcher.labelIndex = true;
    }

    private static final String[] QUERIES = {
        "MATCH (a:A) RETURN a",
        "MATCH (a:A|B) RETURN a.p, a.s",
        "MATCH (a:A&B) RETURN count(*)",
        "MATCH (a:!C) RETURN a.p",
        "MATCH (a:%) RETURN count(a)",
        "MATCH (a) RETURN count(a)",
        "MATCH (a:A)-[r:R]->(b) RETURN a.p, type(r), b.p",
        "MATCH (b)<-[r]-(a:B) RETURN a.s, b.s",
        "MATCH (a:A) WHERE a.p > 1 RETURN a.p",
        "MATCH (a:A {p: 2}) RETURN a",
        "MATCH (a:B) WHERE a.p = 1.0 RETURN a.s",
        "MATCH (a:A {s: 'x1'}) RETURN a.p",
        "MATCH (a:B) WHERE a.s = 'x2' RETURN a.p",
        "MATCH (a:A)-[*1..2]->(b:B) RETURN count(*)",
        "MATCH (a:A|B)-[:S*1..3]-(b:C) RETURN count(DISTINCT b)",
        "OPTIONAL MATCH (a:A) RETURN count(a)",
        "MATCH (a:B) MATCH (a)-[:S]->(c:A) RETURN count(*)",
        "MATCH (a:A), (b:B) RETURN count(*)",
        "MATCH (a:C) RETURN count(a)",
        "MATCH (x:Z) RETURN x",
        "MATCH (a:A) WITH a MATCH (b:A) WHERE b.p = a.p RETURN count(*)",
        "MATCH (a:A)-[:R]->(b:A) RETURN a.p, b.p ORDER BY a.p, b.p LIMIT 3",
        // the planner starts at the rarer label
        "MATCH (c:C)-[r:R]->(a:A) RETURN c.p, a.p, r",
        "MATCH (c:C)-[:S*1..2]->(a:A|B) RETURN c.s, count(*)",
        "MATCH p = (c:C)<-[:R]-(b:B)-[:S]->(x) RETURN nodes(p)",
    };

    /** Labels skewed so that A, A&B and B fall under the index's threshold and C does not. */
    static TinkerGraph graph(Random rnd) {
        GraphBuilder b = new GraphBuilder();
        int n = 30 + rnd.nextInt(50);
        List<Object> ids = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            double x = rnd.nextDouble();
            List<String> labels = x < 0.06 ? List.of("A") : x < 0.12 ? List.of("A", "B") : x < 0.3 ? List.of("B")
                    : x < 0.9 ? List.of("C") : List.of();
            Map<String, Object> props = new java.util.HashMap<>();
            if (rnd.nextInt(4) > 0) props.put("p", rnd.nextBoolean() ? (Object) (long) rnd.nextInt(4) : (Object) (double) rnd.nextInt(3));
            if (rnd.nextInt(3) > 0) props.put("s", "x" + rnd.nextInt(3));
            ids.add(b.addNode(labels, props));
        }
        for (int i = 0; i < 2 * n; i++) {
            b.addRelationship(ids.get(rnd.nextInt(n)), ids.get(rnd.nextInt(n)), rnd.nextBoolean() ? "R" : "S", Map.of());
        }
        return b.graph();
    }

    @Test
    void rowsWithTheIndexEqualRowsFromTheScan() {
        Random rnd = new Random(20261202L);
        List<String> report = new ArrayList<>();
        int runs = 0, indexed = 0;
        for (int gi = 0; gi < 20; gi++) {
            try (Engine engine = Engines.embedded(graph(rnd), "labels")) {
                for (String text : QUERIES) {
                    Query q = parse(text);
                    Matcher.labelIndex = true;
                    List<String> withIndex = PushdownDifferentialTest.outcome(engine, q, text, false);
                    if (plan(engine, q, text, GraphSchema.empty()).contains("$labelIndex")) indexed++;
                    Matcher.labelIndex = false;
                    List<String> scan = PushdownDifferentialTest.outcome(engine, q, text, false);
                    Matcher.labelIndex = true;
                    runs++;
                    if (!withIndex.equals(scan) && report.size() < 8) {
                        report.add("graph " + gi + ": " + text + "\n  index " + withIndex + "\n  scan  " + scan);
                    }
                }
            }
        }
        System.out.printf("label index differential: %d runs, %d planned from the index%n", runs, indexed);
        assertEquals(List.of(), report, "rows from the label index that differ from the label scan");
        // Without this the test could pass by never using the index.
        assertTrue(indexed >= runs / 3, "only " + indexed + " of " + runs + " runs started from the label index");
    }

    @Test
    void theIndexIsTakenForASelectiveLabelWithoutAnIndexedEquality() {
        try (Engine engine = Engines.embedded(graph(new Random(5L)), "labels")) {
            String selective = plan(engine, "MATCH (a:A) RETURN a");
            assertTrue(selective.contains("g.V($labelIndex).hasLabel("), selective);
            // a number equality is no index probe (1 = 1.0), so the label index still serves it
            assertTrue(plan(engine, "MATCH (a:A {p: 2}) RETURN a").contains("g.V($labelIndex)"));
            // a string equality is answered by the property index instead
            assertFalse(plan(engine, "MATCH (a:A {s: 'x1'}) RETURN a").contains("$labelIndex"));
            // C covers more than a third of the vertices: testing each label is as quick
            assertFalse(plan(engine, "MATCH (a:C) RETURN a").contains("$labelIndex"));
            assertFalse(plan(engine, "MATCH (a) RETURN a").contains("$labelIndex"));
        }
    }

    @Test
    void ofTwoLabelledStartsThePlannerTakesTheRarerLabel() {
        try (Engine engine = Engines.embedded(graph(new Random(5L)), "labels")) {
            String plan = plan(engine, "MATCH (c:C)-[:R]->(a:A) RETURN c.p, a.p");
            assertTrue(plan.contains("g.V($labelIndex).hasLabel(within(['A', 'A::B'])).as('n1')")
                    || plan.contains("g.V($labelIndex).hasLabel(within(['A::B', 'A'])).as('n1')"), plan);
            // the scan's planner took the first of equals
            Matcher.labelIndex = false;
            plan = plan(engine, "MATCH (c:C)-[:R]->(a:A) RETURN c.p, a.p");
            assertTrue(plan.contains("g.V().hasLabel('C').as('n0')"), plan);
        }
    }

    @Test
    void theDemoGoldQueriesGiveTheSameRows() {
        GraphSchema schema = DemoQueries.schema();
        int indexed = 0;
        try (Engine engine = GraphFiles.demo(schema).engine()) {
            for (DemoQueries.Gold gold : DemoQueries.gold()) {
                Query q = parse(gold.query());
                Request req = new Request(q, gold.query(), schema, null, Limits.unlimitedRows(Duration.ofSeconds(20)));
                Matcher.labelIndex = true;
                List<String> withIndex = RowBags.bag(engine.run(req).rows());
                if (engine.explain(req).render().contains("$labelIndex")) indexed++;
                Matcher.labelIndex = false;
                List<String> scan = RowBags.bag(engine.run(req).rows());
                Matcher.labelIndex = true;
                assertEquals(scan, withIndex, gold.id() + ": " + gold.query());
            }
        }
        assertTrue(indexed > 0, "no gold query started from the label index");
    }

    private static String plan(Engine engine, String text) {
        return plan(engine, parse(text), text, GraphSchema.empty());
    }

    private static String plan(Engine engine, Query q, String text, GraphSchema schema) {
        return engine.explain(new Request(q, text, schema, null, Limits.defaults())).render();
    }

    private static Query parse(String text) {
        ParseResult pr = new CypherParser().parse(text);
        assertTrue(pr.isValid(), text + ": " + pr.diagnostics());
        return pr.tree();
    }
}

package dev.termgate.engine;

import dev.termgate.parser.CypherParser;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * What {@link ProjectionPushdown} sends to the graph, seen through {@code --explain} on the demo graph
 * (examples/maritime), and that a pushed query answers as the client path does.
 */
class ProjectionPushdownTest {
    private static Engine demo;

    @BeforeAll
    static void open() {
        demo = GraphFiles.demo(DemoQueries.schema()).engine();
    }

    @AfterAll
    static void close() {
        demo.close();
    }

    @AfterEach
    void restore() {
        ProjectionPushdown.enabled = true;
    }

    private static Request request(String text) {
        return Request.of(new CypherParser().parse(text).tree(), text, DemoQueries.schema(), Limits.defaults());
    }

    private static Plan plan(String text) {
        return demo.explain(request(text));
    }

    private static String traversal(Plan p) {
        return p.steps().stream().filter(s -> s.kind() == Plan.Kind.TRAVERSAL).map(Plan.Step::text).findFirst().orElse("");
    }

    private static List<Plan.Step> client(Plan p) {
        return p.steps().stream().filter(s -> s.kind() == Plan.Kind.CLIENT).toList();
    }

    @Test
    void countOfALabelIsOneNumberFromTheGraph() {
        Plan p = plan("MATCH (v:Vessel) RETURN count(v)");
        String t = traversal(p);
        assertTrue(t.endsWith(".as('n0').count()"), p.render());
        assertEquals(List.of(), client(p), p.render());
    }

    @Test
    void groupedCountWithOrderAndLimitRunsWhollyInTheTraversal() {
        String q = "MATCH (p:Port)<-[:AT_PORT]-(c:PortCall) RETURN p.name, count(c) ORDER BY count(c) DESC LIMIT 3";
        Plan p = plan(q);
        String t = traversal(p);
        for (String step : List.of(".groupCount().by(", ".order().by(__.select('v'), Order.desc)", ".range(0L, 3L)")) {
            assertTrue(t.contains(step), step + " missing in\n" + p.render());
        }
        assertEquals(List.of(), client(p), "nothing left for the client:\n" + p.render());
    }

    @Test
    void aFloatSumIsFinishedOnTheClientAndItsOrderToo() {
        Plan p = plan("MATCH (s:Shipment)-[:CONSIGNED_TO]->(c:Consignee) RETURN c.name, sum(s.declaredValue) AS v ORDER BY v DESC LIMIT 1");
        assertTrue(traversal(p).contains(".sum()") && traversal(p).contains(".groupCount()"), p.render());
        List<String> kinds = client(p).stream().map(Plan.Step::clause).toList();
        assertEquals(List.of("RETURN", "ORDER BY", "LIMIT"), kinds, p.render());
    }

    @Test
    void aPlainProjectionSortsAndCutsInTheTraversal() {
        Plan p = plan("MATCH (v:Vessel)-[:OPERATED_BY]->(c:Carrier) RETURN v.name, c.name ORDER BY c.name DESC, v.name LIMIT 3");
        String t = traversal(p);
        for (String step : List.of(".order().by(", ".limit(3L)", ".project('c0', 'c1', 'bad')")) {
            assertTrue(t.contains(step), step + " missing in\n" + p.render());
        }
        assertFalse(t.contains("elementMap"), "only the projected values come back:\n" + p.render());
        assertEquals(List.of(), client(p), p.render());
    }

    @Test
    void ineligibleProjectionsKeepTheClientSteps() {
        for (String q : List.of(
                "MATCH (v:Vessel) RETURN CASE WHEN v.grossTonnage > 50000 THEN 'big' ELSE 'small' END AS size, count(v)",
                "OPTIONAL MATCH (v:Vessel) RETURN count(v)",
                "MATCH (v:Vessel) RETURN count(v) + 1",
                "MATCH (v:Vessel)-[:OPERATED_BY*1..2]->(c) RETURN count(c)",
                "MATCH (v:Voyage) WHERE v.departureDate >= date('2024-01-01') RETURN count(v)",
                "MATCH (v:Vessel) RETURN v.name ORDER BY v.grossTonnage LIMIT 3",
                "MATCH (v:Vessel) RETURN v ORDER BY v LIMIT 3")) {
            Plan p = plan(q);
            assertTrue(client(p).stream().anyMatch(s -> s.clause().equals("RETURN")), q + "\n" + p.render());
            assertFalse(traversal(p).contains(".group()") || traversal(p).contains(".fold()"), q + "\n" + p.render());
        }
    }

    @Test
    void pushedAndClientAnswersAgreeOnTheDemoGraph() {
        for (String q : List.of(
                "MATCH (v:Vessel) RETURN count(v)",
                "MATCH (p:Port)<-[:AT_PORT]-(c:PortCall) RETURN p.name, count(c) ORDER BY count(c) DESC, p.name LIMIT 3",
                "MATCH (s:Shipment) RETURN s.currency, avg(s.declaredValue) AS avgValue, count(s) AS shipments",
                "MATCH (t:Terminal)-[:LOCATED_IN]->(p:Port) RETURN p.name, count(t) AS n, min(t.name), max(t.name) ORDER BY n DESC, p.name",
                "MATCH (v:Vessel)-[:OPERATED_BY]->(c:Carrier) RETURN v.name, c.name ORDER BY c.name DESC, v.name SKIP 2 LIMIT 5",
                "MATCH (v:Vessel) RETURN v, v.grossTonnage AS t ORDER BY t")) {
            long before = ProjectionPushdown.TAKEN.get();
            Result pushed = demo.run(request(q));
            assertEquals(before + 1, ProjectionPushdown.TAKEN.get(), "not pushed: " + q);
            ProjectionPushdown.enabled = false;
            Result client = demo.run(request(q));
            ProjectionPushdown.enabled = true;
            assertEquals(client.columns(), pushed.columns(), q);
            assertEquals(Values.literal(client.rows().stream().sorted(java.util.Comparator.comparing(Values::literal)).toList()),
                    Values.literal(pushed.rows().stream().sorted(java.util.Comparator.comparing(Values::literal)).toList()), q);
            if (q.contains("ORDER BY")) assertEquals(Values.literal(client.rows()), Values.literal(pushed.rows()), q);
            assertFalse(pushed.rows().isEmpty(), q);
        }
    }
}

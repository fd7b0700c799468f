package dev.termgate.engine;

import dev.termgate.parser.CypherParser;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Where a pattern starts is a matter of speed only: each query here is run once as written, where a node is
 * looked up by property equality (inline or in WHERE, at an end or in the middle), and once with the same
 * condition hidden in an expression no index can answer; the rows must be the same (common practice: a plan
 * change never changes the answer), and the plan must start at the looked-up node.
 */
class PatternStartTest {
    private static final GraphSchema SCHEMA = DemoQueries.schema();

    /** {@code start}: the first steps of the plan, before any edge is walked. */
    private record Case(String lookedUp, String hidden, String start) {}

    private static final List<Case> CASES = List.of(
            new Case("MATCH (voy:Voyage)-[:PERFORMED_BY]->(v:Vessel {name: 'Corvessa Vesenda'})-[:OPERATED_BY]->(c:Carrier) "
                    + "RETURN voy.voyageNumber, c.name",
                    "MATCH (voy:Voyage)-[:PERFORMED_BY]->(v:Vessel)-[:OPERATED_BY]->(c:Carrier) WHERE toUpper(v.name) = "
                    + "toUpper('Corvessa Vesenda') RETURN voy.voyageNumber, c.name",
                    "has('name', eq('Corvessa Vesenda')).as('n1')"),
            new Case("MATCH (voy:Voyage)-[:PERFORMED_BY]->(v:Vessel)-[r:OPERATED_BY]->(c:Carrier) WHERE c.name = 'Tessarine Lines' "
                    + "RETURN voy.voyageNumber, v.name, type(r)",
                    "MATCH (voy:Voyage)-[:PERFORMED_BY]->(v:Vessel)-[r:OPERATED_BY]->(c:Carrier) WHERE c.name + '' = 'Tessarine Lines' "
                    + "RETURN voy.voyageNumber, v.name, type(r)",
                    "has('name', eq('Tessarine Lines')).as('n2')"),
            new Case("MATCH (p:Port)<-[:AT_PORT]-(pc:PortCall)<-[:HAS_PORT_CALL]-(voy:Voyage)-[:PERFORMED_BY]->(v:Vessel) "
                    + "WHERE v.name = 'Corvessa Vesenda' MATCH (v)<-[:PERFORMED_BY]-(other:Voyage) "
                    + "RETURN p.name, voy.voyageNumber, other.voyageNumber",
                    "MATCH (p:Port)<-[:AT_PORT]-(pc:PortCall)<-[:HAS_PORT_CALL]-(voy:Voyage)-[:PERFORMED_BY]->(v:Vessel) "
                    + "WHERE v.name STARTS WITH 'Corvessa Vesenda' AND v.name ENDS WITH 'Corvessa Vesenda' "
                    + "MATCH (v)<-[:PERFORMED_BY]-(other:Voyage) RETURN p.name, voy.voyageNumber, other.voyageNumber",
                    "has('name', eq('Corvessa Vesenda')).as('n3')"));

    @Test
    void startingAtTheLookedUpNodeGivesTheSameRows() {
        try (Engine e = GraphFiles.demo(SCHEMA).engine()) {
            for (Case c : CASES) {
                List<String> fast = bag(e, c.lookedUp());
                assertFalse(fast.isEmpty(), "the demo data has matches for " + c.lookedUp());
                assertEquals(bag(e, c.hidden()), fast, c.lookedUp());
                String plan = e.explain(request(c.lookedUp())).render();
                String first = plan.substring(0, plan.indexOf("E('"));
                // "MATCH" alone, or "MATCH … RETURN" when the projection runs in the same traversal (ProjectionPushdown)
                assertTrue(first.startsWith("gremlin: MATCH") && first.contains("  g.V().hasLabel(") && first.contains(c.start()), plan);
            }
        }
    }

    @Test
    void anEqualityOnANumberStillMatchesTheEqualFloat() {
        // openCypher TCK (Comparison): 1 = 1.0 is true, so an index probing for the stored value 1 must not be used.
        String script = "CREATE (:N {k: 1.0, name: 'a'}), (:N {k: 1, name: 'b'}), (:N {k: 'x', name: 'c'})";
        try (Engine e = Engines.embedded(dev.termgate.engine.GraphFiles.read(List.of(write(script)), GraphSchema.empty(),
                new ArrayList<>()), "test")) {
            // index the key first through a string lookup, then look up by number
            assertEquals(List.of("[c]"), bag(e, "MATCH (n:N {k: 'x'}) RETURN n.name"));
            assertEquals(List.of("[a]", "[b]"), bag(e, "MATCH (n:N) WHERE n.k = 1 RETURN n.name"));
            assertEquals(List.of("[a]", "[b]"), bag(e, "MATCH (n:N {k: 1.0}) RETURN n.name"));
        }
    }

    private static java.nio.file.Path write(String script) {
        try {
            java.nio.file.Path f = java.nio.file.Files.createTempFile("start", ".cypher");
            f.toFile().deleteOnExit();
            return java.nio.file.Files.writeString(f, script);
        } catch (java.io.IOException ex) {
            throw new java.io.UncheckedIOException(ex);
        }
    }

    private static Request request(String text) {
        return Request.of(new CypherParser().parse(text).tree(), text, SCHEMA, Limits.defaults());
    }

    private static List<String> bag(Engine e, String text) {
        List<String> rows = new ArrayList<>();
        for (List<Object> r : e.run(request(text)).rows()) rows.add(r.toString());
        Collections.sort(rows);
        return rows;
    }
}

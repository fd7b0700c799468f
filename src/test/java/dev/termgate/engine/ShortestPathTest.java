package dev.termgate.engine;

import dev.termgate.parser.CypherParser;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;

/**
 * shortestPath / allShortestPaths. The TCK M23 has no scenario for them, so the reference is their definition
 * (from memory, Cypher manual: among the paths the pattern matches between two nodes, those with the fewest
 * relationships; shortestPath keeps one of them), computed here independently by matching every path with an
 * ordinary variable-length pattern and keeping the shortest per pair of ends.
 */
class ShortestPathTest {
    /** Two equally short ways from a to d (via b or c), a longer one via e, and one way back that needs direction. */
    private static final String GRAPH = """
            CREATE (a:P {n: 'a'}), (b:P {n: 'b'}), (c:P {n: 'c'}), (d:P {n: 'd'}), (e:P {n: 'e'}), (f:P {n: 'f'}),
                   (a)-[:R {w: 1}]->(b), (b)-[:R {w: 1}]->(d), (a)-[:R {w: 2}]->(c), (c)-[:R {w: 2}]->(d),
                   (a)-[:R {w: 1}]->(e), (e)-[:S {w: 1}]->(f), (f)-[:R {w: 1}]->(d), (d)-[:R {w: 3}]->(a)
            """;

    private static Engine engine() throws Exception {
        Path f = Files.createTempFile("shortest", ".cypher");
        f.toFile().deleteOnExit();
        Files.writeString(f, GRAPH);
        return GraphFiles.open(List.of(f), GraphSchema.empty()).engine();
    }

    private static List<String> rows(Engine e, String q) {
        List<String> out = new ArrayList<>();
        for (List<Object> r : e.run(Request.of(new CypherParser().parse(q).tree(), q, GraphSchema.empty(), Limits.defaults())).rows()) {
            out.add(r.toString());
        }
        Collections.sort(out);
        return out;
    }

    /**
     * The reference: every path the plain pattern matches between two different nodes, keeping per pair of ends
     * those of the fewest hops ({@code cond}: more conditions on the ends).
     */
    private static List<String> reference(Engine e, String pattern, String cond) {
        String q = "MATCH p = " + pattern + " WHERE x <> y" + cond + " WITH x, y, min(length(p)) AS shortest "
                + "MATCH p = " + pattern + " WHERE length(p) = shortest" + cond
                + " RETURN x.n, y.n, [n IN nodes(p) | n.n] AS way";
        return rows(e, q);
    }

    @Test
    void allShortestPathsEqualsTheShortestOfAllPaths() throws Exception {
        try (Engine e = engine()) {
            for (String[] c : new String[][] {
                    {"(x:P)-[:R*]->(y:P)", ""},
                    {"(x:P)-[*]-(y:P)", " AND x.n = 'a' AND y.n = 'f'"},
                    {"(x:P)-[*..2]->(y:P)", " AND x.n = 'e'"},
                    {"(x:P)<-[:R|S*]-(y:P)", " AND x.n = 'd'"}}) {
                String pattern = c[0], cond = c[1];
                String q = "MATCH p = allShortestPaths(" + pattern + ") WHERE true" + cond
                        + " RETURN x.n, y.n, [n IN nodes(p) | n.n] AS way";
                List<String> expected = reference(e, pattern, cond);
                assertEquals(expected, rows(e, q), q);
            }
        }
    }

    @Test
    void shortestPathKeepsOnePerPairAndStopsAtTheBoundEnd() throws Exception {
        try (Engine e = engine()) {
            // a to d: two ways of two hops (via b, via c); shortestPath keeps one of them
            List<String> one = rows(e, "MATCH (x:P {n: 'a'}), (y:P {n: 'd'}) MATCH p = shortestPath((x)-[:R*]->(y)) "
                    + "RETURN length(p), [n IN nodes(p) | n.n][1] IN ['b', 'c']");
            assertEquals(List.of("[2, true]"), one);
            // the relationship's properties restrict the search: with w = 1 the only way is via b
            assertEquals(List.of("[[a, b, d]]"), rows(e, "MATCH p = shortestPath((x:P {n: 'a'})-[:R*1.. {w: 1}]->(y:P {n: 'd'})) "
                    + "RETURN [n IN nodes(p) | n.n]"));
            // no way at all (f cannot reach e along the direction)
            assertEquals(List.of(), rows(e, "MATCH p = shortestPath((x:P {n: 'f'})-[*]->(y:P {n: 'e'})) WHERE false RETURN p"));
            assertEquals(List.of("[[f, d, a, e]]"), rows(e, "MATCH p = shortestPath((x:P {n: 'f'})-[*]->(y:P {n: 'e'})) "
                    + "RETURN [n IN nodes(p) | n.n]"));
            // a single relationship without a star is a path of one hop
            assertEquals(List.of("[f, 1]"), rows(e, "MATCH p = shortestPath((x:P {n: 'e'})-[:S]->(y)) RETURN y.n, length(p)"));
        }
    }
}

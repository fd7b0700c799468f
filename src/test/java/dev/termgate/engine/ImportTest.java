package dev.termgate.engine;

import dev.termgate.cli.Main;
import dev.termgate.graph.ImportException;
import dev.termgate.parser.CypherParser;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Every import format gives the same graph; bad data gives a clear message with its place. */
class ImportTest {
    @TempDir
    Path dir;

    private static final String SCRIPT = """
            // a small graph with a node of two labels
            CREATE (a:Vessel:Tanker {name: 'Ardent', dwt: 1200.5, tags: ['x', 'y']}),
                   (b:Carrier {name: 'Blue; Line'}),
                   (c:Port {name: 'Cove', founded: 1894});
            MATCH (a:Vessel), (b:Carrier) CREATE (a)-[:OPERATED_BY {since: 2020}]->(b);
            MATCH (a:Vessel), (c:Port) CREATE (a)-[:CALLS_AT]->(c)
            """;

    private static final String QUERY = "MATCH (v:Tanker)-[r:OPERATED_BY]->(c) RETURN v.name, labels(v), v.dwt, v.tags, r.since, c.name";

    private List<List<Object>> rows(Engine e) {
        var tree = new CypherParser().parse(QUERY).tree();
        return e.run(Request.of(tree, QUERY, GraphSchema.empty(), Limits.defaults())).rows();
    }

    private List<List<Object>> expected() {
        return List.of(List.of("Ardent", List.of("Vessel", "Tanker"), 1200.5, List.of("x", "y"), 2020L, "Blue; Line"));
    }

    @Test
    void cypherScriptCsvGraphMlAndTheImportedFileGiveTheSameGraph() throws IOException {
        Path script = Files.writeString(dir.resolve("g.cypher"), SCRIPT);
        try (Engine e = GraphFiles.open(List.of(script), GraphSchema.empty()).engine()) {
            assertEquals(expected(), rows(e));
        }
        Path nodes = Files.writeString(dir.resolve("nodes.csv"), """
                @node,@labels,name,dwt|float,tags|string[],founded|int
                a,Vessel;Tanker,Ardent,1200.5,x;y,
                b,Carrier,"Blue; Line",,,
                c,Port,Cove,,,1894
                """);
        Path rels = Files.writeString(dir.resolve("rels.csv"), """
                @from,@to,@type,since|int
                a,b,OPERATED_BY,2020
                a,c,CALLS_AT,
                """);
        try (Engine e = GraphFiles.open(List.of(rels, nodes), GraphSchema.empty()).engine()) {
            assertEquals(expected(), rows(e));
        }
        Path kryo = dir.resolve("g.tgraph");
        GraphFiles.Loaded imported = GraphFiles.importTo(List.of(script), GraphSchema.empty(), kryo);
        assertEquals(3, imported.nodes());
        assertEquals(2, imported.relationships());
        imported.engine().close();
        try (Engine e = GraphFiles.open(List.of(kryo), GraphSchema.empty()).engine()) {
            assertEquals(expected(), rows(e));
        }
        Path graphml = dir.resolve("g.graphml");
        GraphFiles.importTo(List.of(nodes, rels), GraphSchema.empty(), graphml).engine().close();
        try (Engine e = GraphFiles.open(List.of(graphml), GraphSchema.empty()).engine()) {
            // GraphML keeps no list values; everything else survives
            var r = rows(e).get(0);
            assertEquals("Ardent", r.get(0));
            assertEquals(List.of("Vessel", "Tanker"), r.get(1));
        }
    }

    @Test
    void importCommandWritesAGraphFileThatRunOpens() throws IOException {
        Path script = Files.writeString(dir.resolve("g.cypher"), SCRIPT);
        Path out = dir.resolve("g.tgraph");
        StringWriter o = new StringWriter(), err = new StringWriter();
        assertEquals(0, Main.run(new String[] {"import", script.toString(), "-o", out.toString()},
                new PrintWriter(o, true), new PrintWriter(err, true)), err.toString());
        assertTrue(o.toString().contains("3 nodes, 2 relationships"), o.toString());
        StringWriter o2 = new StringWriter(), err2 = new StringWriter();
        int exit = Main.run(new String[] {"run", "--schema-free", "--graph", out.toString(), "--format", "csv", QUERY},
                new PrintWriter(o2, true), new PrintWriter(err2, true));
        assertEquals(0, exit, err2.toString());
        assertTrue(o2.toString().startsWith("v.name,labels(v),v.dwt,v.tags,r.since,c.name"), o2.toString());
        assertTrue(o2.toString().contains("Ardent,\"['Vessel', 'Tanker']\",1200.5"), o2.toString());
    }

    @Test
    void wrongTypedCsvValueNamesFileLineAndColumn() throws IOException {
        Path nodes = Files.writeString(dir.resolve("nodes.csv"), "@node,age|int\nn1,12\nn2,twelve\n");
        ImportException e = assertThrows(ImportException.class, () -> GraphFiles.open(List.of(nodes), GraphSchema.empty()));
        assertTrue(e.getMessage().contains("nodes.csv:3: column 'age' holds int values, but the value is 'twelve'"), e.getMessage());

        StringWriter o = new StringWriter(), err = new StringWriter();
        int exit = Main.run(new String[] {"run", "--schema-free", "--graph", nodes.toString(), "MATCH (n) RETURN n"},
                new PrintWriter(o, true), new PrintWriter(err, true));
        assertEquals(1, exit);
        assertTrue(err.toString().contains("twelve"), err.toString());
        assertEquals("", o.toString());
    }

    @Test
    void scriptsWithOtherWritesOrBadSyntaxAreRefused() throws IOException {
        Path bad = Files.writeString(dir.resolve("bad.cypher"), "CREATE (a:A);\nMATCH (a) SET a.x = 1");
        ImportException e = assertThrows(ImportException.class, () -> GraphFiles.open(List.of(bad), GraphSchema.empty()));
        assertTrue(e.getMessage().contains("only CREATE statements can be imported"), e.getMessage());
        Path broken = Files.writeString(dir.resolve("broken.cypher"), "CREATE (a:A;");
        ImportException e2 = assertThrows(ImportException.class, () -> GraphFiles.open(List.of(broken), GraphSchema.empty()));
        assertTrue(e2.getMessage().contains("statement 1 does not parse"), e2.getMessage());
    }

    @Test
    void rdfTermsTheOntologyLacksAreReportedNotDropped() throws IOException {
        Path data = Files.writeString(dir.resolve("d.ttl"), """
                @prefix mar: <https://example.org/termgate/maritime#> .
                @prefix d: <https://example.org/data/> .
                d:v1 a mar:Tanker ; mar:name "Ardent" ; mar:hullColour "red" .
                """);
        GraphFiles.Loaded l = GraphFiles.open(List.of(data), DemoQueries.schema());
        try (Engine e = l.engine()) {
            assertTrue(l.problems().stream().anyMatch(d -> d.message().contains("hullColour")), l.problems().toString());
            String q = "MATCH (v:Vessel) RETURN v.name";
            var r = e.run(Request.of(new CypherParser().parse(q).tree(), q, DemoQueries.schema(), Limits.defaults()));
            // ontology-aware matching: a Tanker is a Vessel (subclass in the demo ontology)
            assertEquals(List.of(List.of("Ardent")), r.rows());
        }
    }
}

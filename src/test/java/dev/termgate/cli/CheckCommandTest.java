package dev.termgate.cli;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** {@code termgate check}: exit codes and output (exit codes as documented in the README, "Exit codes"). */
class CheckCommandTest {

    record Run(int exit, String out, String err) {}

    static Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Run(code, out.toString(), err.toString());
    }

    @Test
    void validQueryPrintsCanonicalForm() {
        Run r = run("check", "--schema-free", "match (v:Vessel) return v.name");
        assertEquals(0, r.exit());
        assertEquals("MATCH (v:Vessel)\nRETURN v.name\n", r.out());
    }

    @Test
    void explainShowsTheOntologyAwarePlanOfAValidQuery() {
        Run r = run("check", "--explain", "MATCH (v:Vessel)-[:OPERATED_BY]->(c:Carrier) WHERE c.name = 'x' RETURN v.name");
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.out().contains("plan:\n  gremlin: MATCH"), r.out());
        // The demo ontology's subclasses of Vessel are matched too (issue "Run validated queries").
        assertTrue(r.out().contains("Tanker"), r.out());
        Run invalid = run("check", "--explain", "--format", "json", "MATCH (v:Vesel) RETURN v.nme, v.x");
        assertEquals(1, invalid.exit());
        assertTrue(JsonParser.parseString(invalid.out()).getAsJsonObject().get("plan").isJsonNull(), "no plan for an invalid query");
    }

    @Test
    void invalidQueryPrintsCaretDiagnostic() {
        Run r = run("check", "--schema-free", "MATCH (v:Vessel) RETRUN v");
        assertEquals(1, r.exit());
        assertTrue(r.out().startsWith("line 1:18: error TG1002: unexpected 'RETRUN'"), r.out());
        assertTrue(r.out().contains("did you mean 'RETURN'?"), r.out());
        assertTrue(r.out().contains("\n                   ^^^^^^\n"), r.out());
    }

    @Test
    void fileWithManyQueriesAsJsonLines(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("q.cypher");
        Files.writeString(f, "// maritime checks\n\nMATCH (v:Vessel)\nRETURN v\n\n\nMATCH (v\nRETURN v\n\nRETURN 'a\n\nb' AS s\n");
        Run r = run("check", "--schema-free", "--file", f.toString(), "--format", "json");
        assertEquals(1, r.exit(), r.err());
        String[] lines = r.out().strip().split("\n");
        assertEquals(3, lines.length, r.out());
        JsonObject first = JsonParser.parseString(lines[0]).getAsJsonObject();
        assertTrue(first.get("valid").getAsBoolean());
        assertEquals("MATCH (v:Vessel)\nRETURN v", first.get("canonical").getAsString());
        assertEquals(3, first.get("line").getAsInt());
        JsonObject second = JsonParser.parseString(lines[1]).getAsJsonObject();
        assertFalse(second.get("valid").getAsBoolean());
        assertTrue(second.get("canonical").isJsonNull());
        JsonObject d = second.getAsJsonArray("diagnostics").get(0).getAsJsonObject();
        assertEquals("TG1002", d.get("code").getAsString());
        assertEquals(8, d.get("line").getAsInt());
        assertEquals(1, d.get("column").getAsInt());
        // a blank line inside a string does not split the query
        JsonObject third = JsonParser.parseString(lines[2]).getAsJsonObject();
        assertTrue(third.get("valid").getAsBoolean(), lines[2]);
    }

    @Test
    void usageErrors() {
        assertEquals(2, run("check", "--schema-free").exit());
        assertEquals(2, run("check", "--schema-free", "RETURN 1", "--file", "x").exit());
        assertEquals(2, run("check", "--schema-free", "--file", "/no/such/file").exit());
        assertEquals(2, run("check", "--schema-free", "--format", "xml", "RETURN 1").exit());
    }
}

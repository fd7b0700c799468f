package dev.termgate.audit;

import com.google.gson.JsonArray;
import com.google.gson.JsonElement;
import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static dev.termgate.audit.AuditCommandTest.audit;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * {@code termgate audit --queries FILE}: queries separated by blank lines, each checked by the shipped gate against
 * the demo ontology (examples/maritime/ontology.ttl, the project's own: 37 classes, 35 object properties, 56 datatype
 * properties, vesselName deprecated, per its README).
 */
class AuditQueriesTest {

    static final String QUERIES = """
            MATCH (v:Vessel)-[:OPERATED_BY]->(c:Carrier)
            RETURN v.name, c.name

            MATCH (v:Vessel) WHERE v.vesselName = 'x'
            RETURN v.name

            MATCH (p:Port) RETURN p.name


            MATCH (x:Starship) RETURN x.name
            """;

    static JsonObject json(Path dir) throws Exception {
        Path f = dir.resolve("queries.cypher");
        Files.writeString(f, QUERIES);
        AuditCommandTest.Run r = audit("--queries", f.toString(), "--format", "json");
        assertEquals(0, r.code(), r.err());
        return JsonParser.parseString(r.out()).getAsJsonObject();
    }

    static List<String> names(JsonArray terms) {
        List<String> out = new ArrayList<>();
        for (JsonElement e : terms) out.add(e.getAsJsonObject().get("kind").getAsString() + " " + e.getAsJsonObject().get("name").getAsString());
        return out;
    }

    static int count(JsonObject j, String kind, String name) {
        for (JsonElement e : j.getAsJsonArray("usage")) {
            JsonObject o = e.getAsJsonObject();
            if (o.get("kind").getAsString().equals(kind) && o.get("name").getAsString().equals(name)) return o.get("count").getAsInt();
        }
        return 0;
    }

    @Test
    void termsPerQueryAndUsageCounts(@TempDir Path dir) throws Exception {
        JsonObject j = json(dir);
        assertEquals(4, j.get("queries").getAsInt());
        assertEquals(3, j.get("valid").getAsInt());
        JsonArray per = j.getAsJsonArray("queries_detail");
        // Ids in file order; the line is where each query starts.
        assertEquals("q1", per.get(0).getAsJsonObject().get("id").getAsString());
        assertEquals(1, per.get(0).getAsJsonObject().get("line").getAsInt());
        assertEquals(4, per.get(1).getAsJsonObject().get("line").getAsInt());
        assertEquals(7, per.get(2).getAsJsonObject().get("line").getAsInt());
        assertEquals(10, per.get(3).getAsJsonObject().get("line").getAsInt());
        List<String> first = names(per.get(0).getAsJsonObject().getAsJsonArray("terms"));
        assertTrue(first.containsAll(List.of("label Vessel", "label Carrier", "relationship OPERATED_BY", "property name")), first.toString());
        assertEquals(4, first.size(), first.toString());
        List<String> third = names(per.get(2).getAsJsonObject().getAsJsonArray("terms"));
        assertEquals(List.of("label Port", "property name"), third.stream().sorted().toList());
        assertFalse(per.get(3).getAsJsonObject().get("valid").getAsBoolean());
        // Counted once per query that uses the term.
        assertEquals(2, count(j, "label", "Vessel"));
        assertEquals(1, count(j, "label", "Carrier"));
        assertEquals(1, count(j, "relationship", "OPERATED_BY"));
        assertEquals(3, count(j, "property", "name"));
        // A file of queries records no card, so nothing can be said to lie outside it.
        assertEquals(0, j.get("entries_with_card").getAsInt());
        assertEquals(0, j.getAsJsonArray("not_in_card").size());
    }

    @Test
    void neverUsedAndDeprecated(@TempDir Path dir) throws Exception {
        JsonObject j = json(dir);
        JsonObject never = j.getAsJsonObject("never_used");
        // 37 classes, three used (Vessel, Carrier, Port); 35 relationship types, one used.
        assertEquals(34, never.getAsJsonArray("label").size());
        assertEquals(34, never.getAsJsonArray("relationship").size());
        assertFalse(never.getAsJsonArray("label").toString().contains("\"Vessel\""));
        assertTrue(never.getAsJsonArray("label").toString().contains("\"Tanker\""));
        assertTrue(never.getAsJsonArray("relationship").toString().contains("\"HOME_PORT\""));
        assertEquals("[\"property vesselName\"]", j.getAsJsonArray("deprecated_used").toString());
        Path f = dir.resolve("queries.cypher");
        AuditCommandTest.Run t = audit("--queries", f.toString());
        assertEquals(0, t.code(), t.err());
        assertTrue(t.out().contains("Deprecated terms used: property vesselName (1)"), t.out());
        assertTrue(t.out().contains("labels        3 of 37 used"), t.out());
        assertTrue(t.out().contains("Terms used outside the card: unknown"), t.out());
    }

    @Test
    void aBatchOutputOrAnotherVersionGivenAsQueriesIsNamed(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("out.jsonl");
        Files.writeString(f, AuditCommandTest.line("a", true, "[]", "[]") + "\n");
        AuditCommandTest.Run r = audit("--queries", f.toString());
        assertEquals(1, r.code(), r.all());
        assertTrue(r.err().contains("out.jsonl line 1: this is a batch output (format termgate-answer/1), not a file of queries;"
                + " audit it as FILE.jsonl, without --queries"), r.err());
        Files.writeString(f, "\n" + AuditCommandTest.line("a", true, "[]", "[]").replace("termgate-answer/1", "termgate-answer/0") + "\n");
        AuditCommandTest.Run old = audit("--queries", f.toString());
        assertEquals(1, old.code(), old.all());
        assertTrue(old.err().contains("out.jsonl line 2: this is a JSON file written in format termgate-answer/0, not a file of queries"), old.err());
        assertFalse(old.err().contains("Exception"), old.err());
    }

    @Test
    void emptyOrMissingQueryFiles(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("none.cypher");
        Files.writeString(f, "\n\n  \n");
        AuditCommandTest.Run r = audit("--queries", f.toString());
        assertEquals(1, r.code(), r.all());
        assertTrue(r.err().contains("none.cypher holds no queries"), r.err());
        assertEquals(2, audit("--queries", dir.resolve("absent.cypher").toString()).code());
        assertEquals(2, audit("--queries", f.toString(), dir.resolve("also.jsonl").toString()).code(), "both inputs at once");
    }
}

package dev.termgate.audit;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.cli.Main;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** {@code termgate audit} of batch output files (format termgate-answer/1, as translate's AnswerJson writes them). */
class AuditCommandTest {

    record Run(int code, String out, String err) {
        String all() {
            return out + err;
        }
    }

    static Run audit(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        String[] all = new String[args.length + 1];
        all[0] = "audit";
        System.arraycopy(args, 0, all, 1, args.length);
        int code = Main.run(all, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Run(code, out.toString(), err.toString());
    }

    static String line(String id, boolean valid, String cardTerms, String terms) {
        return "{\"format\":\"termgate-answer/1\",\"id\":\"" + id + "\",\"question\":\"q\",\"query\":\"MATCH (v:Vessel) RETURN v.name\","
                + "\"valid\":" + valid + ",\"model\":\"offline\",\"card_terms\":" + cardTerms + ",\"terms\":" + terms + "}";
    }

    static final String VESSEL = "{\"kind\":\"label\",\"name\":\"Vessel\",\"iri\":\"https://example.org/termgate/maritime#Vessel\",\"via\":\"direct\"}";
    static final String OPERATED = "{\"kind\":\"relationship\",\"name\":\"OPERATED_BY\",\"iri\":\"https://example.org/termgate/maritime#operatedBy\",\"via\":\"direct\"}";
    static final String OLD_NAME = "{\"kind\":\"property\",\"name\":\"vesselName\",\"iri\":\"https://example.org/termgate/maritime#vesselName\",\"via\":\"direct\"}";

    @Test
    void countsNeverUsedDeprecatedAndOffCard(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("out.jsonl");
        Files.writeString(f, line("a", true, "[\"Vessel\"]", "[" + VESSEL + "," + OPERATED + "]") + "\n"
                + line("b", true, "[\"Vessel\",\"vesselName\"]", "[" + VESSEL + "," + OLD_NAME + "]") + "\n"
                + line("c", false, "[]", "[]") + "\n");
        Run r = audit(f.toString(), "--format", "json");
        assertEquals(0, r.code(), r.err());
        JsonObject j = JsonParser.parseString(r.out()).getAsJsonObject();
        assertEquals(3, j.get("queries").getAsInt());
        assertEquals("Vessel", j.getAsJsonArray("usage").get(0).getAsJsonObject().get("name").getAsString());
        assertEquals(2, j.getAsJsonArray("usage").get(0).getAsJsonObject().get("count").getAsInt());
        // The demo ontology has 37 classes (examples/maritime/README.md): one used, 36 never.
        assertEquals(36, j.getAsJsonObject("never_used").getAsJsonArray("label").size());
        assertEquals("property vesselName", j.getAsJsonArray("deprecated_used").get(0).getAsString());
        assertEquals(1, j.getAsJsonArray("not_in_card").size());
        assertEquals("OPERATED_BY", j.getAsJsonArray("not_in_card").get(0).getAsJsonObject().get("name").getAsString());
        Run t = audit(f.toString());
        assertTrue(t.out().contains("Deprecated terms used: property vesselName (1)"), t.out());
    }

    @Test
    void anotherFormatVersionIsRefusedClearly(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("old.jsonl");
        Files.writeString(f, line("a", true, "[]", "[]").replace("termgate-answer/1", "termgate-answer/0") + "\n");
        Run r = audit(f.toString());
        assertEquals(1, r.code());
        assertTrue(r.err().contains("old.jsonl line 1: written in format termgate-answer/0, which this version of termgate cannot read (it reads termgate-answer/1)"), r.err());
        Files.writeString(f, "{\"id\":\"x\"}\n");
        Run n = audit(f.toString());
        assertEquals(1, n.code());
        assertTrue(n.err().contains("no format field"), n.err());
        Files.writeString(f, "hello\n" + line("a", true, "[]", "[]") + "\n");
        assertEquals(1, audit(f.toString()).code());
    }

    @Test
    void cutOffLastLineIsSkippedWithANotice(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("killed.jsonl");
        Files.writeString(f, line("a", true, "[\"Vessel\"]", "[" + VESSEL + "]") + "\n{\"format\":\"termgate-ans");
        Run r = audit(f.toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(r.err().contains("skipped an unfinished last line"), r.err());
    }

    @Test
    void usage(@TempDir Path dir) {
        assertEquals(2, audit().code());
        assertEquals(2, audit(dir.resolve("none.jsonl").toString()).code());
    }
}

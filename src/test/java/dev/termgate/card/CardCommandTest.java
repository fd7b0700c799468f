package dev.termgate.card;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.cli.Main;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/** {@code termgate card} through {@link Main#run}: exit codes, standard output and standard error. */
class CardCommandTest {

    record Run(int exit, String out, String err) {}

    @TempDir
    Path tmp;

    private Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        String[] all = new String[args.length + 1];
        all[0] = "card";
        System.arraycopy(args, 0, all, 1, args.length);
        int exit = Main.run(all, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Run(exit, out.toString(), err.toString());
    }

    private static String golden(String name) throws Exception {
        return Files.readString(Golden.DIR.resolve(name), StandardCharsets.UTF_8);
    }

    @Test
    void wholeDemoCardWithItsSizeOnStandardError() throws Exception {
        Run r = run("--no-cache");
        assertEquals(0, r.exit(), r.err());
        assertEquals(golden("maritime.card"), r.out());
        int tokens = TokenCounter.of(TokenEncoding.CL100K_BASE).count(r.out());
        assertTrue(r.err().contains("whole-ontology card: 37 labels, 35 relationship types, 56 property keys; "
                + tokens + " tokens (cl100k_base)"), r.err());
    }

    @Test
    void orgCardFromAFile() throws Exception {
        Run r = run("--no-cache", "--ontology", TestOntologies.DIR.resolve("org.nq").toString());
        assertEquals(0, r.exit(), r.err());
        assertEquals(golden("org.card"), r.out());
    }

    @Test
    void otherEncodingCountsDifferently() {
        Run r = run("--no-cache", "--encoding", "o200k_base");
        assertEquals(0, r.exit(), r.err());
        int tokens = TokenCounter.of(TokenEncoding.O200K_BASE).count(r.out());
        assertTrue(r.err().contains(tokens + " tokens (o200k_base)"), r.err());
    }

    @Test
    void jsonOfTheWholeCard() {
        Run r = run("--no-cache", "--format", "json");
        assertEquals(0, r.exit(), r.err());
        JsonObject o = JsonParser.parseString(r.out()).getAsJsonObject();
        assertTrue(o.get("budget").isJsonNull());
        assertTrue(o.get("question").isJsonNull());
        assertEquals(37 + 35 + 56, o.getAsJsonArray("terms").size());
        JsonObject first = o.getAsJsonArray("terms").get(0).getAsJsonObject();
        assertEquals("label", first.get("kind").getAsString());
        assertTrue(first.get("iri").getAsString().startsWith("http"));
        assertEquals(TokenCounter.of(TokenEncoding.CL100K_BASE).count(o.get("text").getAsString()), o.get("tokens").getAsInt());
        assertTrue(o.getAsJsonObject("schema").has("labels"), "the derived schema (SchemaJson)");
    }

    @Test
    void dotAndSvgToAFile() throws Exception {
        Run dot = run("--no-cache", "--format", "dot");
        assertEquals(0, dot.exit(), dot.err());
        assertEquals(golden("maritime.dot"), dot.out());
        assumeTrue(Graphviz.available(), "Graphviz 'dot' is not installed (Debian package graphviz; .ci/run installs it)");
        Path svg = tmp.resolve("card.svg");
        Run r = run("--no-cache", "--format", "svg", "--out", svg.toString());
        assertEquals(0, r.exit(), r.err());
        assertEquals("", r.out());
        assertTrue(Files.readString(svg).contains("<svg"));
    }

    @Test
    void usageErrors() {
        String[][] table = {
                {"--encoding", "p50k_base"}, {"'p50k_base' is not a known encoding; use one of cl100k_base, o200k_base"},
                {"--format", "png"}, {"'png' is not a card format; use text, json, dot or svg"},
                {"--budget", "0"}, {"--budget must be a positive number of tokens, not 0"},
                {"--why"}, {"--why explains the terms chosen for a question; add --question"},
                {"--question", " "}, {"--question needs a non-empty text"},
        };
        for (int i = 0; i < table.length; i += 2) {
            Run r = run(table[i]);
            assertEquals(2, r.exit(), String.join(" ", table[i]));
            assertTrue(r.err().contains(table[i + 1][0]), r.err());
            assertEquals("", r.out());
        }
    }

    @Test
    void unwritableOutputFileIsAUsageError() {
        Run r = run("--no-cache", "--out", tmp.resolve("no/such/dir/card.txt").toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().startsWith("termgate: cannot write "), r.err());
    }

    @Test
    void missingOntologyIsInvalidInput() {
        Run r = run("--no-cache", "--ontology", tmp.resolve("nothing.ttl").toString());
        assertEquals(1, r.exit(), r.err());
        assertTrue(!r.err().contains("Exception"), r.err());
    }
}

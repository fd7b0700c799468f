package dev.termgate.cli;

import com.google.gson.JsonArray;
import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.translate.ScriptedModelServer;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Function;

import static dev.termgate.translate.ScriptedModelServer.answer;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * {@code termgate eval} end to end: the shipped pipeline (the demo ontology, the real gate, repair and the engine on
 * the embedded demo graph), questions translated by the scripted OpenAI-compatible model server on 127.0.0.1, gold
 * queries run on the same engine. Every figure follows from the script, so each is asserted exactly; rows come
 * from the demo graph (examples/maritime/data.ttl, the project's own invented data), so a right answer must
 * really give the gold's rows and a wrong one really gives others.
 */
class EvalEndToEndTest {

    static ScriptedModelServer server;
    static final Map<String, AtomicInteger> calls = new ConcurrentHashMap<>();
    static final Map<String, Function<Integer, ScriptedModelServer.Action>> script = new HashMap<>();

    @BeforeAll
    static void start() throws Exception {
        // Answers by question and attempt (1 = first ask, 2 = first re-ask, …).
        script.put("Which ports are there?", n -> answer("```cypher\nMATCH (p:Port) RETURN p.name\n```"));
        // A misspelt label the ontology makes certain: repaired without a re-ask.
        script.put("Name the vessels.", n -> answer("MATCH (v:Vesel) RETURN v.name"));
        // A class the ontology lacks and no certain repair: re-asked, then right.
        script.put("Which countries are there?", n -> n == 1 ? answer("MATCH (s:Spaceship) RETURN s.name")
                : answer("MATCH (c:Country) RETURN c.name"));
        // Valid on the first attempt but counts the wrong class.
        script.put("How many tankers are there?", n -> answer("MATCH (v:Vessel) RETURN count(v)"));
        // Never valid: the same unknown class on every attempt.
        script.put("Which moons are there?", n -> answer("MATCH (m:Moon) RETURN m.name"));
        // The model is right, but the gold names a class the ontology lacks.
        script.put("Which carriers are there?", n -> answer("MATCH (c:Carrier) RETURN c.name"));
        server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen -> {
            String q = seen.question();
            int n = calls.computeIfAbsent(q, k -> new AtomicInteger()).incrementAndGet();
            return script.getOrDefault(q, k -> answer("no script for " + q)).apply(n);
        });
    }

    @AfterAll
    static void stop() {
        server.close();
    }

    @BeforeEach
    void freshCounts() {
        calls.clear();
    }

    static String q(String id, String question, String gold, String shape) {
        JsonObject o = new JsonObject();
        o.addProperty("id", id);
        o.addProperty("question", question);
        o.addProperty("gold", gold);
        o.addProperty("shape", shape);
        return o + "\n";
    }

    static final String QUESTIONS = q("right", "Which ports are there?", "MATCH (x:Port) RETURN x.name AS port", "list")
            + q("repaired", "Name the vessels.", "MATCH (v:Vessel) RETURN v.name", "list")
            + q("reasked", "Which countries are there?", "MATCH (k:Country) RETURN k.name", "list")
            + q("wrong", "How many tankers are there?", "MATCH (t:Tanker) RETURN count(t) AS tankers", "count")
            + q("never", "Which moons are there?", "MATCH (p:Port) RETURN p.name", "list")
            + q("badgold", "Which carriers are there?", "MATCH (c:Carrier) RETURN c.nam AS name", "list");

    static CliRun.Result eval(Path dir, String questions, String... extra) throws Exception {
        Path file = dir.resolve("questions.jsonl");
        Files.writeString(file, questions);
        List<String> args = new ArrayList<>(List.of("--questions", file.toString(), "--model", server.modelOption("m1"),
                "--base-url", server.baseUrl(), "--model-timeout", "5", "--retries", "0", "--attempts", "3"));
        args.addAll(List.of(extra));
        // The public constructor: the shipped pipeline, as `termgate eval` runs it.
        return CliRun.run(new EvalCommand(), c -> ((EvalCommand) c).model.env = CliRun.env(), args.toArray(String[]::new));
    }

    @Test
    void scriptedAnswersGiveExactFiguresOnTheDemoGraph(@TempDir Path dir) throws Exception {
        CliRun.Result r = eval(dir, QUESTIONS, "--format", "json");
        assertEquals(0, r.code(), r.all());
        JsonObject j = JsonParser.parseString(r.out()).getAsJsonObject();
        assertEquals(6, j.get("questions").getAsInt());
        assertEquals(1, j.get("bad_gold").getAsInt());
        assertEquals(5, j.get("counted").getAsInt());
        // right, repaired and reasked give the gold's rows; wrong counts vessels, not tankers; never is invalid.
        assertEquals(3, j.get("correct").getAsInt());
        assertEquals(0.6, j.get("execution_accuracy").getAsDouble(), 1e-12);
        assertEquals(0.4, j.get("valid_as_written").getAsDouble(), 1e-12);   // right, wrong
        assertEquals(0.6, j.get("valid_after_repair").getAsDouble(), 1e-12); // + repaired
        assertEquals(0.8, j.get("valid_after_reask").getAsDouble(), 1e-12);  // + reasked
        assertEquals(2, j.get("reasked").getAsInt());
        JsonObject attempts = j.getAsJsonObject("attempts");
        assertEquals(4, attempts.get("1").getAsInt()); // right, repaired, wrong, badgold
        assertEquals(1, attempts.get("2").getAsInt()); // reasked
        assertEquals(1, attempts.get("3").getAsInt()); // never, out of attempts
        JsonObject repairs = j.getAsJsonObject("repairs_by_kind");
        assertEquals(1, repairs.size(), repairs.toString());
        // Named as the repairer names the kind of fix (analyze.FixKind), not by the first word only.
        assertEquals(1, repairs.get("replace label").getAsInt());
        // 1 + 1 + 2 + 1 + 3 + 1 asks, each 100 prompt and 20 completion tokens in the server's script.
        assertEquals(900, j.get("prompt_tokens").getAsInt());
        assertEquals(180, j.get("completion_tokens").getAsInt());
        JsonObject status = j.getAsJsonObject("by_status");
        assertEquals(3, status.get("correct").getAsInt());
        assertEquals(1, status.get("wrong").getAsInt());
        assertEquals(1, status.get("invalid").getAsInt());
        assertEquals(1, status.get("bad_gold").getAsInt());
        JsonObject shapes = j.getAsJsonObject("by_shape");
        assertEquals(3, shapes.getAsJsonObject("list").get("correct").getAsInt());
        assertEquals(4, shapes.getAsJsonObject("list").get("counted").getAsInt());
        assertEquals(0, shapes.getAsJsonObject("count").get("correct").getAsInt());
        assertEquals(1, shapes.getAsJsonObject("count").get("counted").getAsInt());

        Map<String, JsonObject> byId = new HashMap<>();
        for (var e : j.getAsJsonArray("results")) byId.put(e.getAsJsonObject().get("id").getAsString(), e.getAsJsonObject());
        assertEquals("correct", byId.get("repaired").get("status").getAsString());
        assertTrue(byId.get("repaired").get("query").getAsString().contains(":Vessel"), byId.get("repaired").toString());
        JsonArray rep = byId.get("repaired").getAsJsonArray("repairs");
        assertEquals(1, rep.size());
        assertEquals("wrong", byId.get("wrong").get("status").getAsString());
        assertEquals("invalid", byId.get("never").get("status").getAsString());
        assertEquals(3, byId.get("never").get("attempts").getAsInt());
        // The gold's own fault, named as such and not held against the model.
        assertEquals("bad_gold", byId.get("badgold").get("status").getAsString());
        // c.nam is one letter short of name: the gate would repair it, but a gold is taken only as written.
        assertTrue(byId.get("badgold").get("detail").getAsString().startsWith("the gold query is invalid as written (a repair would change it: "),
                byId.get("badgold").toString());
        assertTrue(byId.get("badgold").get("detail").getAsString().contains("'nam' → 'name'"), byId.get("badgold").toString());
        // One ask per attempt, as the figures say.
        assertEquals(9, server.seen().size() - seenBefore);
    }

    static int seenBefore;

    @BeforeEach
    void markSeen() {
        seenBefore = server.seen().size();
    }

    @Test
    void goldNamingWhatTheOntologyLacksIsBadGold(@TempDir Path dir) throws Exception {
        CliRun.Result r = eval(dir, q("g", "Which ports are there?", "MATCH (s:Starship) RETURN s.name", "list"), "--format", "json");
        assertEquals(0, r.code(), r.all());
        JsonObject res = JsonParser.parseString(r.out()).getAsJsonObject().getAsJsonArray("results").get(0).getAsJsonObject();
        assertEquals("bad_gold", res.get("status").getAsString());
        assertTrue(res.get("detail").getAsString().startsWith("the gold query is invalid: TG"), res.toString());
        // The model's answer was still asked for and checked; it is just not scored.
        assertTrue(res.get("valid").getAsBoolean(), res.toString());
    }

    @Test
    void goldThatFailsAtRunTimeIsBadGoldToo(@TempDir Path dir) throws Exception {
        // Valid for the gate, but the engine refuses it when it runs (a list where a number is needed).
        CliRun.Result r = eval(dir, q("g", "Which ports are there?", "MATCH (p:Port) RETURN p.name LIMIT toInteger('x')", "list"),
                "--format", "json");
        assertEquals(0, r.code(), r.all());
        JsonObject j = JsonParser.parseString(r.out()).getAsJsonObject();
        assertEquals(1, j.get("bad_gold").getAsInt(), r.out());
        assertEquals(0, j.get("counted").getAsInt());
    }

    @Test
    void missingGoldFieldsAreNamedBeforeAnyModelIsAsked(@TempDir Path dir) throws Exception {
        record Case(String file, String message) {}
        for (Case c : List.of(
                new Case(q("a", "Which ports are there?", "MATCH (p:Port) RETURN p.name", "list")
                        + "{\"id\":\"b\",\"question\":\"Name the vessels.\"}\n", "questions.jsonl line 2: the field 'gold' is missing"),
                new Case("{\"id\":\"a\",\"question\":\"Name the vessels.\",\"gold\":\"\"}\n", "questions.jsonl line 1: the field 'gold' is empty"),
                new Case("{\"id\":\"a\",\"gold\":\"MATCH (p:Port) RETURN p.name\"}\n", "questions.jsonl line 1: the field 'question' is missing"))) {
            int before = server.seen().size();
            CliRun.Result r = eval(dir, c.file());
            assertEquals(1, r.code(), c.file() + " → " + r.all());
            assertTrue(r.err().contains(c.message()), r.err());
            assertTrue(!r.err().contains("Exception"), r.err());
            assertEquals(before, server.seen().size(), "no question was sent for a malformed file");
        }
    }

    @Test
    void theOfflineInterpreterThroughTheSamePath(@TempDir Path dir) throws Exception {
        Path file = dir.resolve("offline.jsonl");
        Files.writeString(file, q("o1", "How many vessels are there in total?", "MATCH (v:Vessel) RETURN count(v)", "count")
                + q("o2", "Tell me a story about the sea.", "MATCH (p:Port) RETURN p.name", "list"));
        CliRun.Result r = CliRun.run(new EvalCommand(), c -> ((EvalCommand) c).model.env = CliRun.env(),
                "--questions", file.toString(), "--model", "offline", "--format", "json");
        assertEquals(0, r.code(), r.all());
        JsonObject j = JsonParser.parseString(r.out()).getAsJsonObject();
        assertEquals("offline", j.get("model").getAsString());
        assertEquals(1, j.get("correct").getAsInt(), r.out());
        assertEquals(1, j.getAsJsonObject("by_status").get("not_understood").getAsInt(), r.out());
        assertTrue(j.get("prompt_tokens").isJsonNull(), "no model, no tokens: " + r.out());
    }
}

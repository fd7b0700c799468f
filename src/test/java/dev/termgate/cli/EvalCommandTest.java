package dev.termgate.cli;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.translate.Checked;
import dev.termgate.translate.Pipeline;
import dev.termgate.translate.RunResult;
import dev.termgate.translate.ScriptedModelServer;
import dev.termgate.translate.ToyPipeline;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Function;

import static dev.termgate.translate.ScriptedModelServer.answer;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * {@code termgate eval} against the translate helper's scripted OpenAI-compatible server (127.0.0.1): known right
 * and wrong answers give known figures, exactly. The gate is translate's stand-in pipeline; the runner answers
 * each query text with rows made from that text, so the same query gives the same rows and another query others.
 */
class EvalCommandTest {

    static ScriptedModelServer server;
    static final Map<String, AtomicInteger> calls = new ConcurrentHashMap<>();
    static final Map<String, Function<Integer, ScriptedModelServer.Action>> script = new ConcurrentHashMap<>();

    @BeforeAll
    static void start() throws Exception {
        server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen -> {
            String q = seen.question();
            int n = calls.computeIfAbsent(q, k -> new AtomicInteger()).incrementAndGet();
            return script.getOrDefault(q, k -> answer("no script for " + q)).apply(n);
        });
        script.put("list the vessels", n -> answer("```cypher\nMATCH (v:Vessel) RETURN v.name\n```"));
        script.put("vessels with a typo", n -> answer("MATCH (v:Vesel) RETURN v.name"));
        script.put("where do ships stop", n -> n == 1 ? answer("MATCH (h:Harbor) RETURN h.name") : answer("MATCH (p:Port) RETURN p.name"));
        script.put("the wrong thing", n -> answer("MATCH (p:Port) RETURN p.name"));
        script.put("tell me a story", n -> answer("Once upon a time there was no query."));
        script.put("bad gold", n -> answer("MATCH (v:Vessel) RETURN v.name"));
    }

    @org.junit.jupiter.api.BeforeEach
    void freshCounts() {
        calls.clear();
    }

    @AfterAll
    static void stop() {
        server.close();
    }

    /** translate's stand-in gate, with rows that depend on the query text. */
    static Pipeline.Factory pipeline() {
        ToyPipeline toy = new ToyPipeline();
        return spec -> {
            Pipeline p = toy.open(spec);
            return new Pipeline(p.schema(), p.cards(), p.gate(),
                    (Checked c, dev.termgate.translate.RunLimits l) -> new RunResult(List.of("x"),
                            List.of(List.of(c.query().replaceAll("\\s+", " ").strip())), false, "", List.of()),
                    p.resources());
        };
    }

    static final String QUESTIONS = String.join("\n",
            "{\"id\":\"e1\",\"question\":\"list the vessels\",\"gold\":\"MATCH (v:Vessel) RETURN v.name\",\"shape\":\"list\"}",
            "{\"id\":\"e2\",\"question\":\"vessels with a typo\",\"gold\":\"MATCH (v:Vessel) RETURN v.name\",\"shape\":\"list\"}",
            "{\"id\":\"e3\",\"question\":\"where do ships stop\",\"gold\":\"MATCH (p:Port) RETURN p.name\",\"shape\":\"list\"}",
            "",
            "{\"id\":\"e4\",\"question\":\"the wrong thing\",\"gold\":\"MATCH (v:Vessel) RETURN v.name\",\"shape\":\"count\"}",
            "{\"id\":\"e5\",\"question\":\"tell me a story\",\"gold\":\"MATCH (v:Vessel) RETURN v.name\",\"shape\":\"count\"}",
            "{\"id\":\"e6\",\"question\":\"bad gold\",\"gold\":\"MATCH (x:Nonexistent) RETURN x.name\",\"shape\":\"count\"}") + "\n";

    static CliRun.Result eval(Path dir, String questions, String... extra) throws Exception {
        Path file = dir.resolve("questions.jsonl");
        Files.writeString(file, questions);
        List<String> args = new java.util.ArrayList<>(List.of("--questions", file.toString(), "--model", server.modelOption("m1"),
                "--base-url", server.baseUrl(), "--model-timeout", "5", "--retries", "0"));
        args.addAll(List.of(extra));
        return CliRun.run(new EvalCommand(pipeline()), c -> ((EvalCommand) c).model.env = CliRun.env(), args.toArray(String[]::new));
    }

    @Test
    void knownAnswersGiveKnownFigures(@TempDir Path dir) throws Exception {
        Path html = dir.resolve("report.html");
        CliRun.Result r = eval(dir, QUESTIONS, "--format", "json", "--html", html.toString());
        assertEquals(0, r.code(), r.all());
        JsonObject j = JsonParser.parseString(r.out()).getAsJsonObject();
        assertEquals("termgate-eval/1", j.get("format").getAsString());
        assertEquals(6, j.get("questions").getAsInt());
        assertEquals(1, j.get("bad_gold").getAsInt());
        assertEquals(5, j.get("counted").getAsInt());
        assertEquals(3, j.get("correct").getAsInt());
        assertEquals(0.6, j.get("execution_accuracy").getAsDouble(), 1e-12);
        // e1 and e4 as written; e2 after the certain repair; e3 only after the re-ask.
        assertEquals(0.4, j.get("valid_as_written").getAsDouble(), 1e-12);
        assertEquals(0.6, j.get("valid_after_repair").getAsDouble(), 1e-12);
        assertEquals(0.8, j.get("valid_after_reask").getAsDouble(), 1e-12);
        assertEquals(2, j.get("reasked").getAsInt());
        JsonObject attempts = j.getAsJsonObject("attempts");
        assertEquals(4, attempts.get("1").getAsInt());
        assertEquals(1, attempts.get("2").getAsInt());
        assertEquals(1, attempts.get("3").getAsInt());
        assertEquals(1, j.getAsJsonObject("repairs_by_kind").get("label").getAsInt());
        // 9 asks in all, 100 prompt and 20 completion tokens each (the server's script).
        assertEquals(900, j.get("prompt_tokens").getAsInt());
        assertEquals(180, j.get("completion_tokens").getAsInt());
        JsonObject shapes = j.getAsJsonObject("by_shape");
        assertEquals(3, shapes.getAsJsonObject("list").get("correct").getAsInt());
        assertEquals(3, shapes.getAsJsonObject("list").get("counted").getAsInt());
        assertEquals(0, shapes.getAsJsonObject("count").get("correct").getAsInt());
        assertEquals(2, shapes.getAsJsonObject("count").get("counted").getAsInt());
        JsonObject status = j.getAsJsonObject("by_status");
        assertEquals(3, status.get("correct").getAsInt());
        assertEquals(1, status.get("wrong").getAsInt());
        assertEquals(1, status.get("invalid").getAsInt());
        assertEquals(1, status.get("bad_gold").getAsInt());
        String page = Files.readString(html);
        assertTrue(page.contains("<svg id=\"accuracy-by-shape\""));
        assertTrue(page.contains("<svg id=\"attempts-histogram\""));
        assertTrue(page.contains("<svg id=\"term-coverage\""));
        assertTrue(!page.contains("<script") && !page.contains("http://") && !page.contains("https://"), "self-contained");
    }

    @Test
    void tableNamesBadGoldApart(@TempDir Path dir) throws Exception {
        CliRun.Result r = eval(dir, QUESTIONS);
        assertEquals(0, r.code(), r.all());
        assertTrue(r.out().contains("execution accuracy      60.0%  (3 of 5)"), r.out());
        assertTrue(r.out().contains("(1 with a bad gold query, not counted)"), r.out());
        assertTrue(r.out().matches("(?s).*e6\\s+bad_gold\\s+the gold query is invalid.*"), r.out());
    }

    @Test
    void missingFieldsAreReportedWithTheirLine(@TempDir Path dir) throws Exception {
        record Case(String file, String message) {}
        for (Case c : List.of(
                new Case("{\"id\":\"a\",\"question\":\"q\",\"gold\":\"MATCH (n) RETURN n\"}\n{\"id\":\"b\",\"question\":\"q2\"}\n",
                        "questions.jsonl line 2: the field 'gold' is missing"),
                new Case("\n{\"question\":\"q\",\"gold\":\"MATCH (n) RETURN n\"}\n", "questions.jsonl line 2: the field 'id' is missing"),
                new Case("{\"id\":\"a\",\"question\":\"\",\"gold\":\"MATCH (n) RETURN n\"}\n", "questions.jsonl line 1: the field 'question' is empty"),
                new Case("not json\n", "questions.jsonl line 1: not valid JSON"),
                new Case("{\"id\":\"a\",\"question\":\"q\",\"gold\":\"g\"}\n{\"id\":\"a\",\"question\":\"q\",\"gold\":\"g\"}\n",
                        "questions.jsonl line 2: id 'a' is used twice"),
                new Case("\n\n", "holds no questions"))) {
            CliRun.Result r = eval(dir, c.file());
            assertEquals(1, r.code(), c.file() + " → " + r.all());
            assertTrue(r.err().contains(c.message()), r.err());
            assertTrue(!r.err().contains("Exception"), r.err());
        }
    }

    @Test
    void usageErrors(@TempDir Path dir) throws Exception {
        CliRun.Result r = CliRun.run(new EvalCommand(pipeline()), c -> ((EvalCommand) c).model.env = CliRun.env(),
                "--questions", dir.resolve("absent.jsonl").toString());
        assertEquals(2, r.code());
        assertTrue(r.err().contains("no such file"), r.err());
        CliRun.Result f = eval(dir, QUESTIONS, "--format", "xml");
        assertEquals(2, f.code());
        CliRun.Result h = eval(dir, QUESTIONS, "--html", dir.resolve("no/such/dir/r.html").toString());
        assertEquals(2, h.code(), h.all());
        assertTrue(h.err().contains("cannot write"), h.err());
        assertNull(null);
    }
}

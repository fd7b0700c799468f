package dev.termgate.cli;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.translate.ScriptedModelServer;
import dev.termgate.translate.ScriptedModelServer.Action;
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
import static dev.termgate.translate.ScriptedModelServer.delay;
import static dev.termgate.translate.ScriptedModelServer.status;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Each scripted model behaviour, seen through {@code ask} (what the user sees) and {@code batch} (what the file
 * records). The model is a scripted server on 127.0.0.1 speaking the OpenAI-compatible protocol; the gate is
 * the stand-in {@link ToyPipeline}, so these tests are about the loop, the retries and the commands.
 */
class AskAndBatchCasesTest {

    static ScriptedModelServer server;
    /** Calls per question, so a script can answer differently on a retry or a re-ask. */
    static final Map<String, AtomicInteger> calls = new ConcurrentHashMap<>();
    static final Map<String, Function<Integer, Action>> script = new ConcurrentHashMap<>();

    static final String FENCED = "```cypher\nMATCH (v:Vessel) RETURN v.name\n```";

    @BeforeAll
    static void start() throws Exception {
        server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen -> {
            String q = seen.question();
            int n = calls.computeIfAbsent(q, k -> new AtomicInteger()).incrementAndGet();
            return script.getOrDefault(q, k -> answer("no script for " + q)).apply(n);
        });
        script.put("list the vessels", n -> answer(FENCED));
        script.put("vessels with a typo", n -> answer("MATCH (v:Vesel) RETURN v.name"));
        script.put("where do ships stop", n -> n == 1 ? answer("```cypher\nMATCH (h:Harbor) RETURN h.name\n```")
                : answer("```cypher\nMATCH (p:Port) RETURN p.name\n```"));
        script.put("vessels per carrier", n -> answer("Sure! Here is the query you asked for:\n\n```\n"
                + "MATCH (c:Carrier)-[:OPERATES]->(v:Vessel)\nRETURN c.name, count(v)\n```\n\nIt counts the vessels of each carrier."));
        script.put("tell me a story", n -> answer("I like turtles. 42 %%% {{card}} ;;"));
        script.put("say nothing", n -> answer(""));
        script.put("a very long reply", n -> answer("lorem ipsum dolor sit amet ".repeat(80_000)
                + "\n\n```cypher\nMATCH (v:Vessel) RETURN v.name\n```\n"));
        script.put("server hiccups", n -> n <= 2 ? status(500, "{\"error\":{\"message\":\"upstream overloaded\"}}", Map.of())
                : answer(FENCED));
        script.put("server always fails", n -> status(503, "{\"error\":{\"message\":\"maintenance\"}}", Map.of()));
        script.put("too many requests", n -> n == 1 ? status(429, "{\"error\":{\"message\":\"slow down\"}}", Map.of("Retry-After", "1"))
                : answer(FENCED));
        script.put("slow model", n -> n == 1 ? delay(3_000, answer(FENCED)) : answer(FENCED));
        script.put("model never answers", n -> delay(3_000, answer(FENCED)));
    }

    @AfterAll
    static void stop() {
        server.close();
    }

    record Seen(CliRun.Result ask, JsonObject record, CliRun.Result batch, int requests) {}

    /** Asks the question with {@code ask}, then with {@code batch} into a fresh file; returns both. */
    static Seen both(Path dir, String question, String... extra) throws Exception {
        ToyPipeline toy = new ToyPipeline();
        calls.clear();
        List<String> args = new java.util.ArrayList<>(List.of("--model", server.modelOption("m1"), "--base-url", server.baseUrl(),
                "--model-timeout", "1", "--schema-free"));
        if (!List.of(extra).contains("--retries")) args.addAll(List.of("--retries", "2"));
        args.addAll(List.of(extra));
        List<String> askArgs = new java.util.ArrayList<>(args);
        askArgs.add(question);
        CliRun.Result ask = CliRun.run(new AskCommand(toy), CliRun.withEnv(CliRun.env()), askArgs.toArray(String[]::new));
        int requests = calls.values().stream().mapToInt(AtomicInteger::get).sum();
        calls.clear();
        Path qf = dir.resolve("questions.txt");
        Path out = dir.resolve("out-" + Math.abs(question.hashCode()) + ".jsonl");
        Files.writeString(qf, question + "\n");
        List<String> batchArgs = new java.util.ArrayList<>(args);
        batchArgs.addAll(List.of("--questions", qf.toString(), "--out", out.toString(), "--no-progress"));
        CliRun.Result batch = CliRun.run(new BatchCommand(toy), CliRun.withEnv(CliRun.env()), batchArgs.toArray(String[]::new));
        List<String> lines = Files.exists(out) ? Files.readAllLines(out) : List.of();
        JsonObject record = lines.isEmpty() ? null : JsonParser.parseString(lines.get(0)).getAsJsonObject();
        assertTrue(lines.size() <= 1, "one line per question");
        return new Seen(ask, record, batch, requests);
    }

    static String codes(JsonObject record) {
        StringBuilder sb = new StringBuilder();
        record.getAsJsonArray("diagnostics").forEach(d -> sb.append(d.getAsJsonObject().get("code").getAsString()).append(' '));
        return sb.toString();
    }

    @Test
    void aCorrectQueryIsShownAndRun(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "list the vessels");
        assertEquals(0, s.ask.code(), s.ask.all());
        assertTrue(s.ask.out().contains("MATCH (v:Vessel) RETURN v.name"), s.ask.out());
        assertTrue(s.ask.out().contains("attempts: 1 of 3"), s.ask.out());
        assertTrue(s.ask.out().contains("Northern Star"), s.ask.out());
        assertTrue(s.ask.out().contains("label: Vessel"), s.ask.out());
        assertEquals(0, s.batch.code(), s.batch.all());
        assertEquals("MATCH (v:Vessel) RETURN v.name", s.record.get("query").getAsString());
        assertTrue(s.record.get("valid").getAsBoolean());
        assertEquals(1, s.record.get("attempts").getAsInt());
        assertEquals("openai:m1", s.record.get("model").getAsString());
        assertEquals(42, s.record.get("card_tokens").getAsInt());
        assertEquals(100, s.record.get("prompt_tokens").getAsInt());
        assertEquals(20, s.record.get("completion_tokens").getAsInt());
        assertEquals(2, s.record.get("row_count").getAsInt());
        assertEquals("Vessel", s.record.getAsJsonArray("terms").get(0).getAsJsonObject().get("name").getAsString());
        assertTrue(s.record.getAsJsonObject("timings").has("total_ms"));
        assertFalse(s.record.has("rows"), "rows only with --with-rows");
    }

    @Test
    void aHallucinatedLabelIsRepairedWithoutAReAsk(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "vessels with a typo");
        assertEquals(0, s.ask.code(), s.ask.all());
        assertTrue(s.ask.out().contains("label 'Vesel' → 'Vessel'"), s.ask.out());
        assertTrue(s.ask.out().contains("MATCH (v:Vessel) RETURN v.name"), s.ask.out());
        assertEquals(1, s.requests);
        assertEquals("MATCH (v:Vessel) RETURN v.name", s.record.get("query").getAsString());
        assertEquals(1, s.record.get("attempts").getAsInt());
        assertTrue(s.record.getAsJsonArray("edits").get(0).getAsJsonObject().get("what").getAsString().contains("'Vesel' → 'Vessel'"));
    }

    @Test
    void anAmbiguousTermIsSentBackWithItsDiagnosticsAndCandidates(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "where do ships stop");
        assertEquals(0, s.ask.code(), s.ask.all());
        assertTrue(s.ask.out().contains("MATCH (p:Port) RETURN p.name"), s.ask.out());
        assertTrue(s.ask.out().contains("attempts: 2 of 3"), s.ask.out());
        List<ScriptedModelServer.Seen> reqs = server.seen().stream().filter(r -> r.question().equals("where do ships stop")).toList();
        ScriptedModelServer.Seen second = reqs.get(1);
        assertEquals(2, second.attempt());
        String reask = second.lastUserText();
        assertTrue(reask.contains("error TG3001: label 'Harbor' is not defined by the ontology"), reask);
        assertTrue(reask.contains("MATCH (h:Harbor) RETURN h.name"), reask);
        assertTrue(reask.contains("Port, PortCall"), reask);
        assertTrue(second.allText().contains("MATCH (h:Harbor)"), "the model's own last reply is part of the conversation");
        assertEquals(2, s.record.get("attempts").getAsInt());
        assertEquals("MATCH (p:Port) RETURN p.name", s.record.get("query").getAsString());
    }

    @Test
    void aFencedQueryIsTakenOutOfTheProse(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "vessels per carrier");
        assertEquals(0, s.ask.code(), s.ask.all());
        assertTrue(s.ask.out().contains("MATCH (c:Carrier)-[:OPERATES]->(v:Vessel)\n  RETURN c.name, count(v)"), s.ask.out());
        assertFalse(s.ask.out().contains("Sure!"), s.ask.out());
        assertEquals("MATCH (c:Carrier)-[:OPERATES]->(v:Vessel)\nRETURN c.name, count(v)", s.record.get("query").getAsString());
    }

    @Test
    void garbageEndsWithTheLastDiagnosticsAndNoQuery(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "tell me a story");
        assertEquals(Exit.INVALID, s.ask.code(), s.ask.all());
        assertTrue(s.ask.out().contains("No valid query for this question (3 attempts"), s.ask.out());
        assertTrue(s.ask.out().contains("TG7001"), s.ask.out());
        assertTrue(s.ask.out().contains("TG7004"), s.ask.out());
        assertFalse(s.ask.out().contains("query:"), "no query is shown as the answer");
        assertEquals(3, s.requests);
        assertEquals(0, s.batch.code(), "every question has a result: " + s.batch.all());
        assertFalse(s.record.get("valid").getAsBoolean());
        assertTrue(s.record.get("query").isJsonNull());
        assertTrue(s.record.get("rejected_query").isJsonNull());
        assertEquals(3, s.record.get("attempts").getAsInt());
        assertTrue(codes(s.record).contains("TG7001") && codes(s.record).contains("TG7004"), codes(s.record));
        assertTrue(s.record.get("row_count").isJsonNull());
    }

    @Test
    void anEmptyReplyIsReportedAsHoldingNoQuery(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "say nothing");
        assertEquals(Exit.INVALID, s.ask.code(), s.ask.all());
        assertTrue(s.ask.out().contains("the model's reply holds no query"), s.ask.out());
        assertFalse(s.record.get("valid").getAsBoolean());
        assertTrue(codes(s.record).startsWith("TG7001"), codes(s.record));
    }

    @Test
    void aTwoMegabyteReplyIsSearchedForItsQuery(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "a very long reply");
        assertEquals(0, s.ask.code(), s.ask.all());
        assertTrue(s.ask.out().length() < 10_000, "the prose is not echoed");
        assertEquals("MATCH (v:Vessel) RETURN v.name", s.record.get("query").getAsString());
    }

    @Test
    void serverErrorsAreRetried(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "server hiccups");
        assertEquals(0, s.ask.code(), s.ask.all());
        assertEquals(3, s.requests, "two 500s, then the answer");
        assertTrue(s.record.get("valid").getAsBoolean());
    }

    @Test
    void aServerThatKeepsFailingStopsWithExitThreeAndLeavesTheQuestionForARerun(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "server always fails", "--retries", "1");
        assertEquals(Exit.SERVICE, s.ask.code(), s.ask.all());
        assertTrue(s.ask.err().contains("the model service failed") && s.ask.err().contains("HTTP 503: maintenance"), s.ask.err());
        assertTrue(s.ask.err().contains("gave up after 2 tries"), s.ask.err());
        assertEquals(Exit.SERVICE, s.batch.code(), s.batch.all());
        assertTrue(s.batch.err().contains("run the same command again"), s.batch.err());
        assertEquals(null, s.record, "no result is recorded for an unanswered question");
    }

    @Test
    void tooManyRequestsWaitsAsTheServerSays(@TempDir Path dir) throws Exception {
        long t0 = System.nanoTime();
        Seen s = both(dir, "too many requests");
        long ms = (System.nanoTime() - t0) / 1_000_000;
        assertEquals(0, s.ask.code(), s.ask.all());
        assertEquals(2, s.requests);
        assertTrue(s.record.get("valid").getAsBoolean());
        assertTrue(ms >= 2_000, "Retry-After: 1 honoured by ask and by batch, took " + ms + " ms");
    }

    @Test
    void aTimeOutIsRetried(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "slow model");
        assertEquals(0, s.ask.code(), s.ask.all());
        assertEquals(2, s.requests);
        assertTrue(s.record.get("valid").getAsBoolean());
    }

    @Test
    void aModelThatNeverAnswersEndsWithExitThree(@TempDir Path dir) throws Exception {
        Seen s = both(dir, "model never answers", "--retries", "0");
        assertEquals(Exit.SERVICE, s.ask.code(), s.ask.all());
        assertTrue(s.ask.err().contains("no answer from http://127.0.0.1:"), s.ask.err());
        assertTrue(s.ask.err().contains("within 1 s"), s.ask.err());
        assertEquals(Exit.SERVICE, s.batch.code());
        assertEquals(null, s.record);
    }
}

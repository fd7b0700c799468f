package dev.termgate.cli;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.batch.QuestionFile;
import dev.termgate.translate.ScriptedModelServer;
import dev.termgate.translate.ToyPipeline;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The batch command's inputs, output file, resume and bad input (exit codes as documented in the README). */
class BatchCommandTest {

    static ScriptedModelServer server;

    @BeforeAll
    static void start() throws Exception {
        server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen -> {
            if (seen.body().get("model").getAsString().equals("no-such-model")) {
                return ScriptedModelServer.status(404, "{\"error\":{\"message\":\"The model `no-such-model` does not exist\"}}", Map.of());
            }
            return ScriptedModelServer.answer("MATCH (v:Vessel) RETURN v.name");
        });
    }

    @AfterAll
    static void stop() {
        server.close();
    }

    static CliRun.Result batch(Path questions, Path out, String... extra) {
        return batch(server, questions, out, extra);
    }

    static CliRun.Result batch(ScriptedModelServer server, Path questions, Path out, String... extra) {
        List<String> args = new ArrayList<>(List.of("--model", server.modelOption("m1"), "--base-url", server.baseUrl(),
                "--schema-free", "--no-progress", "--questions", questions.toString(), "--out", out.toString()));
        args.addAll(List.of(extra));
        return CliRun.run(new BatchCommand(new ToyPipeline()), CliRun.withEnv(CliRun.env()), args.toArray(String[]::new));
    }

    /** A text question file of {@code n} numbered questions. */
    static Path numberedQuestions(Path dir, int n) throws Exception {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < n; i++) sb.append("question number ").append(i).append('\n');
        return Files.writeString(dir.resolve("q.txt"), sb.toString());
    }

    static List<JsonObject> records(Path out) throws Exception {
        List<JsonObject> r = new ArrayList<>();
        for (String l : Files.readAllLines(out)) r.add(JsonParser.parseString(l).getAsJsonObject());
        return r;
    }

    @Test
    void textCsvAndJsonLinesGiveOneRecordPerQuestion(@TempDir Path dir) throws Exception {
        Path txt = Files.writeString(dir.resolve("q.txt"), "first question\n\nsecond question\nfirst question\n");
        Path csv = Files.writeString(dir.resolve("q.csv"), "id,text\nA1,\"first, with a comma\"\nA2,\"second\nover two lines\"\n");
        Path jsonl = Files.writeString(dir.resolve("q.jsonl"), "{\"id\":\"x\",\"question\":\"one\"}\n\"two\"\n");
        CliRun.Result t = batch(txt, dir.resolve("t.jsonl"));
        assertEquals(0, t.code(), t.all());
        assertTrue(t.err().contains("skipped 1 blank entry"), t.err());
        assertTrue(t.err().contains(":4: repeats the question of line 1; it is asked once"), t.err());
        List<JsonObject> tr = records(dir.resolve("t.jsonl"));
        assertEquals(2, tr.size());
        assertEquals(Set.of(QuestionFile.idOf("first question"), QuestionFile.idOf("second question")),
                Set.of(tr.get(0).get("id").getAsString(), tr.get(1).get("id").getAsString()));
        CliRun.Result c = batch(csv, dir.resolve("c.jsonl"), "--column", "text", "--with-rows");
        assertEquals(0, c.code(), c.all());
        List<JsonObject> cr = records(dir.resolve("c.jsonl"));
        assertEquals(Set.of("A1", "A2"), Set.of(cr.get(0).get("id").getAsString(), cr.get(1).get("id").getAsString()));
        assertTrue(cr.stream().anyMatch(r -> r.get("question").getAsString().equals("second\nover two lines")));
        assertEquals("Northern Star", cr.get(0).getAsJsonArray("rows").get(0).getAsJsonArray().get(0).getAsString());
        CliRun.Result j = batch(jsonl, dir.resolve("j.jsonl"));
        assertEquals(0, j.code(), j.all());
        assertEquals(2, records(dir.resolve("j.jsonl")).size());
    }

    @Test
    void aRerunDoesOnlyTheUnfinishedQuestionsAndDropsAHalfWrittenLine(@TempDir Path dir) throws Exception {
        Path q = Files.writeString(dir.resolve("q.txt"), "alpha\nbeta\ngamma\n");
        Path out = dir.resolve("out.jsonl");
        // As a run killed in the middle of its second write would leave it: one whole line, one half line.
        String done = "{\"id\":\"" + QuestionFile.idOf("alpha") + "\",\"question\":\"alpha\",\"valid\":true,\"kept\":\"as is\"}\n";
        Files.writeString(out, done + "{\"id\":\"" + QuestionFile.idOf("beta") + "\",\"quest");
        int before = server.seen().size();
        CliRun.Result r = batch(q, out);
        assertEquals(0, r.code(), r.all());
        assertTrue(r.err().contains("removed an unfinished last line"), r.err());
        assertEquals(2, server.seen().size() - before, "alpha was not asked again");
        List<String> lines = Files.readAllLines(out);
        assertEquals(3, lines.size());
        assertEquals(done.strip(), lines.get(0), "finished results are kept byte for byte");
        Set<String> ids = new HashSet<>();
        records(out).forEach(o -> assertTrue(ids.add(o.get("id").getAsString()), "one result per question"));
        CliRun.Result again = batch(q, out);
        assertEquals(0, again.code());
        assertTrue(again.err().contains("all 3 questions already have a result"), again.err());
        assertEquals(3, Files.readAllLines(out).size());
    }

    @Test
    void badInputHasClearMessagesAndExitCodesAndLosesNothing(@TempDir Path dir) throws Exception {
        Path empty = Files.writeString(dir.resolve("empty.txt"), "");
        Path blanks = Files.writeString(dir.resolve("blanks.txt"), "\n   \n\t\n");
        Path q = Files.writeString(dir.resolve("q.txt"), "alpha\n");
        Path out = dir.resolve("out.jsonl");
        Files.writeString(out, "{\"id\":\"old\",\"question\":\"kept\"}\n");
        byte[] before = Files.readAllBytes(out);

        CliRun.Result r = batch(empty, out);
        assertEquals(Exit.INVALID, r.code());
        assertTrue(r.err().contains("empty.txt holds no questions"), r.err());

        r = batch(blanks, out);
        assertEquals(Exit.INVALID, r.code());
        assertTrue(r.err().contains("holds no questions"), r.err());

        r = batch(dir.resolve("missing.txt"), out);
        assertEquals(Exit.USAGE, r.code());
        assertTrue(r.err().contains("missing.txt: no such file"), r.err());

        r = batch(q, dir.resolve("no-such-dir").resolve("out.jsonl"));
        assertEquals(Exit.USAGE, r.code());
        assertTrue(r.err().contains("does not exist"), r.err());

        Path locked = Files.writeString(dir.resolve("locked.jsonl"), "");
        Files.setPosixFilePermissions(locked, PosixFilePermissions.fromString("r--r--r--"));
        if (!Files.isWritable(locked)) { // root may write anyway
            r = batch(q, locked);
            assertEquals(Exit.USAGE, r.code());
            assertTrue(r.err().contains("permission denied"), r.err());
        }

        List<String> args = new ArrayList<>(List.of("--model", server.modelOption("no-such-model"), "--base-url", server.baseUrl(),
                "--schema-free", "--no-progress", "--questions", q.toString(), "--out", out.toString()));
        r = CliRun.run(new BatchCommand(new ToyPipeline()), CliRun.withEnv(CliRun.env()), args.toArray(String[]::new));
        assertEquals(Exit.SERVICE, r.code());
        assertTrue(r.err().contains("rejected the model name") && r.err().contains("no-such-model"), r.err());

        r = CliRun.run(new BatchCommand(new ToyPipeline()), CliRun.withEnv(CliRun.env()), "--model", "openai:some-model",
                "--base-url", "https://models.example.invalid/v1", "--schema-free", "--questions", q.toString(), "--out", out.toString());
        assertEquals(Exit.USAGE, r.code());
        assertTrue(r.err().contains("needs an API key") && r.err().contains("TERMGATE_API_KEY"), r.err());

        r = CliRun.run(new BatchCommand(new ToyPipeline()), CliRun.withEnv(CliRun.env()), "--model", "gpt:x",
                "--schema-free", "--questions", q.toString(), "--out", out.toString());
        assertEquals(Exit.USAGE, r.code());
        assertTrue(r.err().contains("unknown model provider 'gpt'"), r.err());

        org.junit.jupiter.api.Assertions.assertArrayEquals(before, Files.readAllBytes(out), "the existing output is untouched");
    }

    @Test
    void theKeyIsNeverPrintedEvenWhenTheProviderEchoesIt(@TempDir Path dir) throws Exception {
        String key = "sk-test-DO-NOT-PRINT-1234567890";
        try (ScriptedModelServer echo = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen ->
                ScriptedModelServer.status(400, "{\"error\":{\"message\":\"bad header " + seen.headers().get("Authorization") + "\"}}", Map.of()))) {
            Path q = Files.writeString(dir.resolve("q.txt"), "alpha\n");
            Map<String, String> env = new java.util.HashMap<>(CliRun.env());
            env.put("TERMGATE_API_KEY", key);
            CliRun.Result r = CliRun.run(new AskCommand(new ToyPipeline()), CliRun.withEnv(env), "--model", echo.modelOption("m"),
                    "--base-url", echo.baseUrl(), "--schema-free", "alpha");
            assertEquals(Exit.SERVICE, r.code(), r.all());
            assertTrue(echo.seen().get(0).headers().get("Authorization").get(0).endsWith(key), "the key was sent");
            assertTrue(!r.all().contains(key) && !r.all().contains("DO-NOT-PRINT"), r.all());
        }
    }

    @Test
    void theResultFileIsAppendedWithWholeLines(@TempDir Path dir) throws Exception {
        Path q = numberedQuestions(dir, 30);
        Path out = dir.resolve("out.jsonl");
        CliRun.Result r = batch(q, out, "--jobs", "8");
        assertEquals(0, r.code(), r.all());
        String text = Files.readString(out, StandardCharsets.UTF_8);
        assertTrue(text.endsWith("\n"));
        assertEquals(30, records(out).size());
        Files.write(out, "garbage that is not json\n".getBytes(StandardCharsets.UTF_8), StandardOpenOption.APPEND);
        r = batch(q, out);
        assertEquals(0, r.code());
        assertTrue(r.err().contains("1 line(s) are not results of this tool; they are kept"), r.err());
    }

    @Test
    void jobsCapsTheRequestsOutAtATimeAndTheCapIsReached(@TempDir Path dir) throws Exception {
        Path q = numberedQuestions(dir, 24);
        Path out = dir.resolve("out.jsonl");
        try (ScriptedModelServer slow = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI,
                seen -> ScriptedModelServer.delay(150, ScriptedModelServer.answer("MATCH (v:Vessel) RETURN v.name")))) {
            CliRun.Result r = batch(slow, q, out, "--jobs", "3");
            assertEquals(0, r.code(), r.all());
            assertEquals(24, records(out).size());
            // More workers than --jobs run (they ready requests while others wait), but the model never has more
            // than 3 requests at once; with 150 ms replies and 24 questions it has 3 most of the time.
            assertEquals(3, ScriptedModelServer.mostAtOnce(slow.exchanges()));
        }
    }
}

package dev.termgate.cli;

import com.google.gson.JsonParser;
import dev.termgate.translate.ScriptedModelServer;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The real {@code termgate batch} ({@link Main}, the shipped pipeline: demo ontology, parser, analyzer, embedded
 * demo graph) as its own process, killed with SIGKILL ({@link Process#destroyForcibly()} on Unix) in the middle of
 * its run, twice, then run to the end: every question ends with exactly one result, and no line is broken.
 */
class BatchKillResumeTest {

    static final int QUESTIONS = 80;

    @Test
    void killedRunsResumeWithExactlyOneResultPerQuestion(@TempDir Path dir) throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI,
                seen -> ScriptedModelServer.delay(40, ScriptedModelServer.answer("MATCH (v:Vessel) RETURN v.name")))) {
            StringBuilder sb = new StringBuilder();
            for (int i = 0; i < QUESTIONS; i++) sb.append("which vessels are in batch ").append(i).append("?\n");
            Path q = Files.writeString(dir.resolve("questions.txt"), sb.toString());
            Path out = dir.resolve("out.jsonl");
            List<String> cmd = List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-cp", System.getProperty("java.class.path"), Main.class.getName(), "batch",
                    "--questions", q.toString(), "--out", out.toString(), "--model", server.modelOption("m"),
                    "--base-url", server.baseUrl(), "--jobs", "4", "--no-progress");
            for (int kill = 1; kill <= 2; kill++) {
                int before = lines(out);
                Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(dir.resolve("log" + kill).toFile()).start();
                long until = System.nanoTime() + 120_000_000_000L;
                while (lines(out) < before + 10 && p.isAlive() && System.nanoTime() < until) Thread.sleep(5);
                assertTrue(p.isAlive(), "killed mid-run, not after: " + Files.readString(dir.resolve("log" + kill)));
                p.destroyForcibly();
                assertTrue(p.waitFor(30, TimeUnit.SECONDS));
                assertEquals(137, p.exitValue(), "SIGKILL");
            }
            int beforeLast = lines(out);
            assertTrue(beforeLast < QUESTIONS, "the kills left work to do");
            Process last = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(dir.resolve("log-last").toFile()).start();
            assertTrue(last.waitFor(180, TimeUnit.SECONDS));
            String log = Files.readString(dir.resolve("log-last"));
            assertEquals(0, last.exitValue(), log);
            Map<String, Integer> count = new HashMap<>();
            List<String> all = Files.readAllLines(out);
            for (String l : all) {
                var o = JsonParser.parseString(l).getAsJsonObject();
                count.merge(o.get("question").getAsString(), 1, Integer::sum);
            }
            assertEquals(QUESTIONS, count.size(), "every question has a result");
            assertTrue(count.values().stream().allMatch(n -> n == 1), "exactly one each: " + count);
            assertEquals(QUESTIONS, all.size());
            for (String l : all) {
                var o = JsonParser.parseString(l).getAsJsonObject();
                // The shipped pipeline checked the query against the demo ontology and ran it on the demo graph.
                assertTrue(o.get("valid").getAsBoolean(), l);
                assertTrue(o.get("row_count").getAsInt() > 0, l);
            }
            List<String> asked = new ArrayList<>();
            server.seen().forEach(s -> asked.add(s.question()));
            assertTrue(asked.size() >= QUESTIONS, "some questions may be asked twice when killed between ask and write");
        }
    }

    private static int lines(Path out) throws Exception {
        if (!Files.exists(out)) return 0;
        byte[] b = Files.readAllBytes(out);
        int n = 0;
        for (byte x : b) if (x == '\n') n++;
        return n;
    }
}

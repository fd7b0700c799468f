package dev.termgate.bench;

import dev.termgate.cli.CliRun;
import dev.termgate.cli.TestCommands;
import dev.termgate.translate.ScriptedModelServer;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;

import static org.junit.jupiter.api.Assertions.assertEquals;

/**
 * Batch throughput of the shipped pipeline (demo ontology, analyzer, embedded demo graph) against a model with a
 * fixed latency: 200 questions, 200 ms each, 8 jobs. The ideal is
 * 200 × 200 ms / 8 = 5.0 s after start-up; the target (issue 6) is within 5% of it.
 * Run: {@code mvn -B -o -Pbench verify -Dtest=BatchThroughputBench}
 */
@Tag("bench")
class BatchThroughputBench {

    @Test
    void twoHundredQuestionsEightJobs(@TempDir Path dir) throws Exception {
        int n = 200;
        long latency = 200;
        int jobs = 8;
        long[] first = {0};
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen -> {
            synchronized (first) {
                if (first[0] == 0) first[0] = System.nanoTime();
            }
            return ScriptedModelServer.delay(latency, ScriptedModelServer.answer("```cypher\nMATCH (v:Vessel) RETURN v.name\n```"));
        })) {
            StringBuilder sb = new StringBuilder();
            for (int i = 0; i < n; i++) sb.append("question number ").append(i).append('\n');
            Path q = Files.writeString(dir.resolve("q.txt"), sb.toString());
            Path out = dir.resolve("out.jsonl");
            long t0 = System.nanoTime();
            CliRun.Result r = TestCommands.shippedBatch(q, out, "--model", server.modelOption("m"), "--base-url", server.baseUrl(),
                    "--jobs", Integer.toString(jobs), "--no-progress");
            long t1 = System.nanoTime();
            assertEquals(0, r.code(), r.all());
            assertEquals(n, Files.readAllLines(out).size());
            double startup = (first[0] - t0) / 1e6;
            double wall = (t1 - t0) / 1e6;
            double ideal = n * latency / (double) jobs;
            double afterStartup = wall - startup;
            System.out.printf(Locale.ROOT, "batch bench: %d questions, %d ms latency, %d jobs: wall %.0f ms, start-up %.0f ms, "
                    + "after start-up %.0f ms, ideal %.0f ms, overhead %.1f%%%n", n, latency, jobs, wall, startup, afterStartup,
                    ideal, 100 * (afterStartup - ideal) / ideal);
            double[] sum = new double[3];
            double[] quarter = new double[4];
            List<String> lines = Files.readAllLines(out);
            for (int i = 0; i < lines.size(); i++) {
                quarter[i * 4 / lines.size()] += com.google.gson.JsonParser.parseString(lines.get(i)).getAsJsonObject()
                        .getAsJsonObject("timings").get("translate_ms").getAsDouble() / (lines.size() / 4.0);
            }
            System.out.printf(Locale.ROOT, "translate mean by quarter of the run: %.0f, %.0f, %.0f, %.0f ms%n",
                    quarter[0], quarter[1], quarter[2], quarter[3]);
            for (String line : lines) {
                var t = com.google.gson.JsonParser.parseString(line).getAsJsonObject().getAsJsonObject("timings");
                sum[0] += t.get("card_ms").getAsDouble();
                sum[1] += t.get("translate_ms").getAsDouble();
                sum[2] += t.get("run_ms").getAsDouble();
            }
            System.out.printf(Locale.ROOT, "per question (mean): card %.1f ms, translate %.1f ms, run %.1f ms%n",
                    sum[0] / n, sum[1] / n, sum[2] / n);
            // Speed is printed, never asserted (figures go to the README).
        }
    }
}

package dev.termgate.bench;

import com.google.gson.JsonParser;
import dev.termgate.engine.GraphFiles;
import dev.termgate.cli.Main;
import dev.termgate.interpret.DataProfiles;
import dev.termgate.interpret.Interpreter;
import dev.termgate.ontology.InstanceReader;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Speed of the offline interpreter (issue target: at most 100 ms per question warm on the demo ontology) and of an
 * evaluation of 60 demo questions with it on the embedded demo graph (target: under 30 s). Run with
 * {@code mvn -B -Pbench verify -Dtest=InterpreterBenchTest}; figures are printed, not asserted.
 */
@Tag("bench")
class InterpreterBenchTest {

    @Test
    void interpreterAndEvaluationSpeed() throws Exception {
        GraphSchema schema = OntologyLoader.load(List.of()).schema();
        Interpreter it = Interpreter.create(schema, DataProfiles.of(InstanceReader.read(GraphFiles.DEMO_DATA, schema), schema));
        List<String[]> qs = new ArrayList<>();
        for (String line : Files.readAllLines(Path.of("examples/maritime/questions.jsonl"))) {
            if (line.isBlank()) continue;
            var o = JsonParser.parseString(line).getAsJsonObject();
            qs.add(new String[] {o.get("question").getAsString(), o.get("gold").getAsString()});
        }
        for (int r = 0; r < 5; r++) for (String[] q : qs) it.interpret(q[0]);
        List<Long> times = new ArrayList<>();
        for (int r = 0; r < 10; r++) {
            for (String[] q : qs) {
                long t0 = System.nanoTime();
                it.interpret(q[0]);
                times.add(System.nanoTime() - t0);
            }
        }
        times.sort(null);
        System.out.printf(Locale.ROOT, "load average at start: %.2f (figures measured while other work runs are inflated)%n",
                java.lang.management.ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage());
        System.out.printf(Locale.ROOT, "interpreter warm: median %.2f ms, p95 %.2f ms, max %.2f ms per question (%d runs)%n",
                times.get(times.size() / 2) / 1e6, times.get(times.size() * 95 / 100) / 1e6, times.get(times.size() - 1) / 1e6, times.size());

        // The evaluation as `termgate eval --model offline` runs it: the shipped pipeline on the embedded demo
        // graph, the gold and the interpreter's query of each question checked and run, rows compared. The first
        // 60 dev questions (only the time is printed).
        Path file = Files.createTempFile("termgate-bench-eval", ".jsonl");
        List<String> dev = new ArrayList<>();
        for (String line : Files.readAllLines(Path.of("examples/maritime/questions.jsonl"))) {
            if (!line.isBlank() && JsonParser.parseString(line).getAsJsonObject().get("split").getAsString().equals("dev")) dev.add(line);
        }
        Files.write(file, dev.subList(0, 60));
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        long t0 = System.nanoTime();
        int code = Main.run(new String[] {"eval", "--questions", file.toString(), "--model", "offline", "--format", "json"},
                new PrintWriter(out, true), new PrintWriter(err, true));
        long t1 = System.nanoTime();
        Files.delete(file);
        if (code != 0) throw new AssertionError("eval failed: " + err);
        var report = JsonParser.parseString(out.toString()).getAsJsonObject();
        System.out.printf(Locale.ROOT, "evaluation of %d questions (termgate eval --model offline, embedded demo graph): %.1f s"
                        + " for the questions, %.1f s for the whole command with loading ontology, graph and profile%n",
                report.get("questions").getAsInt(), report.getAsJsonObject("time_per_question").get("total_ms").getAsLong() / 1e3,
                (t1 - t0) / 1e9);
    }
}

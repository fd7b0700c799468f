package dev.termgate.bench;

import com.google.gson.JsonParser;
import dev.termgate.engine.Engine;
import dev.termgate.engine.GraphFiles;
import dev.termgate.engine.Limits;
import dev.termgate.engine.Request;
import dev.termgate.interpret.DataProfiles;
import dev.termgate.interpret.Interpreter;
import dev.termgate.ontology.InstanceReader;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.repair.CheckResult;
import dev.termgate.repair.QueryCheck;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
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
        System.out.printf(Locale.ROOT, "interpreter warm: median %.2f ms, p95 %.2f ms, max %.2f ms per question (%d runs)%n",
                times.get(times.size() / 2) / 1e6, times.get(times.size() * 95 / 100) / 1e6, times.get(times.size() - 1) / 1e6, times.size());

        long t0 = System.nanoTime();
        Engine engine = GraphFiles.demo(schema).engine();
        Interpreter fresh = Interpreter.create(schema, DataProfiles.of(InstanceReader.read(GraphFiles.DEMO_DATA, schema), schema));
        long t1 = System.nanoTime();
        for (String[] q : qs.subList(0, 60)) {
            run(engine, schema, q[1]);
            fresh.interpret(q[0]).query().ifPresent(text -> run(engine, schema, text));
        }
        long t2 = System.nanoTime();
        System.out.printf(Locale.ROOT, "evaluation of 60 questions: %.1f s (plus %.1f s loading graph and profile)%n", (t2 - t1) / 1e9, (t1 - t0) / 1e9);
        engine.close();
    }

    static void run(Engine engine, GraphSchema schema, String text) {
        CheckResult c = QueryCheck.check(text, schema);
        c.runnableTree().ifPresent(t -> engine.run(Request.of(t, c.finalText(), schema, Limits.unlimitedRows(Duration.ofSeconds(30)))));
    }
}

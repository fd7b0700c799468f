package dev.termgate.interpret;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.engine.Engine;
import dev.termgate.engine.GraphFiles;
import dev.termgate.engine.Limits;
import dev.termgate.engine.Request;
import dev.termgate.eval.Evaluator;
import dev.termgate.eval.RowMatch;
import dev.termgate.ontology.InstanceReader;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.query.Query;
import dev.termgate.repair.CheckResult;
import dev.termgate.repair.QueryCheck;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;

import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The benchmark of the offline interpreter: the demo question set (examples/maritime/questions.jsonl, the
 * project's own invented test data, gold queries written with the set), each question interpreted, checked by
 * the same analyzer as a model's answer and run on the same embedded demo graph as its gold query; rows compared
 * as in {@code termgate eval}. The holdout split (25 questions, written before the interpreter and never used to
 * tune it) is reported separately.
 *
 * <p>Measured before the interpreter's second round of general mechanisms: dev 59/77 (76.6%), holdout 9/25 (36.0%),
 * whole set 68/102 (66.7%). After it (grammatical joins of verbs, possessives and names, succession, ordering
 * conventions, group members, times of unnamed events; chosen on dev questions only, the holdout looked at only as
 * this test's aggregate figure, twice): dev 70/77 (90.9%), holdout 9/25 (36.0%), whole set 79/102 (77.5%). The
 * issue's 70% over the whole set is reached, but the holdout figure did not move: the new mechanisms fix dev
 * failures and leave the holdout's as they were, so the dev figure overstates what the interpreter does on
 * wordings it was not developed on. The assertions guard the target over the whole set (70%) and the dev
 * level (80%) against regressions.
 */
class InterpreterAccuracyTest {

    static GraphSchema schema;
    static Engine engine;
    static Interpreter interpreter;

    @BeforeAll
    static void load() {
        schema = OntologyLoader.load(List.of()).schema();
        engine = GraphFiles.demo(schema).engine();
        interpreter = Interpreter.create(schema, DataProfiles.of(InstanceReader.read(GraphFiles.DEMO_DATA, schema), schema));
    }

    @AfterAll
    static void close() {
        engine.close();
    }

    record Rows(List<List<Object>> rows, Query tree) {}

    static Rows run(String text) {
        CheckResult c = QueryCheck.check(text, schema);
        if (c.runnableTree().isEmpty()) return null;
        try {
            var r = engine.run(Request.of(c.runnableTree().get(), c.finalText(), schema, Limits.unlimitedRows(Duration.ofSeconds(30))));
            return new Rows(r.rows(), c.runnableTree().get());
        } catch (RuntimeException e) {
            return null;
        }
    }

    @Test
    void executionAccuracyOnTheDemoSet() throws Exception {
        Map<String, Map<String, int[]>> bySplit = new TreeMap<>();
        int correct = 0;
        int total = 0;
        StringBuilder misses = new StringBuilder();
        for (String line : Files.readAllLines(Path.of("examples/maritime/questions.jsonl"), StandardCharsets.UTF_8)) {
            if (line.isBlank()) continue;
            JsonObject q = JsonParser.parseString(line).getAsJsonObject();
            String split = q.get("split").getAsString();
            String shape = q.get("shape").getAsString();
            Rows gold = run(q.get("gold").getAsString());
            assertTrue(gold != null, "gold query of " + q.get("id") + " runs");
            Interpretation it = interpreter.interpret(q.get("question").getAsString());
            Rows cand = it.query().map(InterpreterAccuracyTest::run).orElse(null);
            boolean ok = cand != null && RowMatch.same(gold.rows(), cand.rows(), Evaluator.sortColumns(gold.tree()));
            total++;
            if (ok) correct++;
            else if (split.equals("dev")) misses.append("  ").append(q.get("id").getAsString()).append(' ').append(it.query().orElse("(not understood)")).append('\n');
            for (String key : List.of(shape, "all")) {
                int[] c = bySplit.computeIfAbsent(split, k -> new TreeMap<>()).computeIfAbsent(key, k -> new int[2]);
                c[1]++;
                if (ok) c[0]++;
            }
        }
        StringBuilder report = new StringBuilder("Offline interpreter, execution accuracy on the demo question set\n");
        for (var s : bySplit.entrySet()) {
            report.append(s.getKey()).append('\n');
            s.getValue().forEach((shape, c) -> report.append(String.format(Locale.ROOT, "  %-12s %3d / %3d  %5.1f%%%n",
                    shape, c[0], c[1], 100.0 * c[0] / c[1])));
        }
        report.append(String.format(Locale.ROOT, "whole set      %3d / %3d  %5.1f%%%n", correct, total, 100.0 * correct / total));
        System.out.println(report);
        System.out.println("dev questions not answered right:\n" + misses);
        int[] dev = bySplit.get("dev").get("all");
        assertTrue(dev[0] >= 0.80 * dev[1], report.toString());
        // The target: at least 70% execution accuracy on the demo question set.
        assertTrue(correct >= 0.70 * total, report.toString());
    }
}

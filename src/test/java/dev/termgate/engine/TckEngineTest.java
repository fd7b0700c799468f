package dev.termgate.engine;

import dev.termgate.graph.GraphBuilder;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.schema.GraphSchema;
import dev.termgate.tck.TckScenarios;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.regex.Pattern;

import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Outside source: the openCypher TCK 1.0.0-M23 (org.opencypher:tck, read from the test classpath). Each
 * scenario's graph is built by the importer's CREATE-script reader (the query path never writes), the query
 * runs schema-free, and the rows are compared with the expected table in the TCK's value notation
 * (order-sensitive only for "in order").
 */
class TckEngineTest {

    private static final Pattern OTHER_WRITES = Pattern.compile(
            "(?<![.:$\\w])(MERGE|SET|DELETE|REMOVE|FOREACH|LOAD\\s+CSV|CALL)(?!\\w)", Pattern.CASE_INSENSITIVE);

    /**
     * The 680 read-only scenarios with an expected result whose graph is made by CREATE only: 19 on the named
     * binary-tree graphs and 661 whose every {@code having executed} statement consists of CREATE clauses alone.
     */
    static List<TckScenarios.Scenario> createSetupScenarios() {
        CypherParser parser = new CypherParser();
        return TckScenarios.readOnlyWithResult().stream()
                .filter(s -> s.graph() == TckScenarios.GraphKind.NAMED
                        || (!s.setup().isEmpty() && s.setup().stream().allMatch(q -> onlyCreate(parser, q))))
                .toList();
    }

    /** Scenarios whose setup also reads (MATCH/UNWIND/WITH before CREATE): run too, reported apart. */
    static List<TckScenarios.Scenario> mixedSetupScenarios() {
        CypherParser parser = new CypherParser();
        return TckScenarios.readOnlyWithResult().stream()
                .filter(s -> s.graph() != TckScenarios.GraphKind.NAMED && !s.setup().isEmpty()
                        && s.setup().stream().noneMatch(q -> OTHER_WRITES.matcher(q).find())
                        && !s.setup().stream().allMatch(q -> onlyCreate(parser, q)))
                .toList();
    }

    private static boolean onlyCreate(CypherParser parser, String q) {
        var r = parser.parse(q);
        return r.isValid() && r.tree().unions().isEmpty()
                && r.tree().first().clauses().stream().allMatch(c -> c instanceof dev.termgate.query.Clause.Create);
    }

    /** The read-only scenarios with an expected result and no setup at all (expression semantics). */
    static List<TckScenarios.Scenario> noSetupScenarios() {
        return TckScenarios.readOnlyWithResult().stream()
                .filter(s -> s.graph() != TckScenarios.GraphKind.NAMED && s.setup().isEmpty())
                .toList();
    }

    @Test
    void createSetupScenariosPass() {
        Report r = runAll(createSetupScenarios());
        r.print("TCK M23 read-only scenarios with CREATE setup");
        Report mixed = runAll(mixedSetupScenarios());
        mixed.print("TCK M23 read-only scenarios whose setup reads and creates (not counted above)");
        assertTrue(mixed.passed >= RECORDED_MIXED_SETUP, "fewer pass than recorded: " + mixed.passed + " < " + RECORDED_MIXED_SETUP);
        // Required by the engine issue: at least 85% pass (outside source: openCypher TCK M23).
        assertTrue(r.total() == 680, "expected the 680 scenarios the issue counts, found " + r.total());
        assertTrue(r.passed >= Math.ceil(0.85 * r.total()), "pass rate below 85%: " + r.passed + "/" + r.total());
        // No step back from the figure in the README.
        assertTrue(r.passed >= RECORDED_CREATE_SETUP, "fewer pass than recorded: " + r.passed + " < " + RECORDED_CREATE_SETUP);
    }

    /** The pass counts the README records (openCypher TCK M23); a change that passes fewer fails here. */
    static final int RECORDED_CREATE_SETUP = 680;
    static final int RECORDED_MIXED_SETUP = 20;
    static final int RECORDED_NO_SETUP = 2186;

    @Test
    void noSetupScenariosReport() {
        Report r = runAll(noSetupScenarios());
        r.print("TCK M23 read-only scenarios without setup (expression semantics)");
        // The issue sets a goal (80%), not a requirement; the figure is printed and reported in the README.
        assertTrue(r.total() > 2000, "scenario selection changed: " + r.total());
        assertTrue(r.passed >= RECORDED_NO_SETUP, "fewer pass than recorded: " + r.passed + " < " + RECORDED_NO_SETUP);
    }

    /** Debugging aid: {@code -Dtck.only=Match9.feature:54} runs matching scenarios and prints their rows. */
    @Test
    void selected() {
        String only = System.getProperty("tck.only");
        if (only == null) return;
        CypherParser parser = new CypherParser();
        for (TckScenarios.Scenario s : TckScenarios.readOnlyWithResult()) {
            if (!s.id().contains(only)) continue;
            System.out.println("== " + s.id() + "\n" + String.join("\n", s.setup()) + "\n" + s.query().orElse(""));
            System.out.println("expected: " + s.expectedTable().orElseThrow());
            System.out.println("cause: " + runOne(s, parser) + " " + lastDetail);
        }
    }

    static String lastDetail = "";
    /** Whether the last scenario's query was answered by a pushed projection (ProjectionPushdown). */
    static boolean lastPushed;

    static final class Report {
        int passed;
        int pushed;
        int pushedPassed;
        final Map<String, List<String>> failures = new TreeMap<>();

        int total() {
            return passed + failures.values().stream().mapToInt(List::size).sum();
        }

        void fail(String cause, String id) {
            failures.computeIfAbsent(cause, k -> new ArrayList<>()).add(id);
        }

        void print(String title) {
            System.out.printf("%s: %d of %d passed (%.1f%%)%n", title, passed, total(), 100.0 * passed / Math.max(1, total()));
            System.out.printf("  %d ran their projection in the traversal (ProjectionPushdown), %d of them pass%n", pushed, pushedPassed);
            failures.entrySet().stream()
                    .sorted((a, b) -> b.getValue().size() - a.getValue().size())
                    .forEach(e -> {
                        System.out.printf("  %4d  %s%n", e.getValue().size(), e.getKey());
                        e.getValue().stream().limit(Long.getLong("tck.examples", 3)).forEach(id -> System.out.println("          e.g. " + id));
                    });
        }
    }

    static Report runAll(List<TckScenarios.Scenario> scenarios) {
        Report report = new Report();
        CypherParser parser = new CypherParser();
        for (TckScenarios.Scenario s : scenarios) {
            String cause = runOne(s, parser);
            if (lastPushed) report.pushed++;
            if (lastPushed && cause == null) report.pushedPassed++;
            if (cause == null) report.passed++;
            else report.fail(cause, s.id());
        }
        return report;
    }

    /** Null when the scenario passes, else the cause (grouped in the report). */
    static String runOne(TckScenarios.Scenario s, CypherParser parser) {
        GraphBuilder builder = new GraphBuilder();
        Map<String, Object> params = new HashMap<>();
        try {
            s.parameters().forEach((k, v) -> params.put(k, TckValues.parse(v)));
        } catch (RuntimeException e) {
            return "parameter notation not read: " + e.getMessage();
        }
        try {
            if (s.graph() == TckScenarios.GraphKind.NAMED) {
                CypherScript.load(namedGraph(s.graphName().orElseThrow()), builder, Map.of());
            }
            for (String q : s.setup()) CypherScript.load(q, builder, params);
        } catch (RuntimeException e) {
            return "setup failed: " + shorten(e.getMessage());
        }
        String text = s.query().orElseThrow();
        ParseResult pr = parser.parse(text);
        if (!pr.isValid()) return "query does not parse: " + shorten(pr.diagnostics().get(0).message());
        Result result;
        try (Engine engine = Engines.embedded(builder.graph(), "tck")) {
            long taken = ProjectionPushdown.TAKEN.get();
            lastPushed = false;
            result = engine.run(new Request(pr.tree(), text, GraphSchema.empty(), params,
                    Limits.unlimitedRows(Duration.ofSeconds(10))));
            lastPushed = ProjectionPushdown.TAKEN.get() > taken;
        } catch (EngineException e) {
            lastDetail = String.valueOf(e.getCause());
            return e.code().id() + " " + shorten(e.getMessage());
        } catch (RuntimeException e) {
            return "internal error: " + e.getClass().getSimpleName() + " " + shorten(String.valueOf(e.getMessage()));
        }
        TckScenarios.Table expected = s.expectedTable().orElseThrow();
        return compare(expected, result);
    }

    static String compare(TckScenarios.Table expected, Result result) {
        if (!expected.header().equals(result.columns()) && !(expected.header().isEmpty() && expected.rows().isEmpty())) {
            return "different columns";
        }
        List<String> want = new ArrayList<>();
        for (List<String> row : expected.rows()) {
            StringBuilder sb = new StringBuilder();
            for (String cell : row) {
                Object v;
                try {
                    v = TckValues.parse(cell);
                } catch (RuntimeException e) {
                    return "expected value notation not read";
                }
                sb.append(TckValues.canon(v, expected.ignoreListOrder())).append(" | ");
            }
            want.add(sb.toString());
        }
        List<String> got = new ArrayList<>();
        for (List<Object> row : result.rows()) {
            StringBuilder sb = new StringBuilder();
            for (Object v : row) sb.append(TckValues.canon(v, expected.ignoreListOrder())).append(" | ");
            got.add(sb.toString());
        }
        if (!expected.ordered()) {
            java.util.Collections.sort(want);
            java.util.Collections.sort(got);
        }
        lastDetail = "\n want " + want + "\n got  " + got;
        if (want.size() != got.size()) return "wrong row count";
        lastDetail = "\n want " + want + "\n got  " + got;
        return want.equals(got) ? null : "wrong values";
    }

    static String namedGraph(String name) {
        String path = "graphs/" + name + "/" + name + ".cypher";
        try (InputStream in = TckEngineTest.class.getClassLoader().getResourceAsStream(path)) {
            if (in == null) throw new IllegalStateException("TCK graph not on the classpath: " + path);
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
    }

    /** Keeps causes groupable: numbers and quoted names are masked. */
    static String shorten(String m) {
        if (m == null) return "";
        String first = m.lines().findFirst().orElse("");
        first = first.replaceAll("'[^']*'", "'…'").replaceAll("\\d+", "N");
        return first.length() > 90 ? first.substring(0, 90) + "…" : first;
    }
}

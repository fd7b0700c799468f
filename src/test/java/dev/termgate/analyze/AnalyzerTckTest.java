package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.tck.TckScenarios;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Parser and analyzer together against the openCypher TCK (org.opencypher:tck:1.0.0-M23, read from the test
 * classpath), in schema-free mode: the read-only scenarios that expect a compile-time SyntaxError must be
 * rejected, and the read-only scenarios that expect a result must not be.
 */
class AnalyzerTckTest {

    private final CypherParser parser = new CypherParser();
    private final Analyzer analyzer = Analyzer.schemaFree();

    @Test
    void compileTimeErrorsAreRejected() {
        List<TckScenarios.Scenario> scenarios = TckScenarios.all().stream()
                .filter(s -> s.isReadOnly() && s.expectsCompileError() && s.query().isPresent()
                        && s.expectedError().get().type().equals("SyntaxError")).toList();
        Map<String, int[]> byDetail = new TreeMap<>();
        List<String> missed = new ArrayList<>();
        int rejected = 0;
        for (TckScenarios.Scenario s : scenarios) {
            String detail = s.expectedError().get().detail();
            int[] c = byDetail.computeIfAbsent(detail, k -> new int[2]);
            c[1]++;
            if (rejects(s.query().get())) {
                c[0]++;
                rejected++;
            } else {
                missed.add(detail + "  " + s.id() + "\n      " + s.query().get().strip().replace("\n", "\n      "));
            }
        }
        System.out.println("TCK read-only compile-time SyntaxError scenarios rejected by parser+analyzer: "
                + rejected + " of " + scenarios.size());
        byDetail.forEach((d, c) -> System.out.printf("  %-36s %4d of %4d%n", d, c[0], c[1]));
        missed.forEach(m -> System.out.println("  not rejected: " + m));
        // The TCK M23 holds 539 such scenarios (measured by the grammar issue).
        assertEquals(539, scenarios.size());
        assertTrue(rejected >= Math.ceil(0.9 * scenarios.size()), "at least 90% must be rejected, got " + rejected);
        // No step back from the figure the README records.
        assertTrue(rejected >= 539, "fewer rejected than recorded (539): " + rejected);
    }

    @Test
    void resultQueriesRaiseNoFalseErrors() {
        List<TckScenarios.Scenario> scenarios = TckScenarios.readOnlyWithResult();
        int parsed = 0, procedures = 0;
        List<String> falseErrors = new ArrayList<>();
        for (TckScenarios.Scenario s : scenarios) {
            ParseResult r = parser.parse(s.query().get());
            if (!r.isValid()) continue;
            parsed++;
            List<Diagnostic> errors = analyzer.analyze(r.tree()).diagnostics().stream().filter(Diagnostic::isError).toList();
            if (errors.isEmpty()) continue;
            if (errors.stream().allMatch(d -> d.code() == Code.PROCEDURE_CALL)) {
                // Refused by policy (a procedure may do anything), not a false error of the analysis.
                procedures++;
                continue;
            }
            falseErrors.add(s.id() + "\n      " + s.query().get().strip().replace("\n", "\n      ") + "\n      → " + errors);
        }
        System.out.println("TCK read-only scenarios with a result: " + scenarios.size() + ", parsed " + parsed
                + ", refused as procedure calls " + procedures + ", false errors " + falseErrors.size());
        falseErrors.forEach(f -> System.out.println("  false error: " + f));
        assertEquals(List.of(), falseErrors);
    }

    private boolean rejects(String query) {
        ParseResult r = parser.parse(query);
        if (!r.isValid()) return true;
        return analyzer.analyze(r.tree()).hasErrors();
    }
}

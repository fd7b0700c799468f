package dev.termgate.tck;

import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Checks the reader of the openCypher TCK (org.opencypher:tck:1.0.0-M23) against counts measured on M23. */
class TckScenariosTest {

    @Test
    void countsMatchTheMeasuredFactsOfM23() {
        var all = TckScenarios.all();
        long readOnly = all.stream().filter(TckScenarios.Scenario::isReadOnly).count();
        long readOnlyResult = TckScenarios.readOnlyWithResult().size();
        long readOnlyCompile = all.stream().filter(s -> s.isReadOnly() && s.expectsCompileError()
                && s.expectedError().get().type().equals("SyntaxError")).count();
        System.out.printf("TCK M23: %d concrete scenarios; %d read-only; %d read-only with an expected result; "
                + "%d read-only with a compile-time SyntaxError%n", all.size(), readOnly, readOnlyResult, readOnlyCompile);
        System.out.println("TCK M23 compile-time error details: " + TckScenarios.compileTimeDetails());
        // Source: the facts measured on openCypher TCK 1.0.0-M23.
        assertEquals(3897, all.size());
        assertEquals(3527, readOnly);
        assertEquals(2888, readOnlyResult);
        assertEquals(539, readOnlyCompile);
        assertTrue(all.stream().allMatch(s -> s.query().isPresent()), "every scenario has a query");
        for (String detail : TckScenarios.compileTimeDetails().keySet()) {
            assertTrue(TckScenarios.PARSER_ERROR_DETAILS.contains(detail)
                    || TckScenarios.ANALYZER_ERROR_DETAILS.contains(detail), "detail not classified: " + detail);
        }
    }
}

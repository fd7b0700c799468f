package dev.termgate.engine;

import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The demo graph loads from the jar's examples/ with no option, and every gold query of the demo runs. */
class DemoGraphTest {

    @Test
    void everyGoldQueryRunsOnTheDemoGraph() {
        GraphFiles.Loaded demo = GraphFiles.demo(DemoQueries.schema());
        assertTrue(demo.nodes() > 100, "demo graph has nodes");
        List<String> failures = new ArrayList<>();
        int empty = 0;
        try (Engine engine = demo.engine()) {
            for (DemoQueries.Gold g : DemoQueries.gold()) {
                ParseResult pr = new CypherParser().parse(g.query());
                if (!pr.isValid()) {
                    failures.add(g.id() + " does not parse");
                    continue;
                }
                try {
                    Result r = engine.run(Request.of(pr.tree(), g.query(), DemoQueries.schema(), Limits.defaults()));
                    if (r.rows().isEmpty()) empty++;
                } catch (EngineException e) {
                    failures.add(g.id() + ": " + e.getMessage() + "  <- " + g.query());
                }
            }
        }
        System.out.println("demo gold queries: " + DemoQueries.gold().size() + ", failures " + failures.size() + ", empty results " + empty);
        failures.forEach(f -> System.out.println("  " + f));
        assertEquals(List.of(), failures);
    }
}

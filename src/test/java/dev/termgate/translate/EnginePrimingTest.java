package dev.termgate.translate;

import dev.termgate.engine.Engine;
import dev.termgate.engine.GraphFiles;
import dev.termgate.ontology.LoadOptions;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;

import java.nio.file.Files;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The engine's rehearsal before a batch's first answers must exercise the engine, not fail quietly at the gate:
 * its queries pass the gate unchanged on the demo ontology and on schema.org (src/test/resources/ontologies, see
 * NOTICE.md), and run without a problem on the demo graph.
 */
class EnginePrimingTest {

    @Test
    void theRehearsalQueriesPassTheGateAndRunOnTheDemoGraph() throws Exception {
        GraphSchema demo = OntologyLoader.load(List.of()).schema();
        List<String> queries = StandardPipeline.primingQueries(demo);
        assertEquals(3, queries.size(), queries.toString());
        QueryGate gate = StandardGate.forSchema(demo, false);
        try (Engine engine = GraphFiles.demo(demo).engine()) {
            EngineRunner runner = new EngineRunner(engine, demo);
            for (String q : queries) {
                Checked c = gate.check(q);
                assertTrue(c.valid(), q + ": " + c.diagnostics());
                assertEquals(List.of(), c.edits(), "accepted as written, no repair: " + q);
                RunResult r = runner.run(c, RunLimits.DEFAULT);
                assertEquals(List.of(), r.diagnostics(), q);
                assertFalse(r.rows().isEmpty(), "the demo graph has an answer for " + q);
            }
        }
    }

    @Test
    void theRehearsalQueriesPassTheGateOnSchemaOrg() throws Exception {
        GraphSchema schema = OntologyLoader.load(List.of("src/test/resources/ontologies/schema.nq"),
                LoadOptions.defaults().withCacheDir(Files.createTempDirectory("termgate-priming"))).schema();
        List<String> queries = StandardPipeline.primingQueries(schema);
        assertEquals(3, queries.size(), queries.toString());
        QueryGate gate = StandardGate.forSchema(schema, false);
        for (String q : queries) assertTrue(gate.check(q).valid(), q + ": " + gate.check(q).diagnostics());
    }

    @Test
    void aSchemaWithoutPropertiesOnLabelsHasNoRehearsal() {
        assertEquals(List.of(), StandardPipeline.primingQueries(GraphSchema.empty()));
    }
}

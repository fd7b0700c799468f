package dev.termgate.cli;

import dev.termgate.translate.ScriptedModelServer;
import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * {@code ask} with the shipped pipeline (demo ontology and graph, the project's parser, analyzer, repair and
 * engine) and a scripted model: a hallucinated relationship type is repaired, the rows come from the demo graph.
 */
class StandardPipelineTest {

    @Test
    void askRepairsAndRunsOnTheDemoGraph() throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen ->
                ScriptedModelServer.answer("```cypher\nMATCH (p:Port)-[:inCountry]->(c:Country) WHERE c.name = 'Valdoria' RETURN p.name\n```"))) {
            CliRun.Result r = CliRun.run(new AskCommand(), CliRun.withEnv(CliRun.env()), "--model", server.modelOption("m"),
                    "--base-url", server.baseUrl(), "List all ports in Valdoria.");
            assertEquals(0, r.code(), "out=" + r.out() + " err=" + r.err() + " code=" + r.code());
            assertTrue(r.out().contains("IN_COUNTRY"), r.out());
            assertTrue(r.out().contains("'inCountry' → 'IN_COUNTRY'"), r.out());
            assertTrue(r.out().contains(" rows)") || r.out().contains(" row)"), r.out());
            assertTrue(server.seen().get(0).allText().contains("Port"), "the card went to the model");
        }
    }

    @Test
    void aWriteFromTheModelIsNeverRunOnTheDemoGraph() throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen ->
                ScriptedModelServer.answer("MATCH (p:Port) DETACH DELETE p"))) {
            CliRun.Result r = CliRun.run(new AskCommand(), CliRun.withEnv(CliRun.env()), "--model", server.modelOption("m"),
                    "--base-url", server.baseUrl(), "Delete all ports.");
            assertEquals(Exit.INVALID, r.code(), r.all());
            assertTrue(r.out().matches("(?s).*TG4\\d{3}.*"), "refused as a write (TG4xxx): " + r.out());
            assertTrue(r.out().contains("rejected, not run"), r.out());
        }
    }
}

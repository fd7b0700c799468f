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
            CliRun.Result explained = CliRun.run(new AskCommand(), CliRun.withEnv(CliRun.env()), "--model", server.modelOption("m"),
                    "--base-url", server.baseUrl(), "--explain", "List all ports in Valdoria.");
            assertEquals(0, explained.code(), explained.all());
            String out = explained.out();
            assertTrue(out.indexOf("plan:\n  gremlin: ") > out.indexOf("query:") && out.indexOf("plan:") < out.lastIndexOf(" rows)"),
                    "the plan between the query and the rows: " + out);
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

    @Test
    void theCardBudgetGivenIsTheOneUsed() throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI, seen ->
                ScriptedModelServer.answer("MATCH (p:Port) RETURN p.name"))) {
            CliRun.Result whole = CliRun.run(new AskCommand(), CliRun.withEnv(CliRun.env()), "--model", server.modelOption("m"),
                    "--base-url", server.baseUrl(), "--format", "json", "--budget", "100000", "List all ports.");
            CliRun.Result pruned = CliRun.run(new AskCommand(), CliRun.withEnv(CliRun.env()), "--model", server.modelOption("m"),
                    "--base-url", server.baseUrl(), "--format", "json", "--budget", "400", "List all ports.");
            assertEquals(0, whole.code(), whole.all());
            assertEquals(0, pruned.code(), pruned.all());
            int wholeTokens = cardTokens(whole.out());
            int prunedTokens = cardTokens(pruned.out());
            assertTrue(prunedTokens <= 400, "pruned to the budget: " + prunedTokens);
            assertTrue(wholeTokens > 400, "the demo's whole card is larger than the small budget: " + wholeTokens);
            assertTrue(server.seen().get(1).allText().length() < server.seen().get(0).allText().length(),
                    "the model got the smaller card");
        }
    }

    @Test
    void aMissingApiKeyIsToldBeforeTheGraphIsLoaded() {
        CliRun.Result r = CliRun.run(new AskCommand(), CliRun.withEnv(CliRun.env()), "--model", "openai:some-model",
                "--base-url", "https://models.example.invalid/v1", "List all ports.");
        assertEquals(Exit.USAGE, r.code(), r.all());
        assertTrue(r.err().contains("needs an API key"), r.err());
        // The demo graph's load reports TG6008 for its one deliberately unknown property; nothing was loaded.
        assertTrue(!r.err().contains("TG6008"), r.err());
    }

    private static int cardTokens(String json) {
        return com.google.gson.JsonParser.parseString(json).getAsJsonObject().get("card_tokens").getAsInt();
    }
}

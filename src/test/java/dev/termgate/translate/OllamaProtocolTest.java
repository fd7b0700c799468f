package dev.termgate.translate;

import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.Map;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The same loop over the Ollama chat protocol. */
class OllamaProtocolTest {

    static Translator translator(ScriptedModelServer server, String model) {
        ModelSettings s = ModelSettings.resolve(Optional.of(server.modelOption(model)), Optional.of(server.baseUrl()),
                Optional.of(Duration.ofSeconds(5)), Map.of(), Optional.empty()).withRetries(1);
        return ModelTranslator.create(s, Prompts.builtIn(), 3);
    }

    @Test
    void answersReAsksAndTokenCountsComeThrough() throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OLLAMA, seen ->
                seen.attempt() == 1 ? ScriptedModelServer.answer("```cypher\nMATCH (h:Harbor) RETURN h\n```")
                        : ScriptedModelServer.answer("MATCH (p:Port) RETURN p.name"))) {
            ToyPipeline toy = new ToyPipeline();
            Pipeline p = toy.open(null);
            Outcome o = new TranslationLoop(translator(server, "local-model"), p.gate(), p.cards(), 3).translate("where do ships stop");
            assertTrue(o.valid());
            assertEquals("MATCH (p:Port) RETURN p.name", o.accepted().get().query());
            assertEquals(2, o.attempts().size());
            assertEquals(200, o.promptTokens().getAsInt(), "prompt_eval_count summed over both asks");
            assertEquals(40, o.completionTokens().getAsInt(), "eval_count summed");
            assertEquals("ollama:local-model", o.model());
            assertEquals("/api/chat", server.seen().get(0).path());
            assertEquals("local-model", server.seen().get(0).body().get("model").getAsString());
            assertTrue(server.seen().get(1).lastUserText().contains("label 'Harbor' is not defined"));
        }
    }

    @Test
    void anUnknownModelIsReportedAsSuch() throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OLLAMA,
                seen -> ScriptedModelServer.status(404, "{\"error\":\"model 'nope' not found, try pulling it first\"}", Map.of()))) {
            Translator t = translator(server, "nope");
            ServiceFailure f = assertThrows(ServiceFailure.class, () -> t.translate(TranslationRequest.first("q", "card")));
            assertEquals(ServiceFailure.Kind.MODEL_NOT_FOUND, f.kind());
            assertTrue(f.getMessage().contains("does not know the model 'nope'"), f.getMessage());
            assertEquals(1, server.seen().size(), "a rejected model name is not retried");
        }
    }
}

package dev.termgate.translate;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.time.Duration;
import java.util.Map;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The rehearsal runs the whole client path of each chat protocol against its canned reply and never the network:
 * the scripted server it is pointed at must see no request.
 */
class RehearsalTest {

    @ParameterizedTest
    @ValueSource(strings = {"OPENAI", "OLLAMA"})
    void rehearsesEachProtocolWithoutAnyRequest(String protocol) throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.valueOf(protocol),
                seen -> ScriptedModelServer.answer("MATCH (n) RETURN n"))) {
            ModelSettings s = ModelSettings.resolve(Optional.of(server.modelOption("m")), Optional.of(server.baseUrl()),
                    Optional.of(Duration.ofSeconds(5)), Map.of("TERMGATE_API_KEY", "k"), Optional.empty());
            Reply canned = ModelTranslator.rehearse(s, Prompts.builtIn(), 3);
            assertEquals("MATCH (n) RETURN n", canned.text(), "the canned reply reads as the protocol's reply");
            assertEquals(java.util.OptionalInt.of(1), canned.promptTokens());
            assertTrue(server.seen().isEmpty());
            // The real client over the same settings does reach the server.
            ModelTranslator.create(s, Prompts.builtIn(), 1).translate(TranslationRequest.first("q", "card"));
            assertEquals(1, server.seen().size());
        }
    }
}

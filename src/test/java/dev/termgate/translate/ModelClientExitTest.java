package dev.termgate.translate;

import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.Map;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The model client's selector thread ends when released, so a process need not wait for it at exit. */
class ModelClientExitTest {

    @Test
    void releasingEndsTheSelectorThreadOfAClientThatWasUsed() throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI,
                seen -> ScriptedModelServer.answer("MATCH (n) RETURN n"))) {
            ModelSettings s = ModelSettings.resolve(Optional.of(server.modelOption("m")), Optional.of(server.baseUrl()),
                    Optional.of(Duration.ofSeconds(5)), Map.of("TERMGATE_API_KEY", "k"), Optional.empty());
            ModelTranslator.create(s, Prompts.builtIn(), 1).translate(TranslationRequest.first("q", "card"));
            assertFalse(ModelHttpClient.selectors().isEmpty(), "the client's selector thread was found");
            assertTrue(ModelHttpClient.selectors().stream().anyMatch(Thread::isAlive));
            Translators.releaseAtExit();
            for (Thread t : ModelHttpClient.selectors()) t.join(2_000);
            assertTrue(ModelHttpClient.selectors().stream().noneMatch(Thread::isAlive),
                    "every selector thread ended once released");
        }
    }
}

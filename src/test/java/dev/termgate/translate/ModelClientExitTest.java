package dev.termgate.translate;

import org.junit.jupiter.api.Test;

import java.time.Duration;
import java.util.Map;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The JDK client's selector thread ends when released, so a process need not wait for it at exit; a service at an
 * http:// address needs no such thread at all.
 */
class ModelClientExitTest {

    @Test
    void releasingEndsTheSelectorThreadOfAClientThatWasUsed() throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI,
                seen -> ScriptedModelServer.answer("MATCH (n) RETURN n"))) {
            // An http:// service is spoken to on plain sockets; the JDK client (https://, proxies) is made on
            // first use, here by hand, and used once.
            ModelHttpClient client = new ModelHttpClient(Duration.ofSeconds(5), Duration.ofSeconds(5), Optional.empty(), "m", 0);
            var request = java.net.http.HttpRequest.newBuilder(java.net.URI.create(server.baseUrl() + "/chat/completions"))
                    .POST(java.net.http.HttpRequest.BodyPublishers.ofString(
                            "{\"model\":\"m\",\"messages\":[{\"role\":\"user\",\"content\":\"q\"}]}")).build();
            assertTrue(client.jdk().send(request, java.net.http.HttpResponse.BodyHandlers.ofString()).statusCode() == 200);
            assertFalse(ModelHttpClient.selectors().isEmpty(), "the client's selector thread was found");
            assertTrue(ModelHttpClient.selectors().stream().anyMatch(Thread::isAlive));
            Translators.releaseAtExit();
            for (Thread t : ModelHttpClient.selectors()) t.join(2_000);
            assertTrue(ModelHttpClient.selectors().stream().noneMatch(Thread::isAlive),
                    "every selector thread ended once released");
        }
    }

    @Test
    void aServiceAtAnHttpAddressStartsNoJdkClient() throws Exception {
        try (ScriptedModelServer server = new ScriptedModelServer(ScriptedModelServer.Protocol.OPENAI,
                seen -> ScriptedModelServer.answer("MATCH (n) RETURN n"))) {
            ModelSettings s = ModelSettings.resolve(Optional.of(server.modelOption("m")), Optional.of(server.baseUrl()),
                    Optional.of(Duration.ofSeconds(5)), Map.of("TERMGATE_API_KEY", "k"), Optional.empty());
            var before = ModelHttpClient.selectors();
            ModelTranslator.create(s, Prompts.builtIn(), 1).translate(TranslationRequest.first("q", "card"));
            assertEquals(1, server.seen().size());
            assertEquals(before, ModelHttpClient.selectors(), "no selector thread was started");
        }
    }
}

package dev.termgate.translate;

import dev.langchain4j.http.client.HttpClient;
import dev.langchain4j.http.client.HttpClientBuilder;
import dev.langchain4j.http.client.HttpRequest;
import dev.langchain4j.http.client.SuccessfulHttpResponse;
import dev.langchain4j.http.client.sse.ServerSentEventListener;
import dev.langchain4j.http.client.sse.ServerSentEventParser;

import java.time.Duration;
import java.util.List;
import java.util.Map;

/**
 * Answers every request with one fixed reply of the provider's protocol, without any network: a chat model built
 * on it lets {@link ModelTranslator#rehearse} run the whole client path once (prompts, the request and reply
 * JSON, the reply's reading) before the first real question.
 */
final class RehearsalHttpClient implements HttpClient {

    private final String body;

    private RehearsalHttpClient(String body) {
        this.body = body;
    }

    static HttpClientBuilder builder(ModelSpec.Provider provider) {
        String body = switch (provider) {
            // The minimal replies of the two chat protocols (OpenAI chat completions; Ollama /api/chat).
            case OPENAI -> "{\"id\":\"rehearsal\",\"object\":\"chat.completion\",\"created\":0,\"model\":\"m\",\"choices\":"
                    + "[{\"index\":0,\"message\":{\"role\":\"assistant\",\"content\":\"MATCH (n) RETURN n\"},"
                    + "\"finish_reason\":\"stop\"}],\"usage\":{\"prompt_tokens\":1,\"completion_tokens\":1,\"total_tokens\":2}}";
            case OLLAMA -> "{\"model\":\"m\",\"created_at\":\"2026-01-01T00:00:00Z\",\"message\":{\"role\":\"assistant\","
                    + "\"content\":\"MATCH (n) RETURN n\"},\"done\":true,\"prompt_eval_count\":1,\"eval_count\":1}";
            case OFFLINE -> throw new IllegalArgumentException("the offline interpreter has no protocol");
        };
        return new HttpClientBuilder() {
            Duration connect = Duration.ofSeconds(1);
            Duration read = Duration.ofSeconds(1);

            @Override public Duration connectTimeout() { return connect; }
            @Override public HttpClientBuilder connectTimeout(Duration d) { if (d != null) connect = d; return this; }
            @Override public Duration readTimeout() { return read; }
            @Override public HttpClientBuilder readTimeout(Duration d) { if (d != null) read = d; return this; }
            @Override public HttpClient build() { return new RehearsalHttpClient(body); }
        };
    }

    @Override
    public SuccessfulHttpResponse execute(HttpRequest request) {
        return SuccessfulHttpResponse.builder().statusCode(200)
                .headers(Map.of("content-type", List.of("application/json"))).body(body).build();
    }

    @Override
    public void execute(HttpRequest request, ServerSentEventParser parser, ServerSentEventListener listener) {
        throw new UnsupportedOperationException("termgate does not stream replies");
    }
}

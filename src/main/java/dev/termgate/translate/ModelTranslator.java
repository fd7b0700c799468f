package dev.termgate.translate;

import dev.langchain4j.data.message.AiMessage;
import dev.langchain4j.data.message.ChatMessage;
import dev.langchain4j.data.message.SystemMessage;
import dev.langchain4j.data.message.UserMessage;
import dev.langchain4j.http.client.HttpClientBuilder;
import dev.langchain4j.model.chat.ChatModel;
import dev.langchain4j.model.chat.response.ChatResponse;
import dev.langchain4j.model.ollama.OllamaChatModel;
import dev.langchain4j.model.openai.OpenAiChatModel;
import dev.langchain4j.model.output.TokenUsage;
import dev.termgate.diag.Diagnostic;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalInt;

/**
 * A translator backed by a chat model through LangChain4j. A first ask sends the system template (card,
 * examples) and the question; a re-ask adds the model's last reply and the re-ask template with the exact
 * diagnostics and ranked candidates, so the model corrects its own answer rather than starting over.
 */
public final class ModelTranslator implements Translator {

    /** A placeholder for servers on this machine that take no key (the OpenAI client insists on one). */
    private static final String NO_KEY = "none";

    private final ChatModel model;
    private final Prompts prompts;
    private final Retry retry;
    private final String name;
    private final int maxAttempts;

    public ModelTranslator(ChatModel model, String name, Prompts prompts, Retry retry, int maxAttempts) {
        this.model = model;
        this.name = name;
        this.prompts = prompts;
        this.retry = retry;
        this.maxAttempts = maxAttempts;
    }

    /**
     * @throws IllegalArgumentException when the settings cannot work (offline spec, missing key); the message is
     *                                  for the user
     */
    public static ModelTranslator create(ModelSettings s, Prompts prompts, int maxAttempts) {
        return new ModelTranslator(chatModel(s), s.spec().toString(), prompts, new Retry(s.maxRetries()), maxAttempts);
    }

    /**
     * Runs the client side of {@code times} exchanges (prompts, request JSON, the JDK's HTTP client, reply
     * reading) against a stand-in service of the same protocol on the loopback address, so no request leaves
     * the process and no key is sent. The first exchanges of a process load and compile most of that code,
     * which took about a second under the first questions of a batch; a caller runs this on a spare thread
     * while it loads the graph.
     *
     * @return the last canned reply
     * @throws ServiceFailure when the loopback exchange fails (the real client will tell its own story)
     */
    public static Reply rehearse(ModelSettings s, Prompts prompts, int times) {
        try (RehearsalServer server = new RehearsalServer(s.spec().provider())) {
            ModelSettings loopback = new ModelSettings(s.spec(), server.baseUrl(s.spec().provider()), Optional.empty(),
                    s.timeout(), 0, 0);
            ModelTranslator t = new ModelTranslator(chatModel(loopback), s.spec().toString(), prompts, new Retry(0), 1);
            Reply last = null;
            for (int i = 0; i < times; i++) last = t.translate(TranslationRequest.first("rehearsal", "(no card)"));
            return last;
        } catch (java.io.IOException e) {
            throw new ServiceFailure(ServiceFailure.Kind.FATAL, "no loopback address for the rehearsal: " + e.getMessage(),
                    Optional.empty());
        }
    }

    static ChatModel chatModel(ModelSettings s) {
        HttpClientBuilder http = ModelHttpClient.builder(s.timeout(), s.apiKey(), s.spec().model(), s.inFlight());
        String modelName = s.spec().model();
        return switch (s.spec().provider()) {
            case OPENAI -> {
                if (s.problem().isPresent()) throw new IllegalArgumentException(s.problem().get());
                yield OpenAiChatModel.builder()
                        .httpClientBuilder(http)
                        .baseUrl(s.baseUrl())
                        .apiKey(s.apiKey().map(Secret::reveal).orElse(NO_KEY))
                        .modelName(modelName)
                        .timeout(s.timeout())
                        .maxRetries(0)
                        .logRequests(false)
                        .logResponses(false)
                        .build();
            }
            case OLLAMA -> OllamaChatModel.builder()
                    .httpClientBuilder(http)
                    .baseUrl(s.baseUrl())
                    .modelName(modelName)
                    .timeout(s.timeout())
                    .customHeaders(s.apiKey().map(k -> Map.of("Authorization", "Bearer " + k.reveal())).orElse(Map.of()))
                    .maxRetries(0)
                    .logRequests(false)
                    .logResponses(false)
                    .build();
            case OFFLINE -> throw new IllegalArgumentException("the offline interpreter is not a chat model");
        };
    }

    @Override
    public String name() {
        return name;
    }

    @Override
    public Reply translate(TranslationRequest request) {
        List<ChatMessage> messages = messages(request);
        ChatResponse response = retry.call(() -> {
            try {
                return model.chat(messages);
            } catch (ServiceFailure f) {
                throw f;
            } catch (RuntimeException e) {
                throw classify(e);
            }
        });
        String text = response.aiMessage() == null || response.aiMessage().text() == null ? "" : response.aiMessage().text();
        TokenUsage usage = response.tokenUsage();
        return new Reply(text, Optional.empty(), count(usage == null ? null : usage.inputTokenCount()),
                count(usage == null ? null : usage.outputTokenCount()));
    }

    /** The messages of one request; public so that tests and {@code --show-prompt} see exactly what is sent. */
    public List<ChatMessage> messages(TranslationRequest request) {
        List<ChatMessage> messages = new ArrayList<>();
        messages.add(SystemMessage.from(prompts.fill(Prompts.SYSTEM, Map.of(
                "card", request.card(),
                "examples", prompts.raw(Prompts.EXAMPLES)))));
        messages.add(UserMessage.from(prompts.fill(Prompts.ASK, Map.of("question", request.question()))));
        request.previous().ifPresent(prev -> {
            // An empty assistant turn is refused by some servers; say what came back instead.
            messages.add(AiMessage.from(prev.reply().isBlank() ? "(empty reply)" : prev.reply()));
            messages.add(UserMessage.from(prompts.fill(Prompts.REASK, Map.of(
                    "question", request.question(),
                    "previous_query", prev.query().orElse("(no query could be found in your reply)"),
                    "diagnostics", prev.rendered().isBlank() ? listed(prev.diagnostics()) : prev.rendered(),
                    "candidates", candidates(prev.diagnostics()),
                    "attempt", Integer.toString(request.attempt()),
                    "attempts_left", Integer.toString(Math.max(0, maxAttempts - request.attempt() + 1))))));
        });
        return messages;
    }

    private static String listed(List<Diagnostic> diagnostics) {
        StringBuilder sb = new StringBuilder();
        diagnostics.forEach(d -> sb.append(d).append('\n'));
        return sb.toString();
    }

    /** The ranked replacements of every diagnostic that has some, as a list the model can pick from. */
    static String candidates(List<Diagnostic> diagnostics) {
        StringBuilder sb = new StringBuilder();
        for (Diagnostic d : diagnostics) {
            if (d.suggestions().isEmpty()) continue;
            if (sb.isEmpty()) sb.append("Names from the card that may be meant, best first:\n");
            sb.append("- instead of the name at ").append(d.span().isNone() ? "(no position)"
                    : "line " + d.span().startLine() + ":" + d.span().startColumn()).append(": ")
                    .append(String.join(", ", d.suggestions())).append('\n');
        }
        return sb.toString();
    }

    private static OptionalInt count(Integer n) {
        return n == null ? OptionalInt.empty() : OptionalInt.of(n);
    }

    /** LangChain4j's own exceptions (for failures outside our HTTP client), mapped to ours. */
    static ServiceFailure classify(RuntimeException e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof ServiceFailure f) return f;
        }
        String msg = String.valueOf(e.getMessage());
        if (e instanceof dev.langchain4j.exception.RetriableException) {
            return new ServiceFailure(ServiceFailure.Kind.RETRIABLE, msg, Optional.empty());
        }
        if (e instanceof dev.langchain4j.exception.AuthenticationException) {
            return new ServiceFailure(ServiceFailure.Kind.AUTHENTICATION, "the provider refused the API key", Optional.empty());
        }
        if (e instanceof dev.langchain4j.exception.ModelNotFoundException) {
            return new ServiceFailure(ServiceFailure.Kind.MODEL_NOT_FOUND, "the provider does not know the model", Optional.empty());
        }
        return new ServiceFailure(ServiceFailure.Kind.FATAL, "the model client failed: "
                + new Secret("").redact(msg.length() > 300 ? msg.substring(0, 300) + "…" : msg), Optional.empty());
    }
}

package dev.termgate.translate;

import dev.langchain4j.http.client.HttpClient;
import dev.langchain4j.http.client.HttpClientBuilder;
import dev.langchain4j.http.client.HttpRequest;
import dev.langchain4j.http.client.SuccessfulHttpResponse;
import dev.langchain4j.http.client.sse.ServerSentEventListener;
import dev.langchain4j.http.client.sse.ServerSentEventParser;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpResponse;
import java.net.http.HttpTimeoutException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.time.ZonedDateTime;
import java.time.format.DateTimeFormatter;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * The HTTP client under LangChain4j's chat models. LangChain4j's own client drops the response headers of a
 * failed call, and {@code Retry-After} is one of them; this one turns every failure into a
 * {@link ServiceFailure} that keeps it, with the key redacted from any echoed text.
 */
final class ModelHttpClient implements HttpClient {

    private static final Set<String> RESTRICTED = Set.of("host", "content-length", "connection", "expect", "upgrade");
    private static final int MAX_ERROR_TEXT = 300;

    /** The JDK client, for https:// and proxied addresses. */
    private final java.util.function.Supplier<java.net.http.HttpClient> http;
    private final Duration readTimeout;
    private final Duration connectTimeout;
    /** Plain-HTTP transports by host and port. */
    private final Map<String, PlainHttp> plain = new java.util.concurrent.ConcurrentHashMap<>();
    private final Optional<Secret> key;
    private final String modelName;
    /** Requests out at a time, when limited. */
    private final Optional<RequestRelay> relay;

    /** The selector threads of the JDK clients made here (see {@link #stopSelectors}). */
    private static final Set<Thread> SELECTORS = java.util.concurrent.ConcurrentHashMap.newKeySet();

    /** @param inFlight the most requests out at a time; 0 for no limit */
    ModelHttpClient(Duration connectTimeout, Duration readTimeout, Optional<Secret> key, String modelName, int inFlight) {
        // Made on first use: a service at an http:// address never needs it, nor its selector thread.
        this.http = Memo.of(() -> jdkClient(connectTimeout));
        this.readTimeout = readTimeout;
        this.connectTimeout = connectTimeout;
        this.key = key;
        this.modelName = modelName;
        this.relay = inFlight > 0 ? Optional.of(new RequestRelay(inFlight)) : Optional.empty();
    }

    /** A JDK client for https:// and proxied addresses; its selector thread is remembered for {@link #stopSelectors}. */
    private static java.net.http.HttpClient jdkClient(Duration connectTimeout) {
        Set<Thread> before = Thread.getAllStackTraces().keySet();
        java.net.http.HttpClient client = java.net.http.HttpClient.newBuilder()
                .version(java.net.http.HttpClient.Version.HTTP_1_1)
                .connectTimeout(connectTimeout)
                .followRedirects(java.net.http.HttpClient.Redirect.NORMAL)
                // Completion steps run on the client's own selector thread instead of hopping through a pool: a
                // blocking send then costs fewer thread switches, which on a small, busy machine were a visible
                // part of each call's time. Nothing that completes a reply here blocks.
                .executor(Runnable::run)
                .build();
        for (Thread t : Thread.getAllStackTraces().keySet()) {
            if (!before.contains(t) && t.getName().endsWith("SelectorManager")) SELECTORS.add(t);
        }
        return client;
    }

    /** The JDK client, made now if it was not yet (tests). */
    java.net.http.HttpClient jdk() {
        return http.get();
    }

    /**
     * Stops the selector threads of the clients made so far, which ends the clients; for the end of the process
     * only. A JVM waits at exit, about 0.3 s, for threads that sit in native code, and a JDK 17 client's selector
     * always does (the batch bench measured 0.38 s from the last reply to the end of the process, 0.08 s with
     * this). Interrupting the selector is what ends its loop; JDK 17 has no close().
     */
    static void stopSelectors() {
        SELECTORS.forEach(Thread::interrupt);
    }

    /** The selector threads found so far (tests). */
    static Set<Thread> selectors() {
        return Set.copyOf(SELECTORS);
    }

    static HttpClientBuilder builder(Duration timeout, Optional<Secret> key, String modelName, int inFlight) {
        return new HttpClientBuilder() {
            Duration connect = Duration.ofSeconds(10);
            Duration read = timeout;

            @Override public Duration connectTimeout() { return connect; }
            @Override public HttpClientBuilder connectTimeout(Duration d) { if (d != null) connect = d; return this; }
            @Override public Duration readTimeout() { return read; }
            // The models pass their own timeout here; ours (from --model-timeout) wins.
            @Override public HttpClientBuilder readTimeout(Duration d) { return this; }
            @Override public HttpClient build() { return new ModelHttpClient(connect, read, key, modelName, inFlight); }
        };
    }

    @Override
    public SuccessfulHttpResponse execute(HttpRequest request) {
        URI uri = URI.create(request.url());
        Map<String, List<String>> headers = new java.util.LinkedHashMap<>();
        request.headers().forEach((k, v) -> {
            if (!RESTRICTED.contains(k.toLowerCase(Locale.ROOT))) headers.put(k, v);
        });
        String method = request.method().name();
        byte[] body = request.method() == dev.langchain4j.http.client.HttpMethod.GET
                || request.method() == dev.langchain4j.http.client.HttpMethod.DELETE || request.body() == null
                ? null : request.body().getBytes(StandardCharsets.UTF_8);
        Got response;
        try {
            response = PlainHttp.serves(uri) ? exchangePlain(plain(uri), method, uri, headers, body)
                    : exchange(jdkRequest(uri, method, headers, body));
        } catch (java.nio.channels.ClosedByInterruptException e) {
            // The shell's Ctrl-C while a plain-HTTP reply was awaited.
            Thread.currentThread().interrupt();
            throw new ServiceFailure(ServiceFailure.Kind.FATAL, "cancelled", Optional.empty());
        } catch (HttpTimeoutException e) {
            throw new ServiceFailure(ServiceFailure.Kind.RETRIABLE,
                    "no answer from " + host(request) + " within " + seconds(readTimeout), Optional.empty());
        } catch (IOException e) {
            throw new ServiceFailure(ServiceFailure.Kind.RETRIABLE,
                    "cannot reach " + host(request) + ": " + redact(String.valueOf(e.getMessage())), Optional.empty());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new ServiceFailure(ServiceFailure.Kind.FATAL, "cancelled", Optional.empty());
        }
        int status = response.status();
        if (status / 100 == 2) {
            return SuccessfulHttpResponse.builder().statusCode(status).headers(response.headers().map())
                    .body(response.body()).build();
        }
        throw failure(status, response.body(), response.headers().firstValue("Retry-After"), request);
    }

    private java.net.http.HttpRequest jdkRequest(URI uri, String method, Map<String, List<String>> headers, byte[] body) {
        java.net.http.HttpRequest.Builder b = java.net.http.HttpRequest.newBuilder(uri).timeout(readTimeout);
        headers.forEach((k, vs) -> vs.forEach(v -> b.header(k, v)));
        return b.method(method, body == null ? java.net.http.HttpRequest.BodyPublishers.noBody()
                : java.net.http.HttpRequest.BodyPublishers.ofByteArray(body)).build();
    }

    /** The plain-socket transport for an address's host and port, made on first use. */
    private PlainHttp plain(URI uri) {
        return plain.computeIfAbsent(uri.getHost() + ":" + uri.getPort(), k -> new PlainHttp(uri, connectTimeout));
    }

    /**
     * Writes the request and reads its reply on this thread; when requests are limited it may first wait for a
     * slot, and a thread that has just read a reply may write this request for it.
     */
    private Got exchangePlain(PlainHttp http, String method, URI uri, Map<String, List<String>> headers, byte[] body)
            throws IOException, InterruptedException {
        if (relay.isEmpty()) {
            PlainHttp.Written w = http.write(method, uri, headers, body, readTimeout);
            return Got.of(http.read(w));
        }
        java.util.concurrent.atomic.AtomicReference<Runnable> release = new java.util.concurrent.atomic.AtomicReference<>();
        java.util.concurrent.CompletableFuture<PlainHttp.Written> written = relay.get().submitHolding(done -> {
            release.set(done);
            try {
                return java.util.concurrent.CompletableFuture.completedFuture(http.write(method, uri, headers, body, readTimeout));
            } catch (IOException e) {
                return java.util.concurrent.CompletableFuture.failedFuture(e);
            }
        });
        PlainHttp.Written w;
        try {
            w = written.get();
        } catch (InterruptedException e) {
            // Withdrawn if it was still waiting; written meanwhile: its connection is dropped and the slot freed.
            if (!written.cancel(false)) {
                if (!written.isCompletedExceptionally()) http.abandon(written.join());
                release.get().run();
            }
            throw e;
        } catch (java.util.concurrent.ExecutionException e) {
            if (e.getCause() instanceof IOException io) throw io;
            if (e.getCause() instanceof RuntimeException r) throw r;
            throw new IOException(e.getCause());
        }
        try {
            return Got.of(http.read(w));
        } finally {
            release.get().run();
        }
    }

    /** A reply as read: status, headers, body. */
    private record Got(int status, java.net.http.HttpHeaders headers, String body) {
        static Got of(HttpResponse<String> r) {
            return new Got(r.statusCode(), r.headers(), r.body());
        }

        static Got of(PlainHttp.Reply r) {
            return new Got(r.status(), r.headers(), r.body());
        }
    }

    /** Sends a request and waits for its reply; when requests are limited, it may first wait for a free slot. */
    private Got exchange(java.net.http.HttpRequest request) throws IOException, InterruptedException {
        HttpResponse.BodyHandler<String> text = HttpResponse.BodyHandlers.ofString(StandardCharsets.UTF_8);
        if (relay.isEmpty()) return Got.of(http.get().send(request, text));
        java.util.concurrent.CompletableFuture<Got> got = new java.util.concurrent.CompletableFuture<>();
        java.util.concurrent.CompletableFuture<HttpResponse<String>> sent = relay.get().submit(done ->
                http.get().sendAsync(request, info -> new Signalling(text.apply(info), info, done, got)));
        // Failures that have no body (time-outs, refused connections) come only this way.
        sent.whenComplete((r, failure) -> {
            if (failure != null) got.completeExceptionally(failure);
            else got.complete(Got.of(r));
        });
        try {
            return got.get();
        } catch (InterruptedException e) {
            sent.cancel(false); // withdrawn if it was still waiting for a slot
            throw e;
        } catch (java.util.concurrent.ExecutionException e) {
            // The same failures as a blocking send: a time-out is an IOException too.
            Throwable cause = e.getCause();
            if (cause instanceof java.util.concurrent.CompletionException && cause.getCause() != null) cause = cause.getCause();
            if (cause instanceof IOException io) throw io;
            if (cause instanceof RuntimeException r) throw r;
            throw new IOException(cause);
        }
    }

    /**
     * A reply body that, on the thread that read it (the client's selector), hands the request's slot on and the
     * reply to its asker. The JDK client passes a finished sendAsync reply to its caller through a new thread on a
     * two-core machine (its default async pool): neither the next request nor the asker waits for that thread.
     */
    private record Signalling(HttpResponse.BodySubscriber<String> body, HttpResponse.ResponseInfo info, Runnable done,
                              java.util.concurrent.CompletableFuture<Got> got) implements HttpResponse.BodySubscriber<String> {
        @Override public java.util.concurrent.CompletionStage<String> getBody() { return body.getBody(); }
        @Override public void onSubscribe(java.util.concurrent.Flow.Subscription s) { body.onSubscribe(s); }
        @Override public void onNext(List<java.nio.ByteBuffer> item) { body.onNext(item); }
        @Override public void onError(Throwable e) {
            done.run();
            body.onError(e);
        }
        @Override public void onComplete() {
            done.run();
            body.onComplete();
            String text = body.getBody().toCompletableFuture().getNow(null);
            if (text != null) got.complete(new Got(info.statusCode(), info.headers(), text));
        }
    }

    private ServiceFailure failure(int status, String body, Optional<String> retryAfter, HttpRequest request) {
        String text = excerpt(body);
        String lower = text.toLowerCase(Locale.ROOT);
        if (status == 401 || status == 403) {
            // The body may quote part of the key: say nothing of it.
            return new ServiceFailure(ServiceFailure.Kind.AUTHENTICATION, host(request)
                    + " refused the API key (HTTP " + status + "); check TERMGATE_API_KEY or the config file", Optional.empty());
        }
        boolean modelUnknown = status == 404 || (status == 400 && lower.contains("model")
                && (lower.contains("not found") || lower.contains("does not exist") || lower.contains("unknown")));
        if (modelUnknown) {
            return new ServiceFailure(ServiceFailure.Kind.MODEL_NOT_FOUND, host(request) + " does not know the model '"
                    + modelName + "' (HTTP " + status + (text.isEmpty() ? "" : ": " + text) + ")", Optional.empty());
        }
        if (status == 429 || status == 408 || status / 100 == 5) {
            return new ServiceFailure(ServiceFailure.Kind.RETRIABLE, host(request) + " answered HTTP " + status
                    + (text.isEmpty() ? "" : ": " + text), retryAfter.flatMap(ModelHttpClient::parseRetryAfter));
        }
        return new ServiceFailure(ServiceFailure.Kind.FATAL, host(request) + " answered HTTP " + status
                + (text.isEmpty() ? "" : ": " + text), Optional.empty());
    }

    /** Retry-After is either a number of seconds or an HTTP date (RFC 9110, section 10.2.3). */
    static Optional<Duration> parseRetryAfter(String value) {
        String v = value.strip();
        try {
            long s = Long.parseLong(v);
            return s >= 0 ? Optional.of(Duration.ofSeconds(s)) : Optional.empty();
        } catch (NumberFormatException notSeconds) {
            try {
                ZonedDateTime at = ZonedDateTime.parse(v, DateTimeFormatter.RFC_1123_DATE_TIME);
                Duration d = Duration.between(ZonedDateTime.now(at.getZone()), at);
                return Optional.of(d.isNegative() ? Duration.ZERO : d);
            } catch (java.time.format.DateTimeParseException notDate) {
                return Optional.empty();
            }
        }
    }

    /** A short, single-line, key-free excerpt of an error body; the error message field when it is JSON. */
    private String excerpt(String body) {
        if (body == null) return "";
        String t = body;
        try {
            var json = com.google.gson.JsonParser.parseString(body);
            if (json.isJsonObject() && json.getAsJsonObject().has("error")) {
                var err = json.getAsJsonObject().get("error");
                t = err.isJsonObject() && err.getAsJsonObject().has("message")
                        ? err.getAsJsonObject().get("message").getAsString() : err.isJsonPrimitive() ? err.getAsString() : t;
            }
        } catch (RuntimeException notJson) {
            // keep the raw text
        }
        t = redact(t.replaceAll("\\s+", " ").strip());
        return t.length() > MAX_ERROR_TEXT ? t.substring(0, MAX_ERROR_TEXT) + "…" : t;
    }

    private String redact(String text) {
        return key.map(k -> k.redact(text)).orElseGet(() -> new Secret("").redact(text));
    }

    private static String host(HttpRequest request) {
        try {
            URI u = URI.create(request.url());
            return u.getScheme() + "://" + u.getAuthority();
        } catch (IllegalArgumentException e) {
            return "the model service";
        }
    }

    static String seconds(Duration d) {
        return d.toMillis() % 1000 == 0 ? d.toSeconds() + " s" : String.format(Locale.ROOT, "%.1f s", d.toMillis() / 1000.0);
    }

    @Override
    public void execute(HttpRequest request, ServerSentEventParser parser, ServerSentEventListener listener) {
        throw new UnsupportedOperationException("termgate does not stream replies");
    }
}

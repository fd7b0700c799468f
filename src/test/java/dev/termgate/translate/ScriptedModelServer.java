package dev.termgate.translate;

import com.google.gson.JsonArray;
import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import com.sun.net.httpserver.HttpExchange;
import com.sun.net.httpserver.HttpServer;

import java.io.IOException;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.Executors;
import java.util.concurrent.TimeUnit;
import java.util.function.Function;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * A model server for tests, on 127.0.0.1: speaks the OpenAI-compatible chat completions protocol
 * ({@code POST /v1/chat/completions}) or the Ollama chat protocol ({@code POST /api/chat}, not streamed) and
 * answers from a script. Message shapes follow the public protocol descriptions (from memory: OpenAI's
 * "choices[0].message.content" and "usage"; Ollama's "message.content", "prompt_eval_count", "eval_count").
 */
public final class ScriptedModelServer implements AutoCloseable {

    public enum Protocol { OPENAI, OLLAMA }

    /** One request as the server saw it. */
    public record Seen(String path, JsonObject body, Map<String, List<String>> headers) {
        /** Every message's text, joined. */
        public String allText() {
            StringBuilder sb = new StringBuilder();
            for (var m : body.getAsJsonArray("messages")) {
                var c = m.getAsJsonObject().get("content");
                sb.append(c == null || c.isJsonNull() ? "" : c.isJsonPrimitive() ? c.getAsString() : c.toString()).append('\n');
            }
            return sb.toString();
        }

        public int messageCount() {
            return body.getAsJsonArray("messages").size();
        }

        public String lastUserText() {
            JsonArray ms = body.getAsJsonArray("messages");
            for (int i = ms.size() - 1; i >= 0; i--) {
                var m = ms.get(i).getAsJsonObject();
                if (m.get("role").getAsString().equals("user")) return m.get("content").getAsString();
            }
            return "";
        }

        private static final Pattern QUESTION = Pattern.compile("(?m)^Question: (.*)$");

        /** The question of the request (the first user message's "Question:" line, as the built-in template writes it). */
        public String question() {
            JsonArray ms = body.getAsJsonArray("messages");
            for (var e : ms) {
                var m = e.getAsJsonObject();
                if (m.get("role").getAsString().equals("user")) {
                    Matcher x = QUESTION.matcher(m.get("content").getAsString());
                    if (x.find()) return x.group(1).strip();
                }
            }
            return "";
        }

        /** 1 for a first ask, 2 for the first re-ask, … */
        public int attempt() {
            return (messageCount() - 2) / 2 + 1;
        }
    }

    /**
     * When one exchange happened, as the server saw it: the request read whole, the reply written. Connections are
     * told apart by the client's port, so that a benchmark can split a round trip into the client's and the
     * server's share.
     */
    /**
     * One answered request: read whole at {@code requestNanos}; its reply about to be written at
     * {@code answeringNanos} (before the client can have it) and written at {@code repliedNanos}.
     */
    public record Exchange(int clientPort, long requestNanos, long answeringNanos, long repliedNanos) {}

    /** What the server does with one request. */
    public sealed interface Action {
        record Answer(String text, int promptTokens, int completionTokens) implements Action {}
        record Status(int code, String body, Map<String, String> headers) implements Action {}
        /** Answers {@code then} no sooner than {@code millis} after the request was read (delays add up). */
        record Delay(long millis, Action then) implements Action {}
    }

    public static Action answer(String text) {
        return new Action.Answer(text, 100, 20);
    }

    public static Action status(int code, String body, Map<String, String> headers) {
        return new Action.Status(code, body, headers);
    }

    public static Action delay(long millis, Action then) {
        return new Action.Delay(millis, then);
    }

    static {
        // Real model servers answer with TCP_NODELAY set; the JDK's server does not by default, and Nagle's delay
        // against the client's delayed acknowledgement then adds about 40 ms to every exchange (read at class
        // initialisation of the JDK server's configuration, so set before the first server is made).
        System.setProperty("sun.net.httpserver.nodelay", "true");
    }

    private final HttpServer server;
    private final Protocol protocol;
    private final List<Seen> seen = new CopyOnWriteArrayList<>();
    private final List<Exchange> exchanges = new CopyOnWriteArrayList<>();
    private volatile Function<Seen, Action> script;

    public ScriptedModelServer(Protocol protocol, Function<Seen, Action> script) throws IOException {
        this.protocol = protocol;
        this.script = script;
        server = HttpServer.create(new InetSocketAddress("127.0.0.1", 0), 64);
        server.setExecutor(Executors.newFixedThreadPool(32, r -> {
            Thread t = new Thread(r, "scripted-model");
            t.setDaemon(true);
            return t;
        }));
        server.createContext(protocol == Protocol.OPENAI ? "/v1/chat/completions" : "/api/chat", this::handle);
        server.start();
    }

    public void script(Function<Seen, Action> s) {
        this.script = s;
    }

    /** The base URL to give {@code --base-url}. */
    public String baseUrl() {
        String root = "http://127.0.0.1:" + server.getAddress().getPort();
        return protocol == Protocol.OPENAI ? root + "/v1" : root;
    }

    public String modelOption(String model) {
        return (protocol == Protocol.OPENAI ? "openai:" : "ollama:") + model;
    }

    public List<Seen> seen() {
        return new ArrayList<>(seen);
    }

    /** Every exchange answered so far, in the order the replies were written. */
    public List<Exchange> exchanges() {
        return new ArrayList<>(exchanges);
    }

    /**
     * The most requests a client had out at one moment, as the server can tell: from a request read whole to its
     * reply about to be written (a client has its reply only after that, so no two of its own count as one).
     */
    public static int mostAtOnce(List<Exchange> exchanges) {
        List<long[]> edges = new ArrayList<>();
        for (Exchange e : exchanges) {
            edges.add(new long[] {e.requestNanos(), 1});
            edges.add(new long[] {e.answeringNanos(), -1});
        }
        // At equal times a reply counts before a request.
        edges.sort((a, b) -> a[0] != b[0] ? Long.compare(a[0], b[0]) : Long.compare(a[1], b[1]));
        int now = 0;
        int most = 0;
        for (long[] e : edges) {
            now += (int) e[1];
            most = Math.max(most, now);
        }
        return most;
    }

    public void forgetExchanges() {
        exchanges.clear();
    }

    private void handle(HttpExchange x) throws IOException {
        try (x) {
            String body = new String(x.getRequestBody().readAllBytes(), StandardCharsets.UTF_8);
            long requestNanos = System.nanoTime();
            Seen s = new Seen(x.getRequestURI().getPath(), JsonParser.parseString(body).getAsJsonObject(), x.getRequestHeaders());
            seen.add(s);
            Action a = script.apply(s);
            // A delay counts from the request's arrival, as a service with a fixed latency answers: the time this
            // server takes to parse the body and run the script is part of it, not added to it.
            long due = requestNanos;
            while (a instanceof Action.Delay d) {
                due += TimeUnit.MILLISECONDS.toNanos(d.millis());
                try {
                    for (long left = due - System.nanoTime(); left > 0; left = due - System.nanoTime()) {
                        TimeUnit.NANOSECONDS.sleep(left);
                    }
                } catch (InterruptedException e) {
                    return;
                }
                a = d.then();
            }
            long answeringNanos = System.nanoTime();
            if (a instanceof Action.Status st) {
                st.headers().forEach((k, v) -> x.getResponseHeaders().add(k, v));
                send(x, st.code(), st.body());
            } else if (a instanceof Action.Answer an) {
                x.getResponseHeaders().add("Content-Type", "application/json");
                send(x, 200, protocol == Protocol.OPENAI ? openAi(s, an) : ollama(s, an));
            }
            exchanges.add(new Exchange(x.getRemoteAddress().getPort(), requestNanos, answeringNanos, System.nanoTime()));
        } catch (IOException e) {
            // the client went away (a time-out test): nothing to answer
        }
    }

    private static void send(HttpExchange x, int code, String body) throws IOException {
        byte[] b = body.getBytes(StandardCharsets.UTF_8);
        x.sendResponseHeaders(code, b.length == 0 ? -1 : b.length);
        if (b.length > 0) {
            try (OutputStream o = x.getResponseBody()) {
                o.write(b);
            }
        }
    }

    private static String openAi(Seen s, Action.Answer a) {
        JsonObject msg = new JsonObject();
        msg.addProperty("role", "assistant");
        msg.addProperty("content", a.text());
        JsonObject choice = new JsonObject();
        choice.addProperty("index", 0);
        choice.add("message", msg);
        choice.addProperty("finish_reason", "stop");
        JsonArray choices = new JsonArray();
        choices.add(choice);
        JsonObject usage = new JsonObject();
        usage.addProperty("prompt_tokens", a.promptTokens());
        usage.addProperty("completion_tokens", a.completionTokens());
        usage.addProperty("total_tokens", a.promptTokens() + a.completionTokens());
        JsonObject o = new JsonObject();
        o.addProperty("id", "chatcmpl-test");
        o.addProperty("object", "chat.completion");
        o.addProperty("created", 0);
        o.addProperty("model", s.body().get("model").getAsString());
        o.add("choices", choices);
        o.add("usage", usage);
        return o.toString();
    }

    private static String ollama(Seen s, Action.Answer a) {
        JsonObject msg = new JsonObject();
        msg.addProperty("role", "assistant");
        msg.addProperty("content", a.text());
        JsonObject o = new JsonObject();
        o.addProperty("model", s.body().get("model").getAsString());
        o.addProperty("created_at", "2026-01-01T00:00:00Z");
        o.add("message", msg);
        o.addProperty("done", true);
        o.addProperty("done_reason", "stop");
        o.addProperty("prompt_eval_count", a.promptTokens());
        o.addProperty("eval_count", a.completionTokens());
        return o.toString();
    }

    @Override
    public void close() {
        server.stop(0);
        ((java.util.concurrent.ExecutorService) server.getExecutor()).shutdownNow();
    }
}

package dev.termgate.translate;

import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.Proxy;
import java.net.ProxySelector;
import java.net.ServerSocket;
import java.net.Socket;
import java.net.SocketAddress;
import java.net.URI;
import java.net.http.HttpTimeoutException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.Function;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The plain-socket HTTP/1.1 transport against a raw server that writes scripted bytes. Message framing follows
 * RFC 9112 (HTTP/1.1): section 6.3 (a body's length: chunked, Content-Length, or until the connection closes),
 * section 7.1 (chunked coding, with extensions and trailers), section 9.3 (persistent connections; HTTP/1.0 closes
 * unless told otherwise); RFC 9110 section 15.2 (1xx replies come before the final one).
 */
class PlainHttpTest {

    private static final Duration SHORT = Duration.ofSeconds(5);
    /** A script's answer that resets the connection instead of replying. */
    private static final String RESET = "reset";

    /** A server on 127.0.0.1 that reads whole requests and answers each with what the script gives. */
    private static final class RawServer implements AutoCloseable {
        /** The reply's bytes for the n-th request on a connection (0-based); null closes the connection unanswered. */
        final Function<Integer, String> script;
        final ServerSocket socket;
        final AtomicInteger connections = new AtomicInteger();
        final List<String> requests = new CopyOnWriteArrayList<>();
        final Thread acceptor;

        RawServer(Function<Integer, String> script) throws IOException {
            this.script = script;
            socket = new ServerSocket(0, 50, InetAddress.getLoopbackAddress());
            acceptor = new Thread(this::accept, "raw-server");
            acceptor.setDaemon(true);
            acceptor.start();
        }

        URI uri() {
            return URI.create("http://127.0.0.1:" + socket.getLocalPort() + "/v1/chat/completions");
        }

        private void accept() {
            while (!socket.isClosed()) {
                try {
                    Socket s = socket.accept();
                    connections.incrementAndGet();
                    Thread t = new Thread(() -> serve(s), "raw-connection");
                    t.setDaemon(true);
                    t.start();
                } catch (IOException closed) {
                    return;
                }
            }
        }

        private void serve(Socket s) {
            try (s) {
                InputStream in = s.getInputStream();
                OutputStream out = s.getOutputStream();
                for (int n = 0; ; n++) {
                    String request = readRequest(in);
                    if (request == null) return;
                    requests.add(request);
                    String reply = script.apply(n);
                    if (reply == null) return;
                    if (reply.equals(RESET)) {
                        s.setSoLinger(true, 0); // closing now sends a reset
                        return;
                    }
                    out.write(reply.getBytes(StandardCharsets.UTF_8));
                    out.flush();
                    if (reply.contains("\r\nConnection: close\r\n") || reply.startsWith("HTTP/1.0")) return;
                }
            } catch (IOException gone) {
                // the client went away
            }
        }

        /** Head and body (by Content-Length) of one request, or null at the end of the stream. */
        private static String readRequest(InputStream in) throws IOException {
            ByteArrayOutputStream head = new ByteArrayOutputStream();
            while (!head.toString(StandardCharsets.ISO_8859_1).endsWith("\r\n\r\n")) {
                int c = in.read();
                if (c < 0) return null;
                head.write(c);
            }
            String h = head.toString(StandardCharsets.ISO_8859_1);
            int length = 0;
            for (String line : h.split("\r\n")) {
                if (line.toLowerCase(Locale.ROOT).startsWith("content-length:")) length = Integer.parseInt(line.substring(15).strip());
            }
            return h + new String(in.readNBytes(length), StandardCharsets.UTF_8);
        }

        @Override
        public void close() throws IOException {
            socket.close();
        }
    }

    private final List<AutoCloseable> open = new ArrayList<>();

    private RawServer server(Function<Integer, String> script) throws IOException {
        RawServer s = new RawServer(script);
        open.add(s);
        return s;
    }

    @AfterEach
    void closeServers() throws Exception {
        for (AutoCloseable c : open) c.close();
    }

    /** A script that keeps every request unanswered for a while, then closes the connection. */
    private static Function<Integer, String> silentFor(long millis) {
        return n -> {
            try {
                Thread.sleep(millis);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            return null;
        };
    }

    private static String ok(String body) {
        return "HTTP/1.1 200 OK\r\nContent-Type: application/json\r\nContent-Length: "
                + body.getBytes(StandardCharsets.UTF_8).length + "\r\n\r\n" + body;
    }

    private static PlainHttp.Reply post(PlainHttp http, URI uri, String body, Duration timeout) throws IOException {
        byte[] bytes = body.getBytes(StandardCharsets.UTF_8);
        Map<String, List<String>> headers = Map.of("Content-Type", List.of("application/json"));
        return http.read(http.write("POST", uri, headers, bytes, timeout));
    }

    @Test
    void aKeptAliveConnectionCarriesTheNextRequest() throws Exception {
        RawServer s = server(n -> ok("{\"n\":" + n + ",\"text\":\"Überseehafen\"}"));
        PlainHttp http = new PlainHttp(s.uri(), SHORT);
        assertEquals("{\"n\":0,\"text\":\"Überseehafen\"}", post(http, s.uri(), "{\"q\":\"café\"}", SHORT).body());
        PlainHttp.Reply second = post(http, s.uri(), "{}", SHORT);
        assertEquals(200, second.status());
        assertEquals("{\"n\":1,\"text\":\"Überseehafen\"}", second.body());
        assertEquals(1, s.connections.get(), "one connection for both");
        String first = s.requests.get(0);
        assertTrue(first.startsWith("POST /v1/chat/completions HTTP/1.1\r\n"), first);
        assertTrue(first.contains("\r\nHost: 127.0.0.1:" + s.socket.getLocalPort() + "\r\n"), first);
        assertTrue(first.contains("\r\nContent-Length: " + "{\"q\":\"café\"}".getBytes(StandardCharsets.UTF_8).length + "\r\n"), first);
        assertTrue(first.endsWith("\r\n\r\n{\"q\":\"café\"}"), first);
    }

    @Test
    void aChunkedBodyIsJoinedWithoutItsExtensionsAndTrailers() throws Exception {
        RawServer s = server(n -> "HTTP/1.1 200 OK\r\nTransfer-Encoding: chunked\r\n\r\n"
                + "5;note=x\r\n{\"a\":\r\n" + "3\r\n12}\r\n" + "0\r\nX-Trailer: t\r\n\r\n");
        PlainHttp http = new PlainHttp(s.uri(), SHORT);
        assertEquals("{\"a\":12}", post(http, s.uri(), "{}", SHORT).body());
        assertEquals("{\"a\":12}", post(http, s.uri(), "{}", SHORT).body());
        assertEquals(1, s.connections.get(), "the connection is still usable after a chunked body");
    }

    @Test
    void aBodyWithoutALengthEndsWithTheConnection() throws Exception {
        RawServer s = server(n -> "HTTP/1.0 200 OK\r\nContent-Type: application/json\r\n\r\n{\"closed\":true}");
        PlainHttp http = new PlainHttp(s.uri(), SHORT);
        assertEquals("{\"closed\":true}", post(http, s.uri(), "{}", SHORT).body());
        assertEquals("{\"closed\":true}", post(http, s.uri(), "{}", SHORT).body());
        assertEquals(2, s.connections.get(), "a connection that ended the body is not used again");
    }

    @Test
    void informationalRepliesComeBeforeTheFinalOne() throws Exception {
        RawServer s = server(n -> "HTTP/1.1 100 Continue\r\n\r\n" + ok("{}"));
        assertEquals(200, post(new PlainHttp(s.uri(), SHORT), s.uri(), "{}", SHORT).status());
    }

    @Test
    void headersAreReadWhateverTheirCaseAndFailuresKeepTheirStatus() throws Exception {
        RawServer s = server(n -> "HTTP/1.1 429 Too Many Requests\r\nretry-after: 7\r\nX-Many: a\r\nx-many: b\r\n"
                + "Content-Length: 2\r\n\r\n{}");
        PlainHttp.Reply r = post(new PlainHttp(s.uri(), SHORT), s.uri(), "{}", SHORT);
        assertEquals(429, r.status());
        assertEquals("7", r.headers().firstValue("Retry-After").orElseThrow());
        assertEquals(List.of("a", "b"), r.headers().allValues("X-Many"));
    }

    @Test
    void aKeptAliveConnectionTheServerClosedIsReplacedOnce() throws Exception {
        // The server answers one request per connection but does not say so: the second request finds the
        // kept connection closed and goes out again on a new one.
        assertSecondRequestGoesOnANewConnection(null);
    }

    @Test
    void aKeptAliveConnectionTheServerResetIsReplacedOnce() throws Exception {
        assertSecondRequestGoesOnANewConnection(RESET);
    }

    /** The server answers the first request of a connection, then does {@code second} (close or reset). */
    private void assertSecondRequestGoesOnANewConnection(String second) throws Exception {
        RawServer s = server(n -> n == 0 ? ok("{\"ok\":true}") : second);
        PlainHttp http = new PlainHttp(s.uri(), SHORT);
        assertEquals("{\"ok\":true}", post(http, s.uri(), "{}", SHORT).body());
        assertEquals("{\"ok\":true}", post(http, s.uri(), "{}", SHORT).body());
        assertEquals(2, s.connections.get());
    }

    @Test
    void theReplacementConnectionHasTheSameTimeout() throws Exception {
        // Requests in the order the server reads them: answered, then the kept connection closed, then the
        // request sent again on a new connection left unanswered.
        AtomicInteger seen = new AtomicInteger();
        Function<Integer, String> silent = silentFor(10_000);
        RawServer s = server(n -> switch (seen.getAndIncrement()) {
            case 0 -> ok("{}");
            case 1 -> null;
            default -> silent.apply(n);
        });
        PlainHttp http = new PlainHttp(s.uri(), SHORT);
        post(http, s.uri(), "{}", SHORT);
        assertThrows(HttpTimeoutException.class, () -> post(http, s.uri(), "{}", Duration.ofMillis(300)));
        assertEquals(2, s.connections.get());
    }

    @Test
    void aNewConnectionClosedWithoutAReplyIsAFailure() throws Exception {
        RawServer s = server(n -> null);
        IOException e = assertThrows(IOException.class, () -> post(new PlainHttp(s.uri(), SHORT), s.uri(), "{}", SHORT));
        assertTrue(e.getMessage().contains("closed before a reply"), e.getMessage());
    }

    @Test
    void somethingThatIsNotHttpIsAFailure() throws Exception {
        RawServer s = server(n -> "SSH-2.0-something\r\n");
        IOException e = assertThrows(IOException.class, () -> post(new PlainHttp(s.uri(), SHORT), s.uri(), "{}", SHORT));
        assertTrue(e.getMessage().startsWith("not an HTTP reply"), e.getMessage());
    }

    @Test
    void aBodyShorterThanItsLengthIsAFailure() throws Exception {
        RawServer s = server(n -> "HTTP/1.1 200 OK\r\nContent-Length: 100\r\nConnection: close\r\n\r\n{}");
        assertThrows(IOException.class, () -> post(new PlainHttp(s.uri(), SHORT), s.uri(), "{}", SHORT));
    }

    @Test
    void noReplyWithinTheTimeoutIsATimeout() throws Exception {
        RawServer s = server(silentFor(10_000));
        assertThrows(HttpTimeoutException.class, () -> post(new PlainHttp(s.uri(), SHORT), s.uri(), "{}", Duration.ofMillis(300)));
    }

    @Test
    void anInterruptStopsAThreadWaitingForAReply() throws Exception {
        RawServer s = server(silentFor(60_000));
        AtomicReference<Throwable> failure = new AtomicReference<>();
        Thread asker = new Thread(() -> {
            try {
                post(new PlainHttp(s.uri(), SHORT), s.uri(), "{}", Duration.ofSeconds(60));
            } catch (Throwable t) {
                failure.set(t);
            }
        });
        asker.start();
        while (s.requests.isEmpty()) Thread.sleep(10);
        asker.interrupt();
        // The read timeout is a minute: a read that ignored the interrupt would still be waiting.
        asker.join(10_000);
        assertFalse(asker.isAlive(), "the interrupted read still waits");
        assertTrue(failure.get() instanceof java.nio.channels.ClosedByInterruptException, String.valueOf(failure.get()));
    }

    @Test
    void onlyPlainHttpWithoutAProxyTakesThisWay() {
        ProxySelector direct = fixed(Proxy.NO_PROXY);
        ProxySelector proxied = fixed(new Proxy(Proxy.Type.HTTP, InetSocketAddress.createUnresolved("proxy.example", 3128)));
        assertTrue(PlainHttp.serves(URI.create("http://127.0.0.1:11434/api/chat"), direct));
        assertTrue(PlainHttp.serves(URI.create("http://127.0.0.1:11434/api/chat"), null));
        assertFalse(PlainHttp.serves(URI.create("https://models.example/v1/chat/completions"), direct));
        assertFalse(PlainHttp.serves(URI.create("http://models.example/v1/chat/completions"), proxied));
    }

    private static ProxySelector fixed(Proxy proxy) {
        return new ProxySelector() {
            @Override public List<Proxy> select(URI uri) { return List.of(proxy); }
            @Override public void connectFailed(URI uri, SocketAddress sa, IOException ioe) {}
        };
    }
}

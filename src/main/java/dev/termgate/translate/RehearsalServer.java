package dev.termgate.translate;

import java.io.BufferedInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.Locale;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;

/**
 * A stand-in model service on this machine's loopback address, for {@link ModelTranslator#rehearse}: it answers
 * every HTTP/1.1 request with one fixed, minimal reply of the provider's chat protocol, so that the rehearsal
 * runs the very client the questions use (the JDK's HTTP client, {@link ModelHttpClient}, the protocol's JSON)
 * without any request leaving the process. It listens on 127.0.0.1 only, on a port the system picks, until
 * closed.
 */
final class RehearsalServer implements AutoCloseable {

    /** Requests larger than this are not a rehearsal's: the connection is dropped. */
    private static final int MAX_REQUEST = 1 << 20;

    private final ServerSocket socket;
    private final byte[] reply;
    private final Set<Socket> open = ConcurrentHashMap.newKeySet();

    RehearsalServer(ModelSpec.Provider provider) throws IOException {
        byte[] body = body(provider).getBytes(StandardCharsets.UTF_8);
        this.reply = concat(("HTTP/1.1 200 OK\r\nContent-Type: application/json\r\nContent-Length: " + body.length
                + "\r\n\r\n").getBytes(StandardCharsets.US_ASCII), body);
        this.socket = new ServerSocket(0, 4, InetAddress.getLoopbackAddress());
        Thread acceptor = new Thread(this::accept, "termgate-rehearsal-server");
        acceptor.setDaemon(true);
        acceptor.start();
    }

    /** The base URL a chat model of the provider is given to reach this server. */
    String baseUrl(ModelSpec.Provider provider) {
        String root = "http://127.0.0.1:" + socket.getLocalPort();
        return provider == ModelSpec.Provider.OPENAI ? root + "/v1" : root;
    }

    /** The minimal replies of the two chat protocols (OpenAI chat completions; Ollama /api/chat, not streamed). */
    static String body(ModelSpec.Provider provider) {
        return switch (provider) {
            case OPENAI -> "{\"id\":\"rehearsal\",\"object\":\"chat.completion\",\"created\":0,\"model\":\"m\",\"choices\":"
                    + "[{\"index\":0,\"message\":{\"role\":\"assistant\",\"content\":\"MATCH (n) RETURN n\"},"
                    + "\"finish_reason\":\"stop\"}],\"usage\":{\"prompt_tokens\":1,\"completion_tokens\":1,\"total_tokens\":2}}";
            case OLLAMA -> "{\"model\":\"m\",\"created_at\":\"2026-01-01T00:00:00Z\",\"message\":{\"role\":\"assistant\","
                    + "\"content\":\"MATCH (n) RETURN n\"},\"done\":true,\"prompt_eval_count\":1,\"eval_count\":1}";
            case OFFLINE -> throw new IllegalArgumentException("the offline interpreter has no protocol");
        };
    }

    private void accept() {
        while (!socket.isClosed()) {
            try {
                Socket s = socket.accept();
                open.add(s);
                Thread t = new Thread(() -> serve(s), "termgate-rehearsal-connection");
                t.setDaemon(true);
                t.start();
            } catch (IOException e) {
                return; // closed
            }
        }
    }

    /** Answers the requests of one kept-alive connection until the client closes it. */
    private void serve(Socket s) {
        try (s) {
            s.setTcpNoDelay(true);
            InputStream in = new BufferedInputStream(s.getInputStream());
            OutputStream out = s.getOutputStream();
            while (true) {
                long length = readHead(in);
                if (length < 0 || length > MAX_REQUEST) return;
                in.skipNBytes(length);
                out.write(reply);
                out.flush();
            }
        } catch (IOException e) {
            // the client went away
        } finally {
            open.remove(s);
        }
    }

    /** Reads one request's head; its Content-Length, 0 when it has none, or -1 at the end of the stream. */
    private static long readHead(InputStream in) throws IOException {
        StringBuilder line = new StringBuilder();
        long length = 0;
        int read = 0;
        for (int c; (c = in.read()) >= 0; ) {
            if (++read > MAX_REQUEST) return -1;
            if (c == '\n') {
                String l = line.toString().strip();
                if (l.isEmpty()) return length;
                int colon = l.indexOf(':');
                if (colon > 0 && l.substring(0, colon).strip().toLowerCase(Locale.ROOT).equals("content-length")) {
                    try {
                        length = Long.parseLong(l.substring(colon + 1).strip());
                    } catch (NumberFormatException e) {
                        return -1;
                    }
                }
                line.setLength(0);
            } else {
                line.append((char) c);
            }
        }
        return -1;
    }

    private static byte[] concat(byte[] a, byte[] b) {
        byte[] out = java.util.Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, out, a.length, b.length);
        return out;
    }

    @Override
    public void close() {
        try {
            socket.close();
        } catch (IOException ignored) {
            // nothing to release
        }
        for (Socket s : open) {
            try {
                s.close();
            } catch (IOException ignored) {
                // already gone
            }
        }
    }
}

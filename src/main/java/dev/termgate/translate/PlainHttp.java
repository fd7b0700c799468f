package dev.termgate.translate;

import java.io.BufferedInputStream;
import java.io.ByteArrayOutputStream;
import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.net.Socket;
import java.net.SocketTimeoutException;
import java.net.URI;
import java.net.http.HttpHeaders;
import java.net.http.HttpTimeoutException;
import java.nio.channels.SocketChannel;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ConcurrentLinkedDeque;

/**
 * HTTP/1.1 over plain sockets for a model service at an {@code http://} address (a model server on this machine
 * or the local network), with kept-alive connections: the thread that asks writes the request and reads its reply
 * itself. The JDK client passes every request and reply through its selector thread; on a small, busy machine
 * each such hand-off waited for a core (BatchThroughputBench: a client doing nothing else spent 3-4 ms per round
 * trip that way, and 40 ms on its first, against under 1 ms and 2 ms on plain sockets).
 * {@code https://} addresses and proxies stay with the JDK client.
 */
final class PlainHttp {

    /** A reply as read. */
    record Reply(int status, HttpHeaders headers, String body) {}

    /** A request written on a connection, whose reply is still to be read; kept whole, to write again once. */
    static final class Written {
        private final Connection connection;
        private final boolean reused;
        private final byte[] request;
        private final Duration readTimeout;

        private Written(Connection connection, boolean reused, byte[] request, Duration readTimeout) {
            this.connection = connection;
            this.reused = reused;
            this.request = request;
            this.readTimeout = readTimeout;
        }
    }

    private static final int MAX_HEADER_LINE = 64 * 1024;

    private final URI target;
    private final String host;
    private final int port;
    private final Duration connectTimeout;
    private final ConcurrentLinkedDeque<Connection> idle = new ConcurrentLinkedDeque<>();

    PlainHttp(URI target, Duration connectTimeout) {
        this.target = target;
        this.host = target.getHost();
        this.port = target.getPort() < 0 ? 80 : target.getPort();
        this.connectTimeout = connectTimeout;
    }

    /** Whether this transport serves the address: plain HTTP to a host reached without a proxy. */
    static boolean serves(URI uri) {
        return serves(uri, java.net.ProxySelector.getDefault());
    }

    static boolean serves(URI uri, java.net.ProxySelector proxies) {
        if (!"http".equalsIgnoreCase(uri.getScheme()) || uri.getHost() == null) return false;
        List<java.net.Proxy> chosen = proxies == null ? List.of() : proxies.select(uri);
        return chosen.stream().allMatch(p -> p.type() == java.net.Proxy.Type.DIRECT);
    }

    /** Writes the request on an idle kept-alive connection, or a new one. */
    Written write(String method, URI uri, Map<String, List<String>> headers, byte[] body, Duration readTimeout)
            throws IOException {
        byte[] request = encode(method, uri, headers, body);
        Connection c = idle.pollFirst();
        if (c != null) {
            try {
                c.send(request, readTimeout);
                return new Written(c, true, request, readTimeout);
            } catch (IOException stale) {
                c.close();
            }
        }
        return new Written(sendOnNew(request, readTimeout), false, request, readTimeout);
    }

    /**
     * Reads the reply of a written request. A kept-alive connection the server had already closed gives no
     * byte at all: the request is written once more on a new connection (nothing of it can have been answered),
     * whose reply is read like the first, time-out included.
     */
    Reply read(Written w) throws IOException {
        try {
            return replyOn(w.connection);
        } catch (EOFException closedBeforeReply) {
            if (!w.reused) throw closedBeforeReply();
        }
        try {
            return replyOn(sendOnNew(w.request, w.readTimeout));
        } catch (EOFException again) {
            throw closedBeforeReply();
        }
    }

    private static IOException closedBeforeReply() {
        return new IOException("the connection was closed before a reply");
    }

    /** The reply on a connection; the connection is closed when anything goes wrong. */
    private Reply replyOn(Connection c) throws IOException {
        try {
            return finish(c, c.reply());
        } catch (SocketTimeoutException e) {
            c.close();
            throw new HttpTimeoutException("request timed out");
        } catch (IOException | RuntimeException e) {
            c.close();
            throw e;
        }
    }

    /** A new connection with the request written on it; closed again if the writing fails. */
    private Connection sendOnNew(byte[] request, Duration readTimeout) throws IOException {
        Connection c = open();
        try {
            c.send(request, readTimeout);
            return c;
        } catch (IOException | RuntimeException e) {
            c.close();
            throw e;
        }
    }

    private Reply finish(Connection c, Connection.Raw raw) {
        if (raw.keepAlive()) idle.addFirst(c);
        else c.close();
        return new Reply(raw.status(), HttpHeaders.of(raw.headers(), (k, v) -> true),
                new String(raw.body(), StandardCharsets.UTF_8));
    }

    /** Drops the connection of a request whose reply will not be read. */
    void abandon(Written w) {
        w.connection.close();
    }

    /**
     * A socket of a channel, not a plain socket: a thread blocked reading a channel's socket stops when it is
     * interrupted (the shell's Ctrl-C), where a plain socket's read waits for the reply or the time-out.
     */
    private Connection open() throws IOException {
        SocketChannel channel = SocketChannel.open();
        try {
            Socket s = channel.socket();
            s.connect(new InetSocketAddress(host, port), (int) Math.min(Integer.MAX_VALUE, connectTimeout.toMillis()));
            s.setTcpNoDelay(true);
            return new Connection(s);
        } catch (IOException e) {
            channel.close();
            throw e;
        }
    }

    private byte[] encode(String method, URI uri, Map<String, List<String>> headers, byte[] body) {
        StringBuilder h = new StringBuilder(256);
        String path = uri.getRawPath() == null || uri.getRawPath().isEmpty() ? "/" : uri.getRawPath();
        if (uri.getRawQuery() != null) path += "?" + uri.getRawQuery();
        h.append(method).append(' ').append(path).append(" HTTP/1.1\r\n");
        h.append("Host: ").append(host).append(target.getPort() < 0 ? "" : ":" + port).append("\r\n");
        headers.forEach((k, vs) -> vs.forEach(v -> h.append(k).append(": ").append(v).append("\r\n")));
        if (body != null) h.append("Content-Length: ").append(body.length).append("\r\n");
        h.append("\r\n");
        byte[] head = h.toString().getBytes(StandardCharsets.UTF_8);
        if (body == null) return head;
        byte[] all = new byte[head.length + body.length];
        System.arraycopy(head, 0, all, 0, head.length);
        System.arraycopy(body, 0, all, head.length, body.length);
        return all;
    }

    /** One socket and its buffered input. */
    private static final class Connection {
        record Raw(int status, Map<String, List<String>> headers, byte[] body, boolean keepAlive) {}

        private final Socket socket;
        private final InputStream in;
        private final OutputStream out;

        Connection(Socket socket) throws IOException {
            this.socket = socket;
            this.in = new BufferedInputStream(socket.getInputStream(), 16 * 1024);
            this.out = socket.getOutputStream();
        }

        void send(byte[] request, Duration readTimeout) throws IOException {
            socket.setSoTimeout((int) Math.min(Integer.MAX_VALUE, Math.max(1, readTimeout.toMillis())));
            out.write(request);
            out.flush();
        }

        Raw reply() throws IOException {
            String statusLine = line(true);
            // 1xx replies (100 Continue) come before the real one.
            while (true) {
                String[] parts = statusLine.split(" ", 3);
                if (parts.length < 2 || !parts[0].startsWith("HTTP/")) throw new IOException("not an HTTP reply: " + excerpt(statusLine));
                int status;
                try {
                    status = Integer.parseInt(parts[1]);
                } catch (NumberFormatException e) {
                    throw new IOException("not an HTTP status: " + excerpt(statusLine));
                }
                Map<String, List<String>> headers = headers();
                if (status / 100 == 1) {
                    statusLine = line(false);
                    continue;
                }
                boolean http10 = parts[0].equals("HTTP/1.0");
                String connection = first(headers, "connection").toLowerCase(Locale.ROOT);
                boolean keepAlive = http10 ? connection.contains("keep-alive") : !connection.contains("close");
                byte[] body;
                String length = first(headers, "content-length");
                if (first(headers, "transfer-encoding").toLowerCase(Locale.ROOT).contains("chunked")) {
                    body = chunked();
                } else if (!length.isEmpty()) {
                    long n;
                    try {
                        n = Long.parseLong(length.strip());
                    } catch (NumberFormatException e) {
                        throw new IOException("bad Content-Length: " + excerpt(length));
                    }
                    if (n < 0 || n > Integer.MAX_VALUE - 16) throw new IOException("bad Content-Length: " + n);
                    body = in.readNBytes((int) n);
                    if (body.length < n) throw new IOException("the reply ended early");
                } else if (status == 204 || status == 304) {
                    body = new byte[0];
                } else {
                    body = in.readAllBytes();
                    keepAlive = false;
                }
                return new Raw(status, headers, body, keepAlive);
            }
        }

        private Map<String, List<String>> headers() throws IOException {
            Map<String, List<String>> headers = new TreeMap<>(String.CASE_INSENSITIVE_ORDER);
            while (true) {
                String l = line(false);
                if (l.isEmpty()) return headers;
                int colon = l.indexOf(':');
                if (colon <= 0) continue;
                headers.computeIfAbsent(l.substring(0, colon).strip(), k -> new ArrayList<>()).add(l.substring(colon + 1).strip());
            }
        }

        private static String first(Map<String, List<String>> headers, String name) {
            List<String> v = headers.get(name);
            return v == null || v.isEmpty() ? "" : v.get(0);
        }

        private byte[] chunked() throws IOException {
            ByteArrayOutputStream body = new ByteArrayOutputStream();
            while (true) {
                String size = line(false);
                int semi = size.indexOf(';');
                int n;
                try {
                    n = Integer.parseInt((semi < 0 ? size : size.substring(0, semi)).strip(), 16);
                } catch (NumberFormatException e) {
                    throw new IOException("bad chunk size: " + excerpt(size));
                }
                if (n < 0) throw new IOException("bad chunk size: " + n);
                if (n == 0) {
                    while (!line(false).isEmpty()) {
                        // trailers: not used
                    }
                    return body.toByteArray();
                }
                byte[] chunk = in.readNBytes(n);
                if (chunk.length < n) throw new IOException("the reply ended early");
                body.write(chunk);
                line(false);
            }
        }

        /**
         * One header line without its line end. Before the first byte of a reply, the end of the stream or a reset
         * connection means the server had closed it (kept alive too long): {@link EOFException}.
         */
        private String line(boolean first) throws IOException {
            ByteArrayOutputStream b = new ByteArrayOutputStream(64);
            if (first) {
                int c;
                try {
                    c = in.read();
                } catch (java.net.SocketException reset) {
                    throw new EOFException("reset before a reply");
                }
                if (c < 0) throw new EOFException();
                if (c != '\n') b.write(c);
                else return "";
            }
            while (true) {
                int c = in.read();
                if (c < 0) throw new IOException("the reply ended early");
                if (c == '\n') break;
                if (b.size() >= MAX_HEADER_LINE) throw new IOException("a header line is too long");
                b.write(c);
            }
            String s = b.toString(StandardCharsets.ISO_8859_1);
            return s.endsWith("\r") ? s.substring(0, s.length() - 1) : s;
        }

        private static String excerpt(String s) {
            return s.length() > 80 ? s.substring(0, 80) + "…" : s;
        }

        void close() {
            try {
                socket.close();
            } catch (IOException ignored) {
                // closing: nothing to do
            }
        }
    }
}

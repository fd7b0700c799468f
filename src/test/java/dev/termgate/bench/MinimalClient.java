package dev.termgate.bench;

import java.io.BufferedInputStream;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.Socket;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * The least a client can do against the scripted model: {@code jobs} threads, each sending its share of
 * {@code n} chat requests one after another on a kept-alive socket of its own, reading the reply by its
 * Content-Length and nothing more. Run in its own JVM by {@link BatchThroughputBench} to measure what the harness
 * and this machine cost before any work of the tool. (The same pattern on the JDK's HTTP client measured 4.9%
 * and 5.1% in two runs, against 1.5% on sockets: the JDK client's hand-offs through its selector thread, which
 * is why the tool now speaks plain HTTP on its own sockets.)
 */
public final class MinimalClient {
    public static void main(String[] args) throws Exception {
        URI url = URI.create(args[0]);
        int n = Integer.parseInt(args[1]);
        int jobs = Integer.parseInt(args[2]);
        byte[] body = "{\"model\":\"m\",\"messages\":[{\"role\":\"user\",\"content\":\"question\"}]}".getBytes(StandardCharsets.UTF_8);
        byte[] head = ("POST " + url.getPath() + " HTTP/1.1\r\nHost: " + url.getHost() + ":" + url.getPort()
                + "\r\nContent-Type: application/json\r\nContent-Length: " + body.length + "\r\n\r\n").getBytes(StandardCharsets.UTF_8);
        byte[] req = new byte[head.length + body.length];
        System.arraycopy(head, 0, req, 0, head.length);
        System.arraycopy(body, 0, req, head.length, body.length);
        ExecutorService pool = Executors.newFixedThreadPool(jobs);
        List<Future<?>> done = new ArrayList<>();
        for (int j = 0; j < jobs; j++) {
            int share = n / jobs + (j < n % jobs ? 1 : 0);
            done.add(pool.submit(() -> {
                try (Socket s = new Socket(url.getHost(), url.getPort())) {
                    s.setTcpNoDelay(true);
                    OutputStream out = s.getOutputStream();
                    InputStream in = new BufferedInputStream(s.getInputStream());
                    for (int i = 0; i < share; i++) {
                        out.write(req);
                        out.flush();
                        int len = -1;
                        boolean statusLine = true;
                        StringBuilder line = new StringBuilder();
                        while (true) {
                            int c = in.read();
                            if (c < 0) throw new IllegalStateException("closed");
                            if (c == '\n') {
                                String l = line.toString().trim();
                                line.setLength(0);
                                if (statusLine && !l.startsWith("HTTP/1.1 200")) throw new IllegalStateException(l);
                                statusLine = false;
                                if (l.isEmpty()) break;
                                if (l.toLowerCase(Locale.ROOT).startsWith("content-length:")) len = Integer.parseInt(l.substring(15).trim());
                            } else line.append((char) c);
                        }
                        in.readNBytes(len);
                    }
                }
                return null;
            }));
        }
        for (Future<?> f : done) f.get();
        pool.shutdown();
    }
}

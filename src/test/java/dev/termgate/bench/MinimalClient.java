package dev.termgate.bench;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * The least a client can do against the scripted model: {@code jobs} threads, each sending its share of
 * {@code n} chat requests one after another on the JDK client, reading nothing but the status. Run in its own JVM
 * by {@link BatchThroughputBench} to measure what the harness and this machine cost before any work of the tool.
 */
public final class MinimalClient {
    public static void main(String[] args) throws Exception {
        String url = args[0];
        int n = Integer.parseInt(args[1]);
        int jobs = Integer.parseInt(args[2]);
        HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
        String body = "{\"model\":\"m\",\"messages\":[{\"role\":\"user\",\"content\":\"question\"}]}";
        ExecutorService pool = Executors.newFixedThreadPool(jobs);
        List<Future<?>> done = new ArrayList<>();
        for (int j = 0; j < jobs; j++) {
            int share = n / jobs + (j < n % jobs ? 1 : 0);
            done.add(pool.submit(() -> {
                for (int i = 0; i < share; i++) {
                    HttpRequest r = HttpRequest.newBuilder(URI.create(url)).header("Content-Type", "application/json")
                            .POST(HttpRequest.BodyPublishers.ofString(body)).build();
                    if (http.send(r, HttpResponse.BodyHandlers.ofString()).statusCode() != 200) throw new IllegalStateException();
                }
                return null;
            }));
        }
        for (Future<?> f : done) f.get();
        pool.shutdown();
        // As the tool does at its end: a JDK 17 JVM waits about 0.3 s at exit for a client's selector thread,
        // which sits in native code until interrupted.
        Thread.getAllStackTraces().keySet().stream().filter(t -> t.getName().endsWith("SelectorManager")).forEach(Thread::interrupt);
    }
}

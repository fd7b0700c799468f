package dev.termgate.engine;

import org.apache.tinkerpop.gremlin.server.GremlinServer;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.time.Duration;

/** A Gremlin Server in this JVM on a free 127.0.0.1 port (see RemoteEngineTest), for benchmarks outside this package. */
public final class InProcessServer implements AutoCloseable {
    private final GremlinServer server;
    private final int port;

    private InProcessServer(GremlinServer server, int port) {
        this.server = server;
        this.port = port;
    }

    public static InProcessServer start(TinkerGraph graph) throws Exception {
        int port = RemoteEngineTest.freePort();
        return new InProcessServer(RemoteEngineTest.start(graph, port), port);
    }

    public Engine engine() {
        return Engines.remote("ws://127.0.0.1:" + port + "/gremlin", "g", Duration.ofSeconds(10));
    }

    @Override
    public void close() throws Exception {
        server.stop().get();
    }
}

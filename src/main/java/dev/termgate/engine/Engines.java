package dev.termgate.engine;

import dev.termgate.diag.Code;
import org.apache.tinkerpop.gremlin.driver.Cluster;
import org.apache.tinkerpop.gremlin.driver.remote.DriverRemoteConnection;
import org.apache.tinkerpop.gremlin.process.traversal.AnonymousTraversalSource;
import org.apache.tinkerpop.gremlin.process.traversal.dsl.graph.GraphTraversalSource;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.net.URI;
import java.time.Duration;

/** Factories for engines. */
public final class Engines {
    private Engines() {}

    /** An engine over an in-process TinkerGraph (already loaded; see {@link GraphFiles}). */
    public static Engine embedded(TinkerGraph graph, String description) {
        return new TraversalEngine(new GraphPort(graph.traversal(), description, graph), false, () -> { });
    }

    /**
     * An engine over a Gremlin Server at {@code ws://host:port/path}, speaking GraphBinary bytecode. The
     * server is asked once right away, so an unreachable server is reported here, not at the first query.
     *
     * @param traversalSource the name the server gives the graph's traversal source (usually {@code g})
     */
    public static Engine remote(String url, String traversalSource, Duration connectTimeout) {
        URI uri;
        try {
            uri = URI.create(url);
        } catch (IllegalArgumentException e) {
            throw new EngineException(Code.REMOTE_UNAVAILABLE, url, "not a ws:// URL");
        }
        if (uri.getHost() == null || !("ws".equals(uri.getScheme()) || "wss".equals(uri.getScheme()))) {
            throw new EngineException(Code.REMOTE_UNAVAILABLE, url, "expected ws://HOST:PORT/gremlin");
        }
        Cluster cluster;
        try {
            cluster = Cluster.build(uri.getHost())
                    .port(uri.getPort() < 0 ? 8182 : uri.getPort())
                    .path(uri.getPath() == null || uri.getPath().isEmpty() ? "/gremlin" : uri.getPath())
                    .enableSsl("wss".equals(uri.getScheme()))
                    .connectionSetupTimeoutMillis(connectTimeout.toMillis())
                    .maxWaitForConnection((int) Math.min(Integer.MAX_VALUE, connectTimeout.toMillis()))
                    .create();
        } catch (RuntimeException e) {
            throw new EngineException(Code.REMOTE_UNAVAILABLE, e, url, TraversalEngine.rootMessage(e));
        }
        DriverRemoteConnection conn = DriverRemoteConnection.using(cluster, traversalSource);
        GraphTraversalSource g = AnonymousTraversalSource.traversal().withRemote(conn);
        Runnable close = () -> {
            try {
                conn.close();
            } catch (Exception ignored) {
                // the server may already be gone; nothing left to release on our side
            }
            cluster.close();
        };
        try {
            g.inject(1).toList();
        } catch (RuntimeException e) {
            close.run();
            throw new EngineException(Code.REMOTE_UNAVAILABLE, e, url, TraversalEngine.rootMessage(e));
        }
        return new TraversalEngine(new GraphPort(g, url, null), true, close);
    }
}

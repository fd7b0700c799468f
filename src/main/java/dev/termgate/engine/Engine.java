package dev.termgate.engine;

import dev.termgate.query.Query;
import dev.termgate.schema.GraphSchema;

/**
 * Runs checked, read-only query trees against a graph. Implementations: embedded TinkerGraph and a remote
 * Gremlin Server, both through the same lambda-free traversals ({@link Engines}).
 *
 * <p>Callers must pass trees the analyzer accepted; write clauses are refused here too, as a second line.
 */
public interface Engine extends AutoCloseable {

    /** Runs under the given control, which the caller may {@link RunControl#cancel()} from another thread. */
    Result run(Request request, RunControl control);

    default Result run(Request request) {
        return run(request, RunControl.of(request.limits()));
    }

    default Result run(Query query, GraphSchema schema, Limits limits) {
        return run(Request.of(query, null, schema, limits));
    }

    /** The plan without running it: traversal text and residual client steps. */
    Plan explain(Request request);

    /** Where the data lives, for messages ("embedded graph from data.ttl", "ws://host:8182/gremlin"). */
    String description();

    @Override
    void close();
}

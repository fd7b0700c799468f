package dev.termgate.graph;

import org.apache.tinkerpop.gremlin.tinkergraph.structure.AbstractTinkerGraph;

import java.util.concurrent.atomic.AtomicLong;

/**
 * Ids of vertex properties in a graph read from a graph file: a plain counter. TinkerGraph's default manager
 * searches for an id no vertex or edge uses (a stream and two map probes per property); property ids never meet
 * vertex or edge ids, and nothing in termgate reads them, so a counter is enough and halves the garbage of a load.
 * TinkerGraph makes one instance per graph (named by class in its configuration).
 */
public final class PropertyIds implements AbstractTinkerGraph.IdManager<Long> {
    private final AtomicLong next = new AtomicLong();

    @Override
    public Long getNextId(AbstractTinkerGraph graph) {
        return next.incrementAndGet();
    }

    @Override
    public Long convert(Object id) {
        if (id instanceof Number n) return n.longValue();
        if (id instanceof String s) return Long.parseLong(s);
        throw new IllegalArgumentException("a vertex property id must be a number, not " + id);
    }

    @Override
    public boolean allow(Object id) {
        return id instanceof Number || id instanceof String;
    }
}

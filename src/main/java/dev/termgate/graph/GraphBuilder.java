package dev.termgate.graph;

import org.apache.tinkerpop.gremlin.structure.Edge;
import org.apache.tinkerpop.gremlin.structure.T;
import org.apache.tinkerpop.gremlin.structure.Vertex;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;

/**
 * Writes nodes and relationships into a TinkerGraph following {@link LabelCodec}. Every importer goes through
 * it, so the storage convention lives in one place. Null property values are not stored (openCypher has no
 * null-valued properties).
 */
public final class GraphBuilder {
    private final TinkerGraph graph;
    private long nodes;
    private long rels;

    public GraphBuilder() {
        this(TinkerGraph.open());
    }

    public GraphBuilder(TinkerGraph graph) {
        this.graph = graph;
    }

    public TinkerGraph graph() {
        return graph;
    }

    public long nodeCount() {
        return nodes;
    }

    public long relationshipCount() {
        return rels;
    }

    /** Adds a node and returns its vertex id. */
    public Object addNode(List<String> labels, Map<String, ?> properties) {
        Vertex v = graph.addVertex(T.label, LabelCodec.encode(labels));
        properties.forEach((k, val) -> {
            Object stored = storable(val);
            if (stored != null) v.property(k, stored);
        });
        nodes++;
        return v.id();
    }

    /** Adds a relationship between two existing vertices and returns its edge id. */
    public Object addRelationship(Object fromId, Object toId, String type, Map<String, ?> properties) {
        Vertex from = vertex(fromId);
        Vertex to = vertex(toId);
        Edge e = from.addEdge(type, to);
        properties.forEach((k, val) -> {
            Object stored = storable(val);
            if (stored != null) e.property(k, stored);
        });
        rels++;
        return e.id();
    }

    public Vertex vertex(Object id) {
        var it = graph.vertices(id);
        if (!it.hasNext()) throw new IllegalArgumentException("no vertex with id " + id);
        return it.next();
    }

    /** Lists are stored as Java lists (TinkerGraph keeps any object; graph files serialize them). */
    static Object storable(Object v) {
        if (v == null) return null;
        if (v instanceof Integer i) return i.longValue();
        if (v instanceof Float f) return f.doubleValue();
        if (v instanceof List<?> l) {
            List<Object> out = new ArrayList<>(l.size());
            for (Object o : l) out.add(storable(o));
            return out;
        }
        return v;
    }
}

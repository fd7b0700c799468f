package dev.termgate.engine;

import dev.termgate.graph.LabelCodec;
import dev.termgate.query.LabelExpr;
import dev.termgate.schema.GraphSchema;
import org.apache.tinkerpop.gremlin.process.traversal.dsl.graph.GraphTraversalSource;
import org.apache.tinkerpop.gremlin.structure.Direction;
import org.apache.tinkerpop.gremlin.structure.T;
import org.apache.tinkerpop.gremlin.structure.Vertex;
import org.apache.tinkerpop.gremlin.tinkergraph.structure.TinkerGraph;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The one door to a graph, embedded or remote: a traversal source plus the catalogue of stored vertex and
 * edge labels (needed to turn label tests into {@code hasLabel(within(...))}, see {@link LabelCodec}).
 *
 * <p>Indexes of the embedded graph are built on first use: the first query that starts a match by property
 * equality on a key ({@code (c {name:'x'})} or {@code WHERE c.name = 'x'}) has TinkerGraph index that vertex
 * key, and every later lookup by that key is a hash probe instead of a scan. Indexing on demand rather than at
 * load keeps loading fast and indexes exactly the keys questions filter on; the query path never writes, so an
 * index, once built, stays right. A remote server decides about its own indexes from the same bytecode.
 */
final class GraphPort {
    private final GraphTraversalSource g;
    private final String description;
    private final TinkerGraph local;
    private final Set<String> indexed = new HashSet<>();
    private volatile List<String> vertexLabels;
    private volatile List<String> edgeLabels;

    /** @param local the embedded graph, whose indexes this port manages; null for a remote server */
    GraphPort(GraphTraversalSource g, String description, TinkerGraph local) {
        this.g = g;
        this.description = description;
        this.local = local;
    }

    /**
     * Makes lookups by {@code key} on the embedded graph indexed. Until this returns, no traversal of this
     * port starts with an equality on the key (see Matcher's use), so a concurrent run never sees half an index.
     */
    synchronized void indexVertexKey(String key) {
        if (local == null || indexed.contains(key)) return;
        local.createIndex(key, Vertex.class);
        indexed.add(key);
    }

    GraphTraversalSource g() {
        return g;
    }

    String description() {
        return description;
    }

    /** Forgets the label catalogue (the importer calls it after writing). */
    void invalidate() {
        vertexLabels = null;
        edgeLabels = null;
    }

    /** Read once per port: the graph is never written through the query path. */
    List<String> vertexLabels() {
        if (vertexLabels == null) {
            vertexLabels = List.copyOf(g.V().label().dedup().toList());
        }
        return vertexLabels;
    }

    List<String> edgeLabels() {
        if (edgeLabels == null) {
            edgeLabels = List.copyOf(g.E().label().dedup().toList());
        }
        return edgeLabels;
    }

    /** Stored vertex labels that satisfy the label expression, with subclasses when a schema is given. */
    List<String> vertexLabelsMatching(LabelExpr expr, GraphSchema schema) {
        List<String> out = new ArrayList<>();
        for (String stored : vertexLabels()) {
            if (matches(expr, new HashSet<>(LabelCodec.decode(stored)), schema, true)) out.add(stored);
        }
        return out;
    }

    /** Stored edge labels that satisfy the type expression, with sub-properties when a schema is given. */
    List<String> edgeLabelsMatching(LabelExpr expr, GraphSchema schema) {
        List<String> out = new ArrayList<>();
        for (String stored : edgeLabels()) {
            if (matches(expr, Set.of(stored), schema, false)) out.add(stored);
        }
        return out;
    }

    static boolean matches(LabelExpr expr, Set<String> have, GraphSchema schema, boolean nodes) {

            if (expr instanceof LabelExpr.Name n) {
                if (have.contains(n.name())) return true;
                Set<String> subs = nodes ? schema.subLabels(n.name()) : schema.subRelTypes(n.name());
                for (String s : subs) if (have.contains(s)) return true;
                return false;
            }
            if (expr instanceof LabelExpr.And a) return a.operands().stream().allMatch(o -> matches(o, have, schema, nodes));
            if (expr instanceof LabelExpr.Or o) return o.operands().stream().anyMatch(x -> matches(x, have, schema, nodes));
            if (expr instanceof LabelExpr.Not n) return !matches(n.operand(), have, schema, nodes);
            if (expr instanceof LabelExpr.Wildcard w) return !have.isEmpty();
            throw new IllegalStateException("unhandled " + expr);

    }

    // ---- decoding elementMap() results into values ----

    static NodeValue node(Object elementMap) {
        Map<?, ?> m = (Map<?, ?>) elementMap;
        Map<String, Object> props = new LinkedHashMap<>();
        Object id = null;
        String label = null;
        for (Map.Entry<?, ?> e : m.entrySet()) {
            Object k = e.getKey();
            if (k == T.id) id = e.getValue();
            else if (k == T.label) label = (String) e.getValue();
            else if (k instanceof String s) props.put(s, Values.normalize(e.getValue()));
        }
        return new NodeValue(id, LabelCodec.decode(label), props);
    }

    static RelValue rel(Object elementMap) {
        Map<?, ?> m = (Map<?, ?>) elementMap;
        Map<String, Object> props = new LinkedHashMap<>();
        Object id = null, start = null, end = null;
        String label = null;
        for (Map.Entry<?, ?> e : m.entrySet()) {
            Object k = e.getKey();
            if (k == T.id) id = e.getValue();
            else if (k == T.label) label = (String) e.getValue();
            else if (k == Direction.OUT) start = ((Map<?, ?>) e.getValue()).get(T.id);
            else if (k == Direction.IN) end = ((Map<?, ?>) e.getValue()).get(T.id);
            else if (k instanceof String s) props.put(s, Values.normalize(e.getValue()));
        }
        return new RelValue(id, label, start, end, props);
    }
}

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
import java.util.Optional;
import java.util.OptionalLong;
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
 *
 * <p>TinkerGraph indexes property keys only: a label test alone is a scan of every vertex. So the port keeps, for
 * the embedded graph, the ids of each stored label's vertices, from one pass over the graph on first use (the pass
 * that also lists the labels), and a match that starts from a selective label looks its vertices up by id.
 */
final class GraphPort {
    private final GraphTraversalSource g;
    private final String description;
    private final TinkerGraph local;
    private final Set<String> indexed = new HashSet<>();
    private volatile List<String> vertexLabels;
    private volatile List<String> edgeLabels;
    private volatile LabelIndex labelIndex;

    /** The embedded graph's vertex ids by stored label, in the order labels first occur, and the vertex count. */
    private record LabelIndex(Map<String, Object[]> ids, long vertices) {
        long count(List<String> labels) {
            long n = 0;
            for (String label : labels) {
                Object[] of = ids.get(label);
                if (of != null) n += of.length;
            }
            return n;
        }
    }

    /**
     * Looking up a third of the vertices by id took about as long as testing every vertex's label; fewer were
     * quicker. Counting a label's vertices on a 1M-node scale graph, by id against by scan, three times each: 1% of
     * them in 7-70 ms against 267-357 ms, 10% in 82-154 against 298-330, 29% in 260-312 against 325-367, 59% in
     * 614-1019 against 429-773 (EngineBench#labelStartsOn1MNodes, which also times whole queries).
     */
    static final double SELECTIVE = 1.0 / 3;

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
        labelIndex = null;
    }

    /** Read once per port: the graph is never written through the query path. */
    List<String> vertexLabels() {
        if (vertexLabels == null) {
            vertexLabels = local != null ? List.copyOf(labelIndex().ids().keySet()) : List.copyOf(g.V().label().dedup().toList());
        }
        return vertexLabels;
    }

    /**
     * The ids of the embedded graph's vertices that satisfy the label expression, when they are at most
     * {@link #SELECTIVE} of all vertices; empty on a remote graph, for a label that covers more, or for none.
     */
    Optional<Object[]> selectiveVertexIds(LabelExpr expr, GraphSchema schema) {
        if (local == null) return Optional.empty();
        List<String> stored = vertexLabelsMatching(expr, schema);
        LabelIndex index = labelIndex();
        long count = index.count(stored);
        // No ids at all would read as "every vertex" to V(...).
        if (count == 0 || count > SELECTIVE * index.vertices()) return Optional.empty();
        if (stored.size() == 1) return Optional.of(index.ids().get(stored.get(0)));
        Object[] all = new Object[(int) count];
        int at = 0;
        for (String label : stored) {
            Object[] ids = index.ids().getOrDefault(label, new Object[0]);
            System.arraycopy(ids, 0, all, at, ids.length);
            at += ids.length;
        }
        return Optional.of(all);
    }

    /** How many of the embedded graph's vertices satisfy the label expression; empty on a remote graph. */
    OptionalLong vertexCount(LabelExpr expr, GraphSchema schema) {
        return local == null ? OptionalLong.empty() : OptionalLong.of(labelIndex().count(vertexLabelsMatching(expr, schema)));
    }

    private LabelIndex labelIndex() {
        LabelIndex index = labelIndex;
        if (index != null) return index;
        synchronized (this) {
            if (labelIndex == null) {
                Map<String, List<Object>> byLabel = new LinkedHashMap<>();
                long[] vertices = {0};
                local.vertices().forEachRemaining(v -> {
                    byLabel.computeIfAbsent(v.label(), k -> new ArrayList<>()).add(v.id());
                    vertices[0]++;
                });
                Map<String, Object[]> ids = new LinkedHashMap<>();
                byLabel.forEach((label, list) -> ids.put(label, list.toArray()));
                labelIndex = new LabelIndex(ids, vertices[0]);
            }
            return labelIndex;
        }
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

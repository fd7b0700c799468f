package dev.termgate.interpret;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.RelType;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.PriorityQueue;
import java.util.Set;
import java.util.function.Predicate;

/**
 * The class graph of the ontology: classes are vertices, each relationship type an edge from its domain to its
 * range (read with {@link GraphSchema#effectiveEndpoints}, so inverses, super-properties and unions count). A
 * node of class C may use an edge whose endpoint is C or a superclass of C. Interpretation trees are grown over
 * it with a shortest-path heuristic for Steiner trees: repeatedly join the cheapest remaining terminal to the tree.
 */
final class SchemaGraph {

    /** {@code (from)-[:type]->(to)} as the ontology allows it. */
    record Edge(String type, String from, String to, boolean symmetric) {}

    /** One hop of a found path: from the previous class, along {@code edge}, forward or backward, to {@code label}. */
    record Hop(Edge edge, boolean forward, String label) {}

    record Path(int startNode, List<Hop> hops, double cost) {}

    static final int MAX_HOPS = 5;

    private final GraphSchema schema;
    private final DataProfile profile;
    private final List<Edge> edges = new ArrayList<>();

    SchemaGraph(GraphSchema schema, DataProfile profile) {
        this.schema = schema;
        this.profile = profile;
        for (RelType r : schema.relTypes().values()) {
            for (Endpoint e : ownEndpoints(r)) {
                if (e.anyFrom() || e.anyTo()) continue;
                Edge edge = new Edge(r.name(), e.from(), e.to(), r.symmetric());
                if (!edges.contains(edge)) edges.add(edge);
            }
        }
        edges.sort(Comparator.comparing(Edge::type).thenComparing(Edge::from).thenComparing(Edge::to));
    }

    /**
     * The type's own endpoints and its inverse's reversed; a super-property's only when it declares none (a
     * sub-property's domain and range are narrower, so the super-property's would let it connect too much).
     */
    private List<Endpoint> ownEndpoints(RelType r) {
        List<Endpoint> out = new ArrayList<>(r.endpoints());
        r.inverseOf().flatMap(schema::relType).ifPresent(inv -> inv.endpoints().forEach(e -> out.add(new Endpoint(e.to(), e.from()))));
        return out.isEmpty() ? schema.effectiveEndpoints(r.name()) : out;
    }

    /**
     * The cheapest path from any of {@code starts} (index → class) to a node of class {@code goal}.
     *
     * @param mentioned relationship types the question names: cheaper to use
     */
    Path cheapest(Map<Integer, String> starts, String goal, Set<String> mentioned) {
        return cheapest(starts, goal, mentioned, Set.of());
    }

    /**
     * As {@link #cheapest(Map, String, Set)}, passing through no node of a class in {@code avoid} on the way
     * (such a node would be a second, unnamed thing of a class the question names separately).
     */
    Path cheapest(Map<Integer, String> starts, String goal, Set<String> mentioned, Set<String> avoid) {
        record State(String label, int start, State prev, Hop hop, double cost, int depth) {}
        PriorityQueue<State> queue = new PriorityQueue<>(Comparator.comparingDouble(State::cost));
        starts.forEach((i, l) -> queue.add(new State(l, i, null, null, 0, 0)));
        Map<String, Double> settled = new HashMap<>();
        while (!queue.isEmpty()) {
            State s = queue.poll();
            if (s.hop() != null && schema.isSubLabel(goal, s.label())) {
                List<Hop> hops = new ArrayList<>();
                for (State k = s; k.hop() != null; k = k.prev()) hops.add(0, k.hop());
                // The last hop lands on the goal node itself, whose class is at least as specific.
                Hop last = hops.remove(hops.size() - 1);
                hops.add(new Hop(last.edge(), last.forward(), goal));
                return new Path(s.start(), hops, s.cost());
            }
            String key = s.label() + "#" + s.start();
            if (s.hop() != null) {
                if (settled.containsKey(key)) continue;
                settled.put(key, s.cost());
            }
            if (s.depth() >= MAX_HOPS) continue;
            if (s.hop() != null && avoid.contains(s.label())) continue;
            for (Edge e : edges) {
                for (boolean forward : new boolean[] {true, false}) {
                    String here = forward ? e.from() : e.to();
                    String there = forward ? e.to() : e.from();
                    if (!schema.isSubLabel(s.label(), here)) continue;
                    if (s.hop() != null && s.hop().edge().equals(e) && s.hop().forward() != forward) continue;
                    double c = cost(e, forward, s.label(), here, mentioned);
                    queue.add(new State(there, s.start(), s, new Hop(e, forward, there), s.cost() + c, s.depth() + 1));
                }
            }
        }
        return null;
    }

    private double cost(Edge e, boolean forward, String nodeLabel, String endpoint, Set<String> mentioned) {
        double c = 1.0;
        boolean named = false;
        for (String m : mentioned) {
            if (schema.subRelTypes(m).contains(e.type()) || schema.superRelTypes(e.type()).contains(m)
                    || schema.relType(m).flatMap(RelType::inverseOf).filter(inv -> inv.equals(e.type())).isPresent()) {
                named = true;
            }
        }
        if (named) c *= 0.4;
        if (!profile.populated(e.type(), schema)) c += 3;
        // A more general endpoint than the node's class is a weaker reading ("involves party" vs "consigned to").
        c += 0.05 * Math.max(0, schema.superLabels(nodeLabel).size() - schema.superLabels(endpoint).size());
        // Reading a many-valued relationship outward from the answer changes what is counted or listed.
        if (profile.known() && !profile.functional(e.type(), forward)) c += 0.25;
        // Equal costs are settled by the edge's place in the sorted list, so the same question gives the same tree.
        return c + 1e-6 * edges.indexOf(e);
    }

    static Predicate<String> any() {
        return s -> true;
    }
}

package dev.termgate.interpret;

import dev.termgate.schema.GraphSchema;

import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * What the interpreter knows of the loaded data, read once when a graph is loaded: which relationship types
 * hold instances and whether they are functional in each direction, which property keys each class fills, and
 * the string values that a question may mention. It plays the part of the ontology-to-database mapping of an
 * ontology-driven interface: terms with no instances are avoided when a populated one says the same.
 * Without data ({@link #empty}) every term counts as populated and no value is known.
 */
public final class DataProfile {

    /** A string value held by nodes of {@code label} under {@code key}. {@code categorical} for small code lists. */
    public record Value(String value, String label, String key, boolean categorical) {}

    private record RelStats(int count, boolean functionalOut, boolean functionalIn) {}

    private final boolean known;
    private final Map<String, RelStats> rels;
    private final Map<String, Integer> nodeCounts;
    private final Map<String, Map<String, Integer>> fill;
    private final Map<String, Map<String, Integer>> distinct;
    private final List<Value> values;

    private DataProfile(boolean known, Map<String, RelStats> rels, Map<String, Integer> nodeCounts,
                        Map<String, Map<String, Integer>> fill, Map<String, Map<String, Integer>> distinct, List<Value> values) {
        this.known = known;
        this.rels = rels;
        this.nodeCounts = nodeCounts;
        this.fill = fill;
        this.distinct = distinct;
        this.values = List.copyOf(values);
    }

    public static DataProfile empty() {
        return new DataProfile(false, Map.of(), Map.of(), Map.of(), Map.of(), List.of());
    }

    public boolean known() {
        return known;
    }

    /** Whether the data holds relationships of this type (or of a sub-type); true when nothing is known. */
    public boolean populated(String relType, GraphSchema schema) {
        if (!known) return true;
        for (String t : schema.subRelTypes(relType)) {
            RelStats s = rels.get(t);
            if (s != null && s.count() > 0) return true;
        }
        return false;
    }

    /** Whether every start node has at most one such relationship ({@code outgoing}) or every end node ({@code !outgoing}). */
    public boolean functional(String relType, boolean outgoing) {
        RelStats s = rels.get(relType);
        if (s == null) return false;
        return outgoing ? s.functionalOut() : s.functionalIn();
    }

    /** Nodes carrying the label or a sub-label. */
    public int nodeCount(String label) {
        return nodeCounts.getOrDefault(label, 0);
    }

    /** How many nodes of the label (or a sub-label) have the key. */
    public int filled(String label, String key) {
        return fill.getOrDefault(label, Map.of()).getOrDefault(key, 0);
    }

    public int distinctValues(String label, String key) {
        return distinct.getOrDefault(label, Map.of()).getOrDefault(key, 0);
    }

    public List<Value> values() {
        return values;
    }

    /**
     * The property that names a node of the label in answers: {@code name} when the data fills it for (nearly)
     * all nodes, else a string key filled for all nodes with a distinct value each (a number or reference).
     * Without data, a string key declared on the class whose words say name/number/reference/code.
     */
    public Optional<String> displayKey(String label, GraphSchema schema) {
        if (!known) {
            for (String key : schema.propertiesOf(label)) {
                String k = key.toLowerCase(Locale.ROOT);
                if (k.equals("name")) return Optional.of(key);
            }
            return Optional.empty();
        }
        int n = nodeCount(label);
        if (n == 0) return Optional.empty();
        if (filled(label, "name") >= 0.9 * n) return Optional.of("name");
        String best = null;
        double bestScore = 0;
        for (String key : schema.propertiesOf(label)) {
            var p = schema.property(key).orElse(null);
            if (p == null || p.valueType() != dev.termgate.schema.ValueType.STRING) continue;
            if (filled(label, key) < 0.9 * n || distinctValues(label, key) < 0.9 * filled(label, key)) continue;
            String k = key.toLowerCase(Locale.ROOT);
            double score = 1 + (k.contains("number") || k.contains("reference") || k.contains("name") ? 1 : 0)
                    + (p.domains().contains(label) ? 0.5 : 0);
            if (score > bestScore) {
                bestScore = score;
                best = key;
            }
        }
        return Optional.ofNullable(best);
    }

    public static Builder builder(GraphSchema schema) {
        return new Builder(schema);
    }

    /** Collects nodes and relationships of the graph; not thread-safe. */
    public static final class Builder {
        private final GraphSchema schema;
        private final Map<String, int[]> relCounts = new HashMap<>();
        private final Map<String, Map<Object, Integer>> outDegree = new HashMap<>();
        private final Map<String, Map<Object, Integer>> inDegree = new HashMap<>();
        private final Map<String, Integer> nodeCounts = new HashMap<>();
        private final Map<String, Map<String, Integer>> fill = new HashMap<>();
        private final Map<String, Map<String, Set<Object>>> distinct = new HashMap<>();
        private final Map<String, Map<String, Set<String>>> stringsByLabelKey = new LinkedHashMap<>();

        private Builder(GraphSchema schema) {
            this.schema = schema;
        }

        /** One node with its stored labels and properties. */
        public Builder node(Collection<String> labels, Map<String, ?> properties) {
            Set<String> all = new HashSet<>();
            for (String l : labels) {
                all.add(l);
                all.addAll(schema.superLabels(l));
            }
            String specific = labels.isEmpty() ? null : mostSpecific(labels);
            for (String l : all) {
                nodeCounts.merge(l, 1, Integer::sum);
                for (Map.Entry<String, ?> e : properties.entrySet()) {
                    if (e.getValue() == null) continue;
                    fill.computeIfAbsent(l, k -> new HashMap<>()).merge(e.getKey(), 1, Integer::sum);
                    distinct.computeIfAbsent(l, k -> new HashMap<>()).computeIfAbsent(e.getKey(), k -> new HashSet<>()).add(e.getValue());
                }
            }
            if (specific != null) {
                for (Map.Entry<String, ?> e : properties.entrySet()) {
                    if (e.getValue() instanceof String s && !s.isBlank() && s.length() <= 80) {
                        stringsByLabelKey.computeIfAbsent(specific, k -> new LinkedHashMap<>())
                                .computeIfAbsent(e.getKey(), k -> new java.util.LinkedHashSet<>()).add(s);
                    }
                }
            }
            return this;
        }

        private String mostSpecific(Collection<String> labels) {
            for (String l : labels) {
                boolean hasSub = false;
                for (String o : labels) if (!o.equals(l) && schema.isSubLabel(o, l)) hasSub = true;
                if (!hasSub) return l;
            }
            return labels.iterator().next();
        }

        /** One relationship of the given type between two node ids. */
        public Builder rel(String type, Object from, Object to) {
            relCounts.computeIfAbsent(type, k -> new int[1])[0]++;
            outDegree.computeIfAbsent(type, k -> new HashMap<>()).merge(from, 1, Integer::sum);
            inDegree.computeIfAbsent(type, k -> new HashMap<>()).merge(to, 1, Integer::sum);
            return this;
        }

        public DataProfile build() {
            Map<String, RelStats> rels = new HashMap<>();
            for (var e : relCounts.entrySet()) {
                String t = e.getKey();
                boolean fOut = outDegree.get(t).values().stream().allMatch(d -> d <= 1);
                boolean fIn = inDegree.get(t).values().stream().allMatch(d -> d <= 1);
                rels.put(t, new RelStats(e.getValue()[0], fOut, fIn));
            }
            Map<String, Map<String, Integer>> dist = new HashMap<>();
            distinct.forEach((l, m) -> {
                Map<String, Integer> d = new HashMap<>();
                m.forEach((k, set) -> d.put(k, set.size()));
                dist.put(l, d);
            });
            List<Value> values = new ArrayList<>();
            stringsByLabelKey.forEach((label, byKey) -> byKey.forEach((key, set) -> {
                // A key with few distinct values over many nodes is a code list ("import"/"export"): its values
                // may be named in lower case in a question, unlike names.
                boolean categorical = set.size() <= 12 && fill.getOrDefault(label, Map.of()).getOrDefault(key, 0) >= 2 * set.size();
                for (String v : set) values.add(new Value(v, label, key, categorical));
            }));
            return new DataProfile(true, Map.copyOf(rels), Map.copyOf(nodeCounts), fill, dist, values);
        }
    }
}

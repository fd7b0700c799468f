package dev.termgate.schema;

import dev.termgate.diag.Diagnostic;

import java.util.ArrayDeque;
import java.util.Collection;
import java.util.Collections;
import java.util.Deque;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;

/**
 * The property-graph schema derived from an ontology: labels, relationship types and property keys, each
 * with the IRI it came from. Immutable; closures and indexes are computed once at construction so that
 * lookups cost the same whatever the ontology's size.
 *
 * <p>Names are exact (case-sensitive) graph names. Lenient lookup for suggestions lives with the analyzer.
 */
public final class GraphSchema {

    private final String sourceHash;
    private final Map<String, NodeLabel> labels;
    private final Map<String, RelType> relTypes;
    private final Map<String, PropertyKey> properties;
    private final Map<String, TermInfo> byIri;
    private final List<Diagnostic> issues;

    private final Map<String, Set<String>> superClosure = new LinkedHashMap<>();
    private final Map<String, Set<String>> subClosure = new LinkedHashMap<>();
    private final Map<String, Set<String>> relSuperClosure = new LinkedHashMap<>();
    private final Map<String, Set<String>> relSubClosure = new LinkedHashMap<>();
    /** Keys declared directly on each label (its rdfs:domain); inherited ones are found through superLabels. */
    private final Map<String, Set<String>> declaredKeys = new LinkedHashMap<>();
    private final Set<String> domainFreeKeys = new TreeSet<>();

    private GraphSchema(String sourceHash, Collection<NodeLabel> labels, Collection<RelType> relTypes,
                        Collection<PropertyKey> properties, List<Diagnostic> issues) {
        this.sourceHash = sourceHash;
        this.labels = index(labels, NodeLabel::name);
        this.relTypes = index(relTypes, RelType::name);
        this.properties = index(properties, PropertyKey::name);
        this.issues = List.copyOf(issues);
        Map<String, TermInfo> iris = new LinkedHashMap<>();
        labels.forEach(l -> iris.putIfAbsent(l.info().iri(), l.info()));
        relTypes.forEach(r -> iris.putIfAbsent(r.info().iri(), r.info()));
        properties.forEach(p -> iris.putIfAbsent(p.info().iri(), p.info()));
        this.byIri = Collections.unmodifiableMap(iris);
        for (String l : this.labels.keySet()) {
            superClosure.put(l, closure(l, n -> this.labels.containsKey(n) ? upAndEquivalent(n) : Set.of()));
        }
        for (String l : this.labels.keySet()) {
            for (String sup : superClosure.get(l)) {
                subClosure.computeIfAbsent(sup, k -> new TreeSet<>()).add(l);
            }
        }
        for (String r : this.relTypes.keySet()) {
            relSuperClosure.put(r, closure(r, n -> this.relTypes.containsKey(n) ? this.relTypes.get(n).superTypes() : Set.of()));
        }
        for (String r : this.relTypes.keySet()) {
            for (String sup : relSuperClosure.get(r)) {
                relSubClosure.computeIfAbsent(sup, k -> new TreeSet<>()).add(r);
            }
        }
        // Not expanded to every subclass here: on schema.org that is a few hundred thousand entries, most never
        // asked for. propertiesOf/allowsProperty walk the (short) superclass closure instead.
        for (PropertyKey p : this.properties.values()) {
            if (p.anyDomain()) domainFreeKeys.add(p.name());
            for (String d : p.domains()) declaredKeys.computeIfAbsent(d, k -> new TreeSet<>()).add(p.name());
        }
    }

    public static GraphSchema of(String sourceHash, Collection<NodeLabel> labels, Collection<RelType> relTypes,
                                 Collection<PropertyKey> properties, List<Diagnostic> issues) {
        return new GraphSchema(sourceHash, labels, relTypes, properties, issues);
    }

    /** A schema with no terms: used in schema-free mode. */
    public static GraphSchema empty() {
        return new GraphSchema("", List.of(), List.of(), List.of(), List.of());
    }

    /** Content hash of the ontology sources this schema was derived from. */
    public String sourceHash() {
        return sourceHash;
    }

    /** Warnings found while deriving the schema (cycles, punning, unsupported domains, …). */
    public List<Diagnostic> issues() {
        return issues;
    }

    public Map<String, NodeLabel> labels() {
        return labels;
    }

    public Map<String, RelType> relTypes() {
        return relTypes;
    }

    public Map<String, PropertyKey> properties() {
        return properties;
    }

    public Optional<NodeLabel> label(String name) {
        return Optional.ofNullable(labels.get(name));
    }

    public Optional<RelType> relType(String name) {
        return Optional.ofNullable(relTypes.get(name));
    }

    public Optional<PropertyKey> property(String name) {
        return Optional.ofNullable(properties.get(name));
    }

    public Optional<TermInfo> byIri(String iri) {
        return Optional.ofNullable(byIri.get(iri));
    }

    /** Every term of the given kind. */
    public List<TermInfo> terms(TermKind kind) {
        return switch (kind) {
            case LABEL -> labels.values().stream().map(NodeLabel::info).toList();
            case RELATIONSHIP -> relTypes.values().stream().map(RelType::info).toList();
            case PROPERTY -> properties.values().stream().map(PropertyKey::info).toList();
        };
    }

    /** The label itself, its superclasses and equivalent classes, transitively. Empty for unknown labels. */
    public Set<String> superLabels(String label) {
        return superClosure.getOrDefault(label, Set.of());
    }

    /** The label itself and every class below it (or equivalent to it), transitively. */
    public Set<String> subLabels(String label) {
        return subClosure.getOrDefault(label, labels.containsKey(label) ? Set.of(label) : Set.of());
    }

    public boolean isSubLabel(String sub, String sup) {
        return superLabels(sub).contains(sup);
    }

    /** The type itself and its super-properties, transitively. */
    public Set<String> superRelTypes(String type) {
        return relSuperClosure.getOrDefault(type, Set.of());
    }

    /** The type itself and its sub-properties, transitively (what {@code [:TYPE]} matches). */
    public Set<String> subRelTypes(String type) {
        return relSubClosure.getOrDefault(type, relTypes.containsKey(type) ? Set.of(type) : Set.of());
    }

    /**
     * Property keys a node with this label may carry: declared on it or a superclass, plus every key with no
     * domain.
     */
    public Set<String> propertiesOf(String label) {
        Set<String> out = new TreeSet<>(domainFreeKeys);
        for (String sup : superLabels(label)) out.addAll(declaredKeys.getOrDefault(sup, Set.of()));
        return out;
    }

    /** Whether a node with the given label may carry the key (inherited and domain-free keys included). */
    public boolean allowsProperty(String label, String key) {
        PropertyKey p = properties.get(key);
        if (p == null) return false;
        if (p.anyDomain()) return true;
        for (String d : p.domains()) {
            if (isSubLabel(label, d)) return true;
        }
        return false;
    }

    /**
     * Whether {@code (from)-[:type]->(to)} is allowed, reading the type's own endpoints and those of its
     * super-properties, with subclasses of each endpoint, with the inverse's endpoints reversed, and both ways
     * for a symmetric type. {@code null} for either label means "unknown class" and matches anything.
     */
    public boolean allows(String type, String from, String to) {
        RelType r = relTypes.get(type);
        if (r == null) return false;
        if (matchesEndpoints(type, from, to)) return true;
        return r.symmetric() && matchesEndpoints(type, to, from);
    }

    /** Declared endpoints of the type, including those inherited from super-properties and read off the inverse. */
    public List<Endpoint> effectiveEndpoints(String type) {
        Set<Endpoint> out = new LinkedHashSet<>();
        for (String t : superRelTypes(type)) {
            RelType r = relTypes.get(t);
            if (r == null) continue;
            out.addAll(r.endpoints());
            r.inverseOf().map(relTypes::get).ifPresent(inv -> inv.endpoints()
                    .forEach(e -> out.add(new Endpoint(e.to(), e.from()))));
        }
        return List.copyOf(out);
    }

    private boolean matchesEndpoints(String type, String from, String to) {
        List<Endpoint> eps = effectiveEndpoints(type);
        if (eps.isEmpty()) return true;
        for (Endpoint e : eps) {
            boolean f = from == null || e.anyFrom() || isSubLabel(from, e.from());
            boolean t = to == null || e.anyTo() || isSubLabel(to, e.to());
            if (f && t) return true;
        }
        return false;
    }

    private Set<String> upAndEquivalent(String name) {
        NodeLabel l = labels.get(name);
        Set<String> out = new LinkedHashSet<>(l.superLabels());
        out.addAll(l.equivalents());
        return out;
    }

    private static Set<String> closure(String start, java.util.function.Function<String, Set<String>> next) {
        // Breadth-first with a visited set: subclass cycles in real ontologies must not loop.
        Set<String> seen = new LinkedHashSet<>();
        Deque<String> todo = new ArrayDeque<>();
        todo.add(start);
        while (!todo.isEmpty()) {
            String n = todo.poll();
            if (seen.add(n)) todo.addAll(next.apply(n));
        }
        return Collections.unmodifiableSet(seen);
    }

    private static <T> Map<String, T> index(Collection<T> items, java.util.function.Function<T, String> key) {
        Map<String, T> m = new LinkedHashMap<>();
        for (T t : items) m.put(key.apply(t), t);
        return Collections.unmodifiableMap(m);
    }
}

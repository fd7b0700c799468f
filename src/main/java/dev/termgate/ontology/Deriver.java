package dev.termgate.ontology;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Quote;
import dev.termgate.query.Span;
import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.LangString;
import dev.termgate.schema.Names;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;
import dev.termgate.schema.ValueType;
import org.apache.jena.graph.Graph;
import org.apache.jena.graph.Node;
import org.apache.jena.graph.Triple;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.Deque;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * Turns an RDF graph holding an ontology into a {@link GraphSchema}. The rules (README, "From ontology to
 * graph schema"):
 *
 * <ul>
 *   <li><b>Labels</b>: every named class declared ({@code owl:Class}, {@code rdfs:Class}) or used as a class in
 *   an axiom (either side of {@code rdfs:subClassOf} / {@code owl:equivalentClass}, a domain or range, a member
 *   of an {@code owl:unionOf}); not datatypes (XSD, {@code rdfs:Literal}, {@code rdfs:Datatype} and schema.org
 *   {@code DataType}s with their subclasses) and not the RDF/RDFS/OWL vocabulary itself ({@code owl:Thing} …).
 *   Classes that only appear as the type of an individual are not labels.</li>
 *   <li><b>Properties</b>: every named property declared (rdf:Property, owl:Object/DatatypeProperty or a property
 *   characteristic) or given a domain or range, except annotation properties. {@code owl:ObjectProperty} →
 *   relationship type, {@code owl:DatatypeProperty} → property key. Otherwise the ranges decide: literal ranges
 *   make a property key, class ranges a relationship type, and a property with both (schema.org has many, e.g.
 *   Text or a class) becomes both; with no range, an object-only characteristic (symmetric, transitive, …) or an
 *   inverse makes it a relationship type, else it is a property key of any type.</li>
 *   <li>Domains and ranges: {@code rdfs:domain}/{@code rdfs:range} and schema.org's {@code domainIncludes}/
 *   {@code rangeIncludes} (http and https), unions expanded; several values are read as alternatives (lenient:
 *   RDFS reads several rdfs:domain values as an intersection). No domain or range → any class.</li>
 * </ul>
 */
final class Deriver {

    private static final Comparator<Node> BY_IRI = Comparator.comparing(Node::getURI);

    private final Graph g;
    private final Naming naming;
    private final List<Diagnostic> issues = new ArrayList<>();
    private final Map<Node, Boolean> datatypeMemo = new HashMap<>();

    private final List<Node> domainPreds;
    private final List<Node> rangePreds;
    private final List<Node> inversePreds;
    private final List<Node> supersededPreds;

    Deriver(Graph g, Names.Style style, Map<String, String> prefixes) {
        this.g = g;
        this.naming = new Naming(style, prefixes);
        this.domainPreds = concat(Vocab.DOMAIN, Vocab.schemaBoth("domainIncludes"));
        this.rangePreds = concat(Vocab.RANGE, Vocab.schemaBoth("rangeIncludes"));
        this.inversePreds = concat(Vocab.INVERSE_OF, Vocab.schemaBoth("inverseOf"));
        this.supersededPreds = Vocab.schemaBoth("supersededBy");
    }

    /** One property's classification, before names are given. */
    private record PropInfo(Node iri, Set<Node> domains, boolean anyDomain, Set<Node> classRanges, boolean anyRange,
                            Set<Node> dataRanges, boolean object, boolean data) {}

    /** Bumped whenever the rules change, so that cached schemas derived by older rules are not reused. */
    static final int RULES_VERSION = 2;

    /** @param loadWarnings problems found while reading the sources; they head the schema's issues */
    GraphSchema derive(String sourceHash, List<Diagnostic> loadWarnings) {
        issues.addAll(loadWarnings);
        Set<Node> classes = classes();
        Map<Node, PropInfo> props = properties(classes);
        reportPunning(classes, props.keySet());

        List<String> classIris = iris(classes);
        List<String> relIris = iris(props.values().stream().filter(PropInfo::object).map(PropInfo::iri).toList());
        List<String> keyIris = iris(props.values().stream().filter(PropInfo::data).map(PropInfo::iri).toList());
        Map<String, String> overrides = overrides();
        naming.setHome(homeNamespace(classIris, relIris, keyIris));
        Map<String, String> labelName = naming.assign(TermKind.LABEL, classIris, overrides, issues);
        Map<String, String> relName = naming.assign(TermKind.RELATIONSHIP, relIris, overrides, issues);
        Map<String, String> keyName = naming.assign(TermKind.PROPERTY, keyIris, overrides, issues);

        reportCycles(classes, labelName);
        reportMixed(props.values());

        List<NodeLabel> labels = new ArrayList<>();
        for (String iri : classIris) {
            Node c = Vocab.iri(iri);
            Set<String> supers = namesOf(objects(c, Vocab.SUB_CLASS_OF), labelName);
            supers.remove(labelName.get(iri));
            Set<String> equivalents = namesOf(objects(c, Vocab.EQUIVALENT_CLASS), labelName);
            equivalents.addAll(namesOf(subjects(Vocab.EQUIVALENT_CLASS, c), labelName));
            equivalents.remove(labelName.get(iri));
            labels.add(new NodeLabel(info(TermKind.LABEL, c, labelName.get(iri)), supers, equivalents));
        }

        List<RelType> rels = new ArrayList<>();
        for (String iri : relIris) {
            PropInfo p = props.get(Vocab.iri(iri));
            rels.add(relType(p, relName.get(iri), labelName, relName));
        }
        List<PropertyKey> keys = new ArrayList<>();
        for (String iri : keyIris) {
            PropInfo p = props.get(Vocab.iri(iri));
            keys.add(propertyKey(p, keyName.get(iri), labelName, keyName));
        }
        return GraphSchema.of(sourceHash, labels, rels, keys, issues);
    }

    // ---------------------------------------------------------------- classes

    private Set<Node> classes() {
        Set<Node> out = new TreeSet<>(BY_IRI);
        for (Node t : List.of(Vocab.OWL_CLASS, Vocab.RDFS_CLASS)) subjects(Vocab.TYPE, t).forEach(n -> addClass(n, out));
        for (Node p : List.of(Vocab.SUB_CLASS_OF, Vocab.EQUIVALENT_CLASS)) {
            g.find(Node.ANY, p, Node.ANY).forEach(t -> {
                addClass(t.getSubject(), out);
                expandClassExpr(t.getObject()).forEach(n -> addClass(n, out));
            });
        }
        for (Node p : concat(domainPreds, rangePreds)) {
            g.find(Node.ANY, p, Node.ANY).forEach(t -> expandClassExpr(t.getObject()).forEach(n -> addClass(n, out)));
        }
        g.find(Node.ANY, Vocab.UNION_OF, Node.ANY).forEach(t -> list(t.getObject()).forEach(n -> addClass(n, out)));
        return out;
    }

    private void addClass(Node n, Set<Node> out) {
        if (n.isURI() && !Vocab.isBuiltIn(n) && !isDatatype(n)) out.add(n);
    }

    /** Named classes of a class expression: itself, or the members of a union (nested unions flattened). */
    private List<Node> expandClassExpr(Node n) {
        List<Node> out = new ArrayList<>();
        expandInto(n, out, new HashSet<>());
        return out;
    }

    /** @return false when some part is neither a named class nor a union (an unsupported expression) */
    private boolean expandInto(Node n, List<Node> out, Set<Node> seen) {
        if (n.isURI()) {
            out.add(n);
            return true;
        }
        if (!n.isBlank() || !seen.add(n)) return false;
        List<Node> unions = objects(n, Vocab.UNION_OF);
        if (unions.isEmpty()) return false;
        boolean ok = true;
        for (Node u : unions) for (Node m : list(u)) ok &= expandInto(m, out, seen);
        return ok;
    }

    /** XSD and RDF literal types, declared datatypes, schema.org DataTypes, and their subclasses. */
    boolean isDatatype(Node n) {
        if (!n.isURI()) return false;
        Boolean memo = datatypeMemo.get(n);
        if (memo != null) return memo;
        datatypeMemo.put(n, false); // a subclass cycle must not loop
        boolean dt = n.getURI().startsWith(Vocab.XSD) || Vocab.LITERAL_CLASSES.contains(n)
                || g.contains(n, Vocab.TYPE, Vocab.DATATYPE)
                || Vocab.schemaBoth("DataType").stream().anyMatch(t -> g.contains(n, Vocab.TYPE, t));
        if (!dt) {
            for (Node sup : objects(n, Vocab.SUB_CLASS_OF)) {
                if (isDatatype(sup)) {
                    dt = true;
                    break;
                }
            }
        }
        datatypeMemo.put(n, dt);
        return dt;
    }

    // ---------------------------------------------------------------- properties

    private Map<Node, PropInfo> properties(Set<Node> classes) {
        Set<Node> candidates = new TreeSet<>(BY_IRI);
        for (Node t : Vocab.PROPERTY_TYPES) subjects(Vocab.TYPE, t).forEach(n -> { if (n.isURI()) candidates.add(n); });
        for (Node p : concat(domainPreds, rangePreds)) {
            g.find(Node.ANY, p, Node.ANY).forEach(t -> { if (t.getSubject().isURI()) candidates.add(t.getSubject()); });
        }
        candidates.removeIf(n -> Vocab.isBuiltIn(n) || isAnnotationOnly(n));
        Map<Node, PropInfo> out = new TreeMap<>(BY_IRI);
        for (Node p : candidates) out.put(p, classify(p, classes));
        return out;
    }

    private boolean isAnnotationOnly(Node p) {
        return g.contains(p, Vocab.TYPE, Vocab.ANNOTATION_PROPERTY)
                && !g.contains(p, Vocab.TYPE, Vocab.OBJECT_PROPERTY) && !g.contains(p, Vocab.TYPE, Vocab.DATATYPE_PROPERTY);
    }

    private PropInfo classify(Node p, Set<Node> classes) {
        Set<Node> domains = new TreeSet<>(BY_IRI);
        boolean anyDomain = collect(p, domainPreds, "domain", domains, classes);
        Set<Node> rangeNodes = new TreeSet<>(BY_IRI);
        boolean anyRange = collect(p, rangePreds, "range", rangeNodes, null);
        Set<Node> classRanges = new TreeSet<>(BY_IRI);
        Set<Node> dataRanges = new TreeSet<>(BY_IRI);
        boolean openRange = false;
        for (Node r : rangeNodes) {
            if (isDatatype(r)) dataRanges.add(r);
            else if (classes.contains(r)) classRanges.add(r);
            else openRange = true; // owl:Thing, rdfs:Resource: any class
        }
        boolean declaredObject = g.contains(p, Vocab.TYPE, Vocab.OBJECT_PROPERTY);
        boolean declaredData = g.contains(p, Vocab.TYPE, Vocab.DATATYPE_PROPERTY);
        boolean object;
        boolean data;
        if (declaredObject || declaredData) {
            object = declaredObject;
            data = declaredData;
        } else {
            object = !classRanges.isEmpty() || openRange;
            data = !dataRanges.isEmpty();
            if (!object && !data) {
                object = Vocab.OBJECT_ONLY_CHARACTERISTICS.stream().anyMatch(t -> g.contains(p, Vocab.TYPE, t))
                        || inversePreds.stream().anyMatch(ip -> g.contains(p, ip, Node.ANY) || g.contains(Node.ANY, ip, p));
                data = !object;
            }
        }
        boolean anyClassRange = anyRange || openRange || classRanges.isEmpty();
        return new PropInfo(p, domains, anyDomain || domains.isEmpty(), classRanges, anyClassRange, dataRanges, object, data);
    }

    /**
     * Collects the named members of the property's domain or range statements into {@code out}.
     *
     * @param keep when not null, only members in this set are kept (others, such as owl:Thing, mean any class)
     * @return true when some statement says "any class" (owl:Thing, rdfs:Resource, an unsupported expression)
     */
    private boolean collect(Node p, List<Node> preds, String what, Set<Node> out, Set<Node> keep) {
        boolean any = false;
        for (Node pred : preds) {
            for (Node o : objects(p, pred)) {
                List<Node> members = new ArrayList<>();
                if (!expandInto(o, members, new HashSet<>())) {
                    issues.add(Diagnostic.at(Code.UNSUPPORTED_DOMAIN, Span.NONE, naming.compact(p.getURI()), what));
                    any = true;
                }
                for (Node m : members) {
                    if (keep == null || keep.contains(m)) out.add(m);
                    else if (!isDatatype(m)) any = true;
                }
            }
        }
        return any;
    }

    private RelType relType(PropInfo p, String name, Map<String, String> labelName, Map<String, String> relName) {
        List<String> froms = new ArrayList<>(namesOf(p.domains(), labelName));
        if (p.anyDomain()) froms.add(null);
        List<String> tos = new ArrayList<>(namesOf(p.classRanges(), labelName));
        if (p.anyRange()) tos.add(null);
        Set<Endpoint> endpoints = new LinkedHashSet<>();
        for (String f : froms) for (String t : tos) endpoints.add(new Endpoint(f, t));
        Set<String> supers = namesOf(objects(p.iri(), Vocab.SUB_PROPERTY_OF), relName);
        supers.remove(name);
        Set<String> inverses = new TreeSet<>();
        for (Node ip : inversePreds) {
            inverses.addAll(namesOf(objects(p.iri(), ip), relName));
            inverses.addAll(namesOf(subjects(ip, p.iri()), relName));
        }
        boolean symmetric = g.contains(p.iri(), Vocab.TYPE, Vocab.SYMMETRIC);
        // A symmetric property declared as its own inverse is just symmetric.
        if (inverses.remove(name)) symmetric = true;
        Optional<String> inverse = inverses.stream().findFirst();
        return new RelType(info(TermKind.RELATIONSHIP, p.iri(), name), List.copyOf(endpoints), supers, inverse, symmetric);
    }

    private PropertyKey propertyKey(PropInfo p, String name, Map<String, String> labelName, Map<String, String> keyName) {
        Set<String> domains = p.anyDomain() ? Set.of() : namesOf(p.domains(), labelName);
        Set<ValueType> types = new TreeSet<>();
        for (Node d : p.dataRanges()) types.add(valueType(d, new HashSet<>()));
        ValueType vt = types.size() == 1 ? types.iterator().next()
                : types.equals(Set.of(ValueType.INTEGER, ValueType.FLOAT)) ? ValueType.FLOAT : ValueType.ANY;
        Optional<String> datatype = p.dataRanges().size() == 1
                ? Optional.of(p.dataRanges().iterator().next().getURI()) : Optional.empty();
        Set<String> supers = namesOf(objects(p.iri(), Vocab.SUB_PROPERTY_OF), keyName);
        supers.remove(name);
        return new PropertyKey(info(TermKind.PROPERTY, p.iri(), name), domains, datatype, vt, supers);
    }

    /** The value type of a datatype, looking at its superclasses when it is itself unknown (schema:URL → Text). */
    private ValueType valueType(Node d, Set<Node> seen) {
        ValueType vt = ValueType.fromDatatype(d.getURI());
        if (vt != ValueType.ANY || !seen.add(d)) return vt;
        for (Node sup : objects(d, Vocab.SUB_CLASS_OF)) {
            if (sup.isURI()) {
                ValueType v = valueType(sup, seen);
                if (v != ValueType.ANY) return v;
            }
        }
        return ValueType.ANY;
    }

    /** The namespace holding the most terms: the ontology's own, whose terms keep plain names in a collision. */
    private static String homeNamespace(List<String> a, List<String> b, List<String> c) {
        Map<String, Integer> counts = new TreeMap<>();
        for (List<String> l : List.of(a, b, c)) for (String iri : l) counts.merge(Naming.namespace(iri), 1, Integer::sum);
        String best = null;
        for (Map.Entry<String, Integer> e : counts.entrySet()) {
            if (best == null || e.getValue() > counts.get(best)) best = e.getKey();
        }
        return best;
    }

    // ---------------------------------------------------------------- annotations

    private TermInfo info(TermKind kind, Node iri, String name) {
        List<LangString> labels = texts(iri, Vocab.LABEL);
        labels.addAll(texts(iri, Vocab.PREF_LABEL));
        List<LangString> alt = texts(iri, Vocab.ALT_LABEL);
        List<LangString> comments = texts(iri, Vocab.COMMENT);
        if (comments.isEmpty()) comments = texts(iri, Vocab.DEFINITION);
        boolean deprecated = objects(iri, Vocab.DEPRECATED).stream()
                .anyMatch(o -> o.isLiteral() && "true".equalsIgnoreCase(o.getLiteralLexicalForm().strip()))
                || supersededPreds.stream().anyMatch(sp -> g.contains(iri, sp, Node.ANY));
        return new TermInfo(kind, iri.getURI(), name, labels, alt, comments, deprecated);
    }

    private List<LangString> texts(Node s, Node p) {
        List<LangString> out = new ArrayList<>();
        for (Node o : objects(s, p)) {
            if (o.isLiteral() && !o.getLiteralLexicalForm().isBlank()) {
                out.add(new LangString(o.getLiteralLexicalForm().strip(), o.getLiteralLanguage()));
            }
        }
        out.sort(Comparator.comparing(LangString::lang).thenComparing(LangString::text));
        return out;
    }

    private Map<String, String> overrides() {
        Map<String, String> out = new HashMap<>();
        g.find(Node.ANY, Vocab.GRAPH_NAME, Node.ANY).forEach(t -> {
            if (t.getSubject().isURI() && t.getObject().isLiteral()) {
                out.putIfAbsent(t.getSubject().getURI(), t.getObject().getLiteralLexicalForm());
            }
        });
        return out;
    }

    // ---------------------------------------------------------------- problems

    private void reportPunning(Set<Node> classes, Set<Node> props) {
        for (Node c : classes) {
            if (props.contains(c)) issues.add(Diagnostic.at(Code.PUNNED_TERM, Span.NONE, naming.compact(c.getURI())));
        }
    }

    /** Strongly connected parts of the subclass graph (Tarjan), each reported once. */
    private void reportCycles(Set<Node> classes, Map<String, String> labelName) {
        Map<Node, Integer> index = new HashMap<>();
        Map<Node, Integer> low = new HashMap<>();
        Deque<Node> stack = new ArrayDeque<>();
        Set<Node> onStack = new HashSet<>();
        int[] counter = {0};
        for (Node c : classes) {
            if (!index.containsKey(c)) strongConnect(c, classes, index, low, stack, onStack, counter, labelName);
        }
    }

    private void strongConnect(Node start, Set<Node> classes, Map<Node, Integer> index, Map<Node, Integer> low,
                               Deque<Node> stack, Set<Node> onStack, int[] counter, Map<String, String> labelName) {
        // Iterative to survive deep hierarchies without a stack overflow.
        Deque<Object[]> work = new ArrayDeque<>();
        work.push(new Object[] {start, supers(start, classes).iterator()});
        index.put(start, counter[0]);
        low.put(start, counter[0]++);
        stack.push(start);
        onStack.add(start);
        while (!work.isEmpty()) {
            Object[] frame = work.peek();
            Node v = (Node) frame[0];
            @SuppressWarnings("unchecked")
            java.util.Iterator<Node> it = (java.util.Iterator<Node>) frame[1];
            if (it.hasNext()) {
                Node w = it.next();
                if (!index.containsKey(w)) {
                    index.put(w, counter[0]);
                    low.put(w, counter[0]++);
                    stack.push(w);
                    onStack.add(w);
                    work.push(new Object[] {w, supers(w, classes).iterator()});
                } else if (onStack.contains(w)) {
                    low.put(v, Math.min(low.get(v), index.get(w)));
                }
                continue;
            }
            work.pop();
            if (!work.isEmpty()) {
                Node parent = (Node) work.peek()[0];
                low.put(parent, Math.min(low.get(parent), low.get(v)));
            }
            if (low.get(v).equals(index.get(v))) {
                List<String> component = new ArrayList<>();
                Node w;
                do {
                    w = stack.pop();
                    onStack.remove(w);
                    component.add(labelName.get(w.getURI()));
                } while (!w.equals(v));
                if (component.size() > 1) {
                    component.sort(null);
                    issues.add(Diagnostic.at(Code.SUBCLASS_CYCLE, Span.NONE, Quote.andList(component)));
                }
            }
        }
    }

    private List<Node> supers(Node c, Set<Node> classes) {
        return objects(c, Vocab.SUB_CLASS_OF).stream().filter(s -> s.isURI() && classes.contains(s) && !s.equals(c)).toList();
    }

    private void reportMixed(java.util.Collection<PropInfo> props) {
        List<String> mixed = props.stream().filter(p -> p.object() && p.data()).map(p -> naming.compact(p.iri().getURI())).toList();
        if (!mixed.isEmpty()) {
            issues.add(Diagnostic.at(Code.MIXED_RANGE, Span.NONE, mixed.size(),
                    Quote.andList(mixed.subList(0, Math.min(3, mixed.size())))));
        }
    }

    // ---------------------------------------------------------------- graph helpers

    private List<Node> objects(Node s, Node p) {
        return g.find(s, p, Node.ANY).mapWith(Triple::getObject).toList();
    }

    private List<Node> subjects(Node p, Node o) {
        return g.find(Node.ANY, p, o).mapWith(Triple::getSubject).toList();
    }

    /** The members of an RDF list; stops at a malformed or cyclic list rather than failing. */
    List<Node> list(Node head) {
        List<Node> out = new ArrayList<>();
        Set<Node> seen = new HashSet<>();
        Node cur = head;
        while (cur != null && !cur.equals(Vocab.NIL) && seen.add(cur)) {
            List<Node> first = objects(cur, Vocab.FIRST);
            if (first.isEmpty()) break;
            out.add(first.get(0));
            List<Node> rest = objects(cur, Vocab.REST);
            cur = rest.isEmpty() ? null : rest.get(0);
        }
        return out;
    }

    private static Set<String> namesOf(java.util.Collection<Node> nodes, Map<String, String> names) {
        Set<String> out = new TreeSet<>();
        for (Node n : nodes) {
            if (n.isURI()) {
                String name = names.get(n.getURI());
                if (name != null) out.add(name);
            }
        }
        return out;
    }

    private static List<String> iris(java.util.Collection<Node> nodes) {
        return nodes.stream().map(Node::getURI).sorted().toList();
    }

    private static List<Node> concat(Node a, List<Node> rest) {
        List<Node> out = new ArrayList<>();
        out.add(a);
        out.addAll(rest);
        return List.copyOf(out);
    }

    private static List<Node> concat(List<Node> a, List<Node> b) {
        List<Node> out = new ArrayList<>(a);
        out.addAll(b);
        return List.copyOf(out);
    }
}

package dev.termgate.ontology;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Span;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.ValueType;
import org.apache.jena.graph.Node;
import org.apache.jena.graph.Triple;

import java.math.BigInteger;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.LocalTime;
import java.time.OffsetDateTime;
import java.time.OffsetTime;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;

/**
 * Reads RDF instance data (any syntax the ontology loader reads) and maps it through a schema:
 * {@code rdf:type} of a known class → a label; a statement whose predicate is a property key and whose object is a
 * literal → a typed property value; a statement whose predicate is a relationship type and whose object is a
 * resource → an edge. Everything else is counted per term and reported ({@link Code#UNKNOWN_DATA_TERM},
 * {@link Code#DATA_KIND_MISMATCH}); nothing is dropped silently. {@code rdf:type} of the OWL/RDFS vocabulary
 * ({@code owl:NamedIndividual} …) says nothing about the domain and is skipped.
 */
public final class InstanceReader {

    private final GraphSchema schema;
    private final Map<String, String> labelByIri = new HashMap<>();
    private final Map<String, String> relByIri = new HashMap<>();
    private final Map<String, PropertyKey> keyByIri = new HashMap<>();

    private final Map<String, Building> nodes = new LinkedHashMap<>();
    private final Set<DataEdge> edges = new LinkedHashSet<>();
    private final Map<String, Integer> unknown = new TreeMap<>();
    private final Map<String, Integer> literalForRel = new TreeMap<>();
    private final Map<String, Integer> resourceForKey = new TreeMap<>();
    private final Map<String, List<String>> badValues = new TreeMap<>();

    private InstanceReader(GraphSchema schema) {
        this.schema = schema;
        for (NodeLabel l : schema.labels().values()) labelByIri.put(l.info().iri(), l.name());
        for (RelType r : schema.relTypes().values()) relByIri.put(r.info().iri(), r.name());
        for (PropertyKey p : schema.properties().values()) keyByIri.put(p.info().iri(), p);
    }

    /** A node under construction. */
    private static final class Building {
        final Set<String> labels = new LinkedHashSet<>();
        final Map<String, List<Object>> props = new LinkedHashMap<>();
    }

    /**
     * @param sources files, URLs, TDB2 directories or {@code sparql:URL} (the whole store is not fetched from an
     *                endpoint: only schema statements are, so use files for data)
     * @throws OntologyException when a source cannot be read or parsed
     */
    public static InstanceData read(List<String> sources, GraphSchema schema) {
        SourceReader.Sink sink = SourceReader.Sink.create();
        for (String s : sources) {
            if (SourceReader.isUrl(s)) SourceReader.readUrl(s, sink);
            else if (SourceReader.isContent(s)) SourceReader.parse(SourceReader.readContent(s), sink);
            else if (!SourceReader.isSparql(s)) SourceReader.readTdb2(s, sink);
            else throw SourceReader.unreadable(s, "instance data is read from files, URLs or TDB2 directories");
        }
        InstanceReader r = new InstanceReader(schema);
        sink.graph().find().forEach(r::accept);
        return r.result();
    }

    public static InstanceData read(String source, GraphSchema schema) {
        return read(List.of(source), schema);
    }

    private void accept(Triple t) {
        Node s = t.getSubject();
        Node p = t.getPredicate();
        Node o = t.getObject();
        String pIri = p.getURI();
        if (p.equals(Vocab.TYPE)) {
            if (!o.isURI() || Vocab.isBuiltIn(o)) return;
            String label = labelByIri.get(o.getURI());
            if (label == null) count(unknown, "<" + o.getURI() + ">");
            else node(s).labels.add(label);
            return;
        }
        if (o.isLiteral()) {
            PropertyKey key = keyByIri.get(pIri);
            if (key != null) node(s).props.computeIfAbsent(key.name(), k -> new ArrayList<>()).add(value(o, key));
            else if (relByIri.containsKey(pIri)) count(literalForRel, relByIri.get(pIri));
            else count(unknown, "<" + pIri + ">");
            return;
        }
        String rel = relByIri.get(pIri);
        if (rel != null) {
            node(s);
            node(o);
            edges.add(new DataEdge(id(s), rel, id(o)));
        } else if (keyByIri.containsKey(pIri)) {
            count(resourceForKey, keyByIri.get(pIri).name());
        } else {
            count(unknown, "<" + pIri + ">");
        }
    }

    private Building node(Node n) {
        return nodes.computeIfAbsent(id(n), k -> new Building());
    }

    private static String id(Node n) {
        return n.isBlank() ? "_:" + n.getBlankNodeLabel() : n.getURI();
    }

    private static void count(Map<String, Integer> m, String key) {
        m.merge(key, 1, Integer::sum);
    }

    /** The literal as a Java value, by its datatype, or by the key's value type for plain strings. */
    private Object value(Node lit, PropertyKey key) {
        String lex = lit.getLiteralLexicalForm();
        String dt = lit.getLiteralDatatypeURI();
        ValueType byLiteral = dt == null ? ValueType.STRING : ValueType.fromDatatype(dt);
        ValueType want = byLiteral == ValueType.STRING && !lit.getLiteralLanguage().isEmpty() ? ValueType.STRING
                : byLiteral == ValueType.STRING || byLiteral == ValueType.ANY ? key.valueType() : byLiteral;
        if (want == ValueType.ANY || want == ValueType.STRING) return lex;
        try {
            return convert(lex.strip(), want);
        } catch (RuntimeException e) {
            badValues.computeIfAbsent(key.name() + "\0" + want.word(), k -> new ArrayList<>()).add(lex);
            return lex;
        }
    }

    static Object convert(String lex, ValueType type) {
        return switch (type) {
            case INTEGER -> {
                BigInteger b = new BigInteger(lex.startsWith("+") ? lex.substring(1) : lex);
                yield b.bitLength() < 64 ? (Object) b.longValue() : (Object) b.doubleValue();
            }
            case FLOAT -> switch (lex) {
                case "INF" -> Double.POSITIVE_INFINITY;
                case "-INF" -> Double.NEGATIVE_INFINITY;
                case "NaN" -> Double.NaN;
                default -> Double.parseDouble(lex);
            };
            case BOOLEAN -> switch (lex) {
                case "true", "1" -> Boolean.TRUE;
                case "false", "0" -> Boolean.FALSE;
                default -> throw new IllegalArgumentException(lex);
            };
            case DATE -> LocalDate.parse(stripZone(lex));
            case DATETIME, LOCALDATETIME -> dateTime(lex);
            case TIME -> hasOffset(lex) ? OffsetTime.parse(zulu(lex)) : LocalTime.parse(lex);
            default -> lex;
        };
    }

    /** xsd:dateTime with a time zone → OffsetDateTime, without → LocalDateTime (XSD allows both). */
    private static Object dateTime(String lex) {
        try {
            return hasOffset(lex) ? OffsetDateTime.parse(zulu(lex)) : LocalDateTime.parse(lex);
        } catch (DateTimeParseException e) {
            throw new IllegalArgumentException(lex, e);
        }
    }

    private static boolean hasOffset(String lex) {
        if (lex.endsWith("Z")) return true;
        int t = lex.indexOf('T');
        String tail = t >= 0 ? lex.substring(t) : lex.length() > 8 ? lex.substring(lex.length() - 6) : lex;
        return tail.matches(".*[+-]\\d\\d:\\d\\d$");
    }

    private static String zulu(String lex) {
        return lex.endsWith("Z") ? lex.substring(0, lex.length() - 1) + "+00:00" : lex;
    }

    /** xsd:date may carry a time zone, which LocalDate cannot hold; the calendar date is kept. */
    private static String stripZone(String lex) {
        if (lex.endsWith("Z")) return lex.substring(0, lex.length() - 1);
        return lex.length() > 10 && lex.substring(10).matches("[+-]\\d\\d:\\d\\d") ? lex.substring(0, 10) : lex;
    }

    private InstanceData result() {
        List<DataNode> out = new ArrayList<>(nodes.size());
        for (Map.Entry<String, Building> e : new TreeMap<>(nodes).entrySet()) {
            Map<String, Object> props = new LinkedHashMap<>();
            // Several values of one key become a list, sorted by text so that the result does not depend on
            // the order the store returns statements in.
            e.getValue().props.forEach((k, v) -> props.put(k, v.size() == 1 ? v.get(0)
                    : v.stream().sorted(java.util.Comparator.comparing(String::valueOf)).toList()));
            out.add(new DataNode(e.getKey(), e.getValue().labels, props));
        }
        List<Diagnostic> problems = new ArrayList<>();
        unknown.forEach((term, n) -> problems.add(Diagnostic.at(Code.UNKNOWN_DATA_TERM, Span.NONE, term, n)));
        literalForRel.forEach((rel, n) -> problems.add(Diagnostic.at(Code.DATA_KIND_MISMATCH, Span.NONE,
                "'" + rel + "'", "relationship type", n, "a literal value")));
        resourceForKey.forEach((key, n) -> problems.add(Diagnostic.at(Code.DATA_KIND_MISMATCH, Span.NONE,
                "'" + key + "'", "property key", n, "a resource (IRI or blank node) value")));
        badValues.forEach((k, vals) -> {
            String[] parts = k.split("\0");
            problems.add(Diagnostic.at(Code.BAD_DATA_VALUE, Span.NONE, vals.size(), "'" + parts[0] + "'", parts[1], vals.get(0)));
        });
        List<DataEdge> sortedEdges = new ArrayList<>(edges);
        sortedEdges.sort(java.util.Comparator.comparing(DataEdge::from).thenComparing(DataEdge::type).thenComparing(DataEdge::to));
        return new InstanceData(out, sortedEdges, problems);
    }

    /** The schema the data was mapped through. */
    GraphSchema schema() {
        return schema;
    }
}

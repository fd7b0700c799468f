package dev.termgate.analyze;

import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Node;
import dev.termgate.query.Pattern;
import dev.termgate.query.Span;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.Collections;
import java.util.Comparator;
import java.util.IdentityHashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** What the checks of one analysis share: the schema, the collector, and the facts {@link ScopeCheck} records. */
final class Context {

    /** A path pattern of the query; {@code mandatory} for MATCH (not OPTIONAL, not inside an expression). */
    record PatternUse(Pattern.Part part, boolean mandatory) {}

    /** {@code target.key} (or a map-projection / pattern-map key) on a binding of the given static type. */
    record PropertyUse(Node node, String key, Binding target, Span keySpan) {}

    final GraphSchema schema;
    final SchemaIndex index;

    private final List<Diagnostic> diagnostics = new ArrayList<>();
    private final List<Fix> fixes = new ArrayList<>();
    private final Map<Node, Binding> bindings = new IdentityHashMap<>();
    final List<PatternUse> patterns = new ArrayList<>();
    final List<PropertyUse> properties = new ArrayList<>();
    private final Map<String, TermUseBuilder> terms = new LinkedHashMap<>();

    private List<Node> all;
    private Map<Class<?>, List<Node>> byClass;

    Context(GraphSchema schema, SchemaIndex index) {
        this.schema = schema;
        this.index = index;
    }

    /**
     * Every node of the query of the given type, in pre-order. The tree is walked once per analysis and shared
     * by the checks, grouped by record class on the way, so a check asking for one class does not scan the rest.
     */
    @SuppressWarnings("unchecked")
    <T extends Node> List<T> nodes(Node root, Class<T> type) {
        if (all == null) {
            all = new ArrayList<>(64);
            byClass = new IdentityHashMap<>();
            dev.termgate.query.Trees.walk(root, n -> {
                all.add(n);
                byClass.computeIfAbsent(n.getClass(), k -> new ArrayList<>(4)).add(n);
            });
        }
        if (java.lang.reflect.Modifier.isFinal(type.getModifiers())) {
            // one record class: its nodes were gathered during the walk, in pre-order
            List<Node> same = byClass.get(type);
            return same == null ? List.of() : (List<T>) Collections.unmodifiableList(same);
        }
        List<T> out = new ArrayList<>();
        for (Node n : all) if (type.isInstance(n)) out.add((T) n);
        return out;
    }

    boolean hasSchema() {
        return schema != null;
    }

    void report(Diagnostic d) {
        diagnostics.add(d);
    }

    void report(Diagnostic d, List<Candidate> candidates) {
        List<String> names = candidates.stream().map(Candidate::after).distinct().toList();
        Diagnostic withNames = names.isEmpty() ? d : d.withSuggestions(names);
        diagnostics.add(withNames);
        if (!candidates.isEmpty()) fixes.add(new Fix(withNames, candidates));
    }

    void bind(Node node, Binding b) {
        bindings.put(node, b);
    }

    /** The binding a variable reference, node pattern or relationship pattern stands for; null if unknown. */
    Binding binding(Node node) {
        return bindings.get(node);
    }

    void use(TermKind kind, String name, Span span, TermUse.Via via) {
        if (schema == null) return;
        TermInfo info = switch (kind) {
            case LABEL -> schema.label(name).map(l -> l.info()).orElse(null);
            case RELATIONSHIP -> schema.relType(name).map(r -> r.info()).orElse(null);
            case PROPERTY -> schema.property(name).map(p -> p.info()).orElse(null);
        };
        if (info == null) return;
        TermUseBuilder b = terms.computeIfAbsent(kind + "\u0000" + name, k -> new TermUseBuilder(kind, name, info.iri()));
        if (span != null && !b.spans.contains(span)) b.spans.add(span);
        if (via != TermUse.Via.DIRECT && b.via == TermUse.Via.DIRECT) b.via = via;
    }

    Analysis result() {
        List<Diagnostic> sorted = new ArrayList<>(diagnostics);
        // Source order reads best; the sort is stable so diagnostics at one place keep the checks' order.
        sorted.sort(Comparator.comparingInt((Diagnostic d) -> d.span().isNone() ? Integer.MAX_VALUE : d.span().startOffset()));
        List<TermUse> uses = terms.values().stream().map(TermUseBuilder::build).toList();
        return new Analysis(sorted, fixes, uses);
    }

    private static final class TermUseBuilder {
        final TermKind kind;
        final String name;
        final String iri;
        final List<Span> spans = new ArrayList<>();
        TermUse.Via via = TermUse.Via.DIRECT;

        TermUseBuilder(TermKind kind, String name, String iri) {
            this.kind = kind;
            this.name = name;
            this.iri = iri;
        }

        TermUse build() {
            List<Span> sorted = new ArrayList<>(spans);
            sorted.sort(Comparator.comparingInt(Span::startOffset));
            return new TermUse(kind, name, iri, sorted, via);
        }
    }
}

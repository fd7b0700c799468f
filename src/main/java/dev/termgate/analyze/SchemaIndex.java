package dev.termgate.analyze;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.Names;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.Collection;
import java.util.Arrays;
import java.util.HashMap;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;

/**
 * Per-schema lookups the checks need, computed once per term on first use and kept: the class sets behind a
 * label, the endpoint pairs behind a relationship type, the classes that may carry a property key, and the
 * lenient name index. Thread-safe; shared by every analysis against the same schema.
 */
final class SchemaIndex {

    /**
     * One way a relationship type may connect two classes, and through which ontology statement.
     * {@code fromName} and {@code toName} are the classes the ontology declares (domain and range, read off the
     * inverse or a super-property as {@code via} says), null for "any class": messages name these, not the
     * query's labels.
     */
    record Pair(Cand from, Cand to, TermUse.Via via, String fromName, String toName) {
        static final Pair ANY = new Pair(Cand.ANY, Cand.ANY, TermUse.Via.DIRECT, null, null);

        Pair reversed(TermUse.Via how) {
            return new Pair(to, from, how, toName, fromName);
        }
    }

    final GraphSchema schema;
    private final Map<String, Cand> labelClasses = new ConcurrentHashMap<>();
    private final Map<String, List<Pair>> pairs = new ConcurrentHashMap<>();
    private final Map<String, Cand> propertyClasses = new ConcurrentHashMap<>();
    private final Map<TermKind, Lenient> lenient = new EnumMap<>(TermKind.class);

    /** Each label's class id (its position in the schema), and back: {@link Cand} holds ids, not names. */
    private final Map<String, Integer> classIds = new HashMap<>();
    private final String[] classNames;

    SchemaIndex(GraphSchema schema) {
        this.schema = schema;
        this.classNames = schema.labels().keySet().toArray(new String[0]);
        for (int i = 0; i < classNames.length; i++) classIds.put(classNames[i], i);
    }

    /** The classes a node labelled {@code label} may be (the label and its subclasses); ANY when unknown. */
    Cand classesOf(String label) {
        return labelClasses.computeIfAbsent(label, l ->
                schema.labels().containsKey(l) ? idsOf(schema.subLabels(l)) : Cand.ANY);
    }

    /** Whether the set holds one of the named classes. */
    boolean holdsAny(Cand c, Collection<String> labels) {
        for (String l : labels) {
            Integer id = classIds.get(l);
            if (id != null && c.holds(id)) return true;
        }
        return false;
    }

    private Cand idsOf(Set<String> labels) {
        if (labels.size() > Cand.LIMIT) return Cand.ANY;
        int[] ids = new int[labels.size()];
        int n = 0;
        for (String l : labels) {
            Integer id = classIds.get(l);
            if (id != null) ids[n++] = id;
        }
        ids = Arrays.copyOf(ids, n);
        Arrays.sort(ids);
        return Cand.of(ids, classNames);
    }

    /** The classes on which the key may appear (domains and their subclasses); ANY for a domain-free key. */
    Cand carriersOf(String key) {
        return propertyClasses.computeIfAbsent(key, k -> {
            Optional<PropertyKey> p = schema.property(k);
            if (p.isEmpty() || p.get().anyDomain()) return Cand.ANY;
            Cand c = Cand.NONE;
            for (String d : p.get().domains()) {
                c = c.or(schema.labels().containsKey(d) ? classesOf(d) : Cand.ANY);
                if (c.any()) break;
            }
            return c;
        });
    }

    /**
     * Every (from, to) a relationship of this type (or of one of its sub-properties, which {@code [:TYPE]} also
     * matches) may connect, most direct first. One pair (ANY, ANY) when the ontology says nothing.
     */
    List<Pair> pairsOf(String type) {
        return pairs.computeIfAbsent(type, this::computePairs);
    }

    private List<Pair> computePairs(String type) {
        RelType r = schema.relTypes().get(type);
        if (r == null) return List.of(Pair.ANY);
        List<Pair> out = new ArrayList<>();
        for (Endpoint e : r.endpoints()) out.add(pair(e, false, TermUse.Via.DIRECT));
        r.inverseOf().map(schema.relTypes()::get)
                .ifPresent(inv -> inv.endpoints().forEach(e -> out.add(pair(e, true, TermUse.Via.INVERSE))));
        for (String sup : schema.superRelTypes(type)) {
            if (sup.equals(type)) continue;
            RelType s = schema.relTypes().get(sup);
            if (s == null) continue;
            for (Endpoint e : s.endpoints()) out.add(pair(e, false, TermUse.Via.SUPERPROPERTY));
            s.inverseOf().map(schema.relTypes()::get)
                    .ifPresent(inv -> inv.endpoints().forEach(e -> out.add(pair(e, true, TermUse.Via.INVERSE))));
        }
        boolean declared = !out.isEmpty();
        for (String sub : schema.subRelTypes(type)) {
            if (sub.equals(type)) continue;
            RelType s = schema.relTypes().get(sub);
            if (s == null) continue;
            for (Endpoint e : s.endpoints()) out.add(pair(e, false, TermUse.Via.SUBPROPERTY));
        }
        if (!declared) {
            // No domain or range anywhere above: any class may take part, whatever sub-properties narrow.
            return List.of(Pair.ANY);
        }
        if (r.symmetric() || schema.superRelTypes(type).stream().map(schema.relTypes()::get)
                .anyMatch(s -> s != null && s.symmetric())) {
            List<Pair> reversed = out.stream().map(p -> p.reversed(TermUse.Via.SYMMETRIC)).toList();
            out.addAll(reversed);
        }
        return List.copyOf(out);
    }

    private Pair pair(Endpoint e, boolean reverse, TermUse.Via via) {
        Cand from = e.anyFrom() ? Cand.ANY : classesOfOrAny(e.from());
        Cand to = e.anyTo() ? Cand.ANY : classesOfOrAny(e.to());
        Pair p = new Pair(from, to, via, e.anyFrom() ? null : e.from(), e.anyTo() ? null : e.to());
        return reverse ? p.reversed(via) : p;
    }

    private Cand classesOfOrAny(String label) {
        return classesOf(label);
    }

    /** Property keys whose name holds every word of {@code key} (e.g. {@code name} → {@code vesselName}). */
    List<String> keysWithWord(String key) {
        List<String> words = Names.words(key);
        if (words.isEmpty()) return List.of();
        Map<String, List<String>> idx = keyWords();
        List<String> out = new ArrayList<>();
        for (String k : idx.getOrDefault(words.get(0), List.of())) {
            if (Names.words(k).containsAll(words)) out.add(k);
        }
        out.sort(java.util.Comparator.comparingInt(String::length).thenComparing(s -> s));
        return out;
    }

    private volatile Map<String, List<String>> keyWords;

    private Map<String, List<String>> keyWords() {
        Map<String, List<String>> m = keyWords;
        if (m == null) {
            m = new java.util.HashMap<>();
            for (String k : schema.properties().keySet()) {
                for (String w : new java.util.LinkedHashSet<>(Names.words(k))) {
                    m.computeIfAbsent(w, x -> new ArrayList<>()).add(k);
                }
            }
            keyWords = m;
        }
        return m;
    }

    /** The lenient name index of one kind of term (built on first use: only a miss needs it). */
    Lenient lenient(TermKind kind) {
        synchronized (lenient) {
            return lenient.computeIfAbsent(kind, k -> new Lenient(schema.terms(k)));
        }
    }
}

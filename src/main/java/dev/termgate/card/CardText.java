package dev.termgate.card;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermInfo;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.SortedSet;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.WeakHashMap;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.Supplier;

/**
 * The card's text layout (termgate's own notation, documented in the README, "Schema card").
 *
 * <pre>
 * Vessel &lt; Asset {builtOn:date, imoNumber:string ~IMO number} ~ship/boat // A self-propelled craft
 * OPERATED_BY: Vessel|Barge->Company ~run by // Who runs it
 * </pre>
 *
 * One line per label and per relationship type, sorted by name (String order), so the same schema always
 * gives the same bytes. A label names its direct parents and lists only its own keys; a relationship type
 * lists its endpoint pairs once, grouped, and names its super type instead of repeating what it inherits.
 * Lines never start with white space, so the token count of the card is the sum of its lines' counts.
 */
final class CardText {

    static final String LANG = "en";

    static final String LEGEND = "# read: Label < Parent (also a Parent: has its keys and relationships) {key:type}"
            + " ~synonyms // note; TYPE: From->To, A|B either, * any label, <-> both ways";
    static final String LABELS = "[labels]";
    static final String RELATIONSHIPS = "[relationship types]";
    static final String DEPRECATED = " (deprecated)";
    static final String ANY = "*";

    private CardText() {}

    static String wholeHeader(GraphSchema s) {
        return "# schema card: " + counts(s.labels().size(), s.relTypes().size(), s.properties().size())
                + "; names are exact and case-sensitive";
    }

    static String questionHeader(GraphSchema s, CardScope scope) {
        return "# schema card for one question: " + scope.labels().size() + " of " + s.labels().size() + " labels, "
                + scope.relTypes().size() + " of " + s.relTypes().size() + " relationship types, "
                + scope.keys().size() + " of " + s.properties().size() + " property keys; names are exact";
    }

    static String leftOutFooter(int leftOut, int budget) {
        return "# not shown: " + leftOut + " more term" + (leftOut == 1 ? "" : "s") + " ranked for the question (over the "
                + budget + "-token budget)";
    }

    private static String counts(int labels, int rels, int keys) {
        return labels + " labels, " + rels + " relationship types, " + keys + " property keys";
    }

    /** The body: label lines, then relationship lines, each section with its heading when it has lines. */
    static List<String> body(GraphSchema s, CardScope scope) {
        Map<String, SortedSet<String>> ownKeys = ownKeys(s, scope);
        List<String> out = new ArrayList<>();
        for (String key : lineKeys(scope)) {
            String line = line(s, scope, ownKeys, key);
            if (line != null) out.add(line);
        }
        return out;
    }

    /*
     * Every line of the body has a key, so that a question card can re-render only the lines an added term
     * changes: LABELS_KEY and RELATIONSHIPS_KEY for the headings, "L:" + label, ANY for the domain-free keys,
     * "R:" + relationship type.
     */
    static final String LABELS_KEY = "[L]";
    static final String RELATIONSHIPS_KEY = "[R]";

    static String labelKey(String label) {
        return "L:" + label;
    }

    static String relKey(String rel) {
        return "R:" + rel;
    }

    /** The keys of the body's possible lines in print order. */
    static List<String> lineKeys(CardScope scope) {
        List<String> keys = new ArrayList<>(scope.size() + 3);
        keys.add(LABELS_KEY);
        for (String l : scope.labels()) keys.add(labelKey(l));
        keys.add(ANY);
        keys.add(RELATIONSHIPS_KEY);
        for (String r : scope.relTypes()) keys.add(relKey(r));
        return keys;
    }

    /** The line with this key, or {@code null} when the card has no such line. */
    static String line(GraphSchema s, CardScope scope, Map<String, SortedSet<String>> ownKeys, String key) {
        if (key.equals(LABELS_KEY)) {
            boolean any = scope.labels().stream().anyMatch(s.labels()::containsKey) || ownKeys.containsKey(ANY);
            return any ? LABELS : null;
        }
        if (key.equals(RELATIONSHIPS_KEY)) {
            return scope.relTypes().stream().anyMatch(s.relTypes()::containsKey) ? RELATIONSHIPS : null;
        }
        if (key.equals(ANY)) {
            SortedSet<String> anyKeys = ownKeys.get(ANY);
            return anyKeys == null || anyKeys.isEmpty() ? null : ANY + " " + keyList(s, anyKeys);
        }
        String name = key.substring(2);
        if (key.startsWith("L:")) {
            NodeLabel label = s.labels().get(name);
            return label == null || !scope.labels().contains(name) ? null
                    : labelLine(s, label, ownKeys.getOrDefault(name, new TreeSet<>()));
        }
        RelType rel = s.relTypes().get(name);
        return rel == null || !scope.relTypes().contains(name) ? null : relLine(s, scope, rel);
    }

    /** Keys of the scope by the shown label that declares them; domain-free keys under {@link #ANY}. */
    static Map<String, SortedSet<String>> ownKeys(GraphSchema s, CardScope scope) {
        Map<String, SortedSet<String>> out = new TreeMap<>();
        for (String k : scope.keys()) {
            PropertyKey key = s.properties().get(k);
            if (key == null) continue;
            if (key.anyDomain()) {
                out.computeIfAbsent(ANY, x -> new TreeSet<>()).add(k);
                continue;
            }
            for (String d : key.domains()) {
                if (scope.labels().contains(d)) out.computeIfAbsent(d, x -> new TreeSet<>()).add(k);
            }
        }
        return out;
    }

    static String labelLine(GraphSchema s, NodeLabel label, SortedSet<String> keys) {
        StringBuilder sb = new StringBuilder(label.name());
        if (!label.superLabels().isEmpty()) sb.append(" < ").append(String.join(", ", new TreeSet<>(label.superLabels())));
        if (!label.equivalents().isEmpty()) sb.append(" = ").append(String.join(", ", new TreeSet<>(label.equivalents())));
        if (!keys.isEmpty()) sb.append(' ').append(keyList(s, keys));
        appendNotes(s, sb, label.info());
        return sb.toString();
    }

    private static String keyList(GraphSchema s, SortedSet<String> keys) {
        StringBuilder sb = new StringBuilder("{");
        for (String k : keys) {
            if (sb.length() > 1) sb.append(", ");
            sb.append(memo(s, "k:" + k, () -> keyEntry(s.properties().get(k))));
        }
        return sb.append('}').toString();
    }

    static String relLine(GraphSchema s, CardScope scope, RelType rel) {
        StringBuilder sb = new StringBuilder(rel.name());
        if (!rel.superTypes().isEmpty()) sb.append(" < ").append(String.join(", ", new TreeSet<>(rel.superTypes())));
        List<Endpoint> pairs = shownEndpoints(s, scope, rel);
        if (!pairs.isEmpty()) sb.append(": ").append(endpointGroups(pairs, rel.symmetric()));
        rel.inverseOf().ifPresent(inv -> sb.append(" (inverse ").append(inv).append(')'));
        appendNotes(s, sb, rel.info());
        return sb.toString();
    }

    private static String keyEntry(PropertyKey key) {
        StringBuilder sb = new StringBuilder(key.name()).append(':').append(key.valueType().word());
        List<String> syn = Wording.synonyms(key.info(), LANG);
        if (!syn.isEmpty()) sb.append(" ~").append(String.join("/", syn));
        if (key.info().deprecated()) sb.append(DEPRECATED);
        return sb.toString();
    }

    private static void appendNotes(GraphSchema s, StringBuilder sb, TermInfo info) {
        sb.append(memo(s, "n:" + info.kind() + ":" + info.name(), () -> {
            StringBuilder notes = new StringBuilder();
            List<String> syn = Wording.synonyms(info, LANG);
            if (!syn.isEmpty()) notes.append(" ~").append(String.join("/", syn));
            if (info.deprecated()) notes.append(DEPRECATED);
            Wording.shortComment(info, LANG).ifPresent(c -> notes.append(" // ").append(c));
            return notes.toString();
        }));
    }

    /**
     * Pieces of text that depend on one term only (its synonyms, trimmed comment, key entry), kept per schema:
     * a question card renders each line many times while it tries terms against the budget.
     */
    private static final Map<GraphSchema, Map<String, String>> MEMO = Collections.synchronizedMap(new WeakHashMap<>());

    private static String memo(GraphSchema s, String key, Supplier<String> make) {
        return MEMO.computeIfAbsent(s, x -> new ConcurrentHashMap<>()).computeIfAbsent(key, k -> make.get());
    }

    /**
     * The endpoint pairs a card shows for a relationship type: its own (declared, or read off its inverse), or
     * — when it has none — those it inherits, unless a super type on the card already shows them. Only pairs
     * whose ends are on the card (or any label) are kept; none is invented.
     */
    static List<Endpoint> shownEndpoints(GraphSchema s, CardScope scope, RelType rel) {
        Set<Endpoint> pairs = new LinkedHashSet<>(ownEndpoints(s, rel));
        if (pairs.isEmpty()) {
            boolean superShown = rel.superTypes().stream().anyMatch(scope.relTypes()::contains);
            if (superShown) return List.of();
            pairs.addAll(s.effectiveEndpoints(rel.name()));
            if (pairs.isEmpty()) pairs.add(new Endpoint(null, null));
        }
        List<Endpoint> out = new ArrayList<>();
        for (Endpoint e : pairs) {
            if (onCard(scope, e.from()) && onCard(scope, e.to())) out.add(e);
        }
        return out;
    }

    /** Declared pairs and the inverse's declared pairs reversed. */
    static List<Endpoint> ownEndpoints(GraphSchema s, RelType rel) {
        Set<Endpoint> pairs = new LinkedHashSet<>(rel.endpoints());
        rel.inverseOf().map(s.relTypes()::get)
                .ifPresent(inv -> inv.endpoints().forEach(e -> pairs.add(new Endpoint(e.to(), e.from()))));
        return List.copyOf(pairs);
    }

    static boolean onCard(CardScope scope, String label) {
        return label == null || scope.labels().contains(label);
    }

    /**
     * Pairs written as few {@code A|B->C|D} groups: starts with the same set of ends are merged. For a
     * symmetric type each pair is read both ways, so it is written once in name order with {@code <->}.
     */
    static String endpointGroups(List<Endpoint> pairs, boolean symmetric) {
        Map<String, SortedSet<String>> endsByStart = new TreeMap<>();
        for (Endpoint e : pairs) {
            String from = e.from() == null ? ANY : e.from();
            String to = e.to() == null ? ANY : e.to();
            if (symmetric && from.compareTo(to) > 0) {
                String t = from;
                from = to;
                to = t;
            }
            endsByStart.computeIfAbsent(from, k -> new TreeSet<>()).add(to);
        }
        Map<String, SortedSet<String>> startsByEnds = new TreeMap<>();
        for (var entry : endsByStart.entrySet()) {
            startsByEnds.computeIfAbsent(String.join("|", entry.getValue()), k -> new TreeSet<>()).add(entry.getKey());
        }
        SortedSet<String> groups = new TreeSet<>();
        String arrow = symmetric ? "<->" : "->";
        for (var entry : startsByEnds.entrySet()) {
            groups.add(String.join("|", entry.getValue()) + arrow + entry.getKey());
        }
        return String.join("; ", groups);
    }

    /** Header, legend, body and optional footer as one text, each line ending in a newline. */
    static String join(List<String> lines) {
        StringBuilder sb = new StringBuilder();
        for (String l : lines) sb.append(l).append('\n');
        return sb.toString();
    }

    static Optional<String> footer(int leftOut, int budget) {
        return leftOut > 0 ? Optional.of(leftOutFooter(leftOut, budget)) : Optional.empty();
    }
}

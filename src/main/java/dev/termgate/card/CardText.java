package dev.termgate.card;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermInfo;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.SortedSet;
import java.util.TreeMap;
import java.util.TreeSet;

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
        List<String> out = new ArrayList<>();
        Map<String, SortedSet<String>> ownKeys = ownKeys(s, scope);
        List<String> labelLines = new ArrayList<>();
        for (String l : scope.labels()) {
            NodeLabel label = s.labels().get(l);
            if (label != null) labelLines.add(labelLine(s, label, ownKeys.getOrDefault(l, new TreeSet<>())));
        }
        SortedSet<String> anyKeys = ownKeys.get(ANY);
        if (anyKeys != null && !anyKeys.isEmpty()) labelLines.add(ANY + " " + keyList(s, anyKeys));
        if (!labelLines.isEmpty()) {
            out.add(LABELS);
            out.addAll(labelLines);
        }
        List<String> relLines = new ArrayList<>();
        for (String r : scope.relTypes()) {
            RelType rel = s.relTypes().get(r);
            if (rel != null) relLines.add(relLine(s, scope, rel));
        }
        if (!relLines.isEmpty()) {
            out.add(RELATIONSHIPS);
            out.addAll(relLines);
        }
        return out;
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
        appendNotes(sb, label.info());
        return sb.toString();
    }

    private static String keyList(GraphSchema s, SortedSet<String> keys) {
        StringBuilder sb = new StringBuilder("{");
        for (String k : keys) {
            PropertyKey key = s.properties().get(k);
            if (sb.length() > 1) sb.append(", ");
            sb.append(k).append(':').append(key.valueType().word());
            List<String> syn = Wording.synonyms(key.info(), LANG);
            if (!syn.isEmpty()) sb.append(" ~").append(String.join("/", syn));
            if (key.info().deprecated()) sb.append(DEPRECATED);
        }
        return sb.append('}').toString();
    }

    static String relLine(GraphSchema s, CardScope scope, RelType rel) {
        StringBuilder sb = new StringBuilder(rel.name());
        if (!rel.superTypes().isEmpty()) sb.append(" < ").append(String.join(", ", new TreeSet<>(rel.superTypes())));
        List<Endpoint> pairs = shownEndpoints(s, scope, rel);
        if (!pairs.isEmpty()) sb.append(": ").append(endpointGroups(pairs, rel.symmetric()));
        rel.inverseOf().ifPresent(inv -> sb.append(" (inverse ").append(inv).append(')'));
        appendNotes(sb, rel.info());
        return sb.toString();
    }

    private static void appendNotes(StringBuilder sb, TermInfo info) {
        List<String> syn = Wording.synonyms(info, LANG);
        if (!syn.isEmpty()) sb.append(" ~").append(String.join("/", syn));
        if (info.deprecated()) sb.append(DEPRECATED);
        Wording.shortComment(info, LANG).ifPresent(c -> sb.append(" // ").append(c));
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

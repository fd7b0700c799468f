package dev.termgate.audit;

import com.google.gson.GsonBuilder;
import com.google.gson.JsonArray;
import com.google.gson.JsonObject;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;
import dev.termgate.translate.Checked;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * Which ontology terms a set of queries used: per query, and across them the count of every class,
 * relationship type and property; the terms never used; the deprecated terms used; and the terms a model used
 * although its card did not hold them (valid, since the analyzer accepted them, but a sign the model knew or
 * guessed more than it was shown).
 */
public final class AuditReport {

    public static final String FORMAT = "termgate-audit/1";

    /** A term and how often valid queries used it. */
    public record Usage(String kind, String name, String iri, int count, boolean deprecated) {}

    /** A term a query used that its card did not show. */
    public record OffCard(String id, String kind, String name) {}

    private final List<AuditEntry> entries;
    private final List<Usage> usage;
    private final Map<String, Set<String>> unused;
    private final List<Usage> deprecatedUsed;
    private final List<OffCard> offCard;
    private final int withCard;

    public AuditReport(List<AuditEntry> entries, GraphSchema schema) {
        this.entries = List.copyOf(entries);
        Map<String, Integer> counts = new TreeMap<>();
        Map<String, String> iris = new LinkedHashMap<>();
        for (AuditEntry e : entries) {
            Set<String> seen = new TreeSet<>();
            for (Checked.TermUse t : e.terms()) {
                String key = t.kind() + "\u0000" + t.name();
                if (seen.add(key)) counts.merge(key, 1, Integer::sum);
                iris.putIfAbsent(key, t.iri());
            }
        }
        List<Usage> u = new ArrayList<>();
        for (var c : counts.entrySet()) {
            String[] k = c.getKey().split("\u0000", 2);
            boolean dep = info(schema, k[0], k[1]).map(TermInfo::deprecated).orElse(false);
            u.add(new Usage(k[0], k[1], iris.get(c.getKey()), c.getValue(), dep));
        }
        u.sort((a, b) -> a.count() != b.count() ? Integer.compare(b.count(), a.count()) : (a.kind() + a.name()).compareTo(b.kind() + b.name()));
        this.usage = List.copyOf(u);
        this.deprecatedUsed = u.stream().filter(Usage::deprecated).toList();
        Map<String, Set<String>> never = new LinkedHashMap<>();
        for (TermKind kind : TermKind.values()) {
            String word = word(kind);
            Set<String> all = new TreeSet<>();
            schema.terms(kind).forEach(t -> all.add(t.name()));
            for (Usage x : u) if (x.kind().equals(word)) all.remove(x.name());
            never.put(word, all);
        }
        this.unused = never;
        List<OffCard> off = new ArrayList<>();
        int cards = 0;
        for (AuditEntry e : entries) {
            if (e.cardTerms().isEmpty()) continue;
            cards++;
            Set<String> card = new TreeSet<>(e.cardTerms().get());
            for (Checked.TermUse t : e.terms()) {
                if (!card.contains(t.name())) off.add(new OffCard(e.id(), t.kind(), t.name()));
            }
        }
        this.offCard = List.copyOf(off);
        this.withCard = cards;
    }

    private static java.util.Optional<TermInfo> info(GraphSchema schema, String kind, String name) {
        return switch (kind) {
            case "label" -> schema.label(name).map(l -> l.info());
            case "relationship" -> schema.relType(name).map(r -> r.info());
            case "property" -> schema.property(name).map(p -> p.info());
            default -> java.util.Optional.empty();
        };
    }

    static String word(TermKind kind) {
        return switch (kind) {
            case LABEL -> "label";
            case RELATIONSHIP -> "relationship";
            case PROPERTY -> "property";
        };
    }

    public List<AuditEntry> entries() {
        return entries;
    }

    public List<Usage> usage() {
        return usage;
    }

    /** Per kind (label, relationship, property): the ontology's terms no query used. */
    public Map<String, Set<String>> unused() {
        return unused;
    }

    public List<Usage> deprecatedUsed() {
        return deprecatedUsed;
    }

    public List<OffCard> offCard() {
        return offCard;
    }

    /** How many entries recorded their card's terms (only those can show off-card use). */
    public int withCard() {
        return withCard;
    }

    public int total(String kind) {
        return (int) usage.stream().filter(x -> x.kind().equals(kind)).count() + unused.getOrDefault(kind, Set.of()).size();
    }

    public int used(String kind) {
        return (int) usage.stream().filter(x -> x.kind().equals(kind)).count();
    }

    public JsonObject toJson() {
        JsonObject j = new JsonObject();
        j.addProperty("format", FORMAT);
        j.addProperty("queries", entries.size());
        j.addProperty("valid", entries.stream().filter(AuditEntry::valid).count());
        JsonArray us = new JsonArray();
        for (Usage x : usage) {
            JsonObject o = new JsonObject();
            o.addProperty("kind", x.kind());
            o.addProperty("name", x.name());
            o.addProperty("iri", x.iri());
            o.addProperty("count", x.count());
            o.addProperty("deprecated", x.deprecated());
            us.add(o);
        }
        j.add("usage", us);
        JsonObject never = new JsonObject();
        unused.forEach((k, v) -> {
            JsonArray a = new JsonArray();
            v.forEach(a::add);
            never.add(k, a);
        });
        j.add("never_used", never);
        JsonArray dep = new JsonArray();
        deprecatedUsed.forEach(x -> dep.add(x.kind() + " " + x.name()));
        j.add("deprecated_used", dep);
        JsonArray off = new JsonArray();
        for (OffCard x : offCard) {
            JsonObject o = new JsonObject();
            o.addProperty("id", x.id());
            o.addProperty("kind", x.kind());
            o.addProperty("name", x.name());
            off.add(o);
        }
        j.add("not_in_card", off);
        j.addProperty("entries_with_card", withCard);
        JsonArray per = new JsonArray();
        for (AuditEntry e : entries) {
            JsonObject o = new JsonObject();
            o.addProperty("id", e.id());
            o.addProperty("line", e.line());
            o.addProperty("valid", e.valid());
            o.addProperty("query", e.query().orElse(null));
            JsonArray ts = new JsonArray();
            for (Checked.TermUse t : e.terms()) {
                JsonObject x = new JsonObject();
                x.addProperty("kind", t.kind());
                x.addProperty("name", t.name());
                x.addProperty("iri", t.iri());
                x.addProperty("via", t.via());
                ts.add(x);
            }
            o.add("terms", ts);
            per.add(o);
        }
        j.add("queries_detail", per);
        return j;
    }

    public String json() {
        return new GsonBuilder().serializeNulls().disableHtmlEscaping().setPrettyPrinting().create().toJson(toJson());
    }

    public String table() {
        StringBuilder sb = new StringBuilder();
        long valid = entries.stream().filter(AuditEntry::valid).count();
        sb.append(String.format(Locale.ROOT, "Term audit of %d quer%s (%d valid)%n", entries.size(), entries.size() == 1 ? "y" : "ies", valid));
        sb.append("\nPer query\n");
        for (AuditEntry e : entries) {
            List<String> names = e.terms().stream().map(t -> t.kind().charAt(0) + ":" + t.name()).distinct().toList();
            sb.append(String.format(Locale.ROOT, "  %-10s %s%n", e.id(), names.isEmpty() ? (e.valid() ? "(no terms)" : "(invalid)") : String.join(" ", names)));
        }
        sb.append("\nUsage                          queries\n");
        for (Usage x : usage) {
            sb.append(String.format(Locale.ROOT, "  %-13s %-28s %3d%s%n", x.kind(), x.name(), x.count(), x.deprecated() ? "  deprecated" : ""));
        }
        sb.append("\nCoverage\n");
        for (String kind : unused.keySet()) {
            sb.append(String.format(Locale.ROOT, "  %-13s %d of %d used%n", kind + "s", used(kind), total(kind)));
        }
        sb.append("\nNever used\n");
        unused.forEach((k, v) -> sb.append(String.format(Locale.ROOT, "  %-13s %s%n", k + "s", v.isEmpty() ? "-" : String.join(", ", v))));
        sb.append("\nDeprecated terms used: ").append(deprecatedUsed.isEmpty() ? "none" : String.join(", ",
                deprecatedUsed.stream().map(x -> x.kind() + " " + x.name() + " (" + x.count() + ")").toList())).append('\n');
        if (withCard == 0) {
            sb.append("Terms used outside the card: unknown (no entry records its card's terms)\n");
        } else {
            sb.append("Terms used outside the card (valid but risky): ").append(offCard.isEmpty() ? "none" : "").append('\n');
            for (OffCard x : offCard) sb.append(String.format(Locale.ROOT, "  %-10s %s %s%n", x.id(), x.kind(), x.name()));
        }
        return sb.toString();
    }
}

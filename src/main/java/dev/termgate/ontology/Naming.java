package dev.termgate.ontology;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Quote;
import dev.termgate.diag.Severity;
import dev.termgate.query.Span;
import dev.termgate.schema.Names;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;

/**
 * Gives every term of one kind its graph name: the {@code tg:graphName} override when present, else the local
 * name in the chosen style. When several IRIs would get one name, at most one keeps it: the only one whose
 * name was set by {@code tg:graphName}, else the only one in the home namespace (the namespace holding most
 * terms: the ontology's own), else the only one whose local name is already exactly that name. The others — all of them when no single one qualifies — are renamed to their
 * prefix-qualified form ({@code foaf:Organization} → {@code FoafOrganization}), or, when that does not tell them
 * apart (one namespace), to their local names as written ({@code familyName}, {@code family_name}); a number is
 * appended if the name is still taken. A {@link Code#NAME_COLLISION} warning names every IRI, so a query never silently reaches the
 * wrong term.
 */
final class Naming {

    private final Names.Style style;
    private final Map<String, String> prefixes;
    private String home = "";

    /** @param prefixes namespace → prefix, as declared by the sources */
    Naming(Names.Style style, Map<String, String> prefixes) {
        this.style = style;
        this.prefixes = prefixes;
    }

    void setHome(String namespace) {
        this.home = namespace == null ? "" : namespace;
    }

    /** IRIs (sorted, so the result is deterministic) → graph names; collisions are reported into {@code issues}. */
    Map<String, String> assign(TermKind kind, List<String> iris, Map<String, String> overrides, List<Diagnostic> issues) {
        Map<String, List<String>> byName = new TreeMap<>();
        for (String iri : iris) {
            byName.computeIfAbsent(baseName(kind, iri, overrides), k -> new ArrayList<>()).add(iri);
        }
        Set<String> taken = new HashSet<>(byName.keySet());
        Map<String, String> out = new LinkedHashMap<>();
        for (Map.Entry<String, List<String>> e : byName.entrySet()) {
            List<String> group = e.getValue();
            if (group.size() == 1) {
                out.put(group.get(0), e.getKey());
                continue;
            }
            String keeper = keeper(kind, group, overrides);
            List<String> renamed = new ArrayList<>();
            for (String iri : group) {
                // Qualifying by prefix only helps across namespaces; within one (foaf:familyName, foaf:family_name)
                // the local names as written are what tells the terms apart.
                boolean sharesNamespace = group.stream().anyMatch(o -> !o.equals(iri) && namespace(o).equals(namespace(iri)));
                String wanted = sharesNamespace ? Names.localName(iri) : qualified(kind, iri);
                String name = iri.equals(keeper) ? e.getKey() : unique(wanted, taken);
                taken.add(name);
                out.put(iri, name);
                renamed.add(name);
            }
            List<String> shown = group.stream().map(this::compact).toList();
            String firsts = String.join(", ", shown.subList(0, shown.size() - 1));
            issues.add(Diagnostic.at(Code.NAME_COLLISION, Span.NONE, firsts, shown.get(shown.size() - 1),
                    kind.word(), e.getKey(), Quote.andList(renamed)).withSeverity(Severity.WARNING));
        }
        return out;
    }

    /** The one IRI of a colliding group that keeps the plain name, or null. */
    private String keeper(TermKind kind, List<String> group, Map<String, String> overrides) {
        List<String> explicit = group.stream().filter(overrides::containsKey).toList();
        if (explicit.size() == 1) return explicit.get(0);
        if (!explicit.isEmpty()) return null;
        List<String> own = group.stream().filter(i -> namespace(i).equals(home)).toList();
        if (own.size() == 1) return own.get(0);
        List<String> exact = (own.isEmpty() ? group : own).stream()
                .filter(i -> Names.localName(i).equals(baseName(kind, i, overrides))).toList();
        return exact.size() == 1 ? exact.get(0) : null;
    }

    private String baseName(TermKind kind, String iri, Map<String, String> overrides) {
        String o = overrides.get(iri);
        if (o != null && !o.isBlank()) return o.strip();
        return Names.graphName(Names.localName(iri), kind, style);
    }

    private String qualified(TermKind kind, String iri) {
        String local = Names.localName(iri);
        String joined = prefixOf(iri) + "_" + local;
        return style == Names.Style.AS_IS ? joined : Names.graphName(joined, kind, style);
    }

    private static String unique(String name, Set<String> taken) {
        if (!taken.contains(name)) return name;
        for (int i = 2; ; i++) {
            if (!taken.contains(name + i)) return name + i;
        }
    }

    /** {@code prefix:local} when the namespace has a known prefix, else {@code <iri>}. */
    String compact(String iri) {
        String ns = namespace(iri);
        String p = prefixes.get(ns);
        return p != null ? p + ":" + iri.substring(ns.length()) : "<" + iri + ">";
    }

    /** The declared prefix of the IRI's namespace, else a short word taken from the namespace itself. */
    String prefixOf(String iri) {
        String ns = namespace(iri);
        String declared = prefixes.get(ns);
        if (declared != null && !declared.isEmpty()) return declared;
        return derivedPrefix(ns);
    }

    static String namespace(String iri) {
        return iri.substring(0, iri.length() - Names.localName(iri).length());
    }

    /**
     * The last path segment that holds a letter and is not a version ({@code http://xmlns.com/foaf/0.1/} → foaf),
     * else the host's first label other than www ({@code http://schema.org/} → schema).
     */
    static String derivedPrefix(String ns) {
        String rest = ns.replaceFirst("^[a-zA-Z][a-zA-Z0-9+.-]*:(//)?", "");
        String[] parts = rest.split("[/#:]+");
        for (int i = parts.length - 1; i >= 1; i--) {
            String seg = parts[i];
            if (seg.chars().anyMatch(Character::isLetter) && !seg.matches("(?i)v?\\d+(\\.\\d+)*")) {
                return clean(seg);
            }
        }
        if (parts.length > 0) {
            for (String label : parts[0].split("\\.")) {
                if (!label.equalsIgnoreCase("www") && label.chars().anyMatch(Character::isLetter)) return clean(label);
            }
        }
        return "ns";
    }

    private static String clean(String s) {
        String c = s.replaceAll("[^A-Za-z0-9]", "");
        // Keep the segment's own word boundaries (FinancialProductsAndServices); a one-word segment is lower case.
        return c.chars().anyMatch(Character::isLowerCase) && c.chars().skip(1).anyMatch(Character::isUpperCase)
                ? c : c.toLowerCase(Locale.ROOT);
    }
}

package dev.termgate.schema;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Graph-name conventions. {@link Style#GRAPH} gives the usual property-graph style: labels UpperCamelCase,
 * relationship types UPPER_SNAKE_CASE, property keys lowerCamelCase. {@link Style#AS_IS} keeps the IRI's local
 * name unchanged.
 */
public final class Names {

    public enum Style { GRAPH, AS_IS }

    private Names() {}

    /** The part of an IRI after the last '#', '/' or ':' (the whole IRI when that part is empty). */
    public static String localName(String iri) {
        int cut = Math.max(iri.lastIndexOf('#'), Math.max(iri.lastIndexOf('/'), iri.lastIndexOf(':')));
        String local = cut >= 0 && cut < iri.length() - 1 ? iri.substring(cut + 1) : iri;
        return local;
    }

    /** The graph name a term of this kind gets from its local name under the style. */
    public static String graphName(String localName, TermKind kind, Style style) {
        if (style == Style.AS_IS) return localName;
        List<String> words = words(localName);
        if (words.isEmpty()) return localName;
        return switch (kind) {
            case LABEL -> upperCamel(words);
            case RELATIONSHIP -> String.join("_", words).toUpperCase(Locale.ROOT);
            case PROPERTY -> lowerCamel(words);
        };
    }

    /**
     * Splits a name into lower-case words on case changes, digits boundaries kept with letters, and on any
     * separator: {@code hasPortCall}, {@code HAS_PORT_CALL}, {@code has-port-call} all give has/port/call.
     * An upper-case run followed by a lower-case letter starts a new word ({@code IMONumber} → imo/number).
     */
    public static List<String> words(String name) {
        List<String> out = new ArrayList<>();
        StringBuilder cur = new StringBuilder();
        int n = name.length();
        for (int i = 0; i < n; i++) {
            char c = name.charAt(i);
            if (!Character.isLetterOrDigit(c)) {
                flush(cur, out);
                continue;
            }
            if (cur.length() > 0) {
                char prev = name.charAt(i - 1);
                boolean lowerToUpper = Character.isUpperCase(c) && (Character.isLowerCase(prev) || Character.isDigit(prev));
                boolean acronymEnd = Character.isUpperCase(c) && Character.isUpperCase(prev)
                        && i + 1 < n && Character.isLowerCase(name.charAt(i + 1));
                if (lowerToUpper || acronymEnd) flush(cur, out);
            }
            cur.append(Character.toLowerCase(c));
        }
        flush(cur, out);
        return out;
    }

    /** Lower-case letters and digits only: the key used to match names across conventions. */
    public static String normalize(String name) {
        StringBuilder sb = new StringBuilder(name.length());
        for (int i = 0; i < name.length(); i++) {
            char c = name.charAt(i);
            if (Character.isLetterOrDigit(c)) sb.append(Character.toLowerCase(c));
        }
        return sb.toString();
    }

    private static void flush(StringBuilder cur, List<String> out) {
        if (cur.length() > 0) {
            out.add(cur.toString());
            cur.setLength(0);
        }
    }

    private static String upperCamel(List<String> words) {
        StringBuilder sb = new StringBuilder();
        for (String w : words) sb.append(Character.toUpperCase(w.charAt(0))).append(w.substring(1));
        return sb.toString();
    }

    private static String lowerCamel(List<String> words) {
        String s = upperCamel(words);
        return Character.toLowerCase(s.charAt(0)) + s.substring(1);
    }
}

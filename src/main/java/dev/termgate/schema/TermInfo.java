package dev.termgate.schema;

import java.util.List;
import java.util.Optional;

/**
 * What every graph term carries from the ontology: its IRI, its graph name, and the annotations used by the
 * card and by schema linking.
 */
public record TermInfo(TermKind kind, String iri, String name, List<LangString> labels, List<LangString> altLabels,
                       List<LangString> comments, boolean deprecated) {

    public TermInfo {
        labels = List.copyOf(labels);
        altLabels = List.copyOf(altLabels);
        comments = List.copyOf(comments);
    }

    /** The best label in the language asked for, then English, then untagged, then any. */
    public Optional<String> label(String lang) {
        return pick(labels, lang);
    }

    public Optional<String> comment(String lang) {
        return pick(comments, lang);
    }

    /** The IRI's local name: after the last '#', '/' or ':'. */
    public String localName() {
        return Names.localName(iri);
    }

    private static Optional<String> pick(List<LangString> texts, String lang) {
        for (String want : new String[] {lang, "en", ""}) {
            for (LangString t : texts) {
                if (t.lang().equalsIgnoreCase(want) || t.lang().toLowerCase().startsWith(want.toLowerCase() + "-") && !want.isEmpty()) {
                    return Optional.of(t.text());
                }
            }
        }
        return texts.isEmpty() ? Optional.empty() : Optional.of(texts.get(0).text());
    }
}

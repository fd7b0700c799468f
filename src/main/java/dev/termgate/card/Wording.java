package dev.termgate.card;

import dev.termgate.schema.LangString;
import dev.termgate.schema.Names;
import dev.termgate.schema.TermInfo;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.regex.Pattern;

/**
 * The words a card shows beside a name: a few synonyms and a trimmed comment. Every choice here is made on
 * sorted input so that the card does not depend on the order in which the ontology listed its annotations.
 */
final class Wording {

    /** Synonyms shown per term: enough to map a question's words, few enough to stay cheap (common practice). */
    static final int MAX_SYNONYMS = 3;
    static final int MAX_SYNONYM_CHARS = 32;
    /** Longest comment kept, in characters, after cutting it to its first sentence. */
    static final int MAX_COMMENT_CHARS = 90;

    private static final Pattern TAG = Pattern.compile("<[^>]{0,200}>");
    private static final Pattern WIKI_LINK = Pattern.compile("\\[\\[([^\\]]*)]]");
    private static final Pattern MD_LINK = Pattern.compile("\\[([^\\]]*)]\\([^)]*\\)");
    private static final Pattern SPACE = Pattern.compile("\\s+");
    private static final Pattern SENTENCE_END = Pattern.compile("(?<![A-Z]\\.[a-z])(?<!\\b(?:e\\.g|i\\.e|etc|vs|cf))[.!?](?=\\s+[A-Z\"'(\\[]|$)");

    private Wording() {}

    /**
     * Labels and alternative labels in the language asked for (or English, or untagged) that say something
     * the graph name does not: a label that only respells the name is dropped.
     */
    static List<String> synonyms(TermInfo info, String lang) {
        Map<String, String> byKey = new LinkedHashMap<>();
        String own = Names.normalize(info.name());
        String local = Names.normalize(info.localName());
        for (List<LangString> group : List.of(info.labels(), info.altLabels())) {
            List<String> texts = inLanguage(group, lang).stream()
                    .map(t -> SPACE.matcher(t).replaceAll(" ").trim())
                    .filter(t -> !t.isEmpty() && t.length() <= MAX_SYNONYM_CHARS && !t.contains("/") && !t.contains("~"))
                    .sorted().toList();
            for (String t : texts) {
                String key = Names.normalize(t);
                if (key.isEmpty() || key.equals(own) || key.equals(local)) continue;
                byKey.putIfAbsent(key, t);
            }
        }
        return byKey.values().stream().limit(MAX_SYNONYMS).toList();
    }

    /** The first sentence of the comment, markup removed, at most {@link #MAX_COMMENT_CHARS} characters. */
    static Optional<String> shortComment(TermInfo info, String lang) {
        List<String> texts = inLanguage(info.comments(), lang);
        if (texts.isEmpty()) return Optional.empty();
        String text = texts.stream().min(Comparator.naturalOrder()).orElseThrow();
        String plain = plain(text);
        var m = SENTENCE_END.matcher(plain);
        if (m.find()) plain = plain.substring(0, m.start());
        plain = cut(plain, MAX_COMMENT_CHARS);
        return plain.isEmpty() ? Optional.empty() : Optional.of(plain);
    }

    static String plain(String text) {
        String s = WIKI_LINK.matcher(text).replaceAll("$1");
        s = MD_LINK.matcher(s).replaceAll("$1");
        s = TAG.matcher(s).replaceAll(" ");
        s = s.replace("&lt;", "<").replace("&gt;", ">").replace("&amp;", "&").replace("&quot;", "\"");
        return SPACE.matcher(s).replaceAll(" ").trim();
    }

    /** Cuts at the last word boundary before the limit and marks the cut; drops a final full stop. */
    static String cut(String text, int max) {
        String s = text.endsWith(".") ? text.substring(0, text.length() - 1) : text;
        if (s.length() <= max) return s;
        int at = s.lastIndexOf(' ', max - 1);
        if (at < max / 2) at = max - 1;
        return s.substring(0, at).replaceAll("[\\s,;:(-]+$", "") + "…";
    }

    /**
     * The texts in the first language of (asked, English, untagged) that has any; otherwise every text. A
     * regional tag counts for its language (en-GB for en).
     */
    static List<String> inLanguage(List<LangString> texts, String lang) {
        for (String want : new String[] {lang, "en", ""}) {
            List<String> hit = new ArrayList<>();
            for (LangString t : texts) {
                String tag = t.lang().toLowerCase(Locale.ROOT);
                boolean match = want.isEmpty() ? tag.isEmpty() : tag.equals(want) || tag.startsWith(want + "-");
                if (match) hit.add(t.text());
            }
            if (!hit.isEmpty()) return hit;
        }
        return texts.stream().map(LangString::text).toList();
    }
}

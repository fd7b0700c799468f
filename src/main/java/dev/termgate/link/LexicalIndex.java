package dev.termgate.link;

import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.LangString;
import dev.termgate.schema.Names;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * Word-level matching of a question against every name and label of the schema's terms. Built once per
 * (schema, language); immutable and thread-safe afterwards.
 *
 * <p>Each term has several surface forms (local name split on case and separators, graph name, labels and
 * SKOS alternative labels in the question's language or untagged). A form matches fully when its stems occur
 * as consecutive content words of the question, loosely when they all occur apart, and partially when only
 * some do (weighted by how rare each word is across the ontology, so "date" alone says little).
 */
final class LexicalIndex {

    /** One surface form of a term. */
    private record Form(int term, List<String> stems, double weight, String source) {}

    /** A question word that stands for a vocabulary stem, exactly or as a probable typo. */
    private record Reading(String stem, double confidence, String typo) {}

    /** What lexical matching found for one term. */
    record Hit(double score, String evidence) {}

    // Scores of the match kinds relative to a full match (common practice: tuned on our own test questions).
    private static final double LOOSE = 0.75;
    private static final double PARTIAL = 0.5;
    private static final double LONGER_FORM_BONUS = 0.08;
    private static final double ALT_LABEL = 0.9;
    private static final double OTHER_LANGUAGE = 0.7;
    private static final double TYPO = 0.8;
    private static final double RENAMED = 0.9;

    private final List<TermRef> terms = new ArrayList<>();
    private final Map<String, List<Form>> byStem = new HashMap<>();
    private final Map<String, Double> idf = new HashMap<>();
    /** Lower-case words of all forms with their stems, by length: typos are judged on words as typed. */
    private final Map<Integer, Map<String, String>> wordsByLength = new HashMap<>();
    private final String lang;

    LexicalIndex(GraphSchema schema, String lang) {
        this.lang = lang;
        Map<String, Integer> df = new HashMap<>();
        for (TermKind kind : TermKind.values()) {
            for (TermInfo info : schema.terms(kind)) {
                int id = terms.size();
                terms.add(new TermRef(kind, info.name()));
                Set<String> termStems = new HashSet<>();
                for (Form f : forms(id, info)) {
                    for (String s : new HashSet<>(f.stems())) byStem.computeIfAbsent(s, k -> new ArrayList<>()).add(f);
                    termStems.addAll(f.stems());
                }
                termStems.forEach(s -> df.merge(s, 1, Integer::sum));
            }
        }
        double n = Math.max(1, terms.size());
        df.forEach((s, d) -> idf.put(s, Math.log(1 + n / d)));

    }

    private List<Form> forms(int id, TermInfo info) {
        Map<List<String>, Form> out = new LinkedHashMap<>();
        boolean hasOwnLanguageLabel = info.labels().stream().anyMatch(l -> sameLanguage(l.lang(), lang));
        // A term renamed to avoid a clash (foaf:Person → FoafPerson) yields to the one that kept the name.
        boolean renamed = !Names.normalize(info.localName()).equals(Names.normalize(info.name()));
        addForm(out, id, Text.words(info.localName()), renamed ? RENAMED : 1.0, "name \"" + info.localName() + "\"");
        addForm(out, id, Text.words(info.name()), 1.0, "name \"" + info.name() + "\"");
        for (LangString l : info.labels()) {
            double w = labelWeight(l, hasOwnLanguageLabel);
            if (w > 0) addForm(out, id, Text.words(l.text()), w, "label \"" + l.text() + "\"" + tag(l));
        }
        for (LangString l : info.altLabels()) {
            double w = labelWeight(l, hasOwnLanguageLabel) * ALT_LABEL;
            if (w > 0) addForm(out, id, Text.words(l.text()), w, "alt label \"" + l.text() + "\"" + tag(l));
        }
        return List.copyOf(out.values());
    }

    private void addForm(Map<List<String>, Form> out, int id, List<String> words, double weight, String source) {
        if (words.isEmpty()) return;
        for (String w : words) wordsByLength.computeIfAbsent(w.length(), k -> new HashMap<>()).put(w, Stemmer.stem(w));
        List<String> stems = Text.termStems(words, lang);
        Form old = out.get(stems);
        if (old == null || old.weight() < weight) out.put(stems, new Form(id, stems, weight, source));
    }

    private double labelWeight(LangString l, boolean hasOwnLanguageLabel) {
        if (l.lang().isEmpty() || sameLanguage(l.lang(), lang)) return 1.0;
        // Labels in other languages only help when the term has none in the question's language.
        if (!hasOwnLanguageLabel && sameLanguage(l.lang(), "en")) return OTHER_LANGUAGE;
        return 0;
    }

    private static boolean sameLanguage(String tag, String lang) {
        String t = tag.toLowerCase(Locale.ROOT);
        return t.equals(lang) || t.startsWith(lang + "-");
    }

    private static String tag(LangString l) {
        return l.lang().isEmpty() ? "" : "@" + l.lang();
    }

    List<TermRef> terms() {
        return terms;
    }

    /** Scores every term that shares at least one content word (or a probable typo of one) with the question. */
    Map<TermRef, Hit> match(List<Text.Token> question) {
        List<Text.Token> content = question.stream().filter(t -> !t.stop()).toList();
        List<List<Reading>> readings = new ArrayList<>();
        for (Text.Token t : content) readings.add(readings(t));
        Set<Form> candidates = new HashSet<>();
        for (List<Reading> rs : readings) {
            for (Reading r : rs) candidates.addAll(byStem.getOrDefault(r.stem(), List.of()));
        }
        Map<TermRef, Hit> best = new HashMap<>();
        for (Form f : candidates) {
            Hit h = score(f, content, readings);
            if (h == null) continue;
            TermRef ref = terms.get(f.term());
            Hit old = best.get(ref);
            if (old == null || old.score() < h.score()) best.put(ref, h);
        }
        return best;
    }

    /** Whether the question word is a word of some term (so it needs no typo correction or paraphrase). */
    boolean known(Text.Token t) {
        return byStem.containsKey(t.stem());
    }

    private List<Reading> readings(Text.Token t) {
        if (byStem.containsKey(t.stem())) return List.of(new Reading(t.stem(), 1.0, null));
        String word = t.lower();
        int len = word.length();
        if (len < 5 || !word.chars().allMatch(Character::isLetter)) return List.of();
        // A capitalised word inside a sentence is a name ("Paris"), not a misspelt term.
        if (Character.isUpperCase(t.raw().charAt(0)) && t.start() > 0) return List.of();
        // Typos: one edit in a word of 5–8 letters, two from 9 (common practice); the first letter is rarely
        // mistyped, and requiring it keeps real words ("weather") from reading as others ("leather").
        int maxEdits = len >= 9 ? 2 : 1;
        String best = null;
        int bestD = maxEdits + 1;
        boolean tie = false;
        // The word as typed, and without a plural "s", since names are mostly singular ("vessles" → vessel).
        List<String> variants = word.endsWith("s") ? List.of(word, word.substring(0, len - 1)) : List.of(word);
        for (String w : variants) {
            for (int l = w.length() - maxEdits; l <= w.length() + maxEdits; l++) {
                for (Map.Entry<String, String> v : wordsByLength.getOrDefault(l, Map.of()).entrySet()) {
                    if (v.getKey().charAt(0) != w.charAt(0)) continue;
                    int d = Fuzzy.distance(w, v.getKey(), maxEdits);
                    if (d < bestD) {
                        bestD = d;
                        best = v.getValue();
                        tie = false;
                    } else if (d == bestD && !v.getValue().equals(best)) {
                        tie = true;
                    }
                }
            }
        }
        // An ambiguous correction is no evidence at all.
        if (best == null || tie) return List.of();
        return List.of(new Reading(best, TYPO - 0.1 * (bestD - 1), t.raw()));
    }

    private Hit score(Form f, List<Text.Token> content, List<List<Reading>> readings) {
        int k = f.stems().size();
        int n = content.size();
        // Full match: the form's stems as consecutive content words.
        double bestFull = 0;
        int fullAt = -1;
        for (int p = 0; p + k <= n; p++) {
            double conf = 1;
            for (int j = 0; j < k && conf > 0; j++) conf = Math.min(conf, confidence(readings.get(p + j), f.stems().get(j)));
            if (conf > bestFull) {
                bestFull = conf;
                fullAt = p;
            }
        }
        if (fullAt >= 0) {
            double s = f.weight() * bestFull * (1 + LONGER_FORM_BONUS * (k - 1));
            return new Hit(s, f.source() + " ~ \"" + span(content, fullAt, k) + "\"" + typoNote(readings, fullAt, k));
        }
        double minConf = 1;
        double matchedWeight = 0;
        double totalWeight = 0;
        List<String> matched = new ArrayList<>();
        for (String stem : f.stems()) {
            double w = idf.getOrDefault(stem, 1.0);
            totalWeight += w;
            double c = 0;
            String word = null;
            for (int p = 0; p < n; p++) {
                double pc = confidence(readings.get(p), stem);
                if (pc > c) {
                    c = pc;
                    word = content.get(p).raw();
                }
            }
            minConf = Math.min(minConf, c);
            if (c > 0) {
                matchedWeight += w * c;
                matched.add(word);
            }
        }
        if (matched.isEmpty()) return null;
        if (matched.size() == k) {
            return new Hit(f.weight() * LOOSE * minConf, f.source() + " ~ \"" + String.join("\" … \"", matched) + "\"");
        }
        double coverage = matchedWeight / totalWeight;
        return new Hit(f.weight() * PARTIAL * coverage,
                f.source() + " partly ~ \"" + String.join("\", \"", matched) + "\"");
    }

    private static double confidence(List<Reading> rs, String stem) {
        for (Reading r : rs) {
            if (r.stem().equals(stem)) return r.confidence();
        }
        return 0;
    }

    private static String span(List<Text.Token> content, int from, int k) {
        StringBuilder sb = new StringBuilder();
        for (int i = from; i < from + k; i++) {
            if (sb.length() > 0) sb.append(' ');
            sb.append(content.get(i).raw());
        }
        return sb.toString();
    }

    private static String typoNote(List<List<Reading>> readings, int from, int k) {
        for (int i = from; i < from + k; i++) {
            for (Reading r : readings.get(i)) {
                if (r.typo() != null) return " (read \"" + r.typo() + "\" as a typo)";
            }
        }
        return "";
    }
}

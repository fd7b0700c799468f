package dev.termgate.interpret;

import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.LangString;
import dev.termgate.schema.Names;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

/**
 * Every way the ontology lets a question name one of its terms: labels in any language, SKOS alternative
 * labels, the local name split into words, and single words of a longer label as weaker partial evidence
 * (for a class only its head noun, the last word: "port visit" → "visit", since modifiers do not name the class).
 */
final class Lexicon {

    /** One phrase for one term. */
    record Phrase(TermKind kind, String name, List<String> stems, List<String> raws, double weight, boolean partial) {}

    static final double LABEL = 1.0;
    static final double ALT_LABEL = 0.9;
    static final double LOCAL_NAME = 0.85;
    static final double PARTIAL = 0.5;
    static final double HEAD_NOUN = 0.6;

    private final List<Phrase> phrases;

    private Lexicon(List<Phrase> phrases) {
        this.phrases = List.copyOf(phrases);
    }

    List<Phrase> phrases() {
        return phrases;
    }

    static Lexicon of(GraphSchema schema) {
        List<Phrase> out = new ArrayList<>();
        for (TermKind kind : TermKind.values()) {
            for (TermInfo t : schema.terms(kind)) {
                Set<String> seen = new LinkedHashSet<>();
                for (LangString l : t.labels()) add(out, seen, t, l.text(), LABEL);
                for (LangString l : t.altLabels()) add(out, seen, t, l.text(), ALT_LABEL);
                add(out, seen, t, String.join(" ", Names.words(t.localName())), LOCAL_NAME);
                add(out, seen, t, String.join(" ", Names.words(t.name())), LOCAL_NAME);
            }
        }
        return new Lexicon(out);
    }

    private static void add(List<Phrase> out, Set<String> seen, TermInfo t, String text, double weight) {
        // Units in parentheses ("quay length (m)") are kept: they are evidence for the number in a question.
        List<Words.Tok> toks = Words.tokens(text.replace('(', ' ').replace(')', ' '));
        if (toks.isEmpty()) return;
        List<String> stems = toks.stream().map(Words.Tok::stem).toList();
        List<String> raws = toks.stream().map(Words.Tok::lower).toList();
        if (seen.add(String.join(" ", stems))) {
            out.add(new Phrase(t.kind(), t.name(), stems, raws, weight, false));
        }
        if (toks.size() < 2) return;
        long content = toks.stream().filter(w -> !Words.isStop(w) && w.lower().length() >= 3 && !w.isNumber()).count();
        for (int i = 0; i < toks.size(); i++) {
            Words.Tok w = toks.get(i);
            if (Words.isStop(w) || w.lower().length() < 3 || w.isNumber()) continue;
            boolean head = i == toks.size() - 1;
            if (t.kind() == TermKind.LABEL && !head) continue;
            if (seen.add("~" + w.stem())) {
                out.add(new Phrase(t.kind(), t.name(), List.of(w.stem()), List.of(w.lower()),
                        // One word tells more of a short label than of a long one.
                        t.kind() == TermKind.LABEL ? HEAD_NOUN : PARTIAL - 0.1 + 0.2 / Math.max(1, content), true));
            }
        }
    }
}

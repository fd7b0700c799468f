package dev.termgate.interpret;

import dev.termgate.link.ValueIndex;
import dev.termgate.link.ValueMention;
import dev.termgate.schema.TermKind;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/**
 * The evidence a question gives: ontology terms named by words (with their spans), instance values, numbers
 * and periods. Overlaps are settled longest span first; values claim their words before terms do, so that
 * "Port Kellhaven" is one port, not the class Port plus a word.
 */
final class Evidence {

    /** One candidate reading of tokens {@code [from, to)} as an ontology term. */
    record TermHit(TermKind kind, String name, int from, int to, double score, boolean partial) {}

    final List<Words.Tok> toks;
    final List<ValueFinder.Hit> values;
    final List<TermHit> terms;
    final List<Quantities.Quantity> quantities;

    private Evidence(List<Words.Tok> toks, List<ValueFinder.Hit> values, List<TermHit> terms,
                     List<Quantities.Quantity> quantities) {
        this.toks = toks;
        this.values = values;
        this.terms = terms;
        this.quantities = quantities;
    }

    static Evidence of(String question, Lexicon lexicon, ValueFinder finder, ValueIndex names) {
        List<Words.Tok> toks = Words.tokens(question);
        List<ValueFinder.Hit> values = new ArrayList<>(onTokens(names.find(question), toks));
        boolean[] named = new boolean[toks.size()];
        for (ValueFinder.Hit h : values) for (int i = h.from(); i < h.to(); i++) named[i] = true;
        for (ValueFinder.Hit h : finder.find(toks)) {
            boolean free = true;
            for (int i = h.from(); i < h.to(); i++) free &= !named[i];
            if (free) values.add(h);
        }
        values.sort(Comparator.comparingInt(ValueFinder.Hit::from));
        boolean[] taken = new boolean[toks.size()];
        for (ValueFinder.Hit h : values) for (int i = h.from(); i < h.to(); i++) taken[i] = true;
        List<Quantities.Quantity> qs = Quantities.find(toks);
        for (Quantities.Quantity q : qs) for (int i = q.from(); i < q.to(); i++) if (toks.get(i).isNumber()) taken[i] = true;

        List<TermHit> all = new ArrayList<>();
        for (int i = 0; i < toks.size(); i++) {
            if (taken[i]) continue;
            for (Lexicon.Phrase p : lexicon.phrases()) {
                double s = matchAt(toks, taken, i, p);
                if (s > 0) all.add(new TermHit(p.kind(), p.name(), i, i + p.stems().size(), s * p.weight(), p.partial()));
            }
        }
        // Longest span first, then the strongest; keep every reading of a chosen span that is nearly as strong.
        all.sort(Comparator.comparingInt((TermHit h) -> -(h.to() - h.from())).thenComparingDouble(h -> -h.score()));
        List<TermHit> chosen = new ArrayList<>();
        boolean[] used = taken.clone();
        for (TermHit h : all) {
            boolean free = true;
            for (int i = h.from(); i < h.to(); i++) free &= !used[i];
            if (free) {
                double best = h.score();
                for (TermHit o : all) {
                    if (o.from() == h.from() && o.to() == h.to() && o.score() >= best - 0.45
                            && chosen.stream().noneMatch(c -> c.kind() == o.kind() && c.name().equals(o.name()) && c.from() == o.from())) {
                        chosen.add(o);
                    }
                }
                for (int i = h.from(); i < h.to(); i++) used[i] = true;
            }
        }
        chosen.sort(Comparator.comparingInt(TermHit::from));
        return new Evidence(toks, values, chosen, qs);
    }

    /** Value mentions (character offsets) placed on the question's tokens; one that splits a token is dropped. */
    private static List<ValueFinder.Hit> onTokens(List<ValueMention> mentions, List<Words.Tok> toks) {
        List<ValueFinder.Hit> out = new ArrayList<>();
        for (ValueMention m : mentions) {
            if (m.property().isEmpty()) continue;
            int from = -1;
            int to = -1;
            for (Words.Tok t : toks) {
                if (t.start() == m.start()) from = t.index();
                if (t.end() == m.end()) to = t.index() + 1;
            }
            if (from < 0 || to <= from) continue;
            out.add(new ValueFinder.Hit(new DataProfile.Value(m.value(), m.label(), m.property().get(), false), from, to));
        }
        return out;
    }

    private static double matchAt(List<Words.Tok> toks, boolean[] taken, int i, Lexicon.Phrase p) {
        int n = p.stems().size();
        if (i + n > toks.size()) return 0;
        double total = 0;
        int content = 0;
        for (int j = 0; j < n; j++) {
            Words.Tok t = toks.get(i + j);
            if (taken[i + j]) return 0;
            double s = Words.same(t.stem(), p.stems().get(j));
            if (s == 0) return 0;
            // A past participle does not name a class ("weight shipped" is no ship), but an adjective made from
            // the class's noun does ("containerised"), and so may a verb its head noun comes from ("visited").
            if (p.kind() == TermKind.LABEL && t.lower().endsWith("ed") && !p.raws().get(j).endsWith("ed")
                    && !t.lower().endsWith("ised") && !t.lower().endsWith("ized")
                    && !((p.partial() || n == 1) && (t.lower().equals(p.raws().get(j) + "ed") || t.lower().equals(p.raws().get(j) + "d")))) return 0;
            if (!Words.isStop(t)) content++;
            total += s;
        }
        if (content == 0) return 0;
        return total / n;
    }

    /** Every reading of the given kind, all candidates of each span included. */
    List<TermHit> termsOf(TermKind kind) {
        return terms.stream().filter(h -> h.kind() == kind).toList();
    }

    /** The strongest reading of each span of the given kind. */
    List<TermHit> bestOf(TermKind kind) {
        java.util.Map<Integer, TermHit> best = new java.util.LinkedHashMap<>();
        for (TermHit h : terms) {
            if (h.kind() != kind) continue;
            TermHit old = best.get(h.from());
            if (old == null || h.score() > old.score()) best.put(h.from(), h);
        }
        return List.copyOf(best.values());
    }

    boolean hasWord(String... words) {
        for (Words.Tok t : toks) for (String w : words) if (t.lower().equals(w)) return true;
        return false;
    }

    int indexOf(String word) {
        for (Words.Tok t : toks) if (t.lower().equals(word)) return t.index();
        return -1;
    }

    /** Whether the words appear one after the other starting at some token. */
    int indexOfPhrase(String... words) {
        outer:
        for (int i = 0; i + words.length <= toks.size(); i++) {
            for (int j = 0; j < words.length; j++) if (!toks.get(i + j).lower().equals(words[j])) continue outer;
            return i;
        }
        return -1;
    }
}

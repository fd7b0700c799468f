package dev.termgate.interpret;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Finds instance values in a question: names and codes on whole words (a one-word name made only of letters
 * must be capitalised in the question, so that the common word "atlas" is not taken for a company called
 * Atlas), and values of code lists ("import", "scan") in any case and number.
 */
final class ValueFinder {

    /** A mention of a value over question tokens {@code [from, to)}. */
    record Hit(DataProfile.Value value, int from, int to) {}

    private record Entry(DataProfile.Value value, List<String> keys) {}

    private final Map<String, List<Entry>> byFirst = new HashMap<>();

    ValueFinder(List<DataProfile.Value> values) {
        for (DataProfile.Value v : values) {
            List<Words.Tok> toks = Words.tokens(v.value());
            if (toks.isEmpty()) continue;
            List<String> keys = toks.stream().map(t -> key(t, v.categorical())).toList();
            // A value made only of stop words ("The") would match almost any question.
            if (toks.stream().allMatch(Words::isStop)) continue;
            byFirst.computeIfAbsent(keys.get(0), k -> new ArrayList<>()).add(new Entry(v, keys));
        }
    }

    private static String key(Words.Tok t, boolean categorical) {
        return categorical ? t.stem() : t.lower();
    }

    List<Hit> find(List<Words.Tok> q) {
        List<Hit> out = new ArrayList<>();
        int i = 0;
        while (i < q.size()) {
            int longest = 0;
            List<Entry> best = new ArrayList<>();
            for (boolean categorical : new boolean[] {false, true}) {
                for (Entry e : byFirst.getOrDefault(key(q.get(i), categorical), List.of())) {
                    if (e.value().categorical() != categorical) continue;
                    int k = e.keys().size();
                    if (k < longest || !matches(q, i, e)) continue;
                    if (k > longest) {
                        longest = k;
                        best.clear();
                    }
                    best.add(e);
                }
            }
            if (longest == 0) {
                i++;
                continue;
            }
            for (Entry e : best) out.add(new Hit(e.value(), i, i + longest));
            i += longest;
        }
        return out;
    }

    private static boolean matches(List<Words.Tok> q, int i, Entry e) {
        int k = e.keys().size();
        if (i + k > q.size()) return false;
        boolean cat = e.value().categorical();
        for (int j = 0; j < k; j++) {
            if (!key(q.get(i + j), cat).equals(e.keys().get(j))) return false;
        }
        if (!cat && k == 1) {
            String v = e.value().value();
            boolean letters = v.chars().allMatch(Character::isLetter);
            return !letters || Character.isUpperCase(q.get(i).raw().charAt(0)) && (i > 0 || !Words.isStop(q.get(i)));
        }
        return true;
    }
}

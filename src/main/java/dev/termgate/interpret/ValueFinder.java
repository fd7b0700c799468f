package dev.termgate.interpret;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Finds values of code lists ("import", "scan") in a question, in any case and number: they are ordinary words,
 * so they are matched on stems. Names and codes of instances are found by the schema-linking value index
 * ({@link dev.termgate.link.ValueIndex}) instead, on whole words as typed.
 */
final class ValueFinder {

    /** A mention of a value over question tokens {@code [from, to)}. */
    record Hit(DataProfile.Value value, int from, int to) {}

    private record Entry(DataProfile.Value value, List<String> stems) {}

    private final Map<String, List<Entry>> byFirst = new HashMap<>();

    /** @param codes values of code lists only */
    ValueFinder(List<DataProfile.Value> codes) {
        for (DataProfile.Value v : codes) {
            List<Words.Tok> toks = Words.tokens(v.value());
            // A value made only of stop words ("The") would match almost any question.
            if (toks.isEmpty() || toks.stream().allMatch(Words::isStop)) continue;
            List<String> stems = toks.stream().map(Words.Tok::stem).toList();
            byFirst.computeIfAbsent(stems.get(0), k -> new ArrayList<>()).add(new Entry(v, stems));
        }
    }

    /** The longest value at each place, every value of that length; left to right, not overlapping. */
    List<Hit> find(List<Words.Tok> q) {
        List<Hit> out = new ArrayList<>();
        int i = 0;
        while (i < q.size()) {
            int longest = 0;
            List<Entry> best = new ArrayList<>();
            for (Entry e : byFirst.getOrDefault(q.get(i).stem(), List.of())) {
                int k = e.stems().size();
                if (k < longest || !matches(q, i, e)) continue;
                if (k > longest) {
                    longest = k;
                    best.clear();
                }
                best.add(e);
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
        int k = e.stems().size();
        if (i + k > q.size()) return false;
        for (int j = 0; j < k; j++) if (!q.get(i + j).stem().equals(e.stems().get(j))) return false;
        return true;
    }
}

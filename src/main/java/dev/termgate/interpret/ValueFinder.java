package dev.termgate.interpret;

import dev.termgate.link.LongestMatch;

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
        return LongestMatch.find(q, Words.Tok::stem, byFirst, Entry::stems, (i, e) -> true).stream()
                .map(m -> new Hit(m.phrase().value(), m.from(), m.to())).toList();
    }
}

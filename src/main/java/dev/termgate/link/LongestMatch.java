package dev.termgate.link;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.BiPredicate;
import java.util.function.Function;

/**
 * Finds known phrases in a sequence of words: at each place the longest phrase that matches (every phrase of that
 * length), left to right, without overlaps. Shared by the value index (instance names) and the interpreter (code
 * list values), which differ only in how a word is compared.
 */
public final class LongestMatch {

    /** A phrase found over words {@code [from, to)}. */
    public record Match<E>(E phrase, int from, int to) {}

    private LongestMatch() {}

    /**
     * @param words    the question's words
     * @param key      how a word is compared (its lower case, its stem…)
     * @param byFirst  the phrases, by the key of their first word
     * @param keysOf   a phrase's word keys
     * @param accepted a further condition on a phrase that matches at a place
     */
    public static <W, E> List<Match<E>> find(List<W> words, Function<? super W, String> key, Map<String, List<E>> byFirst,
                                             Function<? super E, List<String>> keysOf, BiPredicate<Integer, ? super E> accepted) {
        List<Match<E>> out = new ArrayList<>();
        int i = 0;
        while (i < words.size()) {
            int longest = 0;
            List<E> best = new ArrayList<>();
            for (E e : byFirst.getOrDefault(key.apply(words.get(i)), List.of())) {
                List<String> keys = keysOf.apply(e);
                if (keys.size() < longest || !matchesAt(words, i, key, keys) || !accepted.test(i, e)) continue;
                if (keys.size() > longest) {
                    longest = keys.size();
                    best.clear();
                }
                best.add(e);
            }
            if (longest == 0) {
                i++;
                continue;
            }
            for (E e : best) out.add(new Match<>(e, i, i + longest));
            i += longest;
        }
        return out;
    }

    private static <W> boolean matchesAt(List<W> words, int i, Function<? super W, String> key, List<String> keys) {
        if (i + keys.size() > words.size()) return false;
        for (int j = 0; j < keys.size(); j++) if (!key.apply(words.get(i + j)).equals(keys.get(j))) return false;
        return true;
    }
}

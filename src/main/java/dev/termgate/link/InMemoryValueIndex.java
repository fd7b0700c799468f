package dev.termgate.link;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * A {@link ValueIndex} over (value text, label[, property]) pairs held in memory. Values match on whole words,
 * case-insensitively; a one-word value made only of letters must also be capitalised or quoted in the
 * question, so an ordinary word such as "atlas" does not turn into a mention of a company called "Atlas".
 */
public final class InMemoryValueIndex implements ValueIndex {

    private record Entry(String value, List<String> words, String label, Optional<String> property) {}

    private record Word(String lower, String raw, int start, int end, boolean quoted) {}

    private final Map<String, List<Entry>> byFirstWord;
    private final int size;

    private InMemoryValueIndex(Map<String, List<Entry>> byFirstWord, int size) {
        this.byFirstWord = byFirstWord;
        this.size = size;
    }

    /** Number of distinct (value, label, property) entries. */
    public int size() {
        return size;
    }

    @Override
    public List<ValueMention> find(String question) {
        List<Word> words = words(question);
        List<ValueMention> out = new ArrayList<>();
        for (LongestMatch.Match<Entry> m : LongestMatch.find(words, Word::lower, byFirstWord, Entry::words,
                (i, e) -> written(words.get(i), e))) {
            Entry e = m.phrase();
            out.add(new ValueMention(e.value(), e.label(), e.property(), words.get(m.from()).start(), words.get(m.to() - 1).end()));
        }
        return out;
    }

    /**
     * A one-word value made only of letters must be capitalised or quoted where it is written: otherwise an
     * ordinary word ("atlas") would be read as a name ("Atlas").
     */
    private static boolean written(Word first, Entry e) {
        if (e.words().size() == 1 && e.value().chars().allMatch(Character::isLetter)) {
            return first.quoted() || Character.isUpperCase(first.raw().charAt(0));
        }
        return true;
    }

    private static List<Word> words(String text) {
        List<Word> out = new ArrayList<>();
        boolean quoted = false;
        int i = 0;
        int n = text.length();
        while (i < n) {
            char c = text.charAt(i);
            if (c == '"' || c == '\u201c' || c == '\u201d' || c == '\'' && (i == 0 || !Character.isLetter(text.charAt(i - 1)))) {
                quoted = !quoted;
                i++;
                continue;
            }
            if (!Character.isLetterOrDigit(c)) {
                i++;
                continue;
            }
            int start = i;
            while (i < n && Character.isLetterOrDigit(text.charAt(i))) i++;
            String raw = text.substring(start, i);
            out.add(new Word(raw.toLowerCase(Locale.ROOT), raw, start, i, quoted));
        }
        return out;
    }

    /** Collects pairs; {@link #build()} makes the immutable index. */
    public static final class Builder {
        private final Set<Entry> entries = new LinkedHashSet<>();

        public Builder add(String value, String label) {
            return add(value, label, null);
        }

        /** Adds a value held by nodes of {@code label} under {@code property} (may be null when unknown). */
        public Builder add(String value, String label, String property) {
            if (value == null || label == null) return this;
            List<String> ws = words(value).stream().map(Word::lower).toList();
            // A value of stop words only ("The", "A") would match almost any question.
            if (ws.isEmpty() || ws.stream().allMatch(w -> Text.isStop(w, "en") || w.length() < 2 && ws.size() == 1)) {
                return this;
            }
            entries.add(new Entry(value, ws, label, Optional.ofNullable(property)));
            return this;
        }

        public InMemoryValueIndex build() {
            Map<String, List<Entry>> m = new HashMap<>();
            for (Entry e : entries) m.computeIfAbsent(e.words().get(0), k -> new ArrayList<>()).add(e);
            m.values().forEach(l -> l.sort(Comparator.comparingInt((Entry e) -> -e.words().size())));
            return new InMemoryValueIndex(Map.copyOf(m), entries.size());
        }
    }
}

package dev.termgate.interpret;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Set;

/**
 * The interpreter's own tokenisation: words with their offsets, lower-cased and stemmed, and numbers kept whole
 * ("100,000", "4.5", "40-foot" → 40 then foot). Question words and ontology words go through the same stemmer, so
 * only equality of stems matters, never their linguistic correctness.
 */
final class Words {

    /** One word of a question or a label. {@code number} is set for numerals. */
    record Tok(String raw, String lower, String stem, int start, int end, int index, Double number) {
        boolean isNumber() {
            return number != null;
        }
    }

    /** Function words that never carry evidence on their own (common practice: a short English stop list). */
    static final Set<String> STOP = Set.of("a", "an", "the", "of", "in", "on", "at", "to", "for", "by", "with", "and",
            "or", "is", "are", "was", "were", "be", "been", "has", "have", "had", "do", "does", "did", "which", "what",
            "who", "whom", "whose", "where", "when", "how", "many", "much", "all", "every", "each", "any", "some", "there",
            "their", "its", "it", "they", "them", "that", "this", "these", "those", "from", "into", "as", "me", "show",
            "list", "give", "name", "names", "tell", "find", "than", "more", "most", "less", "least", "not", "no",
            "never", "without", "per", "total", "i", "we", "you", "can", "could", "would", "will", "our", "your", "my",
            "data", "together", "also", "made", "make", "get", "got", "s", "up", "out", "over", "under", "after",
            "before", "between", "about", "else", "other", "same", "different", "distinct", "number", "count");

    private Words() {}

    static List<Tok> tokens(String text) {
        List<Tok> out = new ArrayList<>();
        int i = 0;
        int n = text.length();
        while (i < n) {
            char c = text.charAt(i);
            if (Character.isDigit(c)) {
                int start = i;
                StringBuilder digits = new StringBuilder();
                while (i < n) {
                    char d = text.charAt(i);
                    if (Character.isDigit(d)) {
                        digits.append(d);
                        i++;
                    } else if ((d == ',' && i + 3 < n + 1 && groupOfThree(text, i + 1)) || (d == '.' && i + 1 < n
                            && Character.isDigit(text.charAt(i + 1)) && digits.indexOf(".") < 0)) {
                        if (d == '.') digits.append('.');
                        i++;
                    } else {
                        break;
                    }
                }
                // An alphanumeric code such as TSLN2304E or 2304E is a word, not a number.
                if (i < n && Character.isLetter(text.charAt(i))) {
                    while (i < n && Character.isLetterOrDigit(text.charAt(i))) i++;
                    String raw = text.substring(start, i);
                    out.add(word(raw, start, i, out.size()));
                    continue;
                }
                String raw = text.substring(start, i);
                out.add(new Tok(raw, raw, raw, start, i, out.size(), Double.parseDouble(digits.toString())));
                continue;
            }
            if (Character.isLetter(c)) {
                int start = i;
                while (i < n && (Character.isLetterOrDigit(text.charAt(i))
                        || (text.charAt(i) == '\'' && i + 1 < n && Character.isLetter(text.charAt(i + 1)) && text.charAt(i + 1) != 's'))) {
                    i++;
                }
                out.add(word(text.substring(start, i), start, i, out.size()));
                continue;
            }
            i++;
        }
        return out;
    }

    private static boolean groupOfThree(String text, int from) {
        if (from + 3 > text.length()) return false;
        for (int k = 0; k < 3; k++) {
            if (!Character.isDigit(text.charAt(from + k))) return false;
        }
        return from + 3 == text.length() || !Character.isDigit(text.charAt(from + 3));
    }

    private static Tok word(String raw, int start, int end, int index) {
        String lower = raw.toLowerCase(Locale.ROOT);
        Double num = WORD_NUMBERS.contains(lower) ? (double) WORD_NUMBERS.indexOf(lower) : null;
        return new Tok(raw, lower, stem(lower), start, end, index, num);
    }

    /** Small numbers written out; their index is their value (common practice). */
    private static final List<String> WORD_NUMBERS = List.of("zero", "one", "two", "three", "four", "five", "six",
            "seven", "eight", "nine", "ten", "eleven", "twelve");

    /** Stems of the words of a name or label. */
    static List<String> stems(String text) {
        return tokens(text).stream().map(Tok::stem).toList();
    }

    /**
     * A small English suffix stripper: plurals, -ing, -ed, a final e and doubled consonants, so that "ships",
     * "shipped", "shipping" all give "ship".
     */
    static String stem(String w) {
        if (w.equals("feet")) return "foot";
        if (w.equals("metres") || w.equals("meters") || w.equals("meter")) return "metr";
        if (w.length() <= 3) return w;
        if (w.endsWith("'s")) w = w.substring(0, w.length() - 2);
        if (w.endsWith("ies") && w.length() > 4) {
            w = w.substring(0, w.length() - 3) + "y";
        } else if (w.endsWith("sses") || w.endsWith("ches") || w.endsWith("shes") || w.endsWith("xes")) {
            w = w.substring(0, w.length() - 2);
        } else if (w.endsWith("s") && !w.endsWith("ss") && !w.endsWith("us") && !w.endsWith("is")) {
            w = w.substring(0, w.length() - 1);
        }
        if (w.endsWith("ing") && w.length() >= 6 && !w.equals("nothing") && !w.equals("during")) {
            w = w.substring(0, w.length() - 3);
        } else if (w.endsWith("ed") && w.length() >= 5 && !w.endsWith("eed")) {
            w = w.substring(0, w.length() - 2);
        }
        if (w.endsWith("e") && w.length() >= 4) w = w.substring(0, w.length() - 1);
        int n = w.length();
        if (n >= 4 && w.charAt(n - 1) == w.charAt(n - 2) && "aeiou".indexOf(w.charAt(n - 1)) < 0) w = w.substring(0, n - 1);
        if (w.endsWith("y") && w.length() >= 4) w = w.substring(0, w.length() - 1) + "i";
        return w;
    }

    /**
     * Whether two stems name the same word: equal, or one a prefix of the other when both are long enough
     * ("depart" / "departur", "weigh" / "weight"). Returns 1 for equality, 0.8 for a prefix match, 0 otherwise.
     */
    static double same(String a, String b) {
        if (a.equals(b)) return 1.0;
        int min = Math.min(a.length(), b.length());
        if (min >= 5 && Math.abs(a.length() - b.length()) <= 4 && (a.startsWith(b) || b.startsWith(a))) return 0.8;
        return 0;
    }

    static boolean isStop(Tok t) {
        return STOP.contains(t.lower());
    }
}

package dev.termgate.link;

import dev.termgate.schema.Names;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/** Tokens of a question or of a term's name, stop words per language and a cheap language guess. */
final class Text {

    /**
     * One word of a text.
     *
     * @param raw     the word as written (used for capitalisation checks by value matching)
     * @param lower   lower-cased
     * @param stem    the matching key from {@link Stemmer}
     * @param stop    a stop word of the text's language
     * @param start   character offset of the chunk the word came from
     */
    record Token(String raw, String lower, String stem, boolean stop, int start) {}

    // Stop words: short lists of function words plus question verbs ("show", "list"), common practice. Words
    // that are often property names ("name", "number", "date", "type") are deliberately NOT stop words.
    private static final Map<String, Set<String>> STOP = Map.of(
            "en", Set.of("a", "an", "the", "of", "in", "on", "at", "to", "for", "from", "by", "with", "and", "or",
                    "is", "are", "was", "were", "be", "been", "being", "do", "does", "did", "has", "have", "had",
                    "what", "which", "who", "whom", "whose", "where", "when", "how", "why", "that", "this", "these",
                    "those", "it", "its", "their", "them", "they", "there", "than", "then", "as", "into", "over",
                    "any", "all", "each", "every", "some", "many", "much", "more", "most", "me", "my", "i", "we",
                    "our", "you", "your", "show", "list", "give", "find", "tell", "return", "get", "please", "can",
                    "could", "would", "should", "will", "not", "no", "per", "s", "about", "also", "only", "just",
                    "between", "via", "both", "other", "such", "if", "so", "up", "out", "he", "she", "his", "her",
                    "ever", "including", "whether", "among", "across"),
            "fr", Set.of("le", "la", "les", "un", "une", "des", "de", "du", "d", "l", "et", "ou", "est", "sont",
                    "quel", "quelle", "quels", "quelles", "qui", "que", "quoi", "où", "combien", "dans", "sur", "pour",
                    "par", "avec", "au", "aux", "ce", "ces", "cette", "leur", "leurs", "son", "sa", "ses", "il", "elle",
                    "ils", "elles", "ont", "a", "été", "moi", "montre", "donne", "liste", "tous", "toutes"),
            "de", Set.of("der", "die", "das", "den", "dem", "des", "ein", "eine", "einen", "einem", "einer", "und",
                    "oder", "ist", "sind", "war", "welche", "welcher", "welches", "wer", "was", "wo", "wie", "viele",
                    "in", "im", "auf", "für", "von", "vom", "mit", "zu", "zum", "zur", "bei", "aus", "nach", "hat",
                    "haben", "alle", "zeige", "gib", "mir", "nicht", "es", "sie", "er"),
            "es", Set.of("el", "la", "los", "las", "un", "una", "unos", "unas", "de", "del", "y", "o", "es", "son",
                    "fue", "qué", "que", "cuál", "cuáles", "quién", "quiénes", "dónde", "cuántos", "cuántas", "en",
                    "con", "por", "para", "al", "su", "sus", "se", "lo", "todos", "todas", "muestra", "dame"),
            "nl", Set.of("de", "het", "een", "en", "of", "is", "zijn", "was", "welke", "wie", "wat", "waar", "hoe",
                    "hoeveel", "in", "op", "voor", "van", "met", "naar", "bij", "uit", "alle", "toon", "geef", "mij"));

    private Text() {}

    /** Languages that have a stop-word list (and so can be guessed). */
    static Set<String> knownLanguages() {
        return STOP.keySet();
    }

    static boolean isStop(String lower, String lang) {
        return STOP.getOrDefault(lang, STOP.get("en")).contains(lower);
    }

    /**
     * Guesses the language of a question by counting its stop words per language; English wins ties and
     * questions with no stop word at all. Cheap on purpose: a question is short and only needs to pick which
     * language-tagged labels to prefer.
     */
    static String guessLanguage(String question) {
        Map<String, Integer> hits = new HashMap<>();
        for (String w : question.toLowerCase(Locale.ROOT).split("[^\\p{L}\\p{N}]+")) {
            if (w.isEmpty()) continue;
            for (Map.Entry<String, Set<String>> e : STOP.entrySet()) {
                if (e.getValue().contains(w)) hits.merge(e.getKey(), 1, Integer::sum);
            }
        }
        String best = "en";
        int bestHits = hits.getOrDefault("en", 0);
        for (Map.Entry<String, Integer> e : hits.entrySet()) {
            if (e.getValue() > bestHits) {
                best = e.getKey();
                bestHits = e.getValue();
            }
        }
        return best;
    }

    /**
     * Splits a text into words: first on anything that is not a letter, digit or apostrophe, then each chunk
     * on case changes ({@link Names#words}) so that a user who types {@code portOfCall} is read like one who
     * types "port of call".
     */
    static List<Token> tokens(String text, String lang) {
        List<Token> out = new ArrayList<>();
        int i = 0;
        int n = text.length();
        while (i < n) {
            while (i < n && !Character.isLetterOrDigit(text.charAt(i))) i++;
            int start = i;
            while (i < n && (Character.isLetterOrDigit(text.charAt(i))
                    || text.charAt(i) == '\'' && i + 1 < n && Character.isLetter(text.charAt(i + 1)))) i++;
            if (i == start) continue;
            String chunk = text.substring(start, i);
            if (chunk.endsWith("'s") || chunk.endsWith("'S")) chunk = chunk.substring(0, chunk.length() - 2);
            chunk = chunk.replace("'", "");
            List<String> parts = Names.words(chunk);
            int offset = start;
            for (String w : parts) {
                int at = indexIgnoreCase(text, w, offset);
                String raw = at >= 0 ? text.substring(at, at + w.length()) : w;
                out.add(new Token(raw, w, Stemmer.stem(w), isStop(w, lang), at >= 0 ? at : start));
                if (at >= 0) offset = at + w.length();
            }
        }
        return out;
    }

    /** Stems of a term's words with stop words removed (all of them kept when nothing else is left). */
    static List<String> termStems(List<String> lowerWords, String lang) {
        List<String> content = new ArrayList<>();
        for (String w : lowerWords) {
            if (!isStop(w, lang)) content.add(Stemmer.stem(w));
        }
        if (content.isEmpty()) {
            for (String w : lowerWords) content.add(Stemmer.stem(w));
        }
        return content;
    }

    /** Words of a label or local name, lower-cased. */
    static List<String> words(String nameOrLabel) {
        return Names.words(nameOrLabel.replace("'s", ""));
    }

    private static int indexIgnoreCase(String text, String lowerWord, int from) {
        int max = text.length() - lowerWord.length();
        for (int i = Math.max(0, from); i <= max; i++) {
            if (text.regionMatches(true, i, lowerWord, 0, lowerWord.length())) return i;
        }
        return -1;
    }
}

package dev.termgate.link;

import java.util.Map;

/**
 * A deliberately small English suffix stripper: plurals, -ing, -ed, a final silent e and doubled final
 * consonants. It only has to map a question word and an ontology word to the same key ("ships", "shipped",
 * "shipping" → "ship"; "located", "locates" → "locat"), not produce linguistic stems, so both sides always go
 * through the same function.
 */
final class Stemmer {

    /** Irregular plurals common in questions (common practice; the list is short on purpose). */
    private static final Map<String, String> IRREGULAR = Map.ofEntries(
            Map.entry("people", "person"), Map.entry("persons", "person"), Map.entry("children", "child"),
            Map.entry("men", "man"), Map.entry("women", "woman"), Map.entry("feet", "foot"),
            Map.entry("teeth", "tooth"), Map.entry("mice", "mouse"), Map.entry("geese", "goose"),
            Map.entry("indices", "index"), Map.entry("criteria", "criterion"), Map.entry("analyses", "analysis"));

    /** Words ending in "ing" that are not a verb form (common practice). */
    private static final java.util.Set<String> NOT_ING = java.util.Set.of("string", "thing", "during", "nothing",
            "something", "anything", "everything", "morning", "evening", "ceiling", "spring", "offspring");

    private Stemmer() {}

    static String stem(String lowerWord) {
        String w = IRREGULAR.getOrDefault(lowerWord, lowerWord);
        if (w.length() <= 3 || !isAlpha(w)) return w;
        if (w.endsWith("'s")) w = w.substring(0, w.length() - 2);
        if (w.endsWith("ies") && w.length() > 4) {
            w = w.substring(0, w.length() - 3) + "y";
        } else if (w.endsWith("sses")) {
            w = w.substring(0, w.length() - 2);
        } else if (w.endsWith("ches") || w.endsWith("shes") || w.endsWith("xes") || w.endsWith("zes")) {
            w = w.substring(0, w.length() - 2);
        } else if (w.endsWith("s") && !w.endsWith("ss") && !w.endsWith("us") && !w.endsWith("is") && w.length() > 3) {
            w = w.substring(0, w.length() - 1);
        }
        if (w.endsWith("ee") && w.length() >= 7) {
            // Agent and patient nouns meet their verb: employee, employer, employed → employ.
            w = w.substring(0, w.length() - 2);
        } else if ((w.endsWith("er") || w.endsWith("or")) && w.length() >= 7) {
            w = w.substring(0, w.length() - 2);
        } else if (w.endsWith("ing") && w.length() >= 6 && !NOT_ING.contains(w)) {
            w = w.substring(0, w.length() - 3);
        } else if (w.endsWith("ed") && w.length() >= 5 && !w.endsWith("eed")) {
            w = w.substring(0, w.length() - 2);
        }
        if (w.endsWith("e") && w.length() >= 4) w = w.substring(0, w.length() - 1);
        int n = w.length();
        if (n >= 4 && w.charAt(n - 1) == w.charAt(n - 2) && !isVowel(w.charAt(n - 1))) w = w.substring(0, n - 1);
        if (w.endsWith("y") && w.length() >= 4) w = w.substring(0, w.length() - 1) + "i";
        return w;
    }

    private static boolean isVowel(char c) {
        return "aeiou".indexOf(c) >= 0;
    }

    private static boolean isAlpha(String w) {
        for (int i = 0; i < w.length(); i++) {
            if (!Character.isLetter(w.charAt(i)) && w.charAt(i) != '\'') return false;
        }
        return true;
    }
}

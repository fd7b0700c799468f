package dev.termgate.link;

import org.junit.jupiter.api.Test;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Word-level helpers. Expected values are common practice for English inflection, not from an outside source. */
class TextAndStemmerTest {

    @Test
    void inflectionsMeetOnOneKey() {
        String[][] same = {
                {"ship", "ships", "shipped", "shipping"},
                {"country", "countries"},
                {"locate", "located", "locates"},
                {"address", "addresses"},
                {"person", "people"},
                {"box", "boxes"},
                {"director", "directed", "directs"},
                {"employee", "employees", "employed"},
                {"name", "names", "named"},
        };
        for (String[] group : same) {
            for (String w : group) assertEquals(Stemmer.stem(group[0]), Stemmer.stem(w), w + " ~ " + group[0]);
        }
    }

    @Test
    void shortAndNonVerbWordsStay() {
        assertEquals("string", Stemmer.stem("string"));
        assertEquals("thing", Stemmer.stem("thing"));
        assertEquals("bus", Stemmer.stem("bus"));
        assertNotEquals(Stemmer.stem("port"), Stemmer.stem("part"));
    }

    @Test
    void tokensSplitCamelCaseAndKeepOffsets() {
        List<Text.Token> ts = Text.tokens("Which portOfCall's vessels?", "en");
        assertEquals(List.of("which", "port", "of", "call", "vessels"), ts.stream().map(Text.Token::lower).toList());
        assertTrue(ts.get(0).stop());
        assertEquals(6, ts.get(1).start());
        assertEquals("vessels", ts.get(4).raw());
    }

    @Test
    void languageGuessFromStopWords() {
        assertEquals("en", Text.guessLanguage("Which ports are in the country?"));
        assertEquals("de", Text.guessLanguage("Welche Häfen liegen in der Region und wie viele sind es?"));
        assertEquals("fr", Text.guessLanguage("Quels sont les ports de la région ?"));
        assertEquals("en", Text.guessLanguage("Vessels"));
    }

    @Test
    void boundedEditDistance() {
        // Optimal string alignment distances, worked by hand (common practice definition).
        assertEquals(1, Fuzzy.distance("adress", "address", 2));
        assertEquals(1, Fuzzy.distance("vesesl", "vessel", 2), "adjacent transposition counts once");
        assertEquals(2, Fuzzy.distance("kitten", "sitten", 1) + 1, "within bound");
        assertEquals(3, Fuzzy.distance("kitten", "sitting", 2), "beyond the bound gives max + 1");
    }
}

package dev.termgate.card;

import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

import java.util.Arrays;
import java.util.List;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

class CardTextTest {

    private final GraphSchema schema = TestSchemas.harbour();
    private final String card = Cards.whole(schema, TokenEncoding.CL100K_BASE).text();

    private String line(String start) {
        List<String> hits = card.lines().filter(l -> l.startsWith(start + " ") || l.startsWith(start + ":") || l.equals(start)).toList();
        assertEquals(1, hits.size(), () -> "one line for " + start + " in\n" + card);
        return hits.get(0);
    }

    @Test
    void sameSchemaGivesSameBytesWhateverTheInputOrder() {
        String again = Cards.whole(TestSchemas.harbour(), TokenEncoding.CL100K_BASE).text();
        assertEquals(card, again);
        for (long seed = 1; seed <= 5; seed++) {
            assertEquals(card, Cards.whole(TestSchemas.harbour(new Random(seed)), TokenEncoding.CL100K_BASE).text(),
                    "seed " + seed);
        }
    }

    @Test
    void aLabelNamesItsParentAndListsOnlyItsOwnKeys() {
        String tanker = line("Tanker");
        assertTrue(tanker.startsWith("Tanker < Vessel {capacityCubicMetres:float}"), tanker);
        assertFalse(tanker.contains("imoNumber"), "inherited from Vessel: " + tanker);
        assertFalse(line("Vessel").contains("purchasedOn"), "inherited from Asset");
        assertTrue(line("Asset").contains("purchasedOn:date"));
    }

    @Test
    void domainFreeKeysAreListedOnceForAnyLabel() {
        assertEquals("* {name:string ~title}", line("*"));
        assertEquals(1, card.split("name:string", -1).length - 1);
    }

    @Test
    void eachRelationshipTypeOnceWithGroupedEndpointsAndDirection() {
        assertEquals("CALLS_AT: Vessel->Port ~visits", line("CALLS_AT"));
        assertEquals("LOCATED_IN: Company|Organisation|Port->Country", line("LOCATED_IN"));
        assertEquals("NEAR: Port<->Port", line("NEAR"));
        assertEquals("REGISTERED_AT: *->Port", line("REGISTERED_AT"));
        assertEquals("RELATED_TO: *->*", line("RELATED_TO"));
    }

    @Test
    void inverseEndpointsAreReadBackwardsAndSubTypesNameTheirSuper() {
        assertTrue(line("OPERATES").startsWith("OPERATES: Company->Vessel; Organisation->Barge (inverse OPERATED_BY)"));
        assertEquals("BUNKERS_AT < CALLS_AT // Takes on fuel at a port", line("BUNKERS_AT"));
    }

    @Test
    void deprecatedTermsAreMarked() {
        assertTrue(line("Wharf").contains("(deprecated)"));
        assertTrue(line("Vessel").contains("dwt:integer ~deadweight (deprecated)"));
    }

    @Test
    void synonymsSkipRespellingsOfTheName() {
        String vessel = line("Vessel");
        assertTrue(vessel.contains("~boat/ship"), vessel);
        assertFalse(vessel.contains("~vessel"), "rdfs:label 'vessel' only respells the name: " + vessel);
    }

    @Test
    void longCommentsAreCutToTheFirstSentenceAndALimit() {
        assertTrue(line("Asset").endsWith("// Something of value that is owned"), "first sentence only, no full stop");
        String vessel = line("Vessel");
        String note = vessel.substring(vessel.indexOf("// ") + 3);
        assertTrue(note.endsWith("…") && note.length() <= Wording.MAX_COMMENT_CHARS + 1, note);
    }

    @Test
    void commentMarkupIsRemoved() {
        assertEquals("A Thing such as a Place", Wording.plain("A [[Thing]] such as a <a href=\"x\">Place</a>"));
        assertEquals("see the spec", Wording.plain("see [the spec](https://example.org/spec)"));
    }

    @Test
    void sentenceCutKeepsAbbreviations() {
        var info = TestSchemas.info(dev.termgate.schema.TermKind.LABEL, "X", List.of(),
                "A place, e.g. a port. Second sentence.");
        assertEquals("A place, e.g. a port", Wording.shortComment(info, "en").orElseThrow());
    }

    /**
     * The budgeted card counts tokens line by line; this holds only if neither tokenizer merges across a line
     * end. Reference: jtokkit's count of the whole text.
     */
    @ParameterizedTest
    @EnumSource(TokenEncoding.class)
    void tokensOfTheCardAreTheSumOfItsLines(TokenEncoding enc) {
        TokenCounter counter = TokenCounter.of(enc);
        Card c = Cards.whole(schema, enc);
        int sum = Arrays.stream(c.text().split("\n")).mapToInt(l -> counter.count(l + "\n")).sum();
        assertEquals(counter.count(c.text()), sum);
        assertEquals(c.tokens(), sum);
    }
}

package dev.termgate.card;

import dev.termgate.link.LinkedTerm;
import dev.termgate.link.Linking;
import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Random;
import java.util.Set;
import java.util.stream.Collectors;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class CardBudgetTest {

    private final GraphSchema schema = TestSchemas.harbour();
    private final TokenCounter counter = TokenCounter.of(TokenEncoding.CL100K_BASE);

    /** "Which tankers called at ports in Norway?" as a linker might rank it (invented test data). */
    private static Linking tankerQuestion() {
        return new Linking(List.of(
                new LinkedTerm(TermKind.LABEL, "Tanker", 0.95, List.of("label \"tanker\" = \"tankers\" (lexical 0.95)")),
                new LinkedTerm(TermKind.RELATIONSHIP, "CALLS_AT", 0.81, List.of("synonym \"visits\" ~ \"called at\"")),
                new LinkedTerm(TermKind.LABEL, "Port", 0.80, List.of("label \"port\" = \"ports\"")),
                new LinkedTerm(TermKind.LABEL, "Country", 0.55, List.of("value \"Norway\" is a Country")),
                new LinkedTerm(TermKind.RELATIONSHIP, "LOCATED_IN", 0.40, List.of("connects Port to Country")),
                new LinkedTerm(TermKind.PROPERTY, "name", 0.30, List.of("value \"Norway\" in name"))),
                false, List.of());
    }

    @Test
    void questionCardGolden() throws IOException {
        Card card = Cards.forQuestion(schema, tankerQuestion(), Cards.DEFAULT_BUDGET, TokenEncoding.CL100K_BASE);
        assertEquals(0, card.leftOut());
        Golden.assertMatches("harbour-tankers.card", card.text());
    }

    @Test
    void relationshipBringsMissingEndpointsAndKeysBringTheirHolder() {
        Linking l = new Linking(List.of(
                new LinkedTerm(TermKind.RELATIONSHIP, "FLAGGED_IN", 0.9, List.of("x")),
                new LinkedTerm(TermKind.PROPERTY, "purchasedOn", 0.5, List.of("y"))), false, List.of());
        Card card = Cards.forQuestion(schema, l, 400, TokenEncoding.CL100K_BASE);
        assertEquals(Set.of("Vessel", "Country", "Asset"), card.scope().labels());
        CardTerm vessel = card.terms().stream().filter(t -> t.name().equals("Vessel")).findFirst().orElseThrow();
        assertTrue(vessel.score().isEmpty());
        assertEquals(List.of("endpoint of FLAGGED_IN"), vessel.evidence());
        CardTerm asset = card.terms().stream().filter(t -> t.name().equals("Asset")).findFirst().orElseThrow();
        assertEquals(List.of("holds key purchasedOn"), asset.evidence(), "Vessel inherits from Asset, so Asset holds it");
        assertValidSubSchema(card);
    }

    @Test
    void subTypeWithoutItsOwnEndpointsShowsInheritedOnesWhenItsSuperIsOffTheCard() {
        Linking l = new Linking(List.of(new LinkedTerm(TermKind.RELATIONSHIP, "BUNKERS_AT", 1, List.of())), false, List.of());
        Card card = Cards.forQuestion(schema, l, 300, TokenEncoding.CL100K_BASE);
        assertTrue(card.text().contains("\nBUNKERS_AT < CALLS_AT: Vessel->Port // Takes on fuel at a port\n"), card.text());
    }

    @Test
    void neverExceedsTheBudgetAndCountsWhatIsLeftOut() {
        List<LinkedTerm> all = allTerms();
        Random random = new Random(7);
        int minimal = Integer.MAX_VALUE;
        for (int round = 0; round < 40; round++) {
            List<LinkedTerm> order = new ArrayList<>(all);
            Collections.shuffle(order, random);
            List<LinkedTerm> ranked = order.subList(0, 1 + random.nextInt(order.size()));
            int budget = 60 + random.nextInt(500);
            Linking linking = new Linking(ranked, false, List.of());
            Card card;
            try {
                card = Cards.forQuestion(schema, linking, budget, TokenEncoding.CL100K_BASE);
            } catch (BudgetTooSmallException e) {
                assertTrue(e.needed() > budget, e.getMessage());
                minimal = Math.min(minimal, e.needed());
                continue;
            }
            assertTrue(card.tokens() <= budget, card.tokens() + " > " + budget);
            assertEquals(counter.count(card.text()), card.tokens(), "jtokkit count of the whole text");
            Set<String> shown = card.terms().stream().map(t -> t.kind() + " " + t.name()).collect(Collectors.toSet());
            long missing = ranked.stream().filter(t -> !shown.contains(t.kind() + " " + t.name())).count();
            assertEquals(missing, card.leftOut());
            assertEquals(missing > 0, card.text().contains("# not shown: " + missing + " more term"), card.text());
            assertValidSubSchema(card);
        }
        assertTrue(minimal < Integer.MAX_VALUE, "some budgets were too small, as intended");
    }

    @Test
    void tooSmallABudgetSaysHowMuchIsNeeded() {
        BudgetTooSmallException e = assertThrows(BudgetTooSmallException.class,
                () -> Cards.forQuestion(schema, tankerQuestion(), 20, TokenEncoding.CL100K_BASE));
        assertTrue(e.getMessage().contains("raise --budget to at least " + e.needed()), e.getMessage());
        Card smallest = Cards.forQuestion(schema, tankerQuestion(), e.needed(), TokenEncoding.CL100K_BASE);
        assertTrue(smallest.leftOut() < tankerQuestion().ranked().size(), "a ranked term fits\n" + smallest.text());
        assertTrue(smallest.tokens() <= e.needed());
    }

    @Test
    void spareBudgetGoesToKeysOfTheLabelsShown() {
        Linking l = new Linking(List.of(new LinkedTerm(TermKind.LABEL, "Vessel", 1, List.of("v"))), false, List.of());
        Card roomy = Cards.forQuestion(schema, l, 1000, TokenEncoding.CL100K_BASE);
        assertEquals(Set.of("builtOn", "grossTonnage", "imoNumber"), roomy.scope().keys(), "not the deprecated dwt");
        Card tight = Cards.forQuestion(schema, l, Cards.forQuestion(schema, l, 1000, TokenEncoding.CL100K_BASE).tokens() - 1,
                TokenEncoding.CL100K_BASE);
        assertTrue(tight.scope().keys().size() < 3);
    }

    @Test
    void fallbackIsSaid() {
        Linking l = new Linking(List.of(new LinkedTerm(TermKind.LABEL, "Port", 0.1, List.of("central"))), true, List.of());
        Card card = Cards.forQuestion(schema, l, 500, TokenEncoding.CL100K_BASE);
        assertTrue(card.fallback());
        assertEquals(List.of(QuestionCard.FALLBACK_NOTICE), card.notices());
        Linking said = new Linking(l.ranked(), true, List.of("no term was recognised (the linker's words)"));
        assertEquals(List.of("no term was recognised (the linker's words)"),
                Cards.forQuestion(schema, said, 500, TokenEncoding.CL100K_BASE).notices(), "said once");
    }

    @Test
    void termsTheSchemaLacksAreIgnoredWithANotice() {
        Linking l = new Linking(List.of(new LinkedTerm(TermKind.LABEL, "Submarine", 1, List.of()),
                new LinkedTerm(TermKind.LABEL, "Port", 0.5, List.of())), false, List.of());
        Card card = Cards.forQuestion(schema, l, 500, TokenEncoding.CL100K_BASE);
        assertEquals(Set.of("Port"), card.scope().labels());
        assertTrue(card.notices().stream().anyMatch(n -> n.contains("'Submarine'")));
    }

    private List<LinkedTerm> allTerms() {
        List<LinkedTerm> out = new ArrayList<>();
        for (TermKind k : TermKind.values()) {
            for (TermInfo t : schema.terms(k)) out.add(new LinkedTerm(k, t.name(), 0.5, List.of()));
        }
        return out;
    }

    /** Every relationship type shown has an endpoint pair on the card (or its super does); every key a holder. */
    private void assertValidSubSchema(Card card) {
        CardScope s = card.scope();
        for (String r : s.relTypes()) {
            RelType rel = schema.relTypes().get(r);
            List<Endpoint> shown = CardText.shownEndpoints(schema, s, rel);
            boolean viaSuper = rel.superTypes().stream().anyMatch(s.relTypes()::contains);
            assertTrue(!shown.isEmpty() || viaSuper, "endpoints of " + r + " in\n" + card.text());
            for (Endpoint e : shown) {
                assertTrue(e.from() == null || s.labels().contains(e.from()));
                assertTrue(e.to() == null || s.labels().contains(e.to()));
            }
        }
        for (String k : s.keys()) {
            PropertyKey key = schema.properties().get(k);
            assertTrue(key.anyDomain() || key.domains().stream().anyMatch(s.labels()::contains), "holder of " + k);
            assertTrue(card.text().contains(k + ":"), k + " written on the card");
        }
        for (String l : s.labels()) assertTrue(card.text().contains("\n" + l), l);
        GraphSchema sub = SubSchema.of(schema, s);
        assertEquals(s.size(), sub.labels().size() + sub.relTypes().size() + sub.properties().size());
        assertFalse(card.text().contains("\n\n"));
    }
}

package dev.termgate.translate;

import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The card is built for a translator that reads it, and not for one that does not (the offline interpreter). */
class TranslationLoopCardTest {

    private static Translator translator(boolean readsCard, List<String> cardsSeen) {
        return new Translator() {
            @Override
            public String name() {
                return "test";
            }

            @Override
            public Reply translate(TranslationRequest request) {
                cardsSeen.add(request.card());
                return Reply.of("MATCH (v:Vessel) RETURN v.name");
            }

            @Override
            public boolean readsCard() {
                return readsCard;
            }
        };
    }

    @Test
    void aCardIsBuiltOnlyForATranslatorThatReadsIt() {
        List<String> built = new ArrayList<>();
        CardSource cards = q -> {
            built.add(q);
            return new CardSource.Card("labels: Vessel", 3, List.of("Vessel"));
        };
        ToyPipeline toy = new ToyPipeline();
        Pipeline p = toy.open(null);
        List<String> seen = new ArrayList<>();
        Outcome reading = new TranslationLoop(translator(true, seen), p.gate(), cards, 3).translate("ships?");
        assertEquals(List.of("ships?"), built);
        assertEquals(List.of("labels: Vessel"), seen);
        assertEquals(3, reading.card().tokens());

        Outcome blind = new TranslationLoop(translator(false, seen), p.gate(), cards, 3).translate("ships again?");
        assertEquals(List.of("ships?"), built, "no card built for a translator that reads none");
        assertEquals("", seen.get(1));
        assertEquals(0, blind.card().tokens());
        assertTrue(blind.valid());
    }
}

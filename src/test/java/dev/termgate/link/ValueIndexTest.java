package dev.termgate.link;

import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.Optional;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The in-memory value index; values are invented. */
class ValueIndexTest {

    private final InMemoryValueIndex index = ValueIndex.builder()
            .add("Port Kellhaven", "Port", "name")
            .add("Kellhaven", "Town")
            .add("Atlas", "Company", "name")
            .add("The", "Company")
            .add("XV-1024", "Container", "containerNumber")
            .build();

    @Test
    void longestMentionWinsAndCarriesItsClass() {
        List<ValueMention> ms = index.find("Which terminals are at port kellhaven?");
        assertEquals(1, ms.size());
        ValueMention m = ms.get(0);
        assertEquals("Port", m.label());
        assertEquals(Optional.of("name"), m.property());
        assertEquals("port kellhaven", "Which terminals are at port kellhaven?".substring(m.start(), m.end()));
    }

    @Test
    void oneOrdinaryWordMustLookLikeAName() {
        assertTrue(index.find("show me an atlas of the ports").isEmpty(), "lower-case ordinary word is not a mention");
        assertEquals("Company", index.find("What does Atlas operate?").get(0).label());
        assertEquals("Company", index.find("what does 'atlas' operate?").get(0).label());
    }

    @Test
    void valuesOfStopWordsOnlyAreNotIndexed() {
        assertEquals(4, index.size());
        assertTrue(index.find("The ships").isEmpty());
    }

    @Test
    void codesWithDigitsMatchInAnyCase() {
        assertEquals("Container", index.find("where is container xv-1024 now").get(0).label());
    }

    @Test
    void emptyIndexFindsNothing() {
        assertTrue(ValueIndex.empty().find("Port Kellhaven").isEmpty());
    }
}

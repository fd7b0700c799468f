package dev.termgate.card;

import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.RelType;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.io.IOException;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Whole-ontology cards of real ontologies: the demo ontology (our own) and the five public ones copied into
 * src/test/resources/ontologies (sources and licences in NOTICE.md there).
 */
class OntologyCardsTest {

    static GraphSchema schema(String file) {
        return TestOntologies.schema(file);
    }

    @Test
    void demoOntologyGolden() throws IOException {
        Golden.assertMatches("maritime.card", Cards.whole(schema(""), TokenEncoding.CL100K_BASE).text());
    }

    @Test
    void orgOntologyGolden() throws IOException {
        // W3C Organization Ontology (org.nq, see NOTICE.md).
        Golden.assertMatches("org.card", Cards.whole(schema("org.nq"), TokenEncoding.CL100K_BASE).text());
    }

    @Test
    void demoDotGolden() throws IOException {
        GraphSchema s = schema("");
        Golden.assertMatches("maritime.dot", DotCard.render(s, CardScope.whole(s)));
    }

    /** Each public ontology (NOTICE.md) renders, deterministically, with every term on the card. */
    @ParameterizedTest
    @ValueSource(strings = {"schema.nq", "org.nq", "prov.nq", "foaf.nq", "dcat.nq"})
    void publicOntologiesRender(String file) {
        GraphSchema s = schema(file);
        Card card = Cards.whole(s, TokenEncoding.CL100K_BASE);
        assertEquals(card.text(), Cards.whole(s, TokenEncoding.CL100K_BASE).text());
        assertEquals(s.labels().size() + s.relTypes().size() + s.properties().size(), card.terms().size());
        List<String> lines = card.text().lines().toList();
        for (String label : s.labels().keySet()) {
            assertEquals(1, lines.stream().filter(l -> l.equals(label) || l.startsWith(label + " ")).count(), label);
        }
        for (RelType r : s.relTypes().values()) {
            assertEquals(1, lines.stream().filter(l -> l.equals(r.name()) || l.startsWith(r.name() + " ")
                    || l.startsWith(r.name() + ":")).count(), r.name());
        }
        for (String key : s.properties().keySet()) {
            assertTrue(card.text().contains(key + ":"), key);
        }
        System.out.printf("card of %s: %d labels, %d relationship types, %d keys; %d tokens cl100k_base%n", file,
                s.labels().size(), s.relTypes().size(), s.properties().size(), card.tokens());
    }
}

package dev.termgate.card;

import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;

import java.util.Set;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

class DotCardTest {

    private final GraphSchema harbour = TestSchemas.harbour();

    @Test
    void labelsAreBoxesWithTheirOwnKeysAndSubclassEdgesAreDistinct() {
        String dot = DotCard.render(harbour, CardScope.whole(harbour));
        assertTrue(dot.contains("\"Tanker\" [label=<<B>Tanker</B><BR ALIGN=\"LEFT\"/>capacityCubicMetres: float<BR ALIGN=\"LEFT\"/>>];"), dot);
        assertTrue(dot.contains("\"Tanker\" -> \"Vessel\" [style=dashed, arrowhead=onormal, color=gray40];"));
        assertTrue(dot.contains("\"Vessel\" -> \"Port\" [label=\"CALLS_AT\"];"));
        assertTrue(dot.contains("\"Port\" -> \"Port\" [label=\"NEAR\", dir=both];"));
        assertTrue(dot.contains("\"*\" -> \"Port\" [label=\"REGISTERED_AT\"];"), "domain-free end drawn from 'any label'");
        assertTrue(dot.contains("\"Wharf\" [label=<<B>Wharf</B> (deprecated)"));
    }

    @Test
    void partOfTheSchemaDrawsOnlyWhatIsShown() {
        CardScope scope = CardScope.of(Set.of("Vessel", "Port"), Set.of("CALLS_AT", "LOCATED_IN"), Set.of("imoNumber"));
        String dot = DotCard.render(harbour, scope);
        assertEquals(1, dot.split(" -> ", -1).length - 1, "LOCATED_IN has no pair on this part: " + dot);
        assertTrue(!dot.contains("Asset"));
    }

    /** Graphviz itself is the reference: it must read back what we write (issue 7). */
    @Test
    void graphvizReadsTheDotBack() throws Exception {
        assumeTrue(Graphviz.available(), "Graphviz 'dot' is not installed (Debian package graphviz; .ci/run installs it)");
        for (GraphSchema s : new GraphSchema[] {harbour, OntologyCardsTest.schema(""), OntologyCardsTest.schema("org.nq")}) {
            String svg = Graphviz.toSvg(DotCard.render(s, CardScope.whole(s)));
            assertTrue(svg.contains("<svg") && svg.contains("</svg>"));
            for (String label : s.labels().keySet()) {
                assertTrue(svg.contains("<title>" + label + "</title>"), "node " + label + " drawn");
            }
        }
    }

    @Test
    void graphvizErrorsAreReportedNotThrownRaw() {
        assumeTrue(Graphviz.available(), "Graphviz 'dot' is not installed (Debian package graphviz; .ci/run installs it)");
        Graphviz.GraphvizException e = org.junit.jupiter.api.Assertions.assertThrows(Graphviz.GraphvizException.class,
                () -> Graphviz.toSvg("digraph { a -> }"));
        assertTrue(e.getMessage().startsWith("Graphviz 'dot' failed"), e.getMessage());
        assertTrue(!e.missing());
    }
}

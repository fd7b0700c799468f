package dev.termgate.link;

import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.Set;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Connection paths and centrality over a hand-built class graph (invented terms). */
class ClassGraphTest {

    private final GraphSchema schema = MiniSchema.logistics();
    private final ClassGraph graph = new ClassGraph(schema);

    @Test
    void pathUsesTheSuperclassOfAnInheritedRelationship() {
        // Tanker inherits operatedBy from Vessel: Tanker ↑ Vessel -OPERATED_BY- Company.
        List<ClassGraph.Step> path = graph.connect(List.of("Company"), "Tanker", t -> 1.0, 5).orElseThrow();
        assertEquals(List.of(
                new ClassGraph.Step("Company", "Vessel", "OPERATED_BY"),
                new ClassGraph.Step("Vessel", "Tanker", null)), path);
    }

    @Test
    void sharingAnAncestorIsNotAConnection() {
        // Port and Company only share Thing; the real path crosses three relationship types.
        List<ClassGraph.Step> path = graph.connect(List.of("Port"), "Company", t -> 1.0, 5).orElseThrow();
        assertEquals(List.of("CALLS_AT", "PERFORMED_BY", "OPERATED_BY"),
                path.stream().map(ClassGraph.Step::relType).filter(r -> r != null).toList());
    }

    @Test
    void cheaperRelationshipTypesArePreferred() {
        GraphSchema s = MiniSchema.create()
                .label("A", null).label("B", null)
                .rel("first", "A", "B", null).rel("second", "A", "B", null)
                .build("two-ways");
        ClassGraph g = new ClassGraph(s);
        assertEquals("SECOND", g.connect(List.of("A"), "B", t -> t.equals("SECOND") ? 0.4 : 1.0, 5)
                .orElseThrow().get(0).relType());
    }

    @Test
    void unreachableWithinTheCostGivesNothing() {
        assertTrue(graph.connect(List.of("Port"), "Company", t -> 1.0, 1.5).isEmpty());
    }

    @Test
    void centralClassesComeFirst() {
        // The root (every subclass edge) and Vessel (most relationship edges) lead; Country, on one edge, does not.
        List<String> central = graph.central(3);
        assertTrue(Set.copyOf(central).containsAll(Set.of("Thing", "Vessel")), central.toString());
        assertTrue(!central.contains("Country"), central.toString());
    }
}

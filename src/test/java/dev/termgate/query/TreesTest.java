package dev.termgate.query;

import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import dev.termgate.tck.TckScenarios;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The written-out child table ({@link Children}) against the generic one read from the record components, on
 * every query of the openCypher TCK 1.0.0-M23 (read from the test classpath) that parses, read-only and update
 * alike; and the table lists every record class of the tree.
 */
class TreesTest {

    @Test
    void everyRecordClassOfTheTreeIsListed() {
        Set<Class<?>> records = new LinkedHashSet<>();
        collect(Node.class, records);
        Set<Class<?>> missing = new LinkedHashSet<>(records);
        missing.removeAll(Children.listed());
        assertEquals(Set.of(), missing, "record classes without written-out children");
        assertTrue(records.size() > 60, "the tree has " + records.size() + " record classes");
    }

    @Test
    void writtenOutChildrenEqualTheGenericOnesOnTheTck() {
        CypherParser parser = new CypherParser();
        int nodes = 0, queries = 0;
        Set<Class<?>> seen = new LinkedHashSet<>();
        for (TckScenarios.Scenario s : TckScenarios.all()) {
            if (s.query().isEmpty()) continue;
            ParseResult r = parser.parse(s.query().get());
            if (!r.isValid()) continue;
            queries++;
            List<Node> order = new ArrayList<>();
            Trees.walk(r.tree(), order::add);
            for (Node n : order) {
                List<Node> generic = new ArrayList<>();
                Trees.genericChildren(n, generic);
                List<Node> written = Trees.children(n);
                assertEquals(generic.size(), written.size(), () -> n.getClass() + " in " + s.id());
                for (int i = 0; i < generic.size(); i++) {
                    int k = i;
                    assertTrue(generic.get(i) == written.get(i), () -> n.getClass() + " child " + k + " in " + s.id());
                }
                seen.add(n.getClass());
                nodes++;
            }
        }
        System.out.printf("Trees: written-out children equal the generic ones on %d nodes of %d TCK queries (%d record classes seen)%n",
                nodes, queries, seen.size());
        assertTrue(queries > 3000, "TCK queries parsed: " + queries);
    }

    @Test
    void equalIgnoringSpansAgreesWithComparingStrippedCopies() {
        CypherParser parser = new CypherParser();
        List<Query> trees = new ArrayList<>();
        for (TckScenarios.Scenario s : TckScenarios.all()) {
            if (s.query().isEmpty()) continue;
            ParseResult r = parser.parse(s.query().get());
            if (r.isValid()) trees.add(r.tree());
        }
        int equal = 0, pairs = 0;
        for (int i = 0; i < trees.size(); i++) {
            Query a = trees.get(i);
            // the same query printed and read again: equal, with other spans
            ParseResult again = parser.parse(Printer.print(a));
            if (again.isValid()) {
                assertEquals(Trees.stripSpans(a).equals(Trees.stripSpans(again.tree())), Trees.equalIgnoringSpans(a, again.tree()));
                pairs++;
            }
            // its neighbour in the TCK: mostly different, sometimes the same query
            Query b = trees.get((i + 1) % trees.size());
            boolean reference = Trees.stripSpans(a).equals(Trees.stripSpans(b));
            assertEquals(reference, Trees.equalIgnoringSpans(a, b), () -> Printer.print(a) + "\n" + Printer.print(b));
            if (reference) equal++;
            pairs++;
        }
        System.out.printf("Trees: equalIgnoringSpans agrees with comparing stripped copies on %d pairs (%d neighbours equal)%n",
                pairs, equal);
        assertTrue(pairs > 6000, "pairs: " + pairs);
    }

    private static void collect(Class<?> c, Set<Class<?>> out) {
        if (c.isRecord()) {
            out.add(c);
            return;
        }
        Class<?>[] subs = c.getPermittedSubclasses();
        if (subs != null) for (Class<?> s : subs) collect(s, out);
    }
}

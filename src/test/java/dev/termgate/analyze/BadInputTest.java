package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.repair.CheckResult;
import dev.termgate.repair.QueryCheck;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.stream.Collectors;
import java.util.stream.IntStream;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Bad input gives clear results, never a crash or a hang: queries with thousands of labels, ontologies with
 * subClassOf cycles, properties without domain or range, punned IRIs. The timeouts only guard against a hang
 * (common practice: far above the expected time); speed is measured in the bench profile.
 */
class BadInputTest {

    private static final Duration HANG = Duration.ofSeconds(60);

    @Test
    void thousandsOfUnknownLabels() {
        GraphSchema demo = OntologyLoader.load(List.of(OntologyLoader.DEMO)).schema();
        String labels = IntStream.range(0, 3000).mapToObj(i -> "Lbl" + i).collect(Collectors.joining(":"));
        CheckResult r = assertTimeoutPreemptively(HANG, () -> QueryCheck.check("MATCH (n:" + labels + ") RETURN n", demo));
        assertFalse(r.valid());
        assertEquals(3000, r.diagnostics().stream().filter(d -> d.code() == Code.UNKNOWN_LABEL).count());
    }

    @Test
    void thousandsOfKnownLabelsAndAlternatives() {
        GraphSchema demo = OntologyLoader.load(List.of(OntologyLoader.DEMO)).schema();
        String same = IntStream.range(0, 3000).mapToObj(i -> "Vessel").collect(Collectors.joining(":"));
        CheckResult a = assertTimeoutPreemptively(HANG, () -> QueryCheck.check("MATCH (n:" + same + ") RETURN n.name", demo));
        assertTrue(a.valid(), a.report());
        String mixed = IntStream.range(0, 2000).mapToObj(i -> i % 2 == 0 ? "Vessel" : "Port").collect(Collectors.joining("|"));
        CheckResult b = assertTimeoutPreemptively(HANG,
                () -> QueryCheck.check("MATCH (n:" + mixed + ")-[:HOME_PORT]->(p:Port) RETURN n", demo));
        assertTrue(b.valid(), b.report());
        String conflicting = IntStream.range(0, 2000).mapToObj(i -> i % 2 == 0 ? "Vessel" : "Port").collect(Collectors.joining(":"));
        CheckResult c = assertTimeoutPreemptively(HANG, () -> QueryCheck.check("MATCH (n:" + conflicting + ") RETURN n", demo));
        assertFalse(c.valid());
        assertTrue(c.diagnostics().stream().anyMatch(d -> d.code() == Code.IMPOSSIBLE_LABELS), c.report());
    }

    @Test
    void longChainsOfHops() {
        GraphSchema demo = OntologyLoader.load(List.of(OntologyLoader.DEMO)).schema();
        String chain = "(a0:PortCall)" + IntStream.range(1, 1500).mapToObj(i -> "-[:NEXT_PORT_CALL]->(a" + i + ")")
                .collect(Collectors.joining());
        CheckResult r = assertTimeoutPreemptively(HANG, () -> QueryCheck.check("MATCH " + chain + " RETURN a0", demo));
        assertTrue(r.valid(), () -> r.report().substring(0, Math.min(2000, r.report().length())));
    }

    private static final String ODD = """
            @prefix rdfs: <http://www.w3.org/2000/01/rdf-schema#> .
            @prefix owl:  <http://www.w3.org/2002/07/owl#> .
            @prefix xsd:  <http://www.w3.org/2001/XMLSchema#> .
            @prefix ex:   <https://example.org/odd#> .
            ex:Alpha a owl:Class ; rdfs:subClassOf ex:Beta .
            ex:Beta  a owl:Class ; rdfs:subClassOf ex:Gamma .
            ex:Gamma a owl:Class ; rdfs:subClassOf ex:Alpha .
            ex:Other a owl:Class .
            ex:linksTo a owl:ObjectProperty ; rdfs:domain ex:Alpha ; rdfs:range ex:Gamma .
            ex:relatesTo a owl:ObjectProperty .
            ex:code a owl:DatatypeProperty ; rdfs:domain ex:Beta ; rdfs:range xsd:string .
            ex:note a owl:DatatypeProperty .
            ex:Member a owl:Class , owl:ObjectProperty ; rdfs:domain ex:Other ; rdfs:range ex:Alpha .
            """;

    @Test
    void cyclesMissingDomainsAndPunning(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("odd.ttl");
        Files.writeString(f, ODD);
        GraphSchema s = OntologyLoader.load(List.of(f.toString())).schema();
        // a cycle makes the classes equivalent: any of them satisfies any other
        assertValid("MATCH (a:Alpha)-[:LINKS_TO]->(b:Beta) RETURN a.code, b.code", s);
        assertValid("MATCH (x:Alpha:Gamma) RETURN x", s);
        assertValid("MATCH (g:Gamma)<-[:LINKS_TO]-(a:Beta) RETURN g", s);
        // no domain or range: any class, both ways; a domain-free key on any label
        assertValid("MATCH (o:Other)-[:RELATES_TO]->(a:Alpha) RETURN o.note, a.note", s);
        assertValid("MATCH (a:Alpha)-[:RELATES_TO]->(o:Other) RETURN o", s);
        // a punned IRI is both a label and a relationship type
        String label = s.labels().containsKey("Member") ? "Member" : null;
        String type = s.relTypes().keySet().stream().filter(t -> t.equalsIgnoreCase("member")).findFirst().orElse(null);
        if (label != null) assertValid("MATCH (m:" + label + ") RETURN m", s);
        if (type != null) assertValid("MATCH (o:Other)-[:" + type + "]->(a:Alpha) RETURN o", s);
        assertTrue(label != null || type != null, "the punned term is kept in some form: " + s.labels().keySet() + s.relTypes().keySet());
        // and a clear error, not a crash, for a wrong use
        CheckResult wrong = QueryCheck.check("MATCH (o:Other) RETURN o.code", s);
        assertFalse(wrong.valid());
        assertTrue(wrong.diagnostics().stream().anyMatch(d -> d.code() == Code.PROPERTY_NOT_ON_LABEL), wrong.report());
    }

    @Test
    void handBuiltCycleInTheSchema() {
        GraphSchema s = GraphSchema.of("cycle", List.of(
                        TestSchemas.label("A", List.of("B"), List.of(), false),
                        TestSchemas.label("B", List.of("A"), List.of(), false)),
                List.of(TestSchemas.rel("R", List.of(new dev.termgate.schema.Endpoint("A", "B")), java.util.Set.of("R"), null, false)),
                List.of(), List.of());
        CheckResult r = assertTimeoutPreemptively(HANG, () -> QueryCheck.check("MATCH (b:B)-[:R]->(a:A) RETURN a", s));
        assertTrue(r.valid(), r.report());
        CheckResult u = QueryCheck.check("MATCH (b:B)-[:Q]->(a:A) RETURN a", s);
        assertFalse(u.valid());
    }

    private static void assertValid(String q, GraphSchema s) {
        CheckResult r = assertTimeoutPreemptively(HANG, () -> QueryCheck.check(q, s));
        List<Diagnostic> errors = r.diagnostics().stream().filter(Diagnostic::isError).toList();
        assertEquals(List.of(), errors, q);
    }
}

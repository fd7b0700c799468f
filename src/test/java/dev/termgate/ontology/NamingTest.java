package dev.termgate.ontology;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Severity;
import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.LangString;
import dev.termgate.schema.Names;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.TermInfo;
import dev.termgate.schema.TermKind;
import dev.termgate.schema.ValueType;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Set;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Graph names: styles, tg:graphName overrides, collisions (never merged), and the way back to IRIs. */
class NamingTest {

    static final String FILE = OntologyErrorsTest.CASES + "naming.ttl";
    static final String EX = "https://example.org/naming#";

    @TempDir
    Path tmp;

    private static GraphSchema load(String file, Names.Style style) {
        return OntologyLoader.load(List.of(file), LoadOptions.defaults().withCache(false).withNaming(style)).schema();
    }

    @Test
    void graphStyleNames() {
        GraphSchema s = load(FILE, Names.Style.GRAPH);
        // Common practice for property graphs: labels UpperCamelCase, types UPPER_SNAKE_CASE, keys lowerCamelCase.
        assertEquals(Set.of("CargoVessel", "Port", "OtherPort", "Terminal", "Quay"), s.labels().keySet());
        assertEquals(Set.of("HAS_PORT_CALL"), s.relTypes().keySet());
        assertEquals(Set.of("grossTonnage", "imoNumber", "oldCode"), s.properties().keySet());
        assertEquals(List.of(new Endpoint("CargoVessel", "Port")), s.relType("HAS_PORT_CALL").orElseThrow().endpoints());
        PropertyKey gt = s.property("grossTonnage").orElseThrow();
        assertEquals(Set.of("CargoVessel"), gt.domains());
        assertEquals(ValueType.FLOAT, gt.valueType());
        PropertyKey imo = s.property("imoNumber").orElseThrow();
        assertTrue(imo.anyDomain());
        assertEquals(ValueType.STRING, imo.valueType());
        assertTrue(s.property("oldCode").orElseThrow().info().deprecated());
    }

    @Test
    void asIsStyleKeepsLocalNamesAndOverrides() {
        GraphSchema s = load(FILE, Names.Style.AS_IS);
        assertEquals(Set.of("cargo_vessel", "Port", "other_Port", "Terminal", "Quay"), s.labels().keySet());
        assertEquals(Set.of("has_port_call"), s.relTypes().keySet());
        assertEquals(Set.of("gross_tonnage", "imoNumber", "oldCode"), s.properties().keySet());
    }

    @Test
    void everyNameMapsBackToItsIri() {
        GraphSchema s = load(FILE, Names.Style.GRAPH);
        for (TermKind k : TermKind.values()) {
            for (TermInfo t : s.terms(k)) assertEquals(t.name(), s.byIri(t.iri()).orElseThrow().name(), t.iri());
        }
        assertEquals(EX + "cargo_vessel", s.label("CargoVessel").orElseThrow().info().iri());
        assertEquals("https://example.org/other#Port", s.label("OtherPort").orElseThrow().info().iri());
    }

    @Test
    void annotationsAreKeptWithLanguageTags() {
        TermInfo t = load(FILE, Names.Style.GRAPH).label("CargoVessel").orElseThrow().info();
        assertEquals(List.of(new LangString("cargo vessel", "en")), t.labels());
        assertEquals(List.of(new LangString("Frachter", "de"), new LangString("freighter", "en")), t.altLabels());
        assertEquals("A ship that carries goods.", t.comment("en").orElseThrow());
    }

    /** Two IRIs, one name: the home namespace's term keeps it, the other is qualified, and a warning says so. */
    @Test
    void collisionIsReportedNotMerged() {
        GraphSchema s = load(FILE, Names.Style.GRAPH);
        List<Diagnostic> c = s.issues().stream().filter(d -> d.code() == Code.NAME_COLLISION).toList();
        assertEquals(1, c.size(), s.issues().toString());
        assertEquals(Severity.WARNING, c.get(0).severity());
        assertEquals("ex:Port and other:Port both map to the label name 'Port'; they are named 'Port' and 'OtherPort'"
                + " (set tg:graphName on a term to choose its name)", c.get(0).message());
    }

    @Test
    void explicitNameWinsACollisionAndSameNamespaceCollisionsKeepTheirLocalNames() throws IOException {
        Path f = tmp.resolve("c.ttl");
        Files.writeString(f, """
                @prefix ex: <https://example.org/c#> .
                @prefix other: <https://example.org/d#> .
                @prefix owl: <http://www.w3.org/2002/07/owl#> .
                @prefix tg: <https://termgate.dev/ns#> .
                ex:Dock a owl:Class . ex:Ship a owl:Class .
                other:Dock a owl:Class ; tg:graphName "Dock" .
                ex:has_part a owl:ObjectProperty . ex:hasPart a owl:ObjectProperty .
                ex:familyName a owl:DatatypeProperty . ex:family_name a owl:DatatypeProperty .
                """);
        GraphSchema s = load(f.toString(), Names.Style.GRAPH);
        assertEquals("https://example.org/d#Dock", s.label("Dock").orElseThrow().info().iri());
        assertEquals("https://example.org/c#Dock", s.label("ExDock").orElseThrow().info().iri());
        // Same namespace: qualifying would not tell them apart, so the local names as written are used; the one
        // whose local name already is the graph name keeps it.
        assertEquals(Set.of("has_part", "hasPart"), s.relTypes().keySet());
        assertEquals("https://example.org/c#familyName", s.property("familyName").orElseThrow().info().iri());
        assertEquals("https://example.org/c#family_name", s.property("family_name").orElseThrow().info().iri());
        assertEquals(3, s.issues().stream().filter(d -> d.code() == Code.NAME_COLLISION).count());
    }

    /** Prefixes derived from namespaces when the file declares none (N-Triples, N-Quads). */
    @Test
    void derivedPrefixes() {
        assertEquals("foaf", Naming.derivedPrefix("http://xmlns.com/foaf/0.1/"));
        assertEquals("schema", Naming.derivedPrefix("http://schema.org/"));
        assertEquals("org", Naming.derivedPrefix("http://www.w3.org/ns/org#"));
        assertEquals("FinancialProductsAndServices", Naming.derivedPrefix(
                "https://spec.example.org/finance/ontology/FBC/ProductsAndServices/FinancialProductsAndServices/"));
    }
}

package dev.termgate.ontology;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.io.IOException;
import java.net.ServerSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Set;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Bad ontologies: each gives a clear diagnostic (or a documented, tested behaviour), never a stack trace. */
class OntologyErrorsTest {

    static final String CASES = "src/test/resources/ontology-cases/";

    @TempDir
    Path tmp;

    private LoadOptions opts() {
        return LoadOptions.defaults().withCache(false);
    }

    /** Sources that cannot be loaded: source → code and the words the message must hold. */
    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
            // Line 5 ends without '.', so the parser meets ex:Berth at line 6, column 1 (from the file itself).
            "syntax-error.ttl   | TG6001 | syntax-error.ttl, line 6, column 1: Triples not terminated by DOT",
            // rdfs: is used on line 5, column 9 without being declared.
            "unknown-prefix.ttl | TG6001 | unknown-prefix.ttl, line 5, column 9: Undefined prefix: rdfs",
            // The closing tag on line 5 does not match the element opened on line 4 (XML parser's position).
            "syntax-error.rdf   | TG6001 | syntax-error.rdf, line 5, column 5: The element type",
            // A trailing comma before '}' on line 5 is not JSON.
            "syntax-error.jsonld | TG6001 | syntax-error.jsonld, line 5, column 1: The document could not be loaded or parsed",
            "empty.ttl          | TG6003 | empty.ttl holds no classes or properties",
            "no-terms.ttl       | TG6003 | no-terms.ttl holds no classes or properties",
            "missing.ttl        | TG6002 | cannot read src/test/resources/ontology-cases/missing.ttl: no such file",
            "../ontologies/NOTICE.md | TG6002 | NOTICE.md: unknown RDF syntax; name the file .ttl, .rdf, .owl, .nt, .nq, .jsonld or .trig",
    })
    void unloadable(String file, String code, String message) {
        OntologyException e = assertThrows(OntologyException.class, () -> OntologyLoader.load(List.of(CASES + file), opts()));
        assertEquals(1, e.problems().size());
        Diagnostic d = e.problems().get(0);
        assertEquals(code, d.code().id());
        assertTrue(d.message().contains(message.strip()), d.message());
        assertFalse(e.serviceFailure());
    }

    @Test
    void directoryThatIsNotTdb2() {
        OntologyException e = assertThrows(OntologyException.class, () -> OntologyLoader.load(List.of(tmp.toString()), opts()));
        assertTrue(e.getMessage().contains("not a TDB2 database"), e.getMessage());
    }

    @Test
    void unreachableSparqlEndpointIsAServiceFailure() throws IOException {
        int port;
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort(); // closed again: nothing listens there
        }
        OntologyException e = assertThrows(OntologyException.class,
                () -> OntologyLoader.load(List.of("sparql:http://127.0.0.1:" + port + "/ds/sparql"), opts()));
        assertTrue(e.serviceFailure());
        assertEquals(Code.ONTOLOGY_UNREADABLE, e.problems().get(0).code());
        assertTrue(e.getMessage().contains("SPARQL endpoint http://127.0.0.1:" + port), e.getMessage());
    }

    @Test
    void unreachableUrlIsAServiceFailure() throws IOException {
        int port;
        try (ServerSocket s = new ServerSocket(0)) {
            port = s.getLocalPort();
        }
        OntologyException e = assertThrows(OntologyException.class,
                () -> OntologyLoader.load(List.of("http://127.0.0.1:" + port + "/ontology.ttl"), opts()));
        assertTrue(e.serviceFailure(), e.getMessage());
        assertTrue(e.getMessage().startsWith("TG6002: cannot read http://127.0.0.1:" + port + "/ontology.ttl"), e.getMessage());
    }

    @Test
    void subclassCycleIsReportedAndTreatedAsEquivalence() {
        LoadedOntology lo = OntologyLoader.load(List.of(CASES + "cycle.ttl"), opts());
        List<Diagnostic> cycles = lo.problems().stream().filter(d -> d.code() == Code.SUBCLASS_CYCLE).toList();
        assertEquals(1, cycles.size(), lo.problems().toString());
        assertEquals("classes 'Conveyance', 'Craft' and 'Vehicle' form a subclass cycle; they are treated as equivalent",
                cycles.get(0).message());
        GraphSchema s = lo.schema();
        Set<String> ring = Set.of("Conveyance", "Craft", "Vehicle");
        for (String c : ring) assertEquals(ring, s.superLabels(c), c);
        assertEquals(Set.of("Barge", "Conveyance", "Craft", "Vehicle"), s.superLabels("Barge"));
        assertEquals(Set.of("Barge", "Conveyance", "Craft", "Vehicle"), s.subLabels("Vehicle"));
    }

    @Test
    void classThatIsAlsoAPropertyKeepsBoth() {
        LoadedOntology lo = OntologyLoader.load(List.of(CASES + "punning.ttl"), opts());
        assertTrue(lo.problems().stream().anyMatch(d -> d.code() == Code.PUNNED_TERM
                && d.message().equals("ex:crew is declared both as a class and as a property")), lo.problems().toString());
        assertTrue(lo.schema().label("Crew").isPresent());
        assertEquals(List.of(new Endpoint("Ship", "Voyage")), lo.schema().relType("CREW").orElseThrow().endpoints());
    }

    @Test
    void blankDomainThatIsNotAUnionMeansAnyClass() {
        LoadedOntology lo = OntologyLoader.load(List.of(CASES + "blank-domain.ttl"), opts());
        List<Diagnostic> d = lo.problems().stream().filter(x -> x.code() == Code.UNSUPPORTED_DOMAIN).toList();
        assertEquals(1, d.size(), lo.problems().toString());
        assertEquals("ex:visits has a domain that is not a class or a union of classes; it is treated as any class",
                d.get(0).message());
        assertEquals(List.of(new Endpoint(null, "Port")), lo.schema().relType("VISITS").orElseThrow().endpoints());
        assertEquals(Set.of(new Endpoint("Port", "Berth"), new Endpoint("Ship", "Berth")),
                Set.copyOf(lo.schema().relType("MOORS_AT").orElseThrow().endpoints()));
        // The restriction's class is not a label source: only named classes used as classes are.
        assertEquals(Set.of("Ship", "Port", "Berth"), lo.schema().labels().keySet());
    }

    @Test
    void importsAreSatisfiedByAnotherSourceOrReported() {
        LoadedOntology lo = OntologyLoader.load(List.of(CASES + "imports-main.ttl", CASES + "imports-base.ttl"), opts());
        List<Diagnostic> imports = lo.problems().stream().filter(x -> x.code() == Code.IMPORT_NOT_LOADED).toList();
        assertEquals(1, imports.size(), lo.problems().toString());
        assertTrue(imports.get(0).message().contains("<https://example.org/elsewhere/not-given>"));
        assertEquals(Set.of("Tanker", "Vessel"), lo.schema().superLabels("Tanker"));
    }

    @Test
    void importOfALocalFileIsRead() throws IOException {
        Path base = tmp.resolve("base.ttl");
        Files.copy(Path.of(CASES + "imports-base.ttl"), base);
        Path main = tmp.resolve("main.ttl");
        Files.writeString(main, """
                @prefix owl: <http://www.w3.org/2002/07/owl#> .
                @prefix rdfs: <http://www.w3.org/2000/01/rdf-schema#> .
                <https://example.org/imp/main> a owl:Ontology ; owl:imports <base.ttl> .
                <https://example.org/imp#Tanker> a owl:Class ; rdfs:subClassOf <https://example.org/imp#Vessel> .
                """);
        LoadedOntology lo = OntologyLoader.load(List.of(main.toString()), opts());
        assertTrue(lo.problems().stream().noneMatch(x -> x.code() == Code.IMPORT_NOT_LOADED), lo.problems().toString());
        assertTrue(lo.schema().byIri("https://example.org/imp#Vessel").isPresent());
    }
}

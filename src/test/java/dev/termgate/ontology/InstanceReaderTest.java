package dev.termgate.ontology;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.ValueType;
import org.apache.jena.query.QueryExecution;
import org.apache.jena.rdf.model.Model;
import org.apache.jena.riot.RDFDataMgr;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.OffsetDateTime;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.function.Function;
import java.util.stream.Collectors;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

class InstanceReaderTest {

    static final String DATA = "examples/maritime/data.ttl";
    static final String MAR = "https://example.org/termgate/maritime#";
    static final String D = "https://example.org/termgate/maritime/data/";

    static GraphSchema schema;
    static InstanceData demo;

    @TempDir
    Path tmp;

    @BeforeAll
    static void read() {
        schema = OntologyLoader.load(List.of(SourcesTest.DEMO_FILE), LoadOptions.defaults().withCache(false)).schema();
        demo = InstanceReader.read(DATA, schema);
    }

    private static long sparqlCount(Model m, String where) {
        try (QueryExecution qe = QueryExecution.create("SELECT (COUNT(*) AS ?n) WHERE { " + where + " }", m)) {
            return qe.execSelect().next().getLiteral("n").getLong();
        }
    }

    /** The demo data maps completely: counts equal Jena SPARQL over the same file, nothing is left unreported. */
    @Test
    void demoDataMapsCompletely() {
        Model m = RDFDataMgr.loadModel(DATA);
        // The demo data holds one statement with a term the ontology lacks, on purpose (examples/maritime/README.md).
        assertEquals(List.of("<" + MAR + "colourOfHull> is not defined by the ontology; 1 statement(s) not imported"),
                demo.problems().stream().map(Diagnostic::message).toList());
        // Every typed subject is a node (Jena SPARQL count over the same file).
        assertEquals(sparqlCount(m, "SELECT DISTINCT ?s WHERE { ?s a ?c }"), demo.nodes().stream().filter(n -> !n.labels().isEmpty()).count());
        // Every statement with a resource object other than rdf:type is an edge.
        assertEquals(sparqlCount(m, "?s ?p ?o FILTER (?p != <http://www.w3.org/1999/02/22-rdf-syntax-ns#type> && !isLiteral(?o))"),
                demo.edges().size());
        long literalStatements = sparqlCount(m, "?s ?p ?o FILTER isLiteral(?o)");
        long values = demo.nodes().stream().flatMap(n -> n.properties().values().stream())
                .mapToLong(v -> v instanceof List<?> l ? l.size() : 1).sum();
        assertEquals(literalStatements - 1, values, "all literal statements but the colourOfHull one");
    }

    @Test
    void valuesAreTypedByTheirDatatype() {
        Map<String, DataNode> byId = demo.nodes().stream().collect(Collectors.toMap(DataNode::id, Function.identity()));
        DataNode v = byId.get(D + "vessel-01");
        // Values as written in examples/maritime/data.ttl.
        assertEquals(Set.of("ContainerShip"), v.labels());
        assertEquals("Tessarine Dalemire", v.properties().get("name"));
        assertEquals("0708138", v.properties().get("imoNumber"));
        assertEquals(2022L, v.properties().get("yearBuilt"));
        assertEquals(33510.0, v.properties().get("dwt"), "named by tg:graphName in the ontology");
        assertEquals(Boolean.TRUE, byId.get(D + "country-xv").properties().get("inCustomsUnion"));
        assertTrue(demo.edges().contains(new DataEdge(D + "vessel-01", "FLAG_STATE", D + "country-xn")));
    }

    @ParameterizedTest
    @CsvSource({
            "42, INTEGER, java.lang.Long",
            "+7, INTEGER, java.lang.Long",
            "123456789012345678901234567890, INTEGER, java.lang.Double",
            "2.5, FLOAT, java.lang.Double",
            "INF, FLOAT, java.lang.Double",
            "true, BOOLEAN, java.lang.Boolean",
            "0, BOOLEAN, java.lang.Boolean",
            "2024-03-01, DATE, java.time.LocalDate",
            "2024-03-01Z, DATE, java.time.LocalDate",
            "2024-03-01T10:15:00, DATETIME, java.time.LocalDateTime",
            "2024-03-01T10:15:00Z, DATETIME, java.time.OffsetDateTime",
            "2024-03-01T10:15:00+02:00, DATETIME, java.time.OffsetDateTime",
            "10:15:00, TIME, java.time.LocalTime",
            "10:15:00+01:00, TIME, java.time.OffsetTime",
    })
    void xsdLexicalFormsConvert(String lex, ValueType type, String javaClass) throws ClassNotFoundException {
        // Lexical forms from XML Schema 1.1 Part 2 (xsd:integer, decimal/double, boolean, date, dateTime, time).
        assertInstanceOf(Class.forName(javaClass), InstanceReader.convert(lex, type));
    }

    @Test
    void unknownTermsAndBadValuesAreReportedNotDropped() throws IOException {
        Path f = tmp.resolve("data.ttl");
        Files.writeString(f, """
                @prefix mar: <https://example.org/termgate/maritime#> .
                @prefix xsd: <http://www.w3.org/2001/XMLSchema#> .
                @prefix ex: <https://example.org/unknown#> .
                <urn:v1> a mar:ContainerShip , ex:Submarine ; mar:name "One" ; ex:colour "red" ; ex:colour "blue" ;
                    mar:yearBuilt "nineteen"^^xsd:integer ; mar:flagState "XV" ; mar:name <urn:v2> .
                <urn:v2> a mar:Vessel ; mar:departureTime "2024-01-02T03:04:05"^^xsd:dateTime .
                """);
        InstanceData d = InstanceReader.read(f.toString(), schema);
        Map<Code, List<String>> byCode = d.problems().stream().collect(Collectors.groupingBy(Diagnostic::code,
                Collectors.mapping(Diagnostic::message, Collectors.toList())));
        assertEquals(List.of("<https://example.org/unknown#Submarine> is not defined by the ontology; 1 statement(s) not imported",
                "<https://example.org/unknown#colour> is not defined by the ontology; 2 statement(s) not imported"),
                byCode.get(Code.UNKNOWN_DATA_TERM));
        assertEquals(List.of("'FLAG_STATE' is a relationship type, but 1 statement(s) give it a literal value; they were not imported",
                "'name' is a property key, but 1 statement(s) give it a resource (IRI or blank node) value; they were not imported"),
                byCode.get(Code.DATA_KIND_MISMATCH));
        assertEquals(List.of("1 value(s) of 'yearBuilt' are not valid integer (e.g. 'nineteen'); they were kept as text"),
                byCode.get(Code.BAD_DATA_VALUE));
        DataNode v1 = d.nodes().get(0);
        assertEquals("urn:v1", v1.id());
        assertEquals(Set.of("ContainerShip"), v1.labels());
        assertEquals("nineteen", v1.properties().get("yearBuilt"));
        assertInstanceOf(LocalDateTime.class, d.nodes().get(1).properties().get("departureTime"));
        assertTrue(LocalDate.class.isInstance(InstanceReader.convert("2024-01-01", ValueType.DATE)));
        assertTrue(OffsetDateTime.class.isInstance(InstanceReader.convert("2024-01-01T00:00:00Z", ValueType.DATETIME)));
    }
}

package dev.termgate.ontology;

import dev.termgate.schema.GraphSchema;
import org.apache.jena.fuseki.main.FusekiServer;
import org.apache.jena.query.Dataset;
import org.apache.jena.query.DatasetFactory;
import org.apache.jena.rdf.model.Model;
import org.apache.jena.rdf.model.ModelFactory;
import org.apache.jena.riot.Lang;
import org.apache.jena.riot.RDFDataMgr;
import org.apache.jena.rdf.model.Statement;
import org.apache.jena.system.Txn;
import org.apache.jena.tdb2.TDB2Factory;
import org.apache.jena.tdb2.sys.TDBInternal;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Every kind of source gives the same schema as the demo ontology's Turtle file. The other syntaxes are written
 * from it by Jena's own writers (the reference), the quad syntaxes with the statements split over two graphs.
 */
class SourcesTest {

    static final String DEMO_FILE = "examples/maritime/ontology.ttl";

    @TempDir
    static Path tmp;

    static GraphSchema reference;
    static Model demo;

    @BeforeAll
    static void readReference() {
        reference = OntologyLoader.load(List.of(DEMO_FILE), LoadOptions.defaults().withCache(false)).schema();
        demo = RDFDataMgr.loadModel(DEMO_FILE);
    }

    static void assertSameSchema(GraphSchema expected, GraphSchema actual) {
        assertEquals(expected.labels(), actual.labels());
        assertEquals(expected.relTypes(), actual.relTypes());
        assertEquals(expected.properties(), actual.properties());
        assertEquals(expected.issues(), actual.issues());
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource({"demo.rdf, RDF/XML", "demo.owl, RDF/XML", "demo.nt, N-Triples", "demo.jsonld, JSON-LD",
            "demo.nq, N-Quads", "demo.trig, TriG", "demo.ttl, Turtle"})
    void everySyntaxGivesTheSameSchema(String file, String langName) throws IOException {
        Lang lang = org.apache.jena.riot.RDFLanguages.nameToLang(langName);
        Path p = tmp.resolve(file);
        try (OutputStream out = Files.newOutputStream(p)) {
            if (org.apache.jena.riot.RDFLanguages.isQuads(lang)) RDFDataMgr.write(out, splitInTwoGraphs(), lang);
            else RDFDataMgr.write(out, demo, lang);
        }
        // Prefixes are not part of every syntax (N-Triples has none): they only matter for collision names,
        // which the demo ontology does not have.
        assertSameSchema(reference, OntologyLoader.load(List.of(p.toString()), LoadOptions.defaults().withCache(false)).schema());
    }

    @Test
    void severalFilesAreMerged() throws IOException {
        Dataset two = splitInTwoGraphs();
        Path a = tmp.resolve("part-a.ttl");
        Path b = tmp.resolve("part-b.ttl");
        try (OutputStream out = Files.newOutputStream(a)) {
            RDFDataMgr.write(out, two.getNamedModel("urn:g:one"), Lang.TURTLE);
        }
        try (OutputStream out = Files.newOutputStream(b)) {
            RDFDataMgr.write(out, two.getNamedModel("urn:g:two"), Lang.TURTLE);
        }
        assertSameSchema(reference, OntologyLoader.load(List.of(a.toString(), b.toString()),
                LoadOptions.defaults().withCache(false)).schema());
    }

    @Test
    void tdb2DirectoryIsRead() {
        Path dir = tmp.resolve("tdb2");
        Dataset ds = TDB2Factory.connectDataset(dir.toString());
        Txn.executeWrite(ds, () -> ds.getDefaultModel().add(demo));
        TDBInternal.expel(ds.asDatasetGraph());
        assertSameSchema(reference, OntologyLoader.load(List.of(dir.toString()), LoadOptions.defaults().withCache(false)).schema());
    }

    /** A real SPARQL endpoint (Apache Jena Fuseki, in process on 127.0.0.1) serving the demo ontology. */
    @Test
    void sparqlEndpointGivesTheSameSchemaAsTheFile() {
        Dataset ds = DatasetFactory.createTxnMem();
        Txn.executeWrite(ds, () -> ds.getDefaultModel().add(demo));
        FusekiServer server = FusekiServer.create().loopback(true).port(0).add("/ds", ds, false).build().start();
        try {
            String endpoint = "http://127.0.0.1:" + server.getPort() + "/ds/sparql";
            LoadedOntology lo = OntologyLoader.load(List.of("sparql:" + endpoint), LoadOptions.defaults().withCache(false));
            assertSameSchema(reference, lo.schema());
            assertTrue(lo.schema().labels().size() >= 25);
            // The same store read as an RDF document over HTTP (SPARQL Graph Store Protocol GET; syntax from the
            // reply's content type).
            String document = "http://127.0.0.1:" + server.getPort() + "/ds?default";
            assertSameSchema(reference, OntologyLoader.load(List.of(document), LoadOptions.defaults().withCache(false)).schema());
        } finally {
            server.stop();
        }
    }

    private static Dataset splitInTwoGraphs() {
        Dataset ds = DatasetFactory.create();
        Model one = ModelFactory.createDefaultModel();
        Model two = ModelFactory.createDefaultModel();
        one.setNsPrefixes(demo.getNsPrefixMap());
        two.setNsPrefixes(demo.getNsPrefixMap());
        List<Statement> all = new ArrayList<>(demo.listStatements().toList());
        // A blank node (a union, a list) is local to its file: every statement touching one stays in the first half.
        for (Statement s : all) {
            boolean first = s.getSubject().isAnon() || s.getObject().isAnon() || s.getSubject().getURI().hashCode() % 2 == 0;
            (first ? one : two).add(s);
        }
        ds.addNamedModel("urn:g:one", one);
        ds.addNamedModel("urn:g:two", two);
        return ds;
    }
}

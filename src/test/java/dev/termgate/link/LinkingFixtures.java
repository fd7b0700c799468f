package dev.termgate.link;

import com.google.gson.JsonObject;
import com.google.gson.JsonParser;
import dev.termgate.ontology.LoadOptions;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.Names;
import org.apache.jena.rdf.model.Literal;
import org.apache.jena.rdf.model.Model;
import org.apache.jena.rdf.model.RDFNode;
import org.apache.jena.rdf.model.Resource;
import org.apache.jena.rdf.model.Statement;
import org.apache.jena.rdf.model.StmtIterator;
import org.apache.jena.riot.RDFDataMgr;
import org.apache.jena.vocabulary.RDF;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;

/**
 * Shared inputs of the linking tests: the schemas (loaded once per JVM, cached under target/), the question
 * sets, and a value index read from the demo data with Jena (the engine builds the real one from a loaded
 * graph; Jena here is only a convenient reader of the same file).
 */
final class LinkingFixtures {

    static final Path CACHE = Path.of("target", "termgate-test-cache");
    static final Path SCHEMA_ORG = Path.of("src/test/resources/ontologies/schema.nq");
    static final Path DEMO_ONTOLOGY = Path.of("examples/maritime/ontology.ttl");
    static final Path DEMO_DATA = Path.of("examples/maritime/data.ttl");

    record Question(String id, String text, List<String> terms) {}

    private static GraphSchema schemaOrg;
    private static GraphSchema demo;

    private LinkingFixtures() {}

    static synchronized GraphSchema schemaOrg() {
        if (schemaOrg == null) schemaOrg = load(SCHEMA_ORG);
        return schemaOrg;
    }

    static synchronized GraphSchema demo() {
        if (demo == null) demo = load(DEMO_ONTOLOGY);
        return demo;
    }

    private static GraphSchema load(Path p) {
        return OntologyLoader.load(List.of(p.toString()), LoadOptions.defaults().withCacheDir(CACHE)).schema();
    }

    static LinkOptions options() {
        return LinkOptions.defaults().withLanguage("en").withCacheDir(CACHE.resolve("embeddings"));
    }

    static List<Question> questions(Path jsonl) throws IOException {
        List<Question> out = new ArrayList<>();
        for (String line : Files.readAllLines(jsonl, StandardCharsets.UTF_8)) {
            if (line.isBlank()) continue;
            JsonObject o = JsonParser.parseString(line).getAsJsonObject();
            List<String> terms = new ArrayList<>();
            o.getAsJsonArray("terms").forEach(e -> terms.add(e.getAsString()));
            out.add(new Question(o.get("id").getAsString(), o.get("question").getAsString(), terms));
        }
        return out;
    }

    /**
     * (value, label, property) for every literal of a name-like property of a typed node in the demo data:
     * what the engine's index holds once the data is loaded.
     */
    static ValueIndex demoValues(GraphSchema schema) {
        Model m = RDFDataMgr.loadModel(DEMO_DATA.toString());
        InMemoryValueIndex.Builder b = ValueIndex.builder();
        Set<String> naming = Set.of("name", "title", "label");
        StmtIterator it = m.listStatements();
        while (it.hasNext()) {
            Statement s = it.next();
            RDFNode o = s.getObject();
            if (!o.isLiteral()) continue;
            List<String> words = Names.words(s.getPredicate().getLocalName());
            if (words.stream().noneMatch(naming::contains)) continue;
            String key = schema.byIri(s.getPredicate().getURI()).map(t -> t.name()).orElse(null);
            Literal lit = o.asLiteral();
            for (Statement t : m.listStatements(s.getSubject(), RDF.type, (RDFNode) null).toList()) {
                Resource cls = t.getObject().asResource();
                schema.byIri(cls.getURI()).ifPresent(info -> b.add(lit.getLexicalForm(), info.name(), key));
            }
        }
        return b.build();
    }
}

package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.ontology.OntologyLoader;
import dev.termgate.parser.CypherParser;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.RelType;
import org.apache.jena.query.Dataset;
import org.apache.jena.rdf.model.InfModel;
import org.apache.jena.rdf.model.Model;
import org.apache.jena.rdf.model.ModelFactory;
import org.apache.jena.rdf.model.RDFNode;
import org.apache.jena.rdf.model.Resource;
import org.apache.jena.reasoner.ReasonerRegistry;
import org.apache.jena.riot.RDFDataMgr;
import org.apache.jena.vocabulary.OWL;
import org.apache.jena.vocabulary.RDFS;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The analyzer's subclass, sub-property and inverse reasoning against Apache Jena's reasoners as the reference
 * computation on the same ontology file: the RDFS reasoner for rdfs:subClassOf / rdfs:subPropertyOf closures,
 * the OWL micro reasoner for owl:inverseOf. Ontologies: the demo (examples/maritime/ontology.ttl) and W3C ORG
 * (src/test/resources/ontologies/org.nq).
 */
class ReasoningReferenceTest {

    static {
        // Jena's vocabulary classes must be initialised in order before a reasoner is built.
        org.apache.jena.sys.JenaSystem.init();
    }

    private static final CypherParser PARSER = new CypherParser();

    @ParameterizedTest
    @ValueSource(strings = {"examples/maritime/ontology.ttl", "src/test/resources/ontologies/org.nq"})
    void labelConjunctionsFollowJenaSubclassClosure(String file) {
        GraphSchema schema = OntologyLoader.load(List.of(file)).schema();
        // The RDFS reasoner gives the rdfs:subClassOf closure; ORG also declares owl:equivalentClass (org:Organization
        // and foaf:Organization), which needs the OWL micro reasoner: its closure includes the RDFS one.
        InfModel rdfs = ModelFactory.createInfModel(ReasonerRegistry.getOWLMicroReasoner(), read(file));
        Analyzer analyzer = Analyzer.forSchema(schema);
        List<NodeLabel> labels = new ArrayList<>(schema.labels().values());
        int pairs = 0;
        List<String> mismatches = new ArrayList<>();
        for (NodeLabel a : labels) {
            for (NodeLabel b : labels) {
                // Reference: some named class is (entailed to be) a subclass of both.
                boolean expected = false;
                for (NodeLabel c : labels) {
                    if (sub(rdfs, c.info().iri(), a.info().iri()) && sub(rdfs, c.info().iri(), b.info().iri())) {
                        expected = true;
                        break;
                    }
                }
                boolean accepted = analyzer.analyze(PARSER.parse("MATCH (n:" + a.name() + ":" + b.name() + ") RETURN n").tree())
                        .diagnostics().stream().noneMatch(d -> d.code() == Code.IMPOSSIBLE_LABELS);
                pairs++;
                if (expected != accepted) mismatches.add(a.name() + "&" + b.name() + " expected " + expected);
            }
        }
        System.out.println(file + ": " + pairs + " label pairs compared with Jena's subclass closure, "
                + mismatches.size() + " differ (reference: Jena OWL micro reasoner, RDFS closure plus owl:equivalentClass)");
        assertEquals(List.of(), mismatches);
    }

    @ParameterizedTest
    @ValueSource(strings = {"examples/maritime/ontology.ttl", "src/test/resources/ontologies/org.nq"})
    void inversesAndSubPropertiesFollowJena(String file) {
        GraphSchema schema = OntologyLoader.load(List.of(file)).schema();
        Model raw = read(file);
        InfModel rdfs = ModelFactory.createInfModel(ReasonerRegistry.getRDFSReasoner(), raw);
        InfModel owl = ModelFactory.createInfModel(ReasonerRegistry.getOWLMicroReasoner(), raw);
        Analyzer analyzer = Analyzer.forSchema(schema);
        int inverseChecks = 0, subChecks = 0;
        List<String> problems = new ArrayList<>();
        for (RelType t : schema.relTypes().values()) {
            Resource tr = owl.getResource(t.info().iri());
            // owl:inverseOf as entailed by the OWL micro reasoner: T used against the inverse's declared direction
            // must be accepted with the inverse's domain and range swapped.
            for (RDFNode inv : owl.listObjectsOfProperty(tr, OWL.inverseOf).toList()) {
                if (!inv.isURIResource()) continue;
                RelType ti = schema.byIri(inv.asResource().getURI()).flatMap(i -> schema.relType(i.name())).orElse(null);
                if (ti == null) continue;
                String dom = namedObject(raw, ti.info().iri(), RDFS.domain, schema);
                String ran = namedObject(raw, ti.info().iri(), RDFS.range, schema);
                if (dom == null || ran == null) continue;
                inverseChecks++;
                String q = "MATCH (a:" + ran + ")-[:" + t.name() + "]->(b:" + dom + ") RETURN a";
                if (analyzer.analyze(PARSER.parse(q).tree()).hasErrors()) problems.add("inverse not used: " + q);
            }
            // rdfs:subPropertyOf (transitive, RDFS reasoner): [:SUPER] also matches SUB edges, so SUB's declared
            // endpoints must be accepted under SUPER.
            Resource sr = rdfs.getResource(t.info().iri());
            String dom = namedObject(raw, t.info().iri(), RDFS.domain, schema);
            String ran = namedObject(raw, t.info().iri(), RDFS.range, schema);
            if (dom == null || ran == null) continue;
            for (RDFNode sup : rdfs.listObjectsOfProperty(sr, RDFS.subPropertyOf).toList()) {
                if (!sup.isURIResource() || sup.asResource().getURI().equals(t.info().iri())) continue;
                RelType ts = schema.byIri(sup.asResource().getURI()).flatMap(i -> schema.relType(i.name())).orElse(null);
                if (ts == null) continue;
                subChecks++;
                String q = "MATCH (a:" + dom + ")-[:" + ts.name() + "]->(b:" + ran + ") RETURN a";
                if (analyzer.analyze(PARSER.parse(q).tree()).hasErrors()) problems.add("sub-property not followed: " + q);
            }
        }
        System.out.println(file + ": " + inverseChecks + " inverse and " + subChecks
                + " sub-property uses compared with Jena's OWL micro / RDFS reasoners, " + problems.size() + " problems");
        assertTrue(inverseChecks > 0 && subChecks > 0, "the ontology should exercise both");
        assertEquals(List.of(), problems);
    }

    private static boolean sub(InfModel m, String sub, String sup) {
        return sub.equals(sup) || m.contains(m.getResource(sub), RDFS.subClassOf, m.getResource(sup));
    }

    /** The graph label of the single named class the ontology gives as domain/range, or null. */
    private static String namedObject(Model raw, String iri, org.apache.jena.rdf.model.Property p, GraphSchema schema) {
        List<RDFNode> objects = raw.listObjectsOfProperty(raw.getResource(iri), p).toList();
        if (objects.size() != 1 || !objects.get(0).isURIResource()) return null;
        return schema.byIri(objects.get(0).asResource().getURI()).filter(i -> schema.labels().containsKey(i.name()))
                .map(i -> i.name()).orElse(null);
    }

    private static Model read(String file) {
        if (file.endsWith(".nq")) {
            Dataset ds = RDFDataMgr.loadDataset(file);
            Model m = ModelFactory.createDefaultModel();
            m.add(ds.getDefaultModel());
            ds.listModelNames().forEachRemaining(n -> m.add(ds.getNamedModel(n)));
            return m;
        }
        return RDFDataMgr.loadModel(file);
    }
}

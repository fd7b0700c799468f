package dev.termgate.ontology;

import dev.termgate.diag.Diagnostic;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.RelType;
import dev.termgate.schema.TermInfo;
import org.apache.jena.query.Dataset;
import org.apache.jena.query.QueryExecution;
import org.apache.jena.query.QuerySolution;
import org.apache.jena.query.ResultSet;
import org.apache.jena.rdf.model.InfModel;
import org.apache.jena.rdf.model.Model;
import org.apache.jena.rdf.model.ModelFactory;
import org.apache.jena.rdf.model.RDFNode;
import org.apache.jena.rdf.model.Resource;
import org.apache.jena.rdf.model.Statement;
import org.apache.jena.rdf.model.StmtIterator;
import org.apache.jena.reasoner.ReasonerRegistry;
import org.apache.jena.riot.RDFDataMgr;
import org.apache.jena.vocabulary.OWL;
import org.apache.jena.vocabulary.RDFS;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.stream.Collectors;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The five public ontologies of src/test/resources/ontologies (sources and licences in NOTICE.md there) against
 * independent computations by Apache Jena over the same files: SPARQL queries written here from the rules in
 * {@link Deriver}'s documentation (not by calling it), and the OWL-micro reasoner.
 */
class PublicOntologiesTest {

    private static final String PREFIXES = """
            PREFIX rdf: <http://www.w3.org/1999/02/22-rdf-syntax-ns#>
            PREFIX rdfs: <http://www.w3.org/2000/01/rdf-schema#>
            PREFIX owl: <http://www.w3.org/2002/07/owl#>
            PREFIX sdo: <http://schema.org/>
            PREFIX sdos: <https://schema.org/>
            """;

    /** ?x is a datatype: XSD, RDF's literal classes, a declared datatype, a schema.org DataType, or below one. */
    private static String isDatatype(String x) {
        return """
                EXISTS { %1$s rdfs:subClassOf* ?dt_%2$s .
                         FILTER (STRSTARTS(STR(?dt_%2$s), "http://www.w3.org/2001/XMLSchema#")
                                 || ?dt_%2$s IN (rdfs:Literal, rdf:langString, rdf:PlainLiteral, rdf:XMLLiteral, rdf:HTML,
                                                 rdf:JSON, rdf:CompoundLiteral, sdo:DataType, sdos:DataType)
                                 || EXISTS { ?dt_%2$s a rdfs:Datatype } || EXISTS { ?dt_%2$s a sdo:DataType }
                                 || EXISTS { ?dt_%2$s a sdos:DataType }) }""".formatted(x, x.substring(1));
    }

    private static String notBuiltIn(String x) {
        return """
                FILTER (isIRI(%1$s) && !STRSTARTS(STR(%1$s), STR(rdf:)) && !STRSTARTS(STR(%1$s), STR(rdfs:))
                        && !STRSTARTS(STR(%1$s), STR(owl:)) && !STRSTARTS(STR(%1$s), "http://www.w3.org/2001/XMLSchema#"))
                """.formatted(x);
    }

    private static final String MEMBERS = "((owl:unionOf/rdf:rest*/rdf:first)*)";
    private static final String DOMAIN = "(rdfs:domain|sdo:domainIncludes|sdos:domainIncludes)";
    private static final String RANGE = "(rdfs:range|sdo:rangeIncludes|sdos:rangeIncludes)";

    /** Named classes declared or used as a class in an axiom; not datatypes, not the RDF/RDFS/OWL vocabulary. */
    static final String LABELS = PREFIXES + "SELECT DISTINCT ?c WHERE {\n"
            + "  { ?c a owl:Class } UNION { ?c a rdfs:Class } UNION { ?c rdfs:subClassOf ?x }\n"
            + "  UNION { ?x (rdfs:subClassOf|owl:equivalentClass)/" + MEMBERS + " ?c } UNION { ?c owl:equivalentClass ?x }\n"
            + "  UNION { ?x (" + DOMAIN + "|" + RANGE + ")/" + MEMBERS + " ?c } UNION { ?u owl:unionOf/rdf:rest*/rdf:first ?c }\n"
            + notBuiltIn("?c") + "  FILTER NOT " + isDatatype("?c") + "\n}";

    /** Declared or described properties, minus annotation-only ones. */
    private static final String CANDIDATE = """
              { ?p a ?t VALUES ?t { rdf:Property owl:ObjectProperty owl:DatatypeProperty owl:FunctionalProperty
                  owl:InverseFunctionalProperty owl:TransitiveProperty owl:SymmetricProperty owl:AsymmetricProperty
                  owl:ReflexiveProperty owl:IrreflexiveProperty } }
              UNION { ?p %s ?anything }
            """.formatted("(" + DOMAIN + "|" + RANGE + ")") + notBuiltIn("?p") + """
              FILTER NOT EXISTS { ?p a owl:AnnotationProperty
                                  FILTER NOT EXISTS { ?p a owl:ObjectProperty } FILTER NOT EXISTS { ?p a owl:DatatypeProperty } }
            """;

    private static final String UNDECLARED = "NOT EXISTS { ?p a owl:ObjectProperty } && NOT EXISTS { ?p a owl:DatatypeProperty }";
    private static final String CLASS_RANGE = "EXISTS { ?p " + RANGE + "/" + MEMBERS + " ?r FILTER (isIRI(?r)) FILTER NOT " + isDatatype("?r") + " }";
    private static final String DATA_RANGE = "EXISTS { ?p " + RANGE + "/" + MEMBERS + " ?r2 FILTER (isIRI(?r2)) FILTER " + isDatatype("?r2") + " }";
    private static final String OBJECT_HINT = """
            (EXISTS { ?p a ?ch VALUES ?ch { owl:InverseFunctionalProperty owl:TransitiveProperty owl:SymmetricProperty
                      owl:AsymmetricProperty owl:ReflexiveProperty owl:IrreflexiveProperty } }
             || EXISTS { ?p owl:inverseOf|sdo:inverseOf|sdos:inverseOf ?i } || EXISTS { ?j owl:inverseOf|sdo:inverseOf|sdos:inverseOf ?p })""";

    static final String REL_TYPES = PREFIXES + "SELECT DISTINCT ?p WHERE {\n" + CANDIDATE
            + "  FILTER (EXISTS { ?p a owl:ObjectProperty } || (" + UNDECLARED + " && (" + CLASS_RANGE + " || (!" + DATA_RANGE
            + " && " + OBJECT_HINT + "))))\n}";

    static final String PROPERTY_KEYS = PREFIXES + "SELECT DISTINCT ?p WHERE {\n" + CANDIDATE
            + "  FILTER (EXISTS { ?p a owl:DatatypeProperty } || (" + UNDECLARED + " && (" + DATA_RANGE + " || (!" + CLASS_RANGE
            + " && !" + OBJECT_HINT + "))))\n}";

    /** Each file is read and derived once for all the checks (the checks are read-only). */
    private static final Map<String, Model> MODELS = new java.util.concurrent.ConcurrentHashMap<>();
    private static final Map<String, GraphSchema> SCHEMAS = new java.util.concurrent.ConcurrentHashMap<>();

    private static Model model(String name) {
        return MODELS.computeIfAbsent(name, PublicOntologiesTest::readModel);
    }

    private static Model readModel(String name) {
        Dataset ds = RDFDataMgr.loadDataset(OntologyLoaderTest.DIR + name + ".nq");
        Model m = ModelFactory.createDefaultModel();
        m.add(ds.getDefaultModel());
        ds.listNames().forEachRemaining(n -> m.add(ds.getNamedModel(n)));
        return m;
    }

    private static Set<String> select(Model m, String query) {
        Set<String> out = new TreeSet<>();
        try (QueryExecution qe = QueryExecution.create(query, m)) {
            ResultSet rs = qe.execSelect();
            String v = rs.getResultVars().get(0);
            while (rs.hasNext()) {
                QuerySolution s = rs.next();
                out.add(s.getResource(v).getURI());
            }
        }
        return out;
    }

    private static Set<String> iris(List<TermInfo> terms) {
        return terms.stream().map(TermInfo::iri).collect(Collectors.toCollection(TreeSet::new));
    }

    private static GraphSchema derive(String name) {
        return SCHEMAS.computeIfAbsent(name, PublicOntologiesTest::load);
    }

    private static GraphSchema load(String name) {
        LoadedOntology lo = OntologyLoader.load(List.of(OntologyLoaderTest.DIR + name + ".nq"), LoadOptions.defaults().withCache(false));
        assertTrue(lo.problems().stream().noneMatch(Diagnostic::isError), lo.problems().toString());
        return lo.schema();
    }

    /** Label, relationship-type and property-key counts (and the IRIs themselves) equal Jena SPARQL's. */
    @ParameterizedTest
    @ValueSource(strings = {"schema", "org", "prov", "foaf", "dcat"})
    void termsEqualIndependentSparql(String name) {
        GraphSchema s = derive(name);
        Model m = model(name);
        Set<String> labels = select(m, LABELS);
        Set<String> rels = select(m, REL_TYPES);
        Set<String> keys = select(m, PROPERTY_KEYS);
        System.out.printf("%s: %d labels, %d relationship types, %d property keys (SPARQL: %d, %d, %d)%n", name,
                s.labels().size(), s.relTypes().size(), s.properties().size(), labels.size(), rels.size(), keys.size());
        assertEquals(labels, iris(s.terms(dev.termgate.schema.TermKind.LABEL)), "labels of " + name);
        assertEquals(rels, iris(s.terms(dev.termgate.schema.TermKind.RELATIONSHIP)), "relationship types of " + name);
        assertEquals(keys, iris(s.terms(dev.termgate.schema.TermKind.PROPERTY)), "property keys of " + name);
    }

    /**
     * For every class, its superclasses (itself, and equivalent classes both ways, included) equal what Jena's
     * OWL-micro reasoner infers as rdfs:subClassOf over the same file, restricted to classes that are labels.
     */
    @ParameterizedTest
    @ValueSource(strings = {"schema", "org", "prov", "foaf", "dcat"})
    void subclassClosureEqualsOwlMicroReasoner(String name) {
        GraphSchema s = derive(name);
        InfModel inf = ModelFactory.createInfModel(ReasonerRegistry.getOWLMicroReasoner(), model(name));
        Map<String, String> nameOf = new HashMap<>();
        for (NodeLabel l : s.labels().values()) nameOf.put(l.info().iri(), l.name());
        int compared = 0;
        for (NodeLabel l : s.labels().values()) {
            Set<String> expected = new TreeSet<>();
            expected.add(l.name());
            StmtIterator it = inf.listStatements(inf.createResource(l.info().iri()), RDFS.subClassOf, (RDFNode) null);
            while (it.hasNext()) {
                Statement st = it.next();
                if (st.getObject().isURIResource() && nameOf.containsKey(st.getResource().getURI())) {
                    expected.add(nameOf.get(st.getResource().getURI()));
                }
            }
            assertEquals(expected, new TreeSet<>(s.superLabels(l.name())), "superclasses of " + l.info().iri() + " in " + name);
            compared++;
        }
        System.out.printf("%s: superclasses of %d classes equal OWL-micro's%n", name, compared);
    }

    /**
     * Inverse relationship types equal owl:inverseOf as inferred by OWL-micro (both directions), plus schema.org's
     * own inverseOf read both ways (a schema.org term the reasoner does not know).
     */
    @ParameterizedTest
    @ValueSource(strings = {"schema", "org", "prov", "foaf", "dcat"})
    void inversesEqualOwlMicroReasoner(String name) {
        GraphSchema s = derive(name);
        Model m = model(name);
        InfModel inf = ModelFactory.createInfModel(ReasonerRegistry.getOWLMicroReasoner(), m);
        Map<String, String> nameOf = new HashMap<>();
        for (RelType r : s.relTypes().values()) nameOf.put(r.info().iri(), r.name());
        int withInverse = 0;
        for (RelType r : s.relTypes().values()) {
            Resource p = inf.createResource(r.info().iri());
            Set<String> expected = new HashSet<>();
            inf.listStatements(p, OWL.inverseOf, (RDFNode) null).forEachRemaining(st -> add(st.getObject(), nameOf, expected));
            for (String ns : List.of("http://schema.org/", "https://schema.org/")) {
                m.listStatements(p, m.createProperty(ns + "inverseOf"), (RDFNode) null).forEachRemaining(st -> add(st.getObject(), nameOf, expected));
                m.listStatements(null, m.createProperty(ns + "inverseOf"), p).forEachRemaining(st -> add(st.getSubject(), nameOf, expected));
            }
            if (expected.remove(r.name())) assertTrue(r.symmetric(), "self-inverse " + r.name() + " is symmetric");
            assertEquals(!expected.isEmpty(), r.inverseOf().isPresent(), "inverse of " + r.info().iri());
            r.inverseOf().ifPresent(i -> assertTrue(expected.contains(i), r.name() + " inverse " + i + " not in " + expected));
            if (r.inverseOf().isPresent()) withInverse++;
        }
        System.out.printf("%s: %d relationship types with an inverse, as OWL-micro infers%n", name, withInverse);
    }

    private static void add(RDFNode n, Map<String, String> nameOf, Set<String> out) {
        if (n.isURIResource() && nameOf.containsKey(n.asResource().getURI())) out.add(nameOf.get(n.asResource().getURI()));
    }
}

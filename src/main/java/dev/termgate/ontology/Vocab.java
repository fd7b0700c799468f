package dev.termgate.ontology;

import org.apache.jena.graph.Node;
import org.apache.jena.graph.NodeFactory;

import java.util.List;
import java.util.Set;

/** The RDF, RDFS, OWL, SKOS, schema.org and termgate terms the derivation reads. */
final class Vocab {
    private Vocab() {}

    static final String RDF = "http://www.w3.org/1999/02/22-rdf-syntax-ns#";
    static final String RDFS = "http://www.w3.org/2000/01/rdf-schema#";
    static final String OWL = "http://www.w3.org/2002/07/owl#";
    static final String XSD = "http://www.w3.org/2001/XMLSchema#";
    static final String SKOS = "http://www.w3.org/2004/02/skos/core#";
    static final String SCHEMA_HTTP = "http://schema.org/";
    static final String SCHEMA_HTTPS = "https://schema.org/";
    /** termgate's own namespace (prefix {@code tg:}). */
    static final String TG = "https://termgate.dev/ns#";

    /** Namespaces whose terms describe ontologies rather than a domain: never graph terms. */
    static final List<String> BUILT_IN = List.of(RDF, RDFS, OWL, XSD);

    static final Node TYPE = iri(RDF + "type");
    static final Node FIRST = iri(RDF + "first");
    static final Node REST = iri(RDF + "rest");
    static final Node NIL = iri(RDF + "nil");
    static final Node PROPERTY = iri(RDF + "Property");

    static final Node RDFS_CLASS = iri(RDFS + "Class");
    static final Node SUB_CLASS_OF = iri(RDFS + "subClassOf");
    static final Node SUB_PROPERTY_OF = iri(RDFS + "subPropertyOf");
    static final Node DOMAIN = iri(RDFS + "domain");
    static final Node RANGE = iri(RDFS + "range");
    static final Node LABEL = iri(RDFS + "label");
    static final Node COMMENT = iri(RDFS + "comment");
    static final Node LITERAL = iri(RDFS + "Literal");
    static final Node RESOURCE = iri(RDFS + "Resource");
    static final Node DATATYPE = iri(RDFS + "Datatype");

    static final Node OWL_CLASS = iri(OWL + "Class");
    static final Node THING = iri(OWL + "Thing");
    static final Node ONTOLOGY = iri(OWL + "Ontology");
    static final Node IMPORTS = iri(OWL + "imports");
    static final Node EQUIVALENT_CLASS = iri(OWL + "equivalentClass");
    static final Node UNION_OF = iri(OWL + "unionOf");
    static final Node INVERSE_OF = iri(OWL + "inverseOf");
    static final Node OBJECT_PROPERTY = iri(OWL + "ObjectProperty");
    static final Node DATATYPE_PROPERTY = iri(OWL + "DatatypeProperty");
    static final Node ANNOTATION_PROPERTY = iri(OWL + "AnnotationProperty");
    static final Node SYMMETRIC = iri(OWL + "SymmetricProperty");
    static final Node DEPRECATED = iri(OWL + "deprecated");
    static final Node VERSION_IRI = iri(OWL + "versionIRI");

    static final Node PREF_LABEL = iri(SKOS + "prefLabel");
    static final Node ALT_LABEL = iri(SKOS + "altLabel");
    static final Node DEFINITION = iri(SKOS + "definition");

    static final Node GRAPH_NAME = iri(TG + "graphName");

    /** Property characteristics that only object properties may have (OWL 2 structural spec, section 9.2). */
    static final Set<Node> OBJECT_ONLY_CHARACTERISTICS = Set.of(
            iri(OWL + "InverseFunctionalProperty"), iri(OWL + "TransitiveProperty"), SYMMETRIC,
            iri(OWL + "AsymmetricProperty"), iri(OWL + "ReflexiveProperty"), iri(OWL + "IrreflexiveProperty"));

    /** Types that declare a property. */
    static final Set<Node> PROPERTY_TYPES = union(Set.of(PROPERTY, OBJECT_PROPERTY, DATATYPE_PROPERTY,
            iri(OWL + "FunctionalProperty")), OBJECT_ONLY_CHARACTERISTICS);

    /** RDF's own literal classes (RDF 1.1 Concepts, section 5) besides the XSD namespace. */
    static final Set<Node> LITERAL_CLASSES = Set.of(LITERAL, iri(RDF + "langString"), iri(RDF + "PlainLiteral"),
            iri(RDF + "XMLLiteral"), iri(RDF + "HTML"), iri(RDF + "JSON"), iri(RDF + "CompoundLiteral"),
            schemaHttp("DataType"), schemaHttps("DataType"));

    static List<Node> schemaBoth(String local) {
        return List.of(schemaHttp(local), schemaHttps(local));
    }

    static Node schemaHttp(String local) {
        return iri(SCHEMA_HTTP + local);
    }

    static Node schemaHttps(String local) {
        return iri(SCHEMA_HTTPS + local);
    }

    static Node iri(String s) {
        return NodeFactory.createURI(s);
    }

    static boolean isBuiltIn(Node n) {
        if (!n.isURI()) return false;
        String s = n.getURI();
        for (String ns : BUILT_IN) if (s.startsWith(ns)) return true;
        return false;
    }

    private static Set<Node> union(Set<Node> a, Set<Node> b) {
        java.util.HashSet<Node> s = new java.util.HashSet<>(a);
        s.addAll(b);
        return Set.copyOf(s);
    }
}

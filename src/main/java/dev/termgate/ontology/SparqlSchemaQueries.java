package dev.termgate.ontology;

import java.util.List;

/**
 * The CONSTRUCT query that fetches an ontology from a SPARQL endpoint (default and named graphs merged).
 * One query rather than several: blank nodes (unions and their lists) keep their identity only within one
 * reply.
 */
final class SparqlSchemaQueries {
    private SparqlSchemaQueries() {}

    private static final String SCHEMA = """
            PREFIX rdf: <http://www.w3.org/1999/02/22-rdf-syntax-ns#>
            PREFIX rdfs: <http://www.w3.org/2000/01/rdf-schema#>
            PREFIX owl: <http://www.w3.org/2002/07/owl#>
            PREFIX skos: <http://www.w3.org/2004/02/skos/core#>
            PREFIX tg: <https://termgate.dev/ns#>
            CONSTRUCT { ?s ?p ?o } WHERE {
              { ?s ?p ?o } UNION { GRAPH ?g { ?s ?p ?o } }
              FILTER (
                # axioms and annotations the derivation reads
                ?p IN (rdfs:subClassOf, rdfs:subPropertyOf, rdfs:domain, rdfs:range, owl:equivalentClass,
                       owl:unionOf, owl:inverseOf, owl:deprecated, owl:imports, owl:versionIRI,
                       rdfs:label, rdfs:comment, skos:prefLabel, skos:altLabel, skos:definition, tg:graphName,
                       <http://schema.org/domainIncludes>, <http://schema.org/rangeIncludes>,
                       <http://schema.org/inverseOf>, <http://schema.org/supersededBy>,
                       <https://schema.org/domainIncludes>, <https://schema.org/rangeIncludes>,
                       <https://schema.org/inverseOf>, <https://schema.org/supersededBy>,
                       rdf:first, rdf:rest)
                # declarations of schema terms, not the typing of instances
                || (?p = rdf:type && ?o IN (owl:Class, rdfs:Class, rdf:Property, owl:ObjectProperty,
                       owl:DatatypeProperty, owl:AnnotationProperty, owl:FunctionalProperty,
                       owl:InverseFunctionalProperty, owl:TransitiveProperty, owl:SymmetricProperty,
                       owl:AsymmetricProperty, owl:ReflexiveProperty, owl:IrreflexiveProperty, owl:Ontology,
                       rdfs:Datatype, <http://schema.org/DataType>, <https://schema.org/DataType>))
              )
            }""";

    static final List<String> ALL = List.of(SCHEMA);
}

package dev.termgate.analyze;

import dev.termgate.diag.Diagnostic;
import dev.termgate.parser.CypherParser;
import dev.termgate.parser.ParseResult;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Table of queries → the diagnostic expected: code, line, column (where ⟦ marks the span's start; ⟧ its end)
 * and the full message. Schema: {@link TestSchemas#shipping()}; "-" as schema means schema-free. Expected
 * values are this project's own wording (no outside source: common practice for a message table).
 */
class DiagnosticTableTest {

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', quoteCharacter = '"', textBlock = """
        # query                                                                        | schema | code   | message
        MATCH (v:⟦Vesel⟧) RETURN v                                                      | ship   | TG3001 | label 'Vesel' is not defined by the ontology; did you mean 'Vessel'?
        MATCH (v:Vessel)-[:⟦OPERATED_BYY⟧]->(c:Carrier) RETURN c                         | ship   | TG3002 | relationship type 'OPERATED_BYY' is not defined by the ontology; did you mean 'OPERATED_BY'?
        MATCH (v:Vessel) RETURN ⟦v.imo_number⟧                                          | ship   | TG3003 | property key 'imo_number' is not defined by the ontology; did you mean 'imoNumber'?
        MATCH (v:Vessel) RETURN ⟦v.nme⟧                                                 | ship   | TG3003 | property key 'nme' is not defined by the ontology; did you mean 'name'?
        MATCH (v:Vessel) RETURN ⟦v.nte⟧                                                 | ship   | TG3003 | property key 'nte' is not defined by the ontology; did you mean 'note'?
        MATCH (p:Port) RETURN ⟦p.imoNumber⟧                                             | ship   | TG3004 | property 'imoNumber' is not defined for 'Port'
        MATCH (c:Carrier)⟦-[:OPERATED_BY]->⟧(v:Vessel) RETURN v                         | ship   | TG3005 | relationship 'OPERATED_BY' goes from 'Vessel' to 'Carrier' in the ontology, not the other way; did you mean '<--' or 'OPERATES'?
        MATCH (c:Carrier)⟦-[:OPERATED_BY]->⟧(t:Tanker) RETURN t                         | ship   | TG3005 | relationship 'OPERATED_BY' goes from 'Vessel' to 'Carrier' in the ontology, not the other way; did you mean '<--' or 'OPERATES'?
        MATCH (v:Vessel)⟦-[:CALLS_AT]->⟧(p:Port) RETURN p                               | ship   | TG3006 | relationship 'CALLS_AT' cannot connect 'Vessel' to 'Port'
        MATCH ⟦(s:Shipment)-[:BOOKED_ON]->(x)-[:CALLS_AT]->(p:Port)⟧ RETURN p          | ship   | TG3007 | no class can satisfy 'x'; the pattern always returns nothing
        MATCH (v:Vessel) WHERE v.grossTonnage > ⟦'5000'⟧ RETURN v                        | ship   | TG3008 | property 'grossTonnage' holds integer values; compared with the string '5000'
        MATCH (b:⟦Berth⟧) RETURN b                                                      | ship   | TG3009 | label 'Berth' is deprecated in the ontology
        MATCH (n⟦:Vessel:Port⟧) RETURN n                                                | ship   | TG3010 | no node can carry both 'Vessel' and 'Port'; did you mean ':Port' or ':Vessel'?
        MATCH (s:⟦ship⟧) RETURN s                                                       | ship   | TG3001 | label 'ship' is not defined by the ontology; did you mean 'Vessel'?
        MATCH (v:Vessel) RETURN ⟦w⟧                                                     | -      | TG2001 | variable 'w' is not defined; did you mean 'v'?
        MATCH ()-[r]-() MATCH (⟦r⟧) RETURN r                                             | -      | TG2002 | variable 'r' is bound as a relationship and used as a node
        MATCH (a)-[r]->()-[⟦r⟧]->(a) RETURN r                                            | -      | TG2003 | variable 'r' is already bound
        MATCH (a) WHERE ⟦count(a)⟧ > 1 RETURN a                                          | -      | TG2004 | aggregation is not allowed in WHERE
        RETURN count(⟦count(*)⟧)                                                        | -      | TG2005 | an aggregation cannot contain another aggregation
        MATCH (a) RETURN DISTINCT a.name ORDER BY ⟦a⟧.age                                | -      | TG2006 | ORDER BY refers to 'a', which is not projected after DISTINCT
        RETURN 1 AS a ⟦UNION RETURN 2 AS b⟧                                              | -      | TG2007 | all parts of a UNION must return the same columns; found a and b
        MATCH () RETURN ⟦*⟧                                                             | -      | TG2008 | RETURN * needs at least one variable in scope
        MATCH (a) WITH a, ⟦count(*)⟧ RETURN a                                            | -      | TG2009 | expression in WITH must be aliased (use AS)
        RETURN 1 AS a, 2 AS ⟦a⟧                                                          | -      | TG2010 | column name 'a' is used more than once
        MATCH (a) RETURN ⟦foo(a)⟧                                                       | -      | TG2011 | unknown function 'foo'
        RETURN ⟦substring('abc')⟧                                                       | -      | TG2012 | function 'substring' takes 2 to 3 argument(s), given 1
        RETURN ⟦123⟧ AND true                                                           | -      | TG2013 | AND needs booleans, found an integer
        MATCH (n) RETURN n LIMIT ⟦-1⟧                                                   | -      | TG2016 | LIMIT must be a non-negative integer
        MATCH (n) RETURN n SKIP ⟦n⟧.count                                               | -      | TG2018 | SKIP must be a constant; it refers to variable 'n'
        MATCH (me)--(you) RETURN ⟦me⟧.age + count(you.age)                              | -      | TG2019 | 'me' is used beside an aggregation but is not a grouping key; project it on its own
        RETURN 1 AS a UNION RETURN 2 AS a ⟦UNION ALL RETURN 3 AS a⟧                      | -      | TG2021 | UNION and UNION ALL cannot be mixed in one query
        RETURN count(⟦rand()⟧)                                                          | -      | TG2022 | rand() gives a new value at every call and cannot be aggregated
        MATCH (a)--(b) RETURN a.x + b.x, count(*) ORDER BY ⟦a.x + b.x⟧ + count(*)        | -      | TG2019 | 'a.x + b.x' is used beside an aggregation but is not a grouping key; project it on its own
        MATCH (v:Vessel) ⟦CREATE (x:Vessel)⟧ RETURN v                                    | ship   | TG4001 | CREATE changes data; only read queries are run
        ⟦MERGE (v:Vessel {name: 'x'})⟧ RETURN v                                          | ship   | TG4005 | MERGE may create data; only read queries are run
        MATCH (v:Vessel) ⟦SET v.name = 'x'⟧ RETURN v                                     | ship   | TG4006 | SET changes data; only read queries are run
        MATCH (v:Vessel) ⟦DETACH DELETE v⟧                                              | ship   | TG4008 | DETACH DELETE deletes data; only read queries are run
        ⟦CALL db.labels() YIELD label⟧ RETURN label                                      | -      | TG4002 | CALL db.labels runs a procedure; only read queries without procedures are run
        ⟦LOAD CSV FROM 'file:///x.csv' AS row⟧ RETURN row                                | -      | TG4003 | LOAD CSV reads outside data; only read queries over the graph are run
        """)
    void diagnostic(String marked, String schema, String code, String message) {
        String q = marked.strip().replace("⟦", "").replace("⟧", "");
        int at = marked.strip().indexOf('⟦');
        int line = 1 + (int) marked.strip().substring(0, at).chars().filter(c -> c == '\n').count();
        int column = at - marked.strip().lastIndexOf('\n', at);
        ParseResult r = new CypherParser().parse(q);
        assertTrue(r.isValid(), () -> r.render());
        Analyzer analyzer = schema.equals("-") ? Analyzer.schemaFree() : Analyzer.forSchema(TestSchemas.shipping());
        List<Diagnostic> found = analyzer.analyze(r.tree()).diagnostics();
        Diagnostic d = found.stream().filter(x -> x.code().id().equals(code)).findFirst()
                .orElseThrow(() -> new AssertionError("no " + code + " in " + found));
        assertEquals(code + " " + line + ":" + column + " " + message.strip(),
                d.code().id() + " " + d.span().startLine() + ":" + d.span().startColumn() + " " + d.fullMessage());
    }
}

package dev.termgate.translate;

/**
 * Checks a query text against the ontology: parse, analyze, apply the certain repairs. The translation loop
 * only ever runs a query this gate declared valid, and the gate refuses every write clause, so a model can
 * never make termgate change data.
 */
public interface QueryGate {
    Checked check(String queryText);
}

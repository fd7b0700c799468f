package dev.termgate.analyze;

import dev.termgate.query.Query;

/**
 * One analyzer check. Checks run in the order the {@link Analyzer} lists them, all of them on every query;
 * each reports through the {@link Context} and never changes the tree. Later checks may read what earlier
 * ones recorded (the variable bindings of {@link ScopeCheck}).
 */
interface Check {
    void run(Query query, Context cx);

    /** Whether the check needs an ontology (skipped in schema-free mode). */
    default boolean needsSchema() {
        return false;
    }
}

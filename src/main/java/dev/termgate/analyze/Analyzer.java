package dev.termgate.analyze;

import dev.termgate.query.Query;
import dev.termgate.schema.GraphSchema;

import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.WeakHashMap;

/**
 * Checks a syntax tree against the openCypher rules and, unless schema-free, against the ontology-derived
 * schema. Returns every finding (never stops at the first), never changes the tree, and is thread-safe.
 * Get one with {@link #forSchema} (cached per schema, so its indexes are built once) or {@link #schemaFree}.
 */
public final class Analyzer {

    /**
     * The checks, in the order they run. {@link ScopeCheck} comes first: it records the variable bindings the
     * later checks read. To add a check, see DEVELOPERS.md, "How to add a check to the analyzer".
     */
    private static final List<Check> CHECKS = List.of(
            new ReadOnlyCheck(),
            new ScopeCheck(),
            new FunctionCheck(),
            new TermCheck(),
            new PatternCheck(),
            new LiteralTypeCheck());

    private static final Analyzer SCHEMA_FREE = new Analyzer(null);
    private static final Map<GraphSchema, Analyzer> CACHE = Collections.synchronizedMap(new WeakHashMap<>());

    private final GraphSchema schema;
    private final SchemaIndex index;

    private Analyzer(GraphSchema schema) {
        this.schema = schema;
        this.index = schema == null ? null : new SchemaIndex(schema);
    }

    public static Analyzer forSchema(GraphSchema schema) {
        if (schema == null) return SCHEMA_FREE;
        return CACHE.computeIfAbsent(schema, Analyzer::new);
    }

    /** Scope, typing, functions and read-only checks only: no ontology terms are checked. */
    public static Analyzer schemaFree() {
        return SCHEMA_FREE;
    }

    /** The schema checked against; null in schema-free mode. */
    public GraphSchema schema() {
        return schema;
    }

    public boolean isSchemaFree() {
        return schema == null;
    }

    public Analysis analyze(Query query) {
        Context cx = new Context(schema, index);
        for (Check c : CHECKS) {
            if (c.needsSchema() && schema == null) continue;
            c.run(query, cx);
        }
        return cx.result();
    }
}

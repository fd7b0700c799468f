package dev.termgate.engine;

import dev.termgate.query.Query;
import dev.termgate.schema.GraphSchema;

import java.util.Map;

/**
 * One query to run. {@code text} is the source the tree was parsed from (used for column names such as
 * {@code n.name}); it may be null for trees made by a tool. {@code schema} drives ontology-aware matching;
 * use {@link GraphSchema#empty()} for schema-free runs.
 */
public record Request(Query query, String text, GraphSchema schema, Map<String, Object> params, Limits limits) {
    public Request {
        params = params == null ? Map.of() : java.util.Collections.unmodifiableMap(new java.util.HashMap<>(params));
        if (schema == null) schema = GraphSchema.empty();
        if (limits == null) limits = Limits.defaults();
    }

    public static Request of(Query query, String text, GraphSchema schema, Limits limits) {
        return new Request(query, text, schema, Map.of(), limits);
    }
}

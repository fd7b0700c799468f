package dev.termgate.graph;

import dev.termgate.diag.Diagnostic;
import dev.termgate.ontology.DataEdge;
import dev.termgate.ontology.DataNode;
import dev.termgate.ontology.InstanceData;
import dev.termgate.ontology.InstanceReader;
import dev.termgate.schema.GraphSchema;

import java.time.temporal.TemporalAccessor;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * RDF instance data mapped through the ontology (class → label, object property → relationship, datatype
 * property → typed property) by the ontology package's reader; this class only stores the result. Terms the
 * ontology lacks come back as problems for the caller to report — nothing is dropped silently.
 */
public final class RdfImport {
    private RdfImport() {}

    /** Loads the sources into the builder; returns the reader's problems (unknown terms, bad values). */
    public static List<Diagnostic> load(List<String> sources, GraphSchema schema, GraphBuilder builder) {
        InstanceData data = InstanceReader.read(sources, schema);
        Map<String, Object> ids = new HashMap<>();
        for (DataNode n : data.nodes()) {
            Map<String, Object> props = new LinkedHashMap<>();
            n.properties().forEach((k, v) -> props.put(k, storable(v)));
            props.putIfAbsent("iri", n.id());
            ids.put(n.id(), builder.addNode(new ArrayList<>(n.labels().stream().sorted().toList()), props));
        }
        for (DataEdge e : data.edges()) {
            Object from = ids.get(e.from());
            Object to = ids.get(e.to());
            if (from == null || to == null) continue;
            builder.addRelationship(from, to, e.type(), Map.of());
        }
        return data.problems();
    }

    /** Temporal values are kept as Java time objects; the engine's value model reads them. */
    private static Object storable(Object v) {
        if (v instanceof List<?> l) {
            List<Object> out = new ArrayList<>();
            for (Object o : l) out.add(storable(o));
            return out;
        }
        if (v instanceof TemporalAccessor) return v;
        return v;
    }
}

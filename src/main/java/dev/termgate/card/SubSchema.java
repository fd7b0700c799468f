package dev.termgate.card;

import dev.termgate.schema.Endpoint;
import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.NodeLabel;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.RelType;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

/**
 * The part of a schema a card shows, as a schema of its own (for the JSON rendering and for callers that check
 * against what the model was shown). References to terms off the card (a parent label, a super type, an
 * inverse) are kept by name: they are real terms of the ontology, just not described here.
 */
public final class SubSchema {

    private SubSchema() {}

    public static GraphSchema of(GraphSchema schema, CardScope scope) {
        List<NodeLabel> labels = new ArrayList<>();
        for (String l : scope.labels()) {
            NodeLabel label = schema.labels().get(l);
            if (label != null) labels.add(label);
        }
        List<RelType> rels = new ArrayList<>();
        for (String r : scope.relTypes()) {
            RelType rel = schema.relTypes().get(r);
            if (rel == null) continue;
            // Endpoints as the card shows them: read off the inverse or a super type when that is off the card.
            List<Endpoint> shown = CardText.shownEndpoints(schema, scope, rel);
            List<Endpoint> eps = shown.isEmpty() && rel.superTypes().stream().anyMatch(scope.relTypes()::contains)
                    ? List.of() : shown;
            rels.add(new RelType(rel.info(), eps, rel.superTypes(), rel.inverseOf(), rel.symmetric()));
        }
        List<PropertyKey> keys = new ArrayList<>();
        for (String k : scope.keys()) {
            PropertyKey key = schema.properties().get(k);
            if (key == null) continue;
            Set<String> domains = new LinkedHashSet<>();
            for (String d : key.domains()) if (scope.labels().contains(d)) domains.add(d);
            if (!key.anyDomain() && domains.isEmpty()) continue;
            keys.add(new PropertyKey(key.info(), domains, key.datatype(), key.valueType(), key.superKeys()));
        }
        return GraphSchema.of(schema.sourceHash(), labels, rels, keys, List.of());
    }
}

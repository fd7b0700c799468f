package dev.termgate.engine;

import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * A node as a query value: identity is the graph element id alone, so that two reads of the same vertex
 * compare equal whatever properties were fetched.
 */
public record NodeValue(Object id, List<String> labels, Map<String, Object> properties) {
    public NodeValue {
        labels = List.copyOf(labels);
        properties = Values.unmodifiableMap(properties);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof NodeValue n && Objects.equals(Values.idKey(id), Values.idKey(n.id));
    }

    @Override
    public int hashCode() {
        return Objects.hashCode(Values.idKey(id));
    }
}

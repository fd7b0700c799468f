package dev.termgate.engine;

import java.util.Map;
import java.util.Objects;

/** A relationship as a query value; identity is its element id. {@code start}/{@code end} are vertex ids. */
public record RelValue(Object id, String type, Object start, Object end, Map<String, Object> properties) {
    public RelValue {
        properties = Values.unmodifiableMap(properties);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof RelValue r && Objects.equals(Values.idKey(id), Values.idKey(r.id));
    }

    @Override
    public int hashCode() {
        return Objects.hashCode(Values.idKey(id));
    }
}

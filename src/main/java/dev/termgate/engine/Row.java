package dev.termgate.engine;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Set;

/** One binding of variables to values; immutable once built (extended by copying). */
final class Row {
    static final Row EMPTY = new Row(new LinkedHashMap<>());

    private final LinkedHashMap<String, Object> values;

    private Row(LinkedHashMap<String, Object> values) {
        this.values = values;
    }

    static Row of(Map<String, Object> values) {
        return new Row(new LinkedHashMap<>(values));
    }

    Object get(String name) {
        return values.get(name);
    }

    boolean has(String name) {
        return values.containsKey(name);
    }

    Set<String> names() {
        return values.keySet();
    }

    Map<String, Object> asMap() {
        return values;
    }

    Row with(String name, Object value) {
        LinkedHashMap<String, Object> m = new LinkedHashMap<>(values);
        m.put(name, value);
        return new Row(m);
    }

    Row withAll(Map<String, Object> more) {
        LinkedHashMap<String, Object> m = new LinkedHashMap<>(values);
        m.putAll(more);
        return new Row(m);
    }

    /** Drops the generated names of anonymous pattern elements once their MATCH is done. */
    Row withoutHidden() {
        boolean any = false;
        for (String k : values.keySet()) if (Names.isHidden(k)) { any = true; break; }
        if (!any) return this;
        LinkedHashMap<String, Object> m = new LinkedHashMap<>();
        values.forEach((k, v) -> { if (!Names.isHidden(k)) m.put(k, v); });
        return new Row(m);
    }

    @Override
    public String toString() {
        return values.toString();
    }

    /** Generated names for anonymous pattern elements: they start with a space, which no query name can. */
    static final class Names {
        private Names() {}

        static String hidden(String kind, int offset, int index) {
            return " " + kind + offset + "_" + index;
        }

        static boolean isHidden(String name) {
            return !name.isEmpty() && name.charAt(0) == ' ';
        }
    }
}

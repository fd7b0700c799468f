package dev.termgate.schema;

import java.util.Optional;
import java.util.Set;

/**
 * A datatype property as a property key.
 *
 * @param domains   labels that declare it (graph names); empty means any label ({@link #anyDomain})
 * @param datatype  the range's datatype IRI, if declared
 * @param superKeys direct super-properties (graph names)
 */
public record PropertyKey(TermInfo info, Set<String> domains, Optional<String> datatype, ValueType valueType,
                          Set<String> superKeys) {
    public PropertyKey {
        domains = Set.copyOf(domains);
        superKeys = Set.copyOf(superKeys);
    }

    public String name() {
        return info.name();
    }

    public boolean anyDomain() {
        return domains.isEmpty();
    }
}

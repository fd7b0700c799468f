package dev.termgate.schema;

import java.util.List;
import java.util.Optional;
import java.util.Set;

/**
 * An object property as a relationship type.
 *
 * @param endpoints  declared (domain, range) pairs, unions expanded; inherited ones are not repeated here
 * @param superTypes direct super-properties (graph names)
 * @param inverseOf  the graph name of the declared inverse, if any (in either direction of owl:inverseOf)
 * @param symmetric  owl:SymmetricProperty: the relationship may be read in both directions
 */
public record RelType(TermInfo info, List<Endpoint> endpoints, Set<String> superTypes, Optional<String> inverseOf,
                      boolean symmetric) {
    public RelType {
        endpoints = List.copyOf(endpoints);
        superTypes = Set.copyOf(superTypes);
    }

    public String name() {
        return info.name();
    }

    public boolean anyDomain() {
        return endpoints.stream().anyMatch(Endpoint::anyFrom);
    }

    public boolean anyRange() {
        return endpoints.stream().anyMatch(Endpoint::anyTo);
    }
}

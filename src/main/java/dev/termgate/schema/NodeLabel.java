package dev.termgate.schema;

import java.util.Set;

/** A class of the ontology as a node label, with its direct superclasses and equivalent classes (graph names). */
public record NodeLabel(TermInfo info, Set<String> superLabels, Set<String> equivalents) {
    public NodeLabel {
        superLabels = Set.copyOf(superLabels);
        equivalents = Set.copyOf(equivalents);
    }

    public String name() {
        return info.name();
    }
}

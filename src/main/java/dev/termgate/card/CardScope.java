package dev.termgate.card;

import dev.termgate.schema.GraphSchema;
import dev.termgate.schema.TermKind;

import java.util.Collections;
import java.util.Set;
import java.util.SortedSet;
import java.util.TreeSet;

/**
 * Which terms of a schema a card shows, by graph name. The whole-ontology card shows every term; a card for a
 * question shows a part chosen so that every relationship type shown has its endpoints shown and every
 * property key shown has a label that holds it (or needs none).
 */
public record CardScope(SortedSet<String> labels, SortedSet<String> relTypes, SortedSet<String> keys) {

    public CardScope {
        labels = Collections.unmodifiableSortedSet(new TreeSet<>(labels));
        relTypes = Collections.unmodifiableSortedSet(new TreeSet<>(relTypes));
        keys = Collections.unmodifiableSortedSet(new TreeSet<>(keys));
    }

    public static CardScope of(Set<String> labels, Set<String> relTypes, Set<String> keys) {
        return new CardScope(new TreeSet<>(labels), new TreeSet<>(relTypes), new TreeSet<>(keys));
    }

    /** Every term of the schema. */
    public static CardScope whole(GraphSchema schema) {
        return of(schema.labels().keySet(), schema.relTypes().keySet(), schema.properties().keySet());
    }

    public boolean contains(TermKind kind, String name) {
        return switch (kind) {
            case LABEL -> labels.contains(name);
            case RELATIONSHIP -> relTypes.contains(name);
            case PROPERTY -> keys.contains(name);
        };
    }

    public int size() {
        return labels.size() + relTypes.size() + keys.size();
    }

    public boolean isEmpty() {
        return size() == 0;
    }
}

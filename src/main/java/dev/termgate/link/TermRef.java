package dev.termgate.link;

import dev.termgate.schema.TermKind;

/** A graph term by kind and name: the key every source of evidence scores. */
record TermRef(TermKind kind, String name) {
    @Override
    public String toString() {
        return name;
    }
}

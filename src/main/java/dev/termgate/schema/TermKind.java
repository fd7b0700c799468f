package dev.termgate.schema;

/** The three kinds of graph term an ontology defines. */
public enum TermKind {
    /** A class, used as a node label. */
    LABEL,
    /** An object property, used as a relationship type. */
    RELATIONSHIP,
    /** A datatype property, used as a property key. */
    PROPERTY;

    public String word() {
        return switch (this) {
            case LABEL -> "label";
            case RELATIONSHIP -> "relationship type";
            case PROPERTY -> "property key";
        };
    }
}

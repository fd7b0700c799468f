package dev.termgate.analyze;

/** The kinds of change a repair may make to a query. */
public enum FixKind {
    FLIP_DIRECTION("flip direction"),
    REPLACE_LABEL("replace label"),
    REPLACE_RELATIONSHIP_TYPE("replace relationship type"),
    REPLACE_PROPERTY("replace property key"),
    USE_INVERSE("use inverse relationship"),
    DROP_LABEL("drop label");

    private final String word;

    FixKind(String word) {
        this.word = word;
    }

    public String word() {
        return word;
    }
}

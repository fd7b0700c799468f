package dev.termgate.analyze;

/**
 * What the analyzer knows statically about a value. {@link #ANY} means "not known", and is never reported:
 * only a type that is certain can make a query wrong.
 */
enum Type {
    BOOLEAN("boolean"), INTEGER("integer"), FLOAT("float"), STRING("string"), LIST("list"), MAP("map"),
    NODE("node"), RELATIONSHIP("relationship"), REL_LIST("list of relationships"), PATH("path"), NULL("null"),
    ANY("value");

    private final String word;

    Type(String word) {
        this.word = word;
    }

    String word() {
        return word;
    }

    /** The word with its indefinite article, for messages. */
    String withArticle() {
        return (word.matches("^[aeiou].*") ? "an " : "a ") + word;
    }

    boolean isNumber() {
        return this == INTEGER || this == FLOAT;
    }

    /** Certainly not usable where a boolean is needed. */
    boolean notBoolean() {
        return this != BOOLEAN && this != NULL && this != ANY;
    }

    /** Certainly not a number (nor a temporal value, which the analyzer types as ANY). */
    boolean notNumber() {
        return switch (this) {
            case STRING, BOOLEAN, LIST, MAP, NODE, RELATIONSHIP, REL_LIST, PATH -> true;
            default -> false;
        };
    }

    /** A graph element whose properties are ontology property keys (or may be). */
    boolean mayBeElement() {
        return this == NODE || this == RELATIONSHIP || this == ANY;
    }
}

package dev.termgate.analyze;

/**
 * One binding of a variable: the thing a name stands for. Compared by identity, so that {@code WITH n AS m}
 * keeps the same binding under a new name and later checks can follow a node through the clauses.
 */
final class Binding {
    final String name;
    final Type type;

    Binding(String name, Type type) {
        this.name = name;
        this.type = type;
    }

    boolean anonymous() {
        return name == null;
    }

    @Override
    public String toString() {
        return (name == null ? "_" : name) + ":" + type.word();
    }
}

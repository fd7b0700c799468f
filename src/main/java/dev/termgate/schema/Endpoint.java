package dev.termgate.schema;

/**
 * One allowed (start, end) pair of a relationship type as declared (before subclass closure). {@code null} on
 * either side means "any class" (the property has no domain or no range).
 */
public record Endpoint(String from, String to) {
    public boolean anyFrom() {
        return from == null;
    }

    public boolean anyTo() {
        return to == null;
    }
}

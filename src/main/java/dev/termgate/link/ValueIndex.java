package dev.termgate.link;

import java.util.List;

/**
 * Instance values (a port's or a company's name) that a question may mention, each pointing at the class of
 * the node that holds it. Built once per loaded graph from its name-like properties; thread-safe.
 */
public interface ValueIndex {

    /** Every value mentioned in the question, longest first where mentions overlap. */
    List<ValueMention> find(String question);

    /** An index that knows no value (no graph loaded). */
    static ValueIndex empty() {
        return question -> List.of();
    }

    /** Starts an in-memory index; see {@link InMemoryValueIndex.Builder}. */
    static InMemoryValueIndex.Builder builder() {
        return new InMemoryValueIndex.Builder();
    }
}

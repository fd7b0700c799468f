package dev.termgate.link;

import java.util.Optional;

/**
 * A question's mention of an instance value.
 *
 * @param value    the value as stored in the graph
 * @param label    the graph label of the node holding it
 * @param property the property key holding it, when known
 * @param start    character offset of the mention in the question
 * @param end      offset just after the mention
 */
public record ValueMention(String value, String label, Optional<String> property, int start, int end) {}

package dev.termgate.engine;

import java.util.List;

/**
 * What a run does, for {@code --explain}: each step is either a Gremlin traversal sent to the graph (as
 * Gremlin text; {@code $name} stands for the id of a variable bound by an earlier step) or a residual step
 * evaluated on the client.
 */
public record Plan(List<Step> steps) {
    public Plan {
        steps = List.copyOf(steps);
    }

    public enum Kind { TRAVERSAL, CLIENT }

    public record Step(Kind kind, String clause, String text) {}

    /** Plain text, one step per line, traversals marked {@code gremlin:} and client steps {@code client:}. */
    public String render() {
        StringBuilder sb = new StringBuilder();
        for (Step s : steps) {
            sb.append(s.kind() == Kind.TRAVERSAL ? "gremlin: " : "client:  ").append(s.clause());
            if (!s.text().isEmpty()) sb.append("  ").append(s.text());
            sb.append('\n');
        }
        return sb.toString();
    }
}

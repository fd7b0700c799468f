package dev.termgate.query;

import java.util.List;
import java.util.Optional;

/** A comma-separated list of path patterns, as in {@code MATCH (a)-->(b), (c)}. */
public record Pattern(List<Part> parts, Span span) implements Node {
    public Pattern {
        parts = List.copyOf(parts);
    }

    public enum Direction {
        /** {@code -->} */ OUTGOING,
        /** {@code <--} */ INCOMING,
        /** {@code --} (or {@code <-->}) */ BOTH
    }

    public enum PathKind { PLAIN, SHORTEST, ALL_SHORTEST }

    /** One path: {@code p = (a)-[r]->(b)<-(c)}. */
    public record Part(Optional<Expr.Variable> pathVariable, PathKind kind, NodePattern start, List<Step> steps, Span span)
            implements Node {
        public Part {
            steps = List.copyOf(steps);
        }

        /** Every node pattern of the path, in order. */
        public List<NodePattern> nodes() {
            var all = new java.util.ArrayList<NodePattern>();
            all.add(start);
            steps.forEach(s -> all.add(s.node()));
            return List.copyOf(all);
        }
    }

    /** One hop: a relationship pattern and the node it leads to. */
    public record Step(RelPattern rel, NodePattern node, Span span) implements Node {}

    /** {@code (v:Label {key: value})}. Properties are a map literal or a parameter. */
    public record NodePattern(Optional<Expr.Variable> variable, Optional<LabelExpr> labels, Optional<Expr> properties,
                              Span span) implements Node {}

    /**
     * {@code -[r:TYPE*1..3 {key: value}]->}. {@code length} is empty for a single hop; a present length with both
     * bounds empty is {@code *}.
     */
    public record RelPattern(Direction direction, Optional<Expr.Variable> variable, Optional<LabelExpr> types,
                             Optional<Length> length, Optional<Expr> properties, Span span) implements Node {}

    /** Bounds of a variable-length relationship; empty means unbounded (min defaults to 1). */
    public record Length(Optional<Long> min, Optional<Long> max) {}
}

package dev.termgate.query;

import java.util.List;

/** A whole statement: one single query, optionally followed by UNION parts. */
public record Query(SingleQuery first, List<UnionPart> unions, Span span) implements Node {
    public Query {
        unions = List.copyOf(unions);
    }

    public static Query of(SingleQuery single) {
        return new Query(single, List.of(), single.span());
    }

    /** All single queries, the first one included, in order. */
    public List<SingleQuery> parts() {
        var all = new java.util.ArrayList<SingleQuery>();
        all.add(first);
        unions.forEach(u -> all.add(u.query()));
        return List.copyOf(all);
    }

    /** {@code UNION [ALL] query}. */
    public record UnionPart(boolean all, SingleQuery query, Span span) implements Node {}
}

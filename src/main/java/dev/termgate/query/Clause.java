package dev.termgate.query;

import java.util.List;
import java.util.Optional;

/**
 * Clauses. Write and side-effect clauses are parsed too, so the analyzer can refuse them with a precise
 * position instead of a vague syntax error; they never reach an engine.
 */
public sealed interface Clause extends Node {

    /** True for clauses that change data or call out of the query (refused by the analyzer). */
    default boolean isWrite() {
        return false;
    }

    record Match(boolean optional, Pattern pattern, Optional<Expr> where, Span span) implements Clause {}

    record Unwind(Expr list, Expr.Variable alias, Span span) implements Clause {}

    record With(Projection projection, Optional<Expr> where, Span span) implements Clause {}

    record Return(Projection projection, Span span) implements Clause {}

    /** The body shared by WITH and RETURN. {@code star} is {@code *} (items may follow it). */
    record Projection(boolean distinct, boolean star, List<ProjectionItem> items, List<SortItem> orderBy,
                      Optional<Expr> skip, Optional<Expr> limit, Span span) implements Node {
        public Projection {
            items = List.copyOf(items);
            orderBy = List.copyOf(orderBy);
        }
    }

    record ProjectionItem(Expr expr, Optional<Expr.Variable> alias, Span span) implements Node {}

    record SortItem(Expr expr, boolean descending, Span span) implements Node {}

    // ---- write and side-effect clauses ----

    record Create(Pattern pattern, Span span) implements Clause {
        @Override public boolean isWrite() { return true; }
    }

    record Merge(Pattern.Part part, List<MergeAction> actions, Span span) implements Clause {
        public Merge { actions = List.copyOf(actions); }
        @Override public boolean isWrite() { return true; }
    }

    /** {@code ON CREATE SET …} or {@code ON MATCH SET …}. */
    record MergeAction(boolean onCreate, List<SetItem> items, Span span) implements Node {
        public MergeAction { items = List.copyOf(items); }
    }

    record SetClause(List<SetItem> items, Span span) implements Clause {
        public SetClause { items = List.copyOf(items); }
        @Override public boolean isWrite() { return true; }
    }

    sealed interface SetItem extends Node {}

    /** {@code target.key = value} */
    record SetProperty(Expr.Property target, Expr value, Span span) implements SetItem {}

    /** {@code n = map} ({@code merge} false) or {@code n += map} ({@code merge} true). */
    record SetVariable(Expr.Variable target, Expr value, boolean merge, Span span) implements SetItem {}

    /** {@code n:Label:Other} */
    record SetLabels(Expr.Variable target, List<String> labels, Span span) implements SetItem {
        public SetLabels { labels = List.copyOf(labels); }
    }

    record Remove(List<RemoveItem> items, Span span) implements Clause {
        public Remove { items = List.copyOf(items); }
        @Override public boolean isWrite() { return true; }
    }

    sealed interface RemoveItem extends Node {}

    record RemoveProperty(Expr.Property target, Span span) implements RemoveItem {}

    record RemoveLabels(Expr.Variable target, List<String> labels, Span span) implements RemoveItem {
        public RemoveLabels { labels = List.copyOf(labels); }
    }

    record Delete(boolean detach, List<Expr> targets, Span span) implements Clause {
        public Delete { targets = List.copyOf(targets); }
        @Override public boolean isWrite() { return true; }
    }

    record Foreach(Expr.Variable variable, Expr list, List<Clause> body, Span span) implements Clause {
        public Foreach { body = List.copyOf(body); }
        @Override public boolean isWrite() { return true; }
    }

    record LoadCsv(boolean withHeaders, Expr source, Expr.Variable alias, Optional<String> fieldTerminator, Span span)
            implements Clause {
        @Override public boolean isWrite() { return true; }
    }

    /**
     * {@code CALL ns.proc(args) YIELD …}. Arguments are empty when the call has no parentheses
     * ({@code implicitArgs}). Refused as a side effect: a procedure may do anything.
     */
    record CallProcedure(List<String> namespace, String name, List<Expr> args, boolean implicitArgs,
                         List<YieldItem> yields, boolean yieldStar, Optional<Expr> where, Span span) implements Clause {
        public CallProcedure {
            namespace = List.copyOf(namespace);
            args = List.copyOf(args);
            yields = List.copyOf(yields);
        }
        @Override public boolean isWrite() { return true; }
    }

    record YieldItem(String field, Optional<Expr.Variable> alias, Span span) implements Node {}

    /** {@code CALL { … }}: refused as a whole, since a subquery may hide writes and is not needed for reading here. */
    record CallSubquery(Query body, Span span) implements Clause {
        @Override public boolean isWrite() { return true; }
    }
}

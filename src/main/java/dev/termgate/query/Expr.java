package dev.termgate.query;

import java.util.List;
import java.util.Optional;

/** Expressions of the openCypher read language. */
public sealed interface Expr extends Node {

    // ---- atoms ----
    record Variable(String name, Span span) implements Expr {}

    record Parameter(String name, Span span) implements Expr {}

    record IntegerLit(long value, Span span) implements Expr {}

    record FloatLit(double value, Span span) implements Expr {}

    record StringLit(String value, Span span) implements Expr {}

    record BooleanLit(boolean value, Span span) implements Expr {}

    record NullLit(Span span) implements Expr {}

    record ListLit(List<Expr> elements, Span span) implements Expr {
        public ListLit { elements = List.copyOf(elements); }
    }

    /** Entries keep their written order. */
    record MapLit(List<MapEntry> entries, Span span) implements Expr {
        public MapLit { entries = List.copyOf(entries); }
    }

    record MapEntry(String key, Expr value, Span span) implements Node {}

    // ---- operators ----
    enum BinaryOp {
        OR("OR"), XOR("XOR"), AND("AND"),
        EQ("="), NE("<>"), LT("<"), GT(">"), LE("<="), GE(">="),
        ADD("+"), SUB("-"), MUL("*"), DIV("/"), MOD("%"), POW("^"),
        STARTS_WITH("STARTS WITH"), ENDS_WITH("ENDS WITH"), CONTAINS("CONTAINS"), IN("IN"), REGEX("=~");

        private final String symbol;

        BinaryOp(String symbol) { this.symbol = symbol; }

        public String symbol() { return symbol; }

        public boolean isComparison() {
            return switch (this) {
                case EQ, NE, LT, GT, LE, GE -> true;
                default -> false;
            };
        }
    }

    enum UnaryOp { NOT, MINUS, PLUS }

    record Binary(BinaryOp op, Expr left, Expr right, Span span) implements Expr {}

    record Unary(UnaryOp op, Expr operand, Span span) implements Expr {}

    /** {@code x IS NULL} or, negated, {@code x IS NOT NULL}. */
    record IsNull(Expr operand, boolean negated, Span span) implements Expr {}

    /** {@code n.key} */
    record Property(Expr target, String key, Span span) implements Expr {}

    /** {@code n:Label} used as a predicate. */
    record HasLabels(Expr target, LabelExpr labels, Span span) implements Expr {}

    /** {@code list[i]} or {@code map['key']} */
    record Subscript(Expr target, Expr index, Span span) implements Expr {}

    /** {@code list[from..to]}, either bound may be absent. */
    record Slice(Expr target, Optional<Expr> from, Optional<Expr> to, Span span) implements Expr {}

    // ---- calls and compound forms ----
    /** {@code ns.name(DISTINCT args)}; the namespace is empty for plain functions. */
    record FunctionCall(List<String> namespace, String name, boolean distinct, List<Expr> args, Span span) implements Expr {
        public FunctionCall {
            namespace = List.copyOf(namespace);
            args = List.copyOf(args);
        }

        /** Namespace and name joined with dots, as written. */
        public String qualifiedName() {
            return namespace.isEmpty() ? name : String.join(".", namespace) + "." + name;
        }
    }

    record CountStar(Span span) implements Expr {}

    /** Simple form ({@code CASE x WHEN v THEN …}) when the subject is present, generic form otherwise. */
    record Case(Optional<Expr> subject, List<CaseWhen> whens, Optional<Expr> otherwise, Span span) implements Expr {
        public Case { whens = List.copyOf(whens); }
    }

    record CaseWhen(Expr when, Expr then, Span span) implements Node {}

    /** {@code [x IN list WHERE pred | expr]} */
    record ListComprehension(Variable variable, Expr source, Optional<Expr> where, Optional<Expr> map, Span span)
            implements Expr {}

    /** {@code [p = (a)-->(b) WHERE pred | expr]} */
    record PatternComprehension(Pattern.Part pattern, Optional<Expr> where, Expr map, Span span) implements Expr {}

    enum Quantifier { ALL, ANY, NONE, SINGLE }

    /** {@code all(x IN list WHERE pred)} and its siblings. */
    record Quantified(Quantifier quantifier, Variable variable, Expr source, Optional<Expr> where, Span span)
            implements Expr {}

    /** {@code reduce(acc = init, x IN list | expr)} */
    record Reduce(Variable accumulator, Expr init, Variable variable, Expr source, Expr map, Span span) implements Expr {}

    /** A path pattern used as a predicate, e.g. {@code WHERE (a)-[:R]->(b)} or inside {@code exists(…)}. */
    record PatternPredicate(Pattern.Part pattern, Span span) implements Expr {}

    /**
     * {@code EXISTS { … }}. The short form {@code EXISTS { (a)-->(b) WHERE p }} is kept as its pattern and
     * predicate; the full form holds a query.
     */
    record ExistsSubquery(Optional<Pattern> pattern, Optional<Expr> where, Optional<Query> query, Span span)
            implements Expr {}

    /** {@code COUNT { … }}, same two forms as {@link ExistsSubquery}. */
    record CountSubquery(Optional<Pattern> pattern, Optional<Expr> where, Optional<Query> query, Span span)
            implements Expr {}

    /** {@code v { .key, other: expr, var, .* }} */
    record MapProjection(Variable variable, List<MapItem> items, Span span) implements Expr {
        public MapProjection { items = List.copyOf(items); }
    }

    sealed interface MapItem extends Node {}

    /** {@code .key} */
    record PropertySelector(String key, Span span) implements MapItem {}

    /** {@code key: expr} */
    record LiteralEntry(String key, Expr value, Span span) implements MapItem {}

    /** {@code var} */
    record VariableSelector(Variable variable, Span span) implements MapItem {}

    /** {@code .*} */
    record AllProperties(Span span) implements MapItem {}
}

package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Expr;
import dev.termgate.query.Node;
import dev.termgate.query.Query;
import dev.termgate.query.Trees;
import dev.termgate.schema.PropertyKey;
import dev.termgate.schema.ValueType;

import java.util.Optional;

/**
 * A property compared with (or matched against) a literal of another kind: a number with a string, a
 * boolean with anything else. Such a comparison is never true, so the query would silently return nothing.
 * Temporal properties accept string literals, since graphs often hold dates as ISO text.
 */
final class LiteralTypeCheck implements Check {

    @Override
    public boolean needsSchema() {
        return true;
    }

    @Override
    public void run(Query query, Context cx) {
        for (Expr.Binary b : cx.nodes(query, Expr.Binary.class)) {
            switch (b.op()) {
                case EQ, NE, LT, GT, LE, GE -> {
                    compare(b.left(), b.right(), cx);
                    compare(b.right(), b.left(), cx);
                }
                case IN -> {
                    if (b.right() instanceof Expr.ListLit l) {
                        for (Expr x : l.elements()) compare(b.left(), x, cx);
                    }
                }
                case STARTS_WITH, ENDS_WITH, CONTAINS, REGEX -> {
                    Optional<PropertyKey> k = key(b.left(), cx);
                    if (k.isPresent() && b.right() instanceof Expr.StringLit s && !accepts(k.get().valueType(), s)
                            && k.get().valueType() != ValueType.STRING) {
                        report(k.get(), b.right(), cx);
                    }
                }
                default -> { }
            }
        }
        for (Context.PropertyUse use : cx.properties) {
            if (use.node() instanceof Expr.MapEntry e) {
                cx.schema.property(use.key()).ifPresent(k -> {
                    if (!accepts(k.valueType(), e.value())) report(k, e.value(), cx);
                });
            }
        }
    }

    private static void compare(Expr side, Expr other, Context cx) {
        key(side, cx).ifPresent(k -> {
            if (!accepts(k.valueType(), other)) report(k, other, cx);
        });
    }

    /** The ontology property key of {@code n.key} on a graph element, if it is one. */
    private static Optional<PropertyKey> key(Expr e, Context cx) {
        if (!(e instanceof Expr.Property p) || !(p.target() instanceof Expr.Variable v)) return Optional.empty();
        Binding b = cx.binding(v);
        if (b == null || !b.type.mayBeElement()) return Optional.empty();
        return cx.schema.property(p.key());
    }

    static boolean accepts(ValueType t, Expr literal) {
        Expr lit = literal instanceof Expr.Unary u && u.op() != Expr.UnaryOp.NOT ? u.operand() : literal;
        boolean number = lit instanceof Expr.IntegerLit || lit instanceof Expr.FloatLit;
        return switch (t) {
            case ANY -> true;
            case STRING -> !number && !(lit instanceof Expr.BooleanLit);
            case INTEGER, FLOAT -> !(lit instanceof Expr.StringLit) && !(lit instanceof Expr.BooleanLit);
            case BOOLEAN -> !number && !(lit instanceof Expr.StringLit);
            case DATE, DATETIME, LOCALDATETIME, TIME, DURATION -> !number && !(lit instanceof Expr.BooleanLit);
        };
    }

    private static void report(PropertyKey k, Node literal, Context cx) {
        cx.report(Diagnostic.of(Code.LITERAL_TYPE_MISMATCH, literal, k.name(), k.valueType().word(), describe(literal)));
    }

    private static String describe(Node lit) {
        Node n = lit instanceof Expr.Unary u ? u.operand() : lit;
        if (n instanceof Expr.IntegerLit) return "an integer";
        if (n instanceof Expr.FloatLit) return "a float";
        if (n instanceof Expr.StringLit s) return "the string '" + s.value() + "'";
        if (n instanceof Expr.BooleanLit) return "a boolean";
        return "a value";
    }
}

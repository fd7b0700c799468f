package dev.termgate.engine;

import dev.termgate.query.Expr;

import java.util.StringJoiner;

/** A short rendering of an expression for column names when the source text is unknown (tool-made trees). */
final class ExprText {
    private ExprText() {}

    static String of(Expr e) {

            if (e instanceof Expr.Variable v) return v.name();
            if (e instanceof Expr.Parameter p) return "$" + p.name();
            if (e instanceof Expr.IntegerLit i) return Long.toString(i.value());
            if (e instanceof Expr.FloatLit f) return Values.formatFloat(f.value());
            if (e instanceof Expr.StringLit s) return Values.literal(s.value());
            if (e instanceof Expr.BooleanLit b) return Boolean.toString(b.value());
            if (e instanceof Expr.NullLit n) return "null";
            if (e instanceof Expr.Property p) return of(p.target()) + "." + p.key();
            if (e instanceof Expr.Binary b) return of(b.left()) + " " + b.op().symbol() + " " + of(b.right());
            if (e instanceof Expr.Unary u) return (u.op() == Expr.UnaryOp.NOT ? "NOT " : u.op() == Expr.UnaryOp.MINUS ? "-" : "+") + of(u.operand());
            if (e instanceof Expr.CountStar c) return "count(*)";
            if (e instanceof Expr.FunctionCall f) {
                StringJoiner j = new StringJoiner(", ", f.qualifiedName() + "(" + (f.distinct() ? "DISTINCT " : ""), ")");
                f.args().forEach(a -> j.add(of(a)));
                return j.toString();
            }
            if (e instanceof Expr.ListLit l) {
                StringJoiner j = new StringJoiner(", ", "[", "]");
                l.elements().forEach(a -> j.add(of(a)));
                return j.toString();
            }
            if (e instanceof Expr.IsNull n) return of(n.operand()) + (n.negated() ? " IS NOT NULL" : " IS NULL");
            if (e instanceof Expr.Subscript s) return of(s.target()) + "[" + of(s.index()) + "]";
            return e.getClass().getSimpleName().toLowerCase(java.util.Locale.ROOT);

    }
}

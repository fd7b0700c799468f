package dev.termgate.parser;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.query.Clause;
import dev.termgate.query.Expr;
import dev.termgate.query.Node;
import dev.termgate.query.Query;
import dev.termgate.query.Trees;

import java.util.ArrayList;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.Collections;

/**
 * A path pattern written as an expression, e.g. {@code (a)-->(b)}, is a predicate: openCypher (TCK 1.0.0-M23,
 * Pattern1 [22]–[24], List6 [6]) accepts it only where a boolean is asked for — a WHERE condition, through
 * AND/OR/XOR/NOT — and as the argument of {@code exists(…)}. Anywhere else it is a syntax error.
 */
final class PatternPlacement {
    private PatternPlacement() {}

    static List<Diagnostic> check(Query query) {
        Set<Node> allowed = Collections.newSetFromMap(new IdentityHashMap<>());
        Trees.walk(query, n -> {
            if (n instanceof Clause.Match m) {
                m.where().ifPresent(w -> allowPredicates(w, allowed));
            } else if (n instanceof Clause.With w) {
                w.where().ifPresent(e -> allowPredicates(e, allowed));
            } else if (n instanceof Clause.CallProcedure c) {
                c.where().ifPresent(e -> allowPredicates(e, allowed));
            } else if (n instanceof Expr.ListComprehension c) {
                c.where().ifPresent(e -> allowPredicates(e, allowed));
            } else if (n instanceof Expr.PatternComprehension c) {
                c.where().ifPresent(e -> allowPredicates(e, allowed));
            } else if (n instanceof Expr.Quantified q) {
                q.where().ifPresent(e -> allowPredicates(e, allowed));
            } else if (n instanceof Expr.ExistsSubquery s) {
                s.where().ifPresent(e -> allowPredicates(e, allowed));
            } else if (n instanceof Expr.CountSubquery s) {
                s.where().ifPresent(e -> allowPredicates(e, allowed));
            } else if (n instanceof Expr.FunctionCall f && f.namespace().isEmpty()
                    && f.name().toLowerCase(Locale.ROOT).equals("exists") && f.args().size() == 1) {
                allowed.add(f.args().get(0));
            }
        });
        List<Diagnostic> out = new ArrayList<>();
        Trees.walk(query, n -> {
            if (n instanceof Expr.PatternPredicate p && !allowed.contains(p)) {
                out.add(Diagnostic.of(Code.PATTERN_NOT_ALLOWED, p, "(…)-->(…)"));
            }
        });
        return out;
    }

    private static void allowPredicates(Expr e, Set<Node> allowed) {
        List<Expr> stack = new ArrayList<>();
        stack.add(e);
        while (!stack.isEmpty()) {
            Expr x = stack.remove(stack.size() - 1);
            if (x instanceof Expr.PatternPredicate) {
                allowed.add(x);
            } else if (x instanceof Expr.Binary b && (b.op() == Expr.BinaryOp.AND || b.op() == Expr.BinaryOp.OR
                    || b.op() == Expr.BinaryOp.XOR)) {
                stack.add(b.left());
                stack.add(b.right());
            } else if (x instanceof Expr.Unary u && u.op() == Expr.UnaryOp.NOT) {
                stack.add(u.operand());
            }
        }
    }
}

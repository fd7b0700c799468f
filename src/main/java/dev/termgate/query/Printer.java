package dev.termgate.query;

import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;


/**
 * Canonical query text: upper-case keywords, one clause per line (WHERE, ORDER BY, SKIP and LIMIT on lines of
 * their own), single spaces around binary operators, single-quoted strings, and parentheses only where precedence
 * needs them. Reading the printed text gives back the same tree, spans aside (checked on every TCK query).
 */
public final class Printer {

    /** Words that cannot stand unquoted as a variable (the grammar's keywords). */
    private static final Set<String> KEYWORDS = Set.of(
            "ALL", "ALLSHORTESTPATHS", "AND", "ANY", "AS", "ASC", "ASCENDING", "BY", "CALL", "CASE", "CONTAINS",
            "COUNT", "CREATE", "CSV", "DELETE", "DESC", "DESCENDING", "DETACH", "DISTINCT", "ELSE", "END", "ENDS",
            "EXISTS", "FALSE", "FIELDTERMINATOR", "FOREACH", "FROM", "HEADERS", "IN", "IS", "LIMIT", "LOAD", "MATCH",
            "MERGE", "NONE", "NOT", "NULL", "ON", "OPTIONAL", "OR", "ORDER", "REDUCE", "REMOVE", "RETURN", "SET",
            "SHORTESTPATH", "SINGLE", "SKIP", "STARTS", "THEN", "TRUE", "UNION", "UNWIND", "WHEN", "WHERE", "WITH",
            "XOR", "YIELD");
    private static final java.util.regex.Pattern PLAIN_NAME = java.util.regex.Pattern.compile("[A-Za-z_][A-Za-z0-9_]*");

    // precedence levels, loosest first (openCypher 9)
    private static final int OR = 1, XOR = 2, AND = 3, NOT = 4, COMPARISON = 5, PREDICATE = 6, ADD = 7, MUL = 8,
            POW = 9, UNARY = 10, POSTFIX = 11, ATOM = 12;

    private Printer() {}

    /** A whole query, or any other node, as canonical text. Queries span several lines. */
    public static String print(Node node) {
        StringBuilder sb = new StringBuilder();
        new Printer().node(sb, node, "\n");
        return sb.toString();
    }

    /** The query on one line (clauses separated by single spaces), e.g. for a log or a table cell. */
    public static String printOneLine(Node node) {
        StringBuilder sb = new StringBuilder();
        new Printer().node(sb, node, " ");
        return sb.toString();
    }

    private void node(StringBuilder sb, Node n, String nl) {
        if (n instanceof Query q) {
            query(sb, q, nl);
        } else if (n instanceof SingleQuery s) {
            single(sb, s, nl);
        } else if (n instanceof Clause c) {
            clause(sb, c, nl);
        } else if (n instanceof Expr e) {
            expr(sb, e);
        } else if (n instanceof Pattern p) {
            pattern(sb, p);
        } else if (n instanceof Pattern.Part p) {
            part(sb, p);
        } else if (n instanceof Pattern.NodePattern p) {
            nodePattern(sb, p);
        } else if (n instanceof Pattern.RelPattern r) {
            rel(sb, r);
        } else if (n instanceof LabelExpr l) {
            sb.append(':');
            labelGql(sb, l, 0);
        } else {
            // items inside clauses: print through their parent; a lone item prints as its parts
            sb.append(n);
        }
    }

    // ---------------------------------------------------------------- queries and clauses

    private void query(StringBuilder sb, Query q, String nl) {
        single(sb, q.first(), nl);
        for (Query.UnionPart u : q.unions()) {
            sb.append(nl).append(u.all() ? "UNION ALL" : "UNION").append(nl);
            single(sb, u.query(), nl);
        }
    }

    private void single(StringBuilder sb, SingleQuery s, String nl) {
        List<Clause> clauses = s.clauses();
        for (int i = 0; i < clauses.size(); i++) {
            if (i > 0) sb.append(nl);
            clause(sb, clauses.get(i), nl);
        }
    }

    private void clause(StringBuilder sb, Clause c, String nl) {
        if (c instanceof Clause.Match m) {
            sb.append(m.optional() ? "OPTIONAL MATCH " : "MATCH ");
            pattern(sb, m.pattern());
            where(sb, m.where(), nl);
        } else if (c instanceof Clause.Unwind u) {
            sb.append("UNWIND ");
            expr(sb, u.list());
            sb.append(" AS ").append(variableName(u.alias().name()));
        } else if (c instanceof Clause.With w) {
            sb.append("WITH ");
            projection(sb, w.projection(), nl);
            where(sb, w.where(), nl);
        } else if (c instanceof Clause.Return r) {
            sb.append("RETURN ");
            projection(sb, r.projection(), nl);
        } else if (c instanceof Clause.Create cr) {
            sb.append("CREATE ");
            pattern(sb, cr.pattern());
        } else if (c instanceof Clause.Merge m) {
            sb.append("MERGE ");
            part(sb, m.part());
            for (Clause.MergeAction a : m.actions()) {
                sb.append(nl).append(a.onCreate() ? "ON CREATE SET " : "ON MATCH SET ");
                setItems(sb, a.items());
            }
        } else if (c instanceof Clause.SetClause s) {
            sb.append("SET ");
            setItems(sb, s.items());
        } else if (c instanceof Clause.Remove r) {
            sb.append("REMOVE ");
            for (int i = 0; i < r.items().size(); i++) {
                if (i > 0) sb.append(", ");
                Clause.RemoveItem item = r.items().get(i);
                if (item instanceof Clause.RemoveProperty p) {
                    expr(sb, p.target());
                } else {
                    Clause.RemoveLabels l = (Clause.RemoveLabels) item;
                    sb.append(variableName(l.target().name()));
                    l.labels().forEach(x -> sb.append(':').append(schemaName(x)));
                }
            }
        } else if (c instanceof Clause.Delete d) {
            sb.append(d.detach() ? "DETACH DELETE " : "DELETE ");
            exprList(sb, d.targets());
        } else if (c instanceof Clause.Foreach f) {
            sb.append("FOREACH (").append(variableName(f.variable().name())).append(" IN ");
            expr(sb, f.list());
            sb.append(" |");
            for (Clause inner : f.body()) {
                sb.append(' ');
                clause(sb, inner, " ");
            }
            sb.append(')');
        } else if (c instanceof Clause.LoadCsv l) {
            sb.append(l.withHeaders() ? "LOAD CSV WITH HEADERS FROM " : "LOAD CSV FROM ");
            expr(sb, l.source());
            sb.append(" AS ").append(variableName(l.alias().name()));
            l.fieldTerminator().ifPresent(t -> sb.append(" FIELDTERMINATOR ").append(string(t)));
        } else if (c instanceof Clause.CallProcedure p) {
            sb.append("CALL ");
            p.namespace().forEach(ns -> sb.append(variableName(ns)).append('.'));
            sb.append(variableName(p.name()));
            if (!p.implicitArgs()) {
                sb.append('(');
                exprList(sb, p.args());
                sb.append(')');
            }
            if (p.yieldStar()) {
                sb.append(" YIELD *");
            } else if (!p.yields().isEmpty()) {
                sb.append(" YIELD ");
                for (int i = 0; i < p.yields().size(); i++) {
                    if (i > 0) sb.append(", ");
                    Clause.YieldItem y = p.yields().get(i);
                    sb.append(schemaName(y.field()));
                    y.alias().ifPresent(a -> sb.append(" AS ").append(variableName(a.name())));
                }
            }
            where(sb, p.where(), " ");
        } else if (c instanceof Clause.CallSubquery s) {
            sb.append("CALL { ");
            query(sb, s.body(), " ");
            sb.append(" }");
        }
    }

    private void where(StringBuilder sb, Optional<Expr> where, String nl) {
        where.ifPresent(w -> {
            sb.append(nl).append("WHERE ");
            expr(sb, w);
        });
    }

    private void projection(StringBuilder sb, Clause.Projection p, String nl) {
        if (p.distinct()) sb.append("DISTINCT ");
        boolean first = true;
        if (p.star()) {
            sb.append('*');
            first = false;
        }
        for (Clause.ProjectionItem item : p.items()) {
            if (!first) sb.append(", ");
            first = false;
            expr(sb, item.expr());
            item.alias().ifPresent(a -> sb.append(" AS ").append(variableName(a.name())));
        }
        if (!p.orderBy().isEmpty()) {
            sb.append(nl).append("ORDER BY ");
            for (int i = 0; i < p.orderBy().size(); i++) {
                if (i > 0) sb.append(", ");
                Clause.SortItem s = p.orderBy().get(i);
                expr(sb, s.expr());
                if (s.descending()) sb.append(" DESC");
            }
        }
        p.skip().ifPresent(s -> {
            sb.append(nl).append("SKIP ");
            expr(sb, s);
        });
        p.limit().ifPresent(l -> {
            sb.append(nl).append("LIMIT ");
            expr(sb, l);
        });
    }

    private void setItems(StringBuilder sb, List<Clause.SetItem> items) {
        for (int i = 0; i < items.size(); i++) {
            if (i > 0) sb.append(", ");
            Clause.SetItem item = items.get(i);
            if (item instanceof Clause.SetProperty p) {
                expr(sb, p.target());
                sb.append(" = ");
                expr(sb, p.value());
            } else if (item instanceof Clause.SetVariable v) {
                sb.append(variableName(v.target().name())).append(v.merge() ? " += " : " = ");
                expr(sb, v.value());
            } else {
                Clause.SetLabels l = (Clause.SetLabels) item;
                sb.append(variableName(l.target().name()));
                l.labels().forEach(x -> sb.append(':').append(schemaName(x)));
            }
        }
    }

    // ---------------------------------------------------------------- patterns

    private void pattern(StringBuilder sb, Pattern p) {
        for (int i = 0; i < p.parts().size(); i++) {
            if (i > 0) sb.append(", ");
            part(sb, p.parts().get(i));
        }
    }

    private void part(StringBuilder sb, Pattern.Part p) {
        p.pathVariable().ifPresent(v -> sb.append(variableName(v.name())).append(" = "));
        switch (p.kind()) {
            case SHORTEST -> sb.append("shortestPath(");
            case ALL_SHORTEST -> sb.append("allShortestPaths(");
            default -> { }
        }
        chain(sb, p);
        if (p.kind() != Pattern.PathKind.PLAIN) sb.append(')');
    }

    private void chain(StringBuilder sb, Pattern.Part p) {
        nodePattern(sb, p.start());
        for (Pattern.Step s : p.steps()) {
            rel(sb, s.rel());
            nodePattern(sb, s.node());
        }
    }

    private void nodePattern(StringBuilder sb, Pattern.NodePattern n) {
        sb.append('(');
        n.variable().ifPresent(v -> sb.append(variableName(v.name())));
        n.labels().ifPresent(l -> nodeLabels(sb, l));
        n.properties().ifPresent(p -> {
            if (n.variable().isPresent() || n.labels().isPresent()) sb.append(' ');
            expr(sb, p);
        });
        sb.append(')');
    }

    private void rel(StringBuilder sb, Pattern.RelPattern r) {
        sb.append(r.direction() == Pattern.Direction.INCOMING ? "<-" : "-");
        boolean detail = r.variable().isPresent() || r.types().isPresent() || r.length().isPresent()
                || r.properties().isPresent();
        if (detail) {
            sb.append('[');
            r.variable().ifPresent(v -> sb.append(variableName(v.name())));
            r.types().ifPresent(t -> {
                sb.append(':');
                labelGql(sb, t, 0);
            });
            r.length().ifPresent(len -> {
                sb.append('*');
                if (len.min().isPresent() && len.min().equals(len.max())) {
                    sb.append(len.min().get());
                } else if (len.min().isPresent() || len.max().isPresent()) {
                    len.min().ifPresent(sb::append);
                    sb.append("..");
                    len.max().ifPresent(sb::append);
                }
            });
            r.properties().ifPresent(p -> {
                if (r.variable().isPresent() || r.types().isPresent() || r.length().isPresent()) sb.append(' ');
                expr(sb, p);
            });
            sb.append(']');
        }
        sb.append(r.direction() == Pattern.Direction.OUTGOING ? "->" : "-");
    }

    // ---------------------------------------------------------------- labels

    /** {@code :A:B} for a conjunction of names, the GQL form otherwise. */
    private void nodeLabels(StringBuilder sb, LabelExpr l) {
        if (l instanceof LabelExpr.And and && and.operands().stream().allMatch(o -> o instanceof LabelExpr.Name)) {
            and.operands().forEach(o -> sb.append(':').append(schemaName(((LabelExpr.Name) o).name())));
        } else {
            sb.append(':');
            labelGql(sb, l, 0);
        }
    }

    /** Levels: 0 or, 1 and, 2 not and atoms. */
    private void labelGql(StringBuilder sb, LabelExpr l, int context) {
        if (l instanceof LabelExpr.Name n) {
            sb.append(schemaName(n.name()));
        } else if (l instanceof LabelExpr.Wildcard) {
            sb.append('%');
        } else if (l instanceof LabelExpr.Not n) {
            sb.append('!');
            labelGql(sb, n.operand(), 2);
        } else if (l instanceof LabelExpr.And a) {
            if (context > 1) sb.append('(');
            for (int i = 0; i < a.operands().size(); i++) {
                if (i > 0) sb.append('&');
                labelGql(sb, a.operands().get(i), 2);
            }
            if (context > 1) sb.append(')');
        } else if (l instanceof LabelExpr.Or o) {
            if (context > 0) sb.append('(');
            for (int i = 0; i < o.operands().size(); i++) {
                if (i > 0) sb.append('|');
                labelGql(sb, o.operands().get(i), 1);
            }
            if (context > 0) sb.append(')');
        }
    }

    // ---------------------------------------------------------------- expressions

    private void exprList(StringBuilder sb, List<Expr> list) {
        for (int i = 0; i < list.size(); i++) {
            if (i > 0) sb.append(", ");
            expr(sb, list.get(i));
        }
    }

    private void expr(StringBuilder sb, Expr e) {
        if (e instanceof Expr.Binary b) {
            int p = precedence(b);
            Expr left = b.left();
            // a comparison on the left of a comparison must keep its parentheses: unparenthesized, it is a chain
            boolean leftParens = precedence(left) < p || (p == COMPARISON && precedence(left) == COMPARISON);
            operand(sb, left, leftParens);
            sb.append(' ').append(b.op().symbol()).append(' ');
            operand(sb, b.right(), precedence(b.right()) <= p);
        } else if (e instanceof Expr.Unary u) {
            switch (u.op()) {
                case NOT -> {
                    sb.append("NOT ");
                    operand(sb, u.operand(), precedence(u.operand()) < NOT);
                }
                case MINUS, PLUS -> {
                    sb.append(u.op() == Expr.UnaryOp.MINUS ? '-' : '+');
                    // a signed operand gets parentheses, so that "- -1" never prints as "--1"; so does a number
                    // under a minus, which would otherwise read back as one negative literal (-(0) is not -0)
                    boolean signed = precedence(u.operand()) == UNARY || (u.op() == Expr.UnaryOp.MINUS
                            && (u.operand() instanceof Expr.IntegerLit || u.operand() instanceof Expr.FloatLit));
                    operand(sb, u.operand(), precedence(u.operand()) < UNARY || signed);
                }
            }
        } else if (e instanceof Expr.IsNull n) {
            operand(sb, n.operand(), precedence(n.operand()) < PREDICATE);
            sb.append(n.negated() ? " IS NOT NULL" : " IS NULL");
        } else if (e instanceof Expr.Property p) {
            operand(sb, p.target(), precedence(p.target()) < POSTFIX);
            sb.append('.').append(schemaName(p.key()));
        } else if (e instanceof Expr.HasLabels h) {
            operand(sb, h.target(), precedence(h.target()) < POSTFIX);
            LabelExpr l = h.labels();
            if (l instanceof LabelExpr.Or) {
                sb.append(":(");
                labelGql(sb, l, 0);
                sb.append(')');
            } else {
                nodeLabels(sb, l);
            }
        } else if (e instanceof Expr.Subscript s) {
            operand(sb, s.target(), precedence(s.target()) < POSTFIX);
            sb.append('[');
            expr(sb, s.index());
            sb.append(']');
        } else if (e instanceof Expr.Slice s) {
            operand(sb, s.target(), precedence(s.target()) < POSTFIX);
            sb.append('[');
            s.from().ifPresent(f -> expr(sb, f));
            sb.append("..");
            s.to().ifPresent(t -> expr(sb, t));
            sb.append(']');
        } else {
            atom(sb, e);
        }
    }

    private void operand(StringBuilder sb, Expr e, boolean parens) {
        if (parens) sb.append('(');
        expr(sb, e);
        if (parens) sb.append(')');
    }

    private void atom(StringBuilder sb, Expr e) {
        if (e instanceof Expr.Variable v) {
            sb.append(variableName(v.name()));
        } else if (e instanceof Expr.Parameter p) {
            sb.append('$').append(p.name().chars().allMatch(Character::isDigit) && !p.name().isEmpty()
                    ? p.name() : variableName(p.name()));
        } else if (e instanceof Expr.IntegerLit i) {
            sb.append(i.value());
        } else if (e instanceof Expr.FloatLit f) {
            sb.append(floatText(f.value()));
        } else if (e instanceof Expr.StringLit s) {
            sb.append(string(s.value()));
        } else if (e instanceof Expr.BooleanLit b) {
            sb.append(b.value() ? "true" : "false");
        } else if (e instanceof Expr.NullLit) {
            sb.append("null");
        } else if (e instanceof Expr.ListLit l) {
            sb.append('[');
            exprList(sb, l.elements());
            sb.append(']');
        } else if (e instanceof Expr.MapLit m) {
            sb.append('{');
            for (int i = 0; i < m.entries().size(); i++) {
                if (i > 0) sb.append(", ");
                Expr.MapEntry entry = m.entries().get(i);
                sb.append(schemaName(entry.key())).append(": ");
                expr(sb, entry.value());
            }
            sb.append('}');
        } else if (e instanceof Expr.FunctionCall f) {
            f.namespace().forEach(ns -> sb.append(variableName(ns)).append('.'));
            sb.append(functionName(f.name())).append('(');
            if (f.distinct()) sb.append("DISTINCT ");
            exprList(sb, f.args());
            sb.append(')');
        } else if (e instanceof Expr.CountStar) {
            sb.append("count(*)");
        } else if (e instanceof Expr.Case c) {
            sb.append("CASE");
            c.subject().ifPresent(s -> {
                sb.append(' ');
                expr(sb, s);
            });
            for (Expr.CaseWhen w : c.whens()) {
                sb.append(" WHEN ");
                expr(sb, w.when());
                sb.append(" THEN ");
                expr(sb, w.then());
            }
            c.otherwise().ifPresent(o -> {
                sb.append(" ELSE ");
                expr(sb, o);
            });
            sb.append(" END");
        } else if (e instanceof Expr.ListComprehension c) {
            sb.append('[').append(variableName(c.variable().name())).append(" IN ");
            expr(sb, c.source());
            c.where().ifPresent(w -> {
                sb.append(" WHERE ");
                expr(sb, w);
            });
            c.map().ifPresent(m -> {
                sb.append(" | ");
                expr(sb, m);
            });
            sb.append(']');
        } else if (e instanceof Expr.PatternComprehension c) {
            sb.append('[');
            part(sb, c.pattern());
            c.where().ifPresent(w -> {
                sb.append(" WHERE ");
                expr(sb, w);
            });
            sb.append(" | ");
            expr(sb, c.map());
            sb.append(']');
        } else if (e instanceof Expr.Quantified q) {
            sb.append(q.quantifier().name().toLowerCase(Locale.ROOT)).append('(')
                    .append(variableName(q.variable().name())).append(" IN ");
            expr(sb, q.source());
            q.where().ifPresent(w -> {
                sb.append(" WHERE ");
                expr(sb, w);
            });
            sb.append(')');
        } else if (e instanceof Expr.Reduce r) {
            sb.append("reduce(").append(variableName(r.accumulator().name())).append(" = ");
            expr(sb, r.init());
            sb.append(", ").append(variableName(r.variable().name())).append(" IN ");
            expr(sb, r.source());
            sb.append(" | ");
            expr(sb, r.map());
            sb.append(')');
        } else if (e instanceof Expr.PatternPredicate p) {
            part(sb, p.pattern());
        } else if (e instanceof Expr.ExistsSubquery s) {
            sb.append("EXISTS ");
            subquery(sb, s.pattern(), s.where(), s.query());
        } else if (e instanceof Expr.CountSubquery s) {
            sb.append("COUNT ");
            subquery(sb, s.pattern(), s.where(), s.query());
        } else if (e instanceof Expr.MapProjection m) {
            sb.append(variableName(m.variable().name())).append(" {");
            for (int i = 0; i < m.items().size(); i++) {
                if (i > 0) sb.append(", ");
                Expr.MapItem item = m.items().get(i);
                if (item instanceof Expr.PropertySelector p) {
                    sb.append('.').append(schemaName(p.key()));
                } else if (item instanceof Expr.LiteralEntry l) {
                    sb.append(schemaName(l.key())).append(": ");
                    expr(sb, l.value());
                } else if (item instanceof Expr.VariableSelector v) {
                    sb.append(variableName(v.variable().name()));
                } else {
                    sb.append(".*");
                }
            }
            sb.append('}');
        } else {
            throw new IllegalArgumentException("cannot print " + e.getClass().getSimpleName());
        }
    }

    private void subquery(StringBuilder sb, Optional<Pattern> pattern, Optional<Expr> where, Optional<Query> query) {
        sb.append("{ ");
        if (query.isPresent()) {
            query(sb, query.get(), " ");
        } else {
            pattern.ifPresent(p -> pattern(sb, p));
            where(sb, where, " ");
        }
        sb.append(" }");
    }

    private static int precedence(Expr e) {
        if (e instanceof Expr.Binary b) return precedence(b);
        if (e instanceof Expr.Unary u) return u.op() == Expr.UnaryOp.NOT ? NOT : UNARY;
        if (e instanceof Expr.IsNull) return PREDICATE;
        if (e instanceof Expr.Property || e instanceof Expr.HasLabels || e instanceof Expr.Subscript
                || e instanceof Expr.Slice) {
            return POSTFIX;
        }
        // a negative literal prints with its sign, so it binds like a unary minus
        if (e instanceof Expr.IntegerLit i && i.value() < 0) return UNARY;
        if (e instanceof Expr.FloatLit f && (f.value() < 0 || (f.value() == 0 && 1 / f.value() < 0))) return UNARY;
        return ATOM;
    }

    private static int precedence(Expr.Binary b) {
        return switch (b.op()) {
            case OR -> OR;
            case XOR -> XOR;
            case AND -> AND;
            case EQ, NE, LT, GT, LE, GE -> COMPARISON;
            case STARTS_WITH, ENDS_WITH, CONTAINS, IN, REGEX -> PREDICATE;
            case ADD, SUB -> ADD;
            case MUL, DIV, MOD -> MUL;
            case POW -> POW;
        };
    }

    // ---------------------------------------------------------------- names and literals

    /** A variable, quoted with backticks when it is not a plain name or is a keyword. */
    static String variableName(String name) {
        if (PLAIN_NAME.matcher(name).matches() && !KEYWORDS.contains(name.toUpperCase(Locale.ROOT))) return name;
        return quoted(name);
    }

    /** Labels, types and property keys may be keywords; only odd characters need backticks. */
    public static String schemaName(String name) {
        return PLAIN_NAME.matcher(name).matches() ? name : quoted(name);
    }

    /** Function names may be keywords such as {@code exists} or {@code count}. */
    private static String functionName(String name) {
        if (name.equalsIgnoreCase("exists") || name.equalsIgnoreCase("count")) return name;
        return variableName(name);
    }

    private static String quoted(String name) {
        return "`" + name.replace("`", "``") + "`";
    }

    /** Single-quoted, with the escapes openCypher defines. */
    public static String string(String value) {
        StringBuilder sb = new StringBuilder(value.length() + 2).append('\'');
        for (int i = 0; i < value.length(); i++) {
            char c = value.charAt(i);
            switch (c) {
                case '\\' -> sb.append("\\\\");
                case '\'' -> sb.append("\\'");
                case '\n' -> sb.append("\\n");
                case '\r' -> sb.append("\\r");
                case '\t' -> sb.append("\\t");
                case '\b' -> sb.append("\\b");
                case '\f' -> sb.append("\\f");
                default -> {
                    if (c < 0x20 || c == 0x7f) {
                        sb.append(String.format(Locale.ROOT, "\\u%04X", (int) c));
                    } else {
                        sb.append(c);
                    }
                }
            }
        }
        return sb.append('\'').toString();
    }

    private static String floatText(double v) {
        if (Double.isNaN(v)) return "(0.0 / 0.0)";
        if (Double.isInfinite(v)) return v > 0 ? "(1.0 / 0.0)" : "(-1.0 / 0.0)";
        return Double.toString(v);
    }
}

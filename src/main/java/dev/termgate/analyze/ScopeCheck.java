package dev.termgate.analyze;

import dev.termgate.diag.Code;
import dev.termgate.diag.Diagnostic;
import dev.termgate.diag.Quote;
import dev.termgate.query.Clause;
import dev.termgate.query.Expr;
import dev.termgate.query.LabelExpr;
import dev.termgate.query.Node;
import dev.termgate.query.Pattern;
import dev.termgate.query.Printer;
import dev.termgate.query.Query;
import dev.termgate.query.SingleQuery;
import dev.termgate.query.Trees;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * Scope and typing by the openCypher rules (openCypher 9 and the TCK's compile-time errors): undefined
 * variables, a name bound as one kind and used as another, rebinding in one pattern, aggregation where it is
 * not allowed or nested, ORDER BY after DISTINCT or aggregation, projection names, UNION columns, SKIP/LIMIT,
 * and operands whose type is certainly wrong. Records every binding in the {@link Context} for later checks.
 */
final class ScopeCheck implements Check {

    static final Set<String> AGGREGATES = Set.of("count", "sum", "avg", "min", "max", "collect", "stdev", "stdevp",
            "percentilecont", "percentiledisc");

    @Override
    public void run(Query query, Context cx) {
        new Walker(cx).query(query, new LinkedHashMap<>(), false);
    }

    /** Where an expression stands, for the aggregation rules. */
    private record Place(String name, boolean aggregationAllowed, boolean insideAggregate) {
        static final Place WHERE = new Place("WHERE", false, false);
        static final Place PLAIN = new Place("this expression", false, false);

        Place inAggregate() {
            return new Place(name, false, true);
        }

        Place withName(String other) {
            return new Place(other, aggregationAllowed, insideAggregate);
        }
    }

    private static final class Walker {
        private final Context cx;
        /** Column names of unaliased items are only needed to compare UNION parts (they cost a tree copy). */
        private boolean needColumns;

        Walker(Context cx) {
            this.cx = cx;
        }

        void query(Query q, Map<String, Binding> outer, boolean subquery) {
            boolean saved = needColumns;
            needColumns = !q.unions().isEmpty();
            List<List<String>> columns = new ArrayList<>();
            for (SingleQuery sq : q.parts()) {
                columns.add(single(sq, new LinkedHashMap<>(outer), subquery));
            }
            if (!q.unions().isEmpty()) {
                boolean all = q.unions().get(0).all();
                for (Query.UnionPart u : q.unions()) {
                    if (u.all() != all) {
                        cx.report(Diagnostic.of(Code.MIXED_UNION, u));
                        break;
                    }
                }
                List<String> first = columns.get(0);
                for (int i = 1; i < columns.size(); i++) {
                    if (first != null && columns.get(i) != null && !first.equals(columns.get(i))) {
                        cx.report(Diagnostic.of(Code.UNION_COLUMN_MISMATCH, q.unions().get(i - 1),
                                String.join(", ", first), String.join(", ", columns.get(i))));
                    }
                }
            }
            needColumns = saved;
        }

        /** Returns the column names of the final RETURN (null when there is none or it is RETURN *). */
        List<String> single(SingleQuery sq, Map<String, Binding> scope, boolean subquery) {
            List<String> columns = null;
            List<Clause> clauses = sq.clauses();
            for (int i = 0; i < clauses.size(); i++) {
                Clause c = clauses.get(i);
                if (c instanceof Clause.Match m) {
                    pattern(m.pattern(), scope, true, !m.optional());
                    m.where().ifPresent(w -> predicate(w, scope));
                } else if (c instanceof Clause.Unwind u) {
                    Type elem = elementType(u.list(), scope);
                    expr(u.list(), scope, Place.PLAIN.withName("UNWIND"));
                    declare(u.alias(), elem, scope);
                } else if (c instanceof Clause.With w) {
                    Map<String, Binding> next = projection(w.projection(), scope, true).visible();
                    // WHERE of a WITH still sees the variables before it, unless an aggregation dropped them
                    // (openCypher TCK, WithWhere1 and WithWhere7).
                    Map<String, Binding> whereScope = new LinkedHashMap<>();
                    boolean aggregating = w.projection().items().stream().anyMatch(it -> containsAggregate(it.expr()));
                    if (!aggregating) whereScope.putAll(scope);
                    whereScope.putAll(next);
                    scope.clear();
                    scope.putAll(next);
                    w.where().ifPresent(x -> predicate(x, whereScope));
                } else if (c instanceof Clause.Return r) {
                    Projected next = projection(r.projection(), scope, false);
                    columns = r.projection().star() ? null : next.columns();
                    scope.clear();
                    scope.putAll(next.visible());
                    if (i < clauses.size() - 1) {
                        cx.report(Diagnostic.of(Code.INVALID_CLAUSE_ORDER, clauses.get(i + 1),
                                "RETURN must be the last clause of a query part"));
                    }
                } else {
                    writeClause(c, scope);
                }
            }
            boolean writes = clauses.stream().anyMatch(Clause::isWrite);
            if (!subquery && !writes && !clauses.isEmpty() && !(clauses.get(clauses.size() - 1) instanceof Clause.Return)) {
                cx.report(Diagnostic.of(Code.NO_RETURN, clauses.get(clauses.size() - 1)));
            }
            return columns;
        }

        /** Write clauses are refused by {@link ReadOnlyCheck}; here they only bind names, so nothing cascades. */
        private void writeClause(Clause c, Map<String, Binding> scope) {
            if (c instanceof Clause.Create cr) {
                pattern(cr.pattern(), scope, true, false);
            } else if (c instanceof Clause.Merge m) {
                pattern(new Pattern(List.of(m.part()), m.span()), scope, true, false);
            } else if (c instanceof Clause.LoadCsv l) {
                declareQuietly(l.alias(), Type.ANY, scope);
            } else if (c instanceof Clause.Foreach f) {
                Map<String, Binding> inner = new LinkedHashMap<>(scope);
                declareQuietly(f.variable(), Type.ANY, inner);
                for (Clause b : f.body()) writeClause(b, inner);
            } else if (c instanceof Clause.CallProcedure p) {
                for (Expr a : p.args()) expr(a, scope, Place.PLAIN.withName("a procedure argument"));
                for (Clause.YieldItem y : p.yields()) {
                    Expr.Variable v = y.alias().orElse(null);
                    String name = v != null ? v.name() : y.field();
                    if (scope.containsKey(name)) {
                        cx.report(Diagnostic.of(Code.VARIABLE_ALREADY_BOUND, y, name));
                    } else {
                        Binding b = new Binding(name, Type.ANY);
                        scope.put(name, b);
                        if (v != null) cx.bind(v, b);
                    }
                }
                p.where().ifPresent(w -> predicate(w, scope));
            }
        }

        // ---- patterns ----

        /**
         * Binds or checks the variables of a pattern. {@code binds} is false for a pattern used as a predicate,
         * which may only refer to variables already bound.
         */
        void pattern(Pattern pat, Map<String, Binding> scope, boolean binds, boolean mandatory) {
            Set<String> relsHere = new HashSet<>();
            for (Pattern.Part part : pat.parts()) {
                part(part, scope, binds, relsHere);
                cx.patterns.add(new Context.PatternUse(part, mandatory));
            }
        }

        private void part(Pattern.Part part, Map<String, Binding> scope, boolean binds, Set<String> relsHere) {
            node(part.start(), scope, binds);
            for (Pattern.Step s : part.steps()) {
                rel(s.rel(), scope, binds, relsHere);
                node(s.node(), scope, binds);
            }
            part.pathVariable().ifPresent(p -> {
                if (scope.containsKey(p.name())) {
                    cx.report(Diagnostic.of(Code.VARIABLE_ALREADY_BOUND, p, p.name()));
                } else if (!binds) {
                    cx.report(Diagnostic.of(Code.UNDEFINED_VARIABLE, p, p.name()));
                } else {
                    Binding b = new Binding(p.name(), Type.PATH);
                    scope.put(p.name(), b);
                    cx.bind(p, b);
                }
            });
        }

        private void node(Pattern.NodePattern np, Map<String, Binding> scope, boolean binds) {
            Binding b;
            if (np.variable().isPresent()) {
                Expr.Variable v = np.variable().get();
                b = scope.get(v.name());
                if (b == null) {
                    if (!binds) undefined(v, scope);
                    b = new Binding(v.name(), Type.NODE);
                    if (binds) scope.put(v.name(), b);
                } else if (b.type != Type.NODE && b.type != Type.ANY && b.type != Type.NULL) {
                    cx.report(Diagnostic.of(Code.VARIABLE_TYPE_CONFLICT, v, v.name(), b.type.word(), "node"));
                }
                cx.bind(v, b);
            } else {
                b = new Binding(null, Type.NODE);
            }
            cx.bind(np, b);
            mapOfPattern(np.properties(), b, scope);
        }

        private void rel(Pattern.RelPattern rp, Map<String, Binding> scope, boolean binds, Set<String> relsHere) {
            Type want = rp.length().isPresent() ? Type.REL_LIST : Type.RELATIONSHIP;
            Binding b;
            if (rp.variable().isPresent()) {
                Expr.Variable v = rp.variable().get();
                b = scope.get(v.name());
                if (b == null) {
                    if (!binds) undefined(v, scope);
                    b = new Binding(v.name(), want);
                    if (binds) {
                        scope.put(v.name(), b);
                        relsHere.add(v.name());
                    }
                } else if (relsHere.contains(v.name())) {
                    cx.report(Diagnostic.of(Code.VARIABLE_ALREADY_BOUND, v, v.name()));
                } else if (b.type != want && b.type != Type.ANY && b.type != Type.NULL
                        && !(b.type == Type.LIST && want == Type.REL_LIST)) {
                    cx.report(Diagnostic.of(Code.VARIABLE_TYPE_CONFLICT, v, v.name(), b.type.word(), want.word()));
                }
                cx.bind(v, b);
            } else {
                b = new Binding(null, want);
            }
            cx.bind(rp, b);
            mapOfPattern(rp.properties(), b, scope);
        }

        private void mapOfPattern(Optional<Expr> props, Binding owner, Map<String, Binding> scope) {
            if (props.isEmpty()) return;
            Expr p = props.get();
            if (p instanceof Expr.Parameter) {
                cx.report(Diagnostic.of(Code.INVALID_PARAMETER_USE, p));
                return;
            }
            if (p instanceof Expr.MapLit m) {
                for (Expr.MapEntry e : m.entries()) {
                    cx.properties.add(new Context.PropertyUse(e, e.key(), owner, e.span()));
                    expr(e.value(), scope, Place.PLAIN);
                }
            } else {
                expr(p, scope, Place.PLAIN);
            }
        }

        // ---- projections ----

        /** The names visible after a projection, and its column names in order (for UNION). */
        private record Projected(Map<String, Binding> visible, List<String> columns) {}

        private Projected projection(Clause.Projection p, Map<String, Binding> scope, boolean isWith) {
            Map<String, Binding> next = new LinkedHashMap<>();
            String clause = isWith ? "WITH" : "RETURN";
            if (p.star()) {
                boolean any = scope.values().stream().anyMatch(b -> !b.anonymous());
                if (!any) cx.report(Diagnostic.of(Code.RETURN_STAR_NO_VARIABLES, p));
                next.putAll(scope);
            }
            boolean aggregating = false;
            for (Clause.ProjectionItem item : p.items()) aggregating |= containsAggregate(item.expr());
            // Beside an aggregation only grouping keys that are a variable or a property of one may appear
            // (openCypher TCK, ReturnOrderBy6 / Return6 / With6: AmbiguousAggregationExpression).
            Set<Object> groupingKeys = new HashSet<>();
            if (p.star()) scope.keySet().forEach(n -> groupingKeys.add(n));
            for (Clause.ProjectionItem item : aggregating ? p.items() : List.<Clause.ProjectionItem>of()) {
                if (containsAggregate(item.expr())) continue;
                if (item.expr() instanceof Expr.Variable v) groupingKeys.add(v.name());
                else if (item.expr() instanceof Expr.Property pr && pr.target() instanceof Expr.Variable) {
                    groupingKeys.add(groupingKey(pr));
                }
            }
            Set<String> names = new LinkedHashSet<>();
            for (Clause.ProjectionItem item : p.items()) {
                Type t = expr(item.expr(), scope, new Place(clause, true, false));
                if (aggregating && containsAggregate(item.expr())) ambiguous(item.expr(), groupingKeys, scope);
                String name = item.alias().map(Expr.Variable::name)
                        .orElse(item.expr() instanceof Expr.Variable v ? v.name() : null);
                if (name == null) {
                    if (isWith) {
                        cx.report(Diagnostic.of(Code.MISSING_ALIAS, item));
                        continue;
                    }
                    name = "\u0000" + (needColumns ? Columns.name(item.expr()) : "#" + names.size());
                } else if (!names.add(name)) {
                    cx.report(Diagnostic.of(Code.DUPLICATE_COLUMN, item.alias().map(a -> (Node) a).orElse(item), name));
                    continue;
                }
                names.add(name);
                Binding b = item.expr() instanceof Expr.Variable v && cx.binding(v) != null ? cx.binding(v)
                        : new Binding(name, t);
                next.put(name, b);
                item.alias().ifPresent(a -> cx.bind(a, b));
            }
            // ORDER BY sees the projected names, and also the earlier variables unless DISTINCT or an
            // aggregation dropped them; an expression equal to a projected one is always fine.
            List<Expr> projected = new ArrayList<>(p.orderBy().isEmpty() ? 0 : p.items().size());
            if (!p.orderBy().isEmpty()) for (Clause.ProjectionItem i : p.items()) projected.add(i.expr());
            Map<String, Binding> orderScope = new LinkedHashMap<>();
            boolean dropping = p.distinct() || aggregating;
            if (!dropping) orderScope.putAll(scope);
            orderScope.putAll(next);
            for (Clause.SortItem s : p.orderBy()) {
                if (!aggregating && containsAggregate(s.expr())) {
                    cx.report(Diagnostic.of(Code.AGGREGATION_NOT_ALLOWED, s, "ORDER BY unless the projection aggregates"));
                    continue;
                }
                orderExpr(s.expr(), orderScope, projected, dropping ? (p.distinct() ? "DISTINCT" : "aggregation") : null,
                        new Place("ORDER BY", aggregating, false));
                if (aggregating && containsAggregate(s.expr())) projectedBesideAggregate(s.expr(), projected);
            }
            p.skip().ifPresent(x -> constant(x, "SKIP", scope));
            p.limit().ifPresent(x -> constant(x, "LIMIT", scope));
            Map<String, Binding> visible = new LinkedHashMap<>();
            List<String> columns = new ArrayList<>();
            for (Map.Entry<String, Binding> e : next.entrySet()) {
                if (e.getKey().charAt(0) != '\u0000') {
                    visible.put(e.getKey(), e.getValue());
                    columns.add(e.getKey());
                } else {
                    columns.add(e.getKey().substring(1));
                }
            }
            return new Projected(visible, columns);
        }

        /**
         * {@code v.key} as a grouping key: the variable's name and the key, apart by a NUL (which no name holds:
         * the parser refuses NUL characters), so it never equals a plain variable's name.
         */
        private static String groupingKey(Expr.Property pr) {
            return ((Expr.Variable) pr.target()).name() + '\u0000' + pr.key();
        }

        /**
         * In an ORDER BY item that aggregates, a part equal to a projected expression stands for a grouping key only
         * when that expression is a variable or a property of one; any other is ambiguous (openCypher TCK,
         * ReturnOrderBy6 [5]: {@code RETURN a.x + b.x, count(*) ORDER BY a.x + b.x + count(*)}).
         */
        private void projectedBesideAggregate(Expr e, List<Expr> projected) {
            if (isAggregate(e)) return;
            for (Expr x : projected) {
                if (containsAggregate(x) || x instanceof Expr.Variable
                        || x instanceof Expr.Property pr && pr.target() instanceof Expr.Variable) {
                    continue;
                }
                if (Trees.equalIgnoringSpans(x, e)) {
                    cx.report(Diagnostic.of(Code.AMBIGUOUS_AGGREGATION, e, Printer.printOneLine(e)));
                    return;
                }
            }
            for (Node c : Trees.children(e)) if (c instanceof Expr x) projectedBesideAggregate(x, projected);
        }

        /** Reports variables beside an aggregation that are not grouping keys (nor inside one). */
        private void ambiguous(Expr e, Set<Object> keys, Map<String, Binding> scope) {
            if (isAggregate(e)) return;
            if (e instanceof Expr.Property pr && pr.target() instanceof Expr.Variable && keys.contains(groupingKey(pr))) return;
            if (e instanceof Expr.Variable v) {
                if (!keys.contains(v.name()) && scope.containsKey(v.name())) {
                    cx.report(Diagnostic.of(Code.AMBIGUOUS_AGGREGATION, v, v.name()));
                }
                return;
            }
            if (e instanceof Expr.ListComprehension || e instanceof Expr.Quantified || e instanceof Expr.Reduce
                    || e instanceof Expr.PatternComprehension || e instanceof Expr.ExistsSubquery
                    || e instanceof Expr.CountSubquery) {
                return;
            }
            for (Node c : Trees.children(e)) {
                if (c instanceof Expr x) ambiguous(x, keys, scope);
                else if (c instanceof Expr.MapEntry m) ambiguous(m.value(), keys, scope);
                else if (c instanceof Expr.CaseWhen w) {
                    ambiguous(w.when(), keys, scope);
                    ambiguous(w.then(), keys, scope);
                }
            }
        }

        private void orderExpr(Expr e, Map<String, Binding> scope, List<Expr> projected, String dropper, Place place) {
            if (projected.stream().anyMatch(x -> Trees.equalIgnoringSpans(x, e))) {
                for (Expr.Variable v : Trees.find(e, Expr.Variable.class)) {
                    Binding b = scope.get(v.name());
                    if (b != null) cx.bind(v, b);
                }
                return;
            }
            Expr head = e instanceof Expr.Property p ? p.target() : e;
            if (head instanceof Expr.Variable v && dropper != null && !scope.containsKey(v.name())) {
                cx.report(Diagnostic.of(Code.ORDER_BY_DROPPED_VARIABLE, v, v.name(), dropper));
                return;
            }
            if (e instanceof Expr.Binary b) {
                orderExpr(b.left(), scope, projected, dropper, place);
                orderExpr(b.right(), scope, projected, dropper, place);
            } else if (e instanceof Expr.Unary u) {
                orderExpr(u.operand(), scope, projected, dropper, place);
            } else if (e instanceof Expr.IsNull n) {
                orderExpr(n.operand(), scope, projected, dropper, place);
            } else {
                expr(e, scope, place);
            }
        }

        private void constant(Expr e, String what, Map<String, Binding> scope) {
            List<Expr.Variable> vars = Trees.find(e, Expr.Variable.class);
            if (!vars.isEmpty()) {
                cx.report(Diagnostic.of(Code.NON_CONSTANT_EXPRESSION, vars.get(0), what, vars.get(0).name()));
                return;
            }
            expr(e, scope, Place.PLAIN.withName(what));
            if (e instanceof Expr.Unary u && u.op() == Expr.UnaryOp.MINUS && u.operand() instanceof Expr.IntegerLit lit
                    && lit.value() > 0) {
                cx.report(Diagnostic.of(Code.NEGATIVE_INTEGER, e, what));
            } else if (e instanceof Expr.IntegerLit lit && lit.value() < 0) {
                cx.report(Diagnostic.of(Code.NEGATIVE_INTEGER, e, what));
            } else if (e instanceof Expr.FloatLit || e instanceof Expr.StringLit || e instanceof Expr.BooleanLit
                    || e instanceof Expr.ListLit || e instanceof Expr.MapLit
                    || e instanceof Expr.Unary u2 && u2.operand() instanceof Expr.FloatLit) {
                cx.report(Diagnostic.of(Code.INVALID_ARGUMENT_TYPE, e, what + " needs an integer, not " + typeOf(e).withArticle()));
            }
        }

        // ---- expressions ----

        private void predicate(Expr e, Map<String, Binding> scope) {
            Type t = expr(e, scope, Place.WHERE);
            if (t.notBoolean()) {
                cx.report(Diagnostic.of(Code.INVALID_ARGUMENT_TYPE, e, "WHERE needs a boolean, found " + t.withArticle()));
            }
        }

        private void undefined(Expr.Variable v, Map<String, Binding> scope) {
            List<String> near = new ArrayList<>();
            for (String name : scope.keySet()) {
                if (name.charAt(0) != '\u0000' && Lenient.distance(name.toLowerCase(Locale.ROOT), v.name().toLowerCase(Locale.ROOT)) <= 1) {
                    near.add(name);
                }
            }
            cx.report(Diagnostic.of(Code.UNDEFINED_VARIABLE, v, v.name()).withSuggestions(near));
        }

        private void declare(Expr.Variable v, Type t, Map<String, Binding> scope) {
            if (scope.containsKey(v.name())) {
                cx.report(Diagnostic.of(Code.VARIABLE_ALREADY_BOUND, v, v.name()));
                return;
            }
            declareQuietly(v, t, scope);
        }

        /**
         * Checks a list comprehension's or quantifier's list in the outer scope, and returns the scope inside it:
         * the outer one plus its variable, typed as the list's elements.
         */
        private Map<String, Binding> elementScope(Expr source, Expr.Variable variable, Map<String, Binding> scope, Place place) {
            Type elem = elementType(source, scope);
            expr(source, scope, place);
            Map<String, Binding> inner = new LinkedHashMap<>(scope);
            declareQuietly(variable, elem, inner);
            return inner;
        }

        private void declareQuietly(Expr.Variable v, Type t, Map<String, Binding> scope) {
            Binding b = new Binding(v.name(), t);
            scope.put(v.name(), b);
            cx.bind(v, b);
        }

        Type expr(Expr e, Map<String, Binding> scope, Place place) {
            if (e instanceof Expr.Variable v) {
                Binding b = scope.get(v.name());
                if (b == null) {
                    undefined(v, scope);
                    return Type.ANY;
                }
                cx.bind(v, b);
                return b.type;
            }
            if (e instanceof Expr.Parameter) return Type.ANY;
            if (e instanceof Expr.IntegerLit) return Type.INTEGER;
            if (e instanceof Expr.FloatLit) return Type.FLOAT;
            if (e instanceof Expr.StringLit) return Type.STRING;
            if (e instanceof Expr.BooleanLit) return Type.BOOLEAN;
            if (e instanceof Expr.NullLit) return Type.NULL;
            if (e instanceof Expr.ListLit l) {
                l.elements().forEach(x -> expr(x, scope, place));
                return Type.LIST;
            }
            if (e instanceof Expr.MapLit m) {
                m.entries().forEach(x -> expr(x.value(), scope, place));
                return Type.MAP;
            }
            if (e instanceof Expr.Binary b) return binary(b, scope, place);
            if (e instanceof Expr.Unary u) {
                Type t = expr(u.operand(), scope, place);
                if (u.op() == Expr.UnaryOp.NOT) {
                    if (t.notBoolean()) wrongType(u.operand(), "NOT needs a boolean", t);
                    return Type.BOOLEAN;
                }
                if (t.notNumber()) wrongType(u.operand(), "unary " + (u.op() == Expr.UnaryOp.MINUS ? "-" : "+") + " needs a number", t);
                return t.isNumber() ? t : Type.ANY;
            }
            if (e instanceof Expr.IsNull n) {
                expr(n.operand(), scope, place);
                return Type.BOOLEAN;
            }
            if (e instanceof Expr.Property p) {
                Type t = expr(p.target(), scope, place);
                if (t == Type.PATH || t == Type.BOOLEAN || t.isNumber() || t == Type.STRING || t == Type.LIST) {
                    wrongType(p.target(), "cannot read property '" + p.key() + "'", t);
                } else if (p.target() instanceof Expr.Variable v && cx.binding(v) != null && t.mayBeElement()) {
                    cx.properties.add(new Context.PropertyUse(p, p.key(), cx.binding(v), p.span()));
                }
                return Type.ANY;
            }
            if (e instanceof Expr.HasLabels h) {
                expr(h.target(), scope, place);
                return Type.BOOLEAN;
            }
            if (e instanceof Expr.Subscript s) {
                expr(s.target(), scope, place);
                expr(s.index(), scope, place);
                return Type.ANY;
            }
            if (e instanceof Expr.Slice s) {
                expr(s.target(), scope, place);
                s.from().ifPresent(x -> expr(x, scope, place));
                s.to().ifPresent(x -> expr(x, scope, place));
                return Type.LIST;
            }
            if (e instanceof Expr.FunctionCall f) return call(f, scope, place);
            if (e instanceof Expr.CountStar c) {
                aggregate(c, place);
                return Type.INTEGER;
            }
            if (e instanceof Expr.Case c) {
                c.subject().ifPresent(x -> expr(x, scope, place));
                for (Expr.CaseWhen w : c.whens()) {
                    expr(w.when(), scope, place);
                    expr(w.then(), scope, place);
                }
                c.otherwise().ifPresent(x -> expr(x, scope, place));
                return Type.ANY;
            }
            if (e instanceof Expr.ListComprehension lc) {
                Map<String, Binding> inner = elementScope(lc.source(), lc.variable(), scope, place);
                Place in = new Place("a list comprehension", false, place.insideAggregate());
                lc.where().ifPresent(w -> boolCheck(w, expr(w, inner, in), "WHERE"));
                lc.map().ifPresent(m -> expr(m, inner, in));
                return Type.LIST;
            }
            if (e instanceof Expr.Quantified q) {
                Map<String, Binding> inner = elementScope(q.source(), q.variable(), scope, place);
                Place in = new Place("a quantifier", false, place.insideAggregate());
                q.where().ifPresent(w -> boolCheck(w, expr(w, inner, in), "WHERE"));
                return Type.BOOLEAN;
            }
            if (e instanceof Expr.Reduce r) {
                expr(r.init(), scope, place);
                Type elem = elementType(r.source(), scope);
                expr(r.source(), scope, place);
                Map<String, Binding> inner = new LinkedHashMap<>(scope);
                declareQuietly(r.accumulator(), Type.ANY, inner);
                declareQuietly(r.variable(), elem, inner);
                expr(r.map(), inner, new Place("reduce", false, place.insideAggregate()));
                return Type.ANY;
            }
            if (e instanceof Expr.PatternPredicate pp) {
                pattern(new Pattern(List.of(pp.pattern()), pp.span()), new LinkedHashMap<>(scope), false, false);
                return Type.BOOLEAN;
            }
            if (e instanceof Expr.PatternComprehension pc) {
                Map<String, Binding> inner = new LinkedHashMap<>(scope);
                pattern(new Pattern(List.of(pc.pattern()), pc.span()), inner, true, false);
                Place in = new Place("a pattern comprehension", false, place.insideAggregate());
                pc.where().ifPresent(w -> boolCheck(w, expr(w, inner, in), "WHERE"));
                expr(pc.map(), inner, in);
                return Type.LIST;
            }
            if (e instanceof Expr.ExistsSubquery x) {
                subquery(x.pattern(), x.where(), x.query(), scope);
                return Type.BOOLEAN;
            }
            if (e instanceof Expr.CountSubquery x) {
                subquery(x.pattern(), x.where(), x.query(), scope);
                return Type.INTEGER;
            }
            if (e instanceof Expr.MapProjection mp) {
                Type t = expr(mp.variable(), scope, place);
                Binding owner = cx.binding(mp.variable());
                for (Expr.MapItem item : mp.items()) {
                    if (item instanceof Expr.PropertySelector ps) {
                        if (owner != null && t.mayBeElement()) {
                            cx.properties.add(new Context.PropertyUse(ps, ps.key(), owner, ps.span()));
                        }
                    } else if (item instanceof Expr.LiteralEntry le) {
                        expr(le.value(), scope, place);
                    } else if (item instanceof Expr.VariableSelector vs) {
                        expr(vs.variable(), scope, place);
                    }
                }
                return Type.MAP;
            }
            return Type.ANY;
        }

        private void subquery(Optional<Pattern> pattern, Optional<Expr> where, Optional<Query> query,
                              Map<String, Binding> scope) {
            Map<String, Binding> inner = new LinkedHashMap<>(scope);
            pattern.ifPresent(p -> pattern(p, inner, true, false));
            where.ifPresent(w -> predicate(w, inner));
            query.ifPresent(q -> query(q, inner, true));
        }

        private void boolCheck(Expr e, Type t, String where) {
            if (t.notBoolean()) wrongType(e, where + " needs a boolean", t);
        }

        private void wrongType(Expr e, String what, Type found) {
            cx.report(Diagnostic.of(Code.INVALID_ARGUMENT_TYPE, e, what + ", found " + found.withArticle()));
        }

        private Type binary(Expr.Binary b, Map<String, Binding> scope, Place place) {
            Type l = expr(b.left(), scope, place);
            Type r = expr(b.right(), scope, place);
            switch (b.op()) {
                case AND, OR, XOR -> {
                    if (l.notBoolean()) wrongType(b.left(), b.op().symbol() + " needs booleans", l);
                    if (r.notBoolean()) wrongType(b.right(), b.op().symbol() + " needs booleans", r);
                    return Type.BOOLEAN;
                }
                case IN -> {
                    if (r != Type.LIST && r != Type.NULL && r != Type.ANY && r != Type.REL_LIST) {
                        wrongType(b.right(), "IN needs a list on its right", r);
                    }
                    return Type.BOOLEAN;
                }
                case SUB, MUL, DIV, MOD, POW -> {
                    if (l.notNumber()) wrongType(b.left(), "'" + b.op().symbol() + "' needs numbers", l);
                    if (r.notNumber()) wrongType(b.right(), "'" + b.op().symbol() + "' needs numbers", r);
                    if (l.isNumber() && r.isNumber()) return l == Type.FLOAT || r == Type.FLOAT ? Type.FLOAT : Type.INTEGER;
                    return Type.ANY;
                }
                case ADD -> {
                    if (l.isNumber() && r.isNumber()) return l == Type.FLOAT || r == Type.FLOAT ? Type.FLOAT : Type.INTEGER;
                    if (l == Type.STRING && r == Type.STRING) return Type.STRING;
                    if (l == Type.LIST || r == Type.LIST) return Type.LIST;
                    return Type.ANY;
                }
                default -> {
                    return Type.BOOLEAN;
                }
            }
        }

        private Type call(Expr.FunctionCall f, Map<String, Binding> scope, Place place) {
            String name = f.qualifiedName().toLowerCase(Locale.ROOT);
            boolean agg = f.namespace().isEmpty() && AGGREGATES.contains(name);
            Place argPlace = place;
            if (agg) {
                aggregate(f, place);
                argPlace = place.inAggregate();
            } else if (place.insideAggregate() && name.equals("rand")) {
                // openCypher TCK, Return6 [15]: NonConstantExpression
                cx.report(Diagnostic.of(Code.NONDETERMINISTIC_AGGREGATE, f, f.name()));
            }
            List<Type> args = new ArrayList<>();
            for (Expr a : f.args()) args.add(expr(a, scope, argPlace));
            if (!args.isEmpty()) argumentKind(f, name, args.get(0));
            return Functions.resultType(name);
        }

        /** The argument kinds a few graph functions accept (openCypher 9 function signatures). */
        private void argumentKind(Expr.FunctionCall f, String name, Type t) {
            if (t == Type.ANY || t == Type.NULL) return;
            Set<Type> ok = switch (name) {
                case "labels" -> Set.of(Type.NODE);
                case "type", "startnode", "endnode" -> Set.of(Type.RELATIONSHIP);
                case "length" -> Set.of(Type.PATH, Type.STRING, Type.LIST);
                case "size" -> Set.of(Type.LIST, Type.STRING, Type.REL_LIST, Type.MAP);
                case "properties", "keys" -> Set.of(Type.NODE, Type.RELATIONSHIP, Type.MAP);
                case "nodes", "relationships" -> Set.of(Type.PATH);
                case "id" -> Set.of(Type.NODE, Type.RELATIONSHIP);
                default -> null;
            };
            if (ok != null && !ok.contains(t)) {
                wrongType(f.args().get(0), f.name() + "() cannot take a " + t.word(), t);
            }
        }

        private void aggregate(Expr e, Place place) {
            if (place.insideAggregate()) {
                cx.report(Diagnostic.of(Code.NESTED_AGGREGATION, e));
            } else if (!place.aggregationAllowed()) {
                cx.report(Diagnostic.of(Code.AGGREGATION_NOT_ALLOWED, e, place.name()));
            }
        }

        private Type elementType(Expr list, Map<String, Binding> scope) {
            if (list instanceof Expr.ListLit l && !l.elements().isEmpty()) {
                Type first = typeOf(l.elements().get(0));
                for (Expr x : l.elements()) if (typeOf(x) != first) return Type.ANY;
                return first == Type.NULL ? Type.ANY : first;
            }
            if (list instanceof Expr.Variable v && scope.get(v.name()) != null && scope.get(v.name()).type == Type.REL_LIST) {
                return Type.RELATIONSHIP;
            }
            return Type.ANY;
        }

        private static Type typeOf(Expr e) {
            if (e instanceof Expr.IntegerLit) return Type.INTEGER;
            if (e instanceof Expr.FloatLit) return Type.FLOAT;
            if (e instanceof Expr.StringLit) return Type.STRING;
            if (e instanceof Expr.BooleanLit) return Type.BOOLEAN;
            if (e instanceof Expr.NullLit) return Type.NULL;
            if (e instanceof Expr.ListLit) return Type.LIST;
            if (e instanceof Expr.MapLit) return Type.MAP;
            return Type.ANY;
        }
    }

    static boolean isAggregate(Node n) {
        if (n instanceof Expr.CountStar) return true;
        return n instanceof Expr.FunctionCall f && f.namespace().isEmpty()
                && AGGREGATES.contains(f.name().toLowerCase(Locale.ROOT));
    }

    /** Whether an aggregation is evaluated by this expression itself (not inside a nested subquery). */
    static boolean containsAggregate(Expr e) {
        if (isAggregate(e)) return true;
        // The common forms without reflection: this runs for every projected item.
        if (e instanceof Expr.Variable || e instanceof Expr.Parameter || e instanceof Expr.IntegerLit
                || e instanceof Expr.FloatLit || e instanceof Expr.StringLit || e instanceof Expr.BooleanLit
                || e instanceof Expr.NullLit) {
            return false;
        }
        if (e instanceof Expr.Property p) return containsAggregate(p.target());
        if (e instanceof Expr.Binary b) return containsAggregate(b.left()) || containsAggregate(b.right());
        if (e instanceof Expr.Unary u) return containsAggregate(u.operand());
        if (e instanceof Expr.FunctionCall f) {
            for (Expr a : f.args()) if (containsAggregate(a)) return true;
            return false;
        }
        if (e instanceof Expr.ExistsSubquery || e instanceof Expr.CountSubquery || e instanceof Expr.PatternComprehension) {
            return false;
        }
        for (Node c : Trees.children(e)) {
            if (c instanceof Expr x && containsAggregate(x)) return true;
            if (c instanceof Expr.CaseWhen w && (containsAggregate(w.when()) || containsAggregate(w.then()))) return true;
            if (c instanceof Expr.MapEntry m && containsAggregate(m.value())) return true;
            if (c instanceof Expr.LiteralEntry m && containsAggregate(m.value())) return true;
        }
        return false;
    }

    /** Variables an expression reads outside its aggregate calls (local comprehension variables excluded). */
    static List<Expr.Variable> freeOutsideAggregates(Expr e) {
        List<Expr.Variable> out = new ArrayList<>();
        collectFree(e, Set.of(), out);
        return out;
    }

    private static void collectFree(Node n, Set<String> local, List<Expr.Variable> out) {
        if (isAggregate(n)) return;
        if (n instanceof Expr.Variable v) {
            if (!local.contains(v.name())) out.add(v);
            return;
        }
        Set<String> inner = local;
        if (n instanceof Expr.ListComprehension lc) inner = with(local, lc.variable().name());
        else if (n instanceof Expr.Quantified q) inner = with(local, q.variable().name());
        else if (n instanceof Expr.Reduce r) inner = with(with(local, r.variable().name()), r.accumulator().name());
        else if (n instanceof Expr.PatternComprehension || n instanceof Expr.ExistsSubquery
                || n instanceof Expr.CountSubquery || n instanceof LabelExpr) return;
        for (Node c : Trees.children(n)) collectFree(c, inner, out);
    }

    private static Set<String> with(Set<String> s, String name) {
        Set<String> out = new HashSet<>(s);
        out.add(name);
        return out;
    }
}

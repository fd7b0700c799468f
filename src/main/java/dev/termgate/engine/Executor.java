package dev.termgate.engine;

import dev.termgate.query.Clause;
import dev.termgate.query.Expr;
import dev.termgate.query.Pattern;
import dev.termgate.query.Query;
import dev.termgate.query.SingleQuery;
import dev.termgate.query.Trees;
import dev.termgate.schema.GraphSchema;

import java.util.ArrayList;
import java.util.Collections;
import java.util.Comparator;
import java.util.HashSet;
import java.util.IdentityHashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.TreeSet;
import java.util.function.Function;

/**
 * Runs the clauses of a read query over rows of bindings: MATCH through the {@link Matcher}, everything else
 * (UNWIND, WITH pipelines, aggregation, ORDER BY, SKIP/LIMIT, DISTINCT, UNION) on the client. Write clauses
 * never run here; {@link #writeHandler} lets the importer (and only it) plug them in.
 */
final class Executor implements Evaluator.Host {

    /** Handles write clauses; the query path passes one that refuses them. */
    interface WriteHandler {
        List<Row> apply(Clause clause, List<Row> rows, Executor ex);
    }

    private final GraphPort port;
    private final GraphSchema schema;
    private final RunControl control;
    private final Map<String, Object> params;
    private final Function<dev.termgate.query.Node, String> namer;
    private final WriteHandler writeHandler;
    final Evaluator ev;
    final Matcher matcher;

    Executor(GraphPort port, GraphSchema schema, RunControl control, Map<String, Object> params,
             Function<dev.termgate.query.Node, String> namer, WriteHandler writeHandler) {
        this.port = port;
        this.schema = schema;
        this.control = control;
        this.params = params;
        this.namer = namer;
        this.writeHandler = writeHandler;
        this.ev = new Evaluator(this);
        this.matcher = new Matcher(port, schema, ev, control);
    }

    /** Column names and rows of a whole query. */
    record Table(List<String> columns, List<Row> rows) {}

    Table run(Query q, List<Row> input) {
        Table first = runSingle(q.first(), input);
        if (q.unions().isEmpty()) return first;
        List<Row> all = new ArrayList<>(first.rows());
        boolean distinct = false;
        for (Query.UnionPart u : q.unions()) {
            Table t = runSingle(u.query(), input);
            if (!new HashSet<>(t.columns()).equals(new HashSet<>(first.columns()))) {
                throw EngineException.runtime("all parts of a UNION must return the same columns");
            }
            all.addAll(t.rows());
            distinct |= !u.all();
        }
        if (distinct) all = distinctRows(all, first.columns());
        return new Table(first.columns(), all);
    }

    private Table runSingle(SingleQuery q, List<Row> input) {
        List<Row> rows = input;
        List<String> columns = List.of();
        // Variables in scope, tracked from the clauses so that RETURN * has columns even with no rows.
        Set<String> scope = new java.util.LinkedHashSet<>();
        if (!input.isEmpty()) for (String n : input.get(0).names()) scope.add(n);
        int from = 0;
        ProjectionPushdown.Planned pushed = ProjectionPushdown.plan(q, input, this);
        List<Row> pushedRows = pushed == null ? null : pushed.run(control);
        if (pushedRows != null) {
            // The first MATCH and its projection ran in the traversal; the rest of that projection runs here.
            from = 2;
            Clause c = q.clauses().get(1);
            Clause.Projection p = c instanceof Clause.With w ? w.projection() : ((Clause.Return) c).projection();
            Optional<Expr> where = c instanceof Clause.With w ? w.where() : Optional.empty();
            List<Item> items = items(p, scope);
            List<Projected> projected = new ArrayList<>(pushedRows.size());
            for (Row r : pushedRows) projected.add(new Projected(r, r));
            Table t = finish(p, items, projected, where, pushed.orderPushed());
            rows = t.rows();
            if (c instanceof Clause.With) scope = new java.util.LinkedHashSet<>(t.columns());
            else columns = t.columns();
        }
        for (Clause c : q.clauses().subList(from, q.clauses().size())) {
            control.checkNow();
            if (c instanceof Clause.Match m) {
                rows = match(m, rows);
                scope.addAll(introduced(m.pattern(), rows));
            } else if (c instanceof Clause.Unwind u) {
                rows = unwind(u, rows);
                scope.add(u.alias().name());
            } else if (c instanceof Clause.With w) {
                Table t = project(w.projection(), rows, w.where(), scope);
                rows = t.rows();
                scope = new java.util.LinkedHashSet<>(t.columns());
            } else if (c instanceof Clause.Return r) {
                Table t = project(r.projection(), rows, Optional.empty(), scope);
                rows = t.rows();
                columns = t.columns();
            } else {
                rows = writeHandler.apply(c, rows, this);
                // The importer's CREATE binds its pattern's variables for the clauses after it (WITH * included).
                if (c instanceof Clause.Create create) scope.addAll(introduced(create.pattern(), rows));
            }
        }
        return new Table(columns, rows);
    }

    // ---------------------------------------------------------------- MATCH, UNWIND

    private List<Row> match(Clause.Match m, List<Row> rows) {
        List<Row> out = new ArrayList<>();
        List<String> newVars = m.optional() ? introduced(m.pattern(), rows) : List.of();
        for (Row row : rows) {
            control.check();
            List<Row> found = matchWhere(m.pattern(), m.where(), row);
            if (found.isEmpty() && m.optional()) {
                Row padded = row;
                for (String v : newVars) if (!row.has(v)) padded = padded.with(v, null);
                out.add(padded);
            } else {
                for (Row f : found) out.add(f.withoutHidden());
            }
            control.checkSize(out.size());
        }
        return out;
    }

    /** Matches and filters by WHERE (openCypher: only TRUE keeps a row). */
    List<Row> matchWhere(Pattern pattern, Optional<Expr> where, Row row) {
        List<Row> found = matcher.match(pattern, where, row, Long.MAX_VALUE);
        if (where.isEmpty()) return found;
        List<Row> kept = new ArrayList<>(found.size());
        for (Row f : found) if (Values.isTrue(ev.eval(where.get(), f))) kept.add(f);
        return kept;
    }

    private static List<String> introduced(Pattern p, List<Row> rows) {
        Set<String> names = new java.util.LinkedHashSet<>();
        for (Pattern.Part part : p.parts()) {
            part.pathVariable().ifPresent(v -> names.add(v.name()));
            for (Pattern.NodePattern n : part.nodes()) n.variable().ifPresent(v -> names.add(v.name()));
            for (Pattern.Step s : part.steps()) s.rel().variable().ifPresent(v -> names.add(v.name()));
        }
        return new ArrayList<>(names);
    }

    private List<Row> unwind(Clause.Unwind u, List<Row> rows) {
        List<Row> out = new ArrayList<>();
        for (Row row : rows) {
            control.check();
            Object v = ev.eval(u.list(), row);
            if (v == null) continue;
            if (v instanceof List<?> l) {
                for (Object o : l) out.add(row.with(u.alias().name(), o));
            } else {
                out.add(row.with(u.alias().name(), v));
            }
            control.checkSize(out.size());
        }
        return out;
    }

    // ---------------------------------------------------------------- WITH / RETURN

    record Item(String name, Expr expr) {}

    /** An output row plus the scope ORDER BY may read (the input row's variables when not aggregating). */
    private record Projected(Row out, Row scope) {}

    private Table project(Clause.Projection p, List<Row> rows, Optional<Expr> where, Set<String> scope) {
        List<Item> items = items(p, scope);
        List<String> columns = items.stream().map(Item::name).toList();
        boolean aggregating = items.stream().anyMatch(i -> Aggregation.contains(i.expr()));
        if (!aggregating && !p.distinct() && p.orderBy().isEmpty() && p.limit().isPresent()) {
            // Only the rows that survive SKIP/LIMIT need projecting.
            long keep = p.skip().map(e -> count(e, "SKIP")).orElse(0L) + count(p.limit().get(), "LIMIT");
            if (keep < rows.size()) rows = rows.subList(0, (int) keep);
        }
        List<Projected> projected = aggregating ? aggregate(items, rows) : plain(items, rows);
        return finish(p, items, projected, where, false);
    }

    /** DISTINCT, ORDER BY, SKIP/LIMIT (unless the traversal did them: {@code ordered}) and WITH's WHERE. */
    private Table finish(Clause.Projection p, List<Item> items, List<Projected> projected, Optional<Expr> where, boolean ordered) {
        List<String> columns = items.stream().map(Item::name).toList();
        if (p.distinct()) {
            Set<Object> seen = new HashSet<>();
            List<Projected> kept = new ArrayList<>();
            for (Projected pr : projected) {
                List<Object> key = new ArrayList<>();
                for (String c : columns) key.add(Values.groupKey(pr.out().get(c)));
                if (seen.add(key)) kept.add(new Projected(pr.out(), pr.out()));
            }
            projected = kept;
        }
        if (!p.orderBy().isEmpty() && !ordered) projected = order(p.orderBy(), items, projected);
        long skip = ordered ? 0 : p.skip().map(e -> count(e, "SKIP")).orElse(0L);
        long limit = ordered ? Long.MAX_VALUE : p.limit().map(e -> count(e, "LIMIT")).orElse(Long.MAX_VALUE);
        if (skip > 0 || limit < Long.MAX_VALUE) {
            int from = (int) Math.min(skip, projected.size());
            int to = (int) Math.min(projected.size(), from + Math.min(limit, Integer.MAX_VALUE));
            projected = projected.subList(from, to);
        }
        List<Row> out = new ArrayList<>(projected.size());
        Expr whereExpr = where.map(w -> substitute(w, items)).orElse(null);
        for (Projected pr : projected) {
            if (whereExpr != null && !Values.isTrue(ev.eval(whereExpr, pr.scope()))) continue;
            out.add(pr.out());
        }
        return new Table(columns, out);
    }

    long count(Expr e, String what) {
        Object v = ev.eval(e, Row.EMPTY);
        if (v instanceof Double d && d == Math.rint(d)) v = d.longValue();
        if (!(v instanceof Long l) || l < 0) throw EngineException.runtime(what + " must be a non-negative integer");
        return l;
    }

    List<Item> items(Clause.Projection p, Set<String> scope) {
        List<Item> items = new ArrayList<>();
        if (p.star()) {
            Set<String> names = new TreeSet<>();
            for (String n : scope) if (!Row.Names.isHidden(n)) names.add(n);
            for (String n : names) items.add(new Item(n, new Expr.Variable(n, dev.termgate.query.Span.NONE)));
        }
        for (Clause.ProjectionItem it : p.items()) {
            String name = it.alias().map(Expr.Variable::name).orElseGet(() -> namer.apply(it));
            items.add(new Item(name, it.expr()));
        }
        return items;
    }

    private List<Projected> plain(List<Item> items, List<Row> rows) {
        List<Projected> out = new ArrayList<>(rows.size());
        for (Row row : rows) {
            control.check();
            Map<String, Object> values = new LinkedHashMap<>();
            for (Item i : items) values.put(i.name(), ev.eval(i.expr(), row));
            out.add(new Projected(Row.of(values), row.withAll(values)));
        }
        return out;
    }

    private List<Projected> aggregate(List<Item> items, List<Row> rows) {
        List<Item> keys = items.stream().filter(i -> !Aggregation.contains(i.expr())).toList();
        List<Item> aggs = items.stream().filter(i -> Aggregation.contains(i.expr())).toList();
        List<Expr> calls = new ArrayList<>();
        for (Item a : aggs) calls.addAll(Aggregation.calls(a.expr()));
        Map<List<Object>, Group> groups = new LinkedHashMap<>();
        for (Row row : rows) {
            control.check();
            List<Object> keyValues = new ArrayList<>();
            for (Item k : keys) keyValues.add(ev.eval(k.expr(), row));
            List<Object> key = new ArrayList<>();
            for (Object v : keyValues) key.add(Values.groupKey(v));
            Group g = groups.computeIfAbsent(key, k -> new Group(keyValues, row, calls));
            for (int i = 0; i < calls.size(); i++) {
                Aggregation.Acc acc = g.accs.get(i);
                Expr call = calls.get(i);
                if (acc.isCountStar()) acc.addStar();
                else {
                    Expr.FunctionCall f = (Expr.FunctionCall) call;
                    Object v = f.args().isEmpty() ? null : ev.eval(f.args().get(0), row);
                    Object extra = f.args().size() > 1 ? ev.eval(f.args().get(1), row) : null;
                    acc.add(v, extra);
                }
            }
        }
        if (groups.isEmpty() && keys.isEmpty()) groups.put(List.of(), new Group(List.of(), Row.EMPTY, calls));
        List<Projected> out = new ArrayList<>();
        for (Group g : groups.values()) {
            IdentityHashMap<Expr, Object> values = new IdentityHashMap<>();
            for (int i = 0; i < calls.size(); i++) values.put(calls.get(i), g.accs.get(i).result());
            Map<String, Object> row = new LinkedHashMap<>();
            int k = 0;
            for (Item i : items) {
                if (Aggregation.contains(i.expr())) row.put(i.name(), ev.eval(i.expr(), g.sample, values));
                else row.put(i.name(), g.keyValues.get(k++));
            }
            Row r = Row.of(row);
            out.add(new Projected(r, r));
        }
        return out;
    }

    private static final class Group {
        final List<Object> keyValues;
        final Row sample;
        final List<Aggregation.Acc> accs = new ArrayList<>();

        Group(List<Object> keyValues, Row sample, List<Expr> calls) {
            this.keyValues = keyValues;
            this.sample = sample;
            for (Expr c : calls) accs.add(new Aggregation.Acc(c));
        }
    }

    private List<Projected> order(List<Clause.SortItem> sort, List<Item> items, List<Projected> rows) {
        List<Object[]> keyed = new ArrayList<>(rows.size());
        for (Projected pr : rows) {
            control.check();
            Object[] k = new Object[sort.size() + 1];
            for (int i = 0; i < sort.size(); i++) k[i] = sortValue(sort.get(i).expr(), items, pr);
            k[sort.size()] = pr;
            keyed.add(k);
        }
        Comparator<Object[]> cmp = (a, b) -> {
            for (int i = 0; i < sort.size(); i++) {
                int c = Values.orderCompare(a[i], b[i]);
                if (c != 0) return sort.get(i).descending() ? -c : c;
            }
            return 0;
        };
        keyed.sort(cmp);
        List<Projected> out = new ArrayList<>(keyed.size());
        for (Object[] k : keyed) out.add((Projected) k[sort.size()]);
        return out;
    }

    private Object sortValue(Expr e, List<Item> items, Projected pr) {
        return ev.eval(substitute(e, items), pr.scope());
    }

    /**
     * After a projection, ORDER BY and WHERE may repeat a projected expression ({@code WITH a.x AS y WHERE
     * a.x > 1}); such subexpressions read the projected column instead (outermost match wins).
     */
    private static Expr substitute(Expr e, List<Item> items) {
        java.util.Set<dev.termgate.query.Node> hits = java.util.Collections.newSetFromMap(new IdentityHashMap<>());
        java.util.Map<dev.termgate.query.Node, String> names = new IdentityHashMap<>();
        java.util.ArrayDeque<dev.termgate.query.Node> todo = new java.util.ArrayDeque<>();
        todo.push(e);
        while (!todo.isEmpty()) {
            dev.termgate.query.Node n = todo.pop();
            String alias = null;
            if (n instanceof Expr x && !(x instanceof Expr.Variable)) {
                for (Item i : items) {
                    if (!(i.expr() instanceof Expr.Variable) && Trees.equalIgnoringSpans(i.expr(), x)) { alias = i.name(); break; }
                }
            }
            if (alias != null) {
                hits.add(n);
                names.put(n, alias);
            } else {
                for (dev.termgate.query.Node c : Trees.children(n)) todo.push(c);
            }
        }
        if (hits.isEmpty()) return e;
        return Trees.rewrite(e, n -> hits.contains(n) ? new Expr.Variable(names.get(n), n.span()) : n);
    }

    private static List<Row> distinctRows(List<Row> rows, List<String> columns) {
        Set<Object> seen = new HashSet<>();
        List<Row> out = new ArrayList<>();
        for (Row r : rows) {
            List<Object> key = new ArrayList<>();
            for (String c : columns) key.add(Values.groupKey(r.get(c)));
            if (seen.add(key)) out.add(r);
        }
        return out;
    }

    // ---------------------------------------------------------------- Evaluator.Host

    @Override
    public List<Row> matchPattern(Pattern pattern, Optional<Expr> where, Row row) {
        return matchWhere(pattern, where, row);
    }

    @Override
    public List<Row> runSubquery(Query query, Row row) {
        return run(query, List.of(row)).rows();
    }

    @Override
    public NodeValue nodeById(Object id) {
        return matcher.nodeById(id);
    }

    @Override
    public Map<String, Object> params() {
        return params;
    }

    @Override
    public RunControl control() {
        return control;
    }

    @Override
    public GraphSchema schema() {
        return schema;
    }

    GraphPort port() {
        return port;
    }

    static List<Object> values(Row row, List<String> columns) {
        List<Object> out = new ArrayList<>(columns.size());
        for (String c : columns) out.add(row.get(c));
        return Collections.unmodifiableList(out);
    }
}

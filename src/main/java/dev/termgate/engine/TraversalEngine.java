package dev.termgate.engine;

import dev.termgate.diag.Code;
import dev.termgate.query.Clause;
import dev.termgate.query.Expr;
import dev.termgate.query.Pattern;
import dev.termgate.query.Query;
import dev.termgate.query.SingleQuery;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.ScheduledFuture;
import java.util.concurrent.TimeUnit;
import java.util.function.Function;

/** The engine over any traversal source: embedded TinkerGraph or a remote server behind the driver. */
final class TraversalEngine implements Engine {
    private static final ScheduledExecutorService WATCHDOG = Executors.newSingleThreadScheduledExecutor(r -> {
        Thread t = new Thread(r, "termgate-watchdog");
        t.setDaemon(true);
        return t;
    });

    private final GraphPort port;
    private final boolean remote;
    private final Runnable onClose;

    TraversalEngine(GraphPort port, boolean remote, Runnable onClose) {
        this.port = port;
        this.remote = remote;
        this.onClose = onClose;
    }

    @Override
    public Result run(Request req, RunControl control) {
        long t0 = System.nanoTime();
        Executor ex = executor(req, control, REFUSE_WRITES);
        long t1 = System.nanoTime();
        control.attach(Thread.currentThread());
        ScheduledFuture<?> dog = WATCHDOG.schedule(control::expire, control.remainingMillis(), TimeUnit.MILLISECONDS);
        try {
            refuseWrites(req.query());
            Executor.Table table = ex.run(req.query(), List.of(Row.EMPTY));
            int cap = req.limits().maxRows();
            boolean truncated = table.rows().size() > cap;
            List<List<Object>> rows = new ArrayList<>();
            for (Row r : truncated ? table.rows().subList(0, cap) : table.rows()) {
                rows.add(Executor.values(r, table.columns()));
            }
            return new Result(table.columns(), rows, truncated, null, t1 - t0, System.nanoTime() - t1);
        } catch (EngineException e) {
            throw e;
        } catch (RuntimeException e) {
            throw translate(e, control);
        } catch (StackOverflowError e) {
            throw EngineException.runtime("the query nests too deeply to evaluate");
        } finally {
            dog.cancel(false);
            control.attach(null);
            Thread.interrupted();
        }
    }

    /** Maps failures of the traversal machinery to the engine's codes; the cause stays for debugging. */
    private EngineException translate(RuntimeException e, RunControl control) {
        for (Throwable c = e; c != null; c = c.getCause()) {
            String name = c.getClass().getSimpleName();
            if (name.equals("TraversalInterruptedException") || c instanceof InterruptedException) {
                return control.stopError();
            }
            if (remote && (name.equals("NoHostAvailableException") || c instanceof java.net.ConnectException
                    || name.equals("ConnectionException") || c instanceof java.nio.channels.ClosedChannelException
                    || name.equals("ResponseException") || c instanceof java.util.concurrent.TimeoutException)) {
                return new EngineException(Code.REMOTE_UNAVAILABLE, e, port.description(), rootMessage(e));
            }
        }
        if (control.expired()) return control.timeoutError();
        if (remote) return new EngineException(Code.REMOTE_UNAVAILABLE, e, port.description(), rootMessage(e));
        return new EngineException(Code.RUNTIME_ERROR, e, rootMessage(e));
    }

    static String rootMessage(Throwable e) {
        Throwable r = e;
        while (r.getCause() != null && r.getCause() != r) r = r.getCause();
        String m = r.getMessage();
        return m == null || m.isBlank() ? r.getClass().getSimpleName() : m;
    }

    private static void refuseWrites(Query q) {
        for (SingleQuery sq : q.parts()) {
            for (Clause c : sq.clauses()) {
                if (c.isWrite()) throw EngineException.runtime("write clauses are never run by the query engine");
            }
        }
    }

    static final Executor.WriteHandler REFUSE_WRITES = (clause, rows, ex) -> {
        throw EngineException.runtime("write clauses are never run by the query engine");
    };

    Executor executor(Request req, RunControl control, Executor.WriteHandler writes) {
        return new Executor(port, req.schema(), control, req.params(), namer(req.text()), writes);
    }

    /** Column names: the expression as written when the source is known, else a canonical rendering. */
    static Function<dev.termgate.query.Node, String> namer(String text) {
        return e -> {
            if (e instanceof Clause.ProjectionItem it && (text == null || it.span().isNone())) e = it.expr();
            if (e instanceof Expr.Variable v) return v.name();
            var s = e.span();
            if (text != null && !s.isNone() && s.endOffset() <= text.length()) {
                return text.substring(s.startOffset(), s.endOffset());
            }
            return e instanceof Expr x ? ExprText.of(x) : e.getClass().getSimpleName();
        };
    }

    @Override
    public Plan explain(Request req) {
        RunControl control = RunControl.of(req.limits());
        Executor ex = executor(req, control, REFUSE_WRITES);
        Function<dev.termgate.query.Node, String> name = namer(req.text());
        List<Plan.Step> steps = new ArrayList<>();
        for (SingleQuery sq : req.query().parts()) {
            if (sq != req.query().first()) steps.add(new Plan.Step(Plan.Kind.CLIENT, "UNION", "combine rows"));
            Map<String, Object> scope = new LinkedHashMap<>();
            List<Clause> clauses = sq.clauses();
            ProjectionPushdown.Planned pushed = ProjectionPushdown.plan(sq, List.of(Row.EMPTY), ex);
            var t = pushed == null ? null : pushed.traversal(true);
            if (t != null) {
                explainPushed(pushed, GremlinText.of(t), clauses.get(1), name, steps);
                clauses = clauses.subList(2, clauses.size());
                for (Executor.Item it : ex.items(projection(sq.clauses().get(1)), java.util.Set.of())) scope.put(it.name(), null);
            }
            for (Clause c : clauses) explainClause(c, ex, name, scope, steps);
        }
        return new Plan(steps);
    }

    private void explainClause(Clause c, Executor ex, Function<dev.termgate.query.Node, String> name, Map<String, Object> scope,
                               List<Plan.Step> steps) {
        if (c instanceof Clause.Match m) {
                String kw = m.optional() ? "OPTIONAL MATCH" : "MATCH";
                List<Matcher.Pushdown> pushed = m.where().map(ex.matcher::pushdowns).orElse(List.of());
                for (Pattern.Part part : m.pattern().parts()) {
                    Row row = Row.of(scope);
                    Matcher.PartPlan plan = ex.matcher.plan(part, row, pushed);
                    if (plan.varLength()) {
                        steps.add(new Plan.Step(Plan.Kind.CLIENT, kw, "expand " + name.apply(new Expr.PatternPredicate(part, part.span()))
                                + " hop by hop (each hop: g.V($from).outE/inE/bothE(types)...)"));
                    } else {
                        var t = ex.matcher.compile(plan, row, pushed, true);
                        steps.add(new Plan.Step(Plan.Kind.TRAVERSAL, kw, t == null ? "(matches nothing)" : GremlinText.of(t)));
                    }
                    plan.nodeVars().forEach(v -> scope.putIfAbsent(v, null));
                    plan.relVars().forEach(v -> scope.putIfAbsent(v, null));
                    plan.pathVar().ifPresent(v -> scope.putIfAbsent(v, null));
                }
                m.where().ifPresent(w -> steps.add(new Plan.Step(Plan.Kind.CLIENT, "WHERE", name.apply(w))));
                if (m.optional()) steps.add(new Plan.Step(Plan.Kind.CLIENT, "OPTIONAL", "pad rows without a match with null"));
        } else if (c instanceof Clause.Unwind u) {
                steps.add(new Plan.Step(Plan.Kind.CLIENT, "UNWIND", name.apply(u.list()) + " AS " + u.alias().name()));
                scope.put(u.alias().name(), null);
        } else if (c instanceof Clause.With w) {
                explainProjection("WITH", w.projection(), name, steps);
                w.where().ifPresent(x -> steps.add(new Plan.Step(Plan.Kind.CLIENT, "WHERE", name.apply(x))));
                if (!w.projection().star()) scope.clear();
                for (Clause.ProjectionItem it : w.projection().items()) {
                    scope.put(it.alias().map(Expr.Variable::name).orElseGet(() -> name.apply(it.expr())), null);
                }
        } else if (c instanceof Clause.Return r) {
            explainProjection("RETURN", r.projection(), name, steps);
        } else {
            steps.add(new Plan.Step(Plan.Kind.CLIENT, "REFUSED", "write clause; never run"));
        }
    }

    private static Clause.Projection projection(Clause c) {
        return c instanceof Clause.With w ? w.projection() : ((Clause.Return) c).projection();
    }

    /** The first MATCH and its projection as one traversal; only what the client still does as client steps. */
    private static void explainPushed(ProjectionPushdown.Planned pushed, String traversal, Clause c,
                                      Function<dev.termgate.query.Node, String> name, List<Plan.Step> steps) {
        String kw = c instanceof Clause.With ? "WITH" : "RETURN";
        Clause.Projection p = projection(c);
        steps.add(new Plan.Step(Plan.Kind.TRAVERSAL, "MATCH … " + kw, traversal));
        if (pushed.finishedOnClient()) {
            steps.add(new Plan.Step(Plan.Kind.CLIENT, kw, "finish aggregates from the traversal's partial results"
                    + " (exact float sums, least/greatest across types, distinct values under openCypher equality)"));
        }
        if (!pushed.orderPushed()) explainOrder(p, name, steps);
        if (c instanceof Clause.With w) w.where().ifPresent(x -> steps.add(new Plan.Step(Plan.Kind.CLIENT, "WHERE", name.apply(x))));
    }

    private static void explainProjection(String kw, Clause.Projection p, Function<dev.termgate.query.Node, String> name, List<Plan.Step> steps) {
        List<String> items = new ArrayList<>();
        if (p.star()) items.add("*");
        for (Clause.ProjectionItem it : p.items()) {
            items.add(name.apply(it.expr()) + it.alias().map(a -> " AS " + a.name()).orElse(""));
        }
        boolean agg = p.items().stream().anyMatch(i -> Aggregation.contains(i.expr()));
        steps.add(new Plan.Step(Plan.Kind.CLIENT, kw, (agg ? "group and aggregate " : "project ")
                + (p.distinct() ? "DISTINCT " : "") + String.join(", ", items)));
        explainOrder(p, name, steps);
    }

    private static void explainOrder(Clause.Projection p, Function<dev.termgate.query.Node, String> name, List<Plan.Step> steps) {
        if (!p.orderBy().isEmpty()) {
            List<String> keys = new ArrayList<>();
            for (Clause.SortItem s : p.orderBy()) keys.add(name.apply(s.expr()) + (s.descending() ? " DESC" : ""));
            steps.add(new Plan.Step(Plan.Kind.CLIENT, "ORDER BY", String.join(", ", keys)));
        }
        p.skip().ifPresent(s -> steps.add(new Plan.Step(Plan.Kind.CLIENT, "SKIP", name.apply(s))));
        p.limit().ifPresent(s -> steps.add(new Plan.Step(Plan.Kind.CLIENT, "LIMIT", name.apply(s))));
    }

    @Override
    public String description() {
        return port.description();
    }

    GraphPort port() {
        return port;
    }

    @Override
    public void close() {
        onClose.run();
    }

}
